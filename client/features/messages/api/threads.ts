import { infiniteQueryOptions, queryOptions, skipToken, useInfiniteQuery, useQuery, type InfiniteData, type QueryClient } from '@tanstack/react-query';
import type { HistoryPage, Message, ThreadAnswer, ThreadList, ThreadSummary } from '@shared/schemas/messages';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { threadKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export const HISTORY_PAGE_SIZE = 30;

export type HistoryData = InfiniteData<HistoryPage, string | null>;

export const threadQueries = {
  /** Every conversation of the signed-in person, newest first, with unread counts (the navigation badge and /messages). */
  mine: () =>
    queryOptions({
      queryKey: threadKeys.mine(),
      queryFn: () => api.get<ThreadList>('/api/threads').then((r) => r.threads),
      staleTime: 30_000,
    }),
  /** The conversations about one job that the person is part of. */
  forJob: (jobId: string) =>
    queryOptions({
      queryKey: threadKeys.forJob(jobId),
      queryFn: () => api.get<ThreadList>(`/api/jobs/${jobId}/threads`).then((r) => r.threads),
      staleTime: 30_000,
    }),
  /** A conversation's messages, newest page first; each page newest first. Kept current by live events, so not refetched on focus. */
  history: (threadId: string) =>
    infiniteQueryOptions({
      queryKey: threadKeys.history(threadId),
      queryFn: ({ pageParam }) =>
        api.get<HistoryPage>(`/api/threads/${threadId}/messages${toSearch({ before: pageParam, limit: HISTORY_PAGE_SIZE })}`),
      initialPageParam: null as string | null,
      getNextPageParam: (last) => last.nextCursor,
      staleTime: Infinity,
    }),
  /** The newest message of a conversation, for a one-line preview in a list. */
  latest: (threadId: string) =>
    queryOptions({
      queryKey: threadKeys.latest(threadId),
      queryFn: () => api.get<HistoryPage>(`/api/threads/${threadId}/messages?limit=1`).then((r) => r.messages[0] ?? null),
      staleTime: 60_000,
    }),
};

export const useMyThreads = (options?: { enabled?: boolean }) => useQuery({ ...threadQueries.mine(), enabled: options?.enabled ?? true });
export const useJobThreads = (jobId: string) => useQuery(threadQueries.forJob(jobId));
export const useThreadHistory = (threadId: string, options?: { enabled?: boolean }) =>
  useInfiniteQuery({ ...threadQueries.history(threadId), enabled: options?.enabled ?? true });
export const useLatestMessage = (threadId: string) => useQuery(threadQueries.latest(threadId));

/** The sum of unread messages over all conversations, for the navigation. */
export function useUnreadTotal(options?: { enabled?: boolean }): number {
  const { data } = useMyThreads(options);
  return (data ?? []).reduce((sum, thread) => sum + thread.unread, 0);
}

/**
 * Opens (or finds) the conversation about a job: the builder names the shop
 * that bid, a shop opens its own. The job's list gets the thread at once.
 */
export const useOpenThread = (jobId: string, options?: MutationOptions<ThreadSummary, { shopId?: string }>) =>
  useApiMutation(
    ({ shopId }: { shopId?: string }) => api.post<ThreadAnswer>(`/api/jobs/${jobId}/threads`, shopId ? { shopId } : {}).then((r) => r.thread),
    {
      update: (queryClient, thread) =>
        queryClient.setQueryData<ThreadSummary[]>(threadKeys.forJob(jobId), (list) => (list ? [thread, ...list.filter((t) => t.id !== thread.id)] : [thread])),
      refreshes: () => [threadKeys.lists()],
    },
    options?.mutationConfig,
  );

// ---- the cache, kept current by live events ----

/** Server order: newest first, ties broken by id, as the history endpoint sorts. */
const newestFirst = (a: Message, b: Message) => (a.createdAt === b.createdAt ? b.id.localeCompare(a.id) : b.createdAt.localeCompare(a.createdAt));

/** Puts a message into its conversation's history (once, by id) and its preview. */
export function addMessageToCache(queryClient: QueryClient, message: Message) {
  queryClient.setQueryData<HistoryData>(threadKeys.history(message.threadId), (data) => {
    if (!data || data.pages.length === 0) return data;
    if (data.pages.some((page) => page.messages.some((m) => m.id === message.id))) return data;
    const [first, ...older] = data.pages;
    return { ...data, pages: [{ ...first, messages: [message, ...first.messages].sort(newestFirst) }, ...older] };
  });
  queryClient.setQueryData<Message | null>(threadKeys.latest(message.threadId), (latest) =>
    latest && newestFirst(latest, message) <= 0 ? latest : message,
  );
}

/**
 * The other person has read up to `messageId`: every list that shows the thread learns it, and
 * the mark is kept apart too. A list fetched before the receipt (a new message refetches them)
 * can land after it; the kept mark stops that answer from taking "Seen" back.
 */
export function setOtherRead(queryClient: QueryClient, threadId: string, messageId: string) {
  queryClient.setQueryData(threadKeys.otherRead(threadId), messageId);
  queryClient.setQueriesData<ThreadSummary[]>({ queryKey: threadKeys.lists() }, (list) =>
    list?.map((thread) => (thread.id === threadId ? { ...thread, otherLastReadMessageId: messageId } : thread)),
  );
}

/** The read mark live events last set for a thread, if any. */
export const liveReadMark = (queryClient: QueryClient, threadId: string) => queryClient.getQueryData<string>(threadKeys.otherRead(threadId));

/** The same, kept current on screen (set only by `setOtherRead`, never fetched). */
export const useLiveReadMark = (threadId: string) =>
  useQuery<string>({ queryKey: threadKeys.otherRead(threadId), queryFn: skipToken, staleTime: Infinity }).data;

/**
 * Where in `delivered` (oldest first) the other person has read to: the later of the marks given,
 * since a read mark only moves forward; -1 when none of them is among the loaded messages.
 */
export function otherReadIndex(delivered: Message[], ...marks: (string | null | undefined)[]): number {
  return Math.max(-1, ...marks.map((mark) => (mark ? delivered.findIndex((m) => m.id === mark) : -1)));
}

/** The messages of a loaded history, oldest first, as a conversation reads. */
export function chronological(data: InfiniteData<HistoryPage, unknown> | undefined): Message[] {
  if (!data) return [];
  return data.pages.flatMap((page) => page.messages).reverse();
}

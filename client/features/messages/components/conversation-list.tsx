import { Link } from 'react-router-dom';
import type { ThreadSummary } from '@shared/schemas/messages';
import { Badge } from '@client/components/ui/badge';
import { Notice } from '@client/components/ui/notice';
import { useRealtimeUserId } from '@client/lib/realtime';
import { useMyThreads } from '../api/threads';
import { fullTime, messageTime, unreadWords } from './message-words';

/** The link that opens a conversation on its job's page. */
export const conversationPath = (thread: Pick<ThreadSummary, 'id' | 'jobId'>) => `/jobs/${thread.jobId}?thread=${thread.id}`;

function Row({ thread, viewerId }: { thread: ThreadSummary; viewerId: string | null }) {
  const other = thread.builder.id === viewerId ? thread.shop.name : `${thread.builder.displayName} (builder)`;
  return (
    <li
      className="relative flex flex-col gap-1 rounded-lg bg-white px-4 py-3 ring-1 ring-slate-200 focus-within:ring-2 focus-within:ring-slate-700 hover:bg-slate-50 sm:flex-row sm:items-center sm:gap-4"
      data-testid="thread-row"
    >
      <div className="flex min-w-0 flex-1 flex-col">
        <Link
          to={conversationPath(thread)}
          className="truncate font-bold text-slate-700 underline-offset-4 after:absolute after:inset-0 after:content-[''] hover:underline focus-visible:outline-none"
        >
          {thread.jobTitle}
        </Link>
        <span className="truncate text-sm text-ink-soft">with {other}</span>
      </div>
      <div className="flex shrink-0 flex-wrap items-center gap-3 text-sm">
        {!thread.canWrite && <Badge tone="muted">Closed</Badge>}
        {thread.lastMessageAt ? (
          <time dateTime={thread.lastMessageAt} title={fullTime(thread.lastMessageAt)} className="text-ink-soft">
            {messageTime(thread.lastMessageAt)}
          </time>
        ) : (
          <span className="text-ink-soft">No messages yet</span>
        )}
        {thread.unread > 0 ? (
          <Badge tone="info">
            <span data-testid="thread-unread">{unreadWords(thread.unread)}</span>
          </Badge>
        ) : (
          <span className="sr-only">no new messages</span>
        )}
      </div>
    </li>
  );
}

/** Every conversation of the signed-in person, newest first, each a link to its job page with the conversation open. */
export function ConversationList() {
  const threads = useMyThreads();
  const viewerId = useRealtimeUserId();
  if (threads.isPending) return <p className="text-ink-soft">Loading your conversations …</p>;
  if (threads.isError && !threads.data) {
    return (
      <Notice tone="error" title="Your conversations could not be loaded" onRetry={() => void threads.refetch()}>
        {threads.error.message}
      </Notice>
    );
  }
  if (threads.data.length === 0) {
    return (
      <Notice title="No conversations yet">
        Builders and shops write to each other from a job’s page: a shop asks the builder a question, a builder writes to a shop that bid.
      </Notice>
    );
  }
  return (
    <ul aria-label="Conversations" className="flex flex-col gap-2">
      {threads.data.map((thread) => (
        <Row key={thread.id} thread={thread} viewerId={viewerId} />
      ))}
    </ul>
  );
}

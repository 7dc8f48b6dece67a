import { infiniteQueryOptions, queryOptions, useInfiniteQuery, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { NeedsYou, Notification, NotificationPage, NotificationPreferences, NotificationPreferencesInput, UnreadNotifications } from '@shared/schemas/notifications';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { notificationKeys } from '@client/lib/query-keys';
import { useSocket, useSocketEvent } from '@client/lib/realtime';
import { toSearch } from '@client/lib/search-params';

export const notificationQueries = {
  /** The person's notices, newest page first; kept current by live events. */
  list: () =>
    infiniteQueryOptions({
      queryKey: notificationKeys.lists(),
      queryFn: ({ pageParam }) => api.get<NotificationPage>(`/api/notifications${toSearch({ cursor: pageParam })}`),
      initialPageParam: undefined as string | undefined,
      getNextPageParam: (last) => last.nextCursor ?? undefined,
    }),
  unread: () =>
    queryOptions({
      queryKey: notificationKeys.unread(),
      queryFn: () => api.get<UnreadNotifications>('/api/notifications/unread').then((r) => r.unread),
      staleTime: 60_000,
    }),
  needsYou: () =>
    queryOptions({
      queryKey: notificationKeys.needsYou(),
      queryFn: () => api.get<NeedsYou>('/api/me/needs-you').then((r) => r.items),
      staleTime: 30_000,
    }),
  preferences: () =>
    queryOptions({
      queryKey: notificationKeys.preferences(),
      queryFn: () => api.get<NotificationPreferences>('/api/me/notification-preferences').then((r) => r.preferences),
    }),
};

export const useNotifications = () => useInfiniteQuery(notificationQueries.list());
export const useUnreadNotifications = (options?: { enabled?: boolean }) => useQuery({ ...notificationQueries.unread(), enabled: options?.enabled ?? true });
export const useNeedsYou = () => useQuery(notificationQueries.needsYou());
export const useNotificationPreferences = () => useQuery(notificationQueries.preferences());

/** Reading changes the count, the list's read marks and nothing else. */
const afterReading = () => [notificationKeys.unread(), notificationKeys.lists()];

export const useMarkNotificationRead = (options?: MutationOptions<Notification, string>) =>
  useApiMutation((id: string) => api.post<{ notification: Notification }>(`/api/notifications/${id}/read`).then((r) => r.notification), { refreshes: afterReading }, options?.mutationConfig);

export const useMarkAllNotificationsRead = (options?: MutationOptions<UnreadNotifications, void>) =>
  useApiMutation(() => api.post<UnreadNotifications>('/api/notifications/read-all'), { refreshes: afterReading }, options?.mutationConfig);

export const useSaveNotificationPreferences = (options?: MutationOptions<NotificationPreferences, NotificationPreferencesInput>) =>
  useApiMutation((input: NotificationPreferencesInput) => api.put<NotificationPreferences>('/api/me/notification-preferences', input), {
    update: (queryClient, data) => queryClient.setQueryData(notificationKeys.preferences(), data.preferences),
  }, options?.mutationConfig);

/**
 * Keeps the bell, the notices and the needs-you list current for a signed-in
 * person: a new notice counts at once (the list and what waits are fetched
 * again), reading on another page recounts, and so does coming back after
 * a gap the connection could not replay.
 */
export function useNotificationsLive() {
  const queryClient = useQueryClient();
  const socket = useSocket();
  useEffect(() => {
    if (!socket) return;
    let connectedBefore = socket.connected;
    const up = () => {
      if (connectedBefore && !socket.recovered) {
        void queryClient.invalidateQueries({ queryKey: notificationKeys.unread() });
        void queryClient.invalidateQueries({ queryKey: notificationKeys.needsYou() });
      }
      connectedBefore = true;
    };
    socket.on('connect', up);
    return () => {
      socket.off('connect', up);
    };
  }, [socket, queryClient]);
  useSocketEvent('notification:new', () => {
    queryClient.setQueryData<number>(notificationKeys.unread(), (count) => (count ?? 0) + 1);
    void queryClient.invalidateQueries({ queryKey: notificationKeys.unread() });
    void queryClient.invalidateQueries({ queryKey: notificationKeys.lists() });
    void queryClient.invalidateQueries({ queryKey: notificationKeys.needsYou() });
  });
  useSocketEvent('notifications:read', () => {
    void queryClient.invalidateQueries({ queryKey: notificationKeys.unread() });
    void queryClient.invalidateQueries({ queryKey: notificationKeys.lists() });
  });
}

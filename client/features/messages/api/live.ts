import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useSyncExternalStore } from 'react';
import { threadKeys } from '@client/lib/query-keys';
import { useRealtimeUserId, useSocket, useSocketEvent } from '@client/lib/realtime';
import { outboxFor, outboxStorageKey, type Outbox, type OutboxEntry, type SendPayload } from '../outbox';
import { addMessageToCache, setOtherRead } from './threads';

/** How long to wait for the server to acknowledge a message before sending it again (same id). */
const SEND_TIMEOUT_MS = 15_000;

const EMPTY: OutboxEntry[] = [];
const noSubscribe = () => () => {};

/** The signed-in person's outgoing queue, or null when nobody is signed in. */
export function useOutbox(): Outbox | null {
  const userId = useRealtimeUserId();
  return useMemo(() => (userId ? outboxFor(userId) : null), [userId]);
}

/** The queued messages of one conversation (waiting, sending or failed), oldest first. */
export function useOutboxEntries(threadId: string): OutboxEntry[] {
  const outbox = useOutbox();
  const all = useSyncExternalStore(outbox?.subscribe ?? noSubscribe, outbox?.getSnapshot ?? (() => EMPTY));
  return useMemo(() => all.filter((entry) => entry.threadId === threadId), [all, threadId]);
}

/**
 * Live conversations for the whole app, mounted once for a signed-in person:
 * hands the outgoing queue the socket while it is connected (so leftovers
 * from an earlier visit go out as soon as the page connects), and keeps the
 * query cache current from server events.
 */
export function useMessagesLive() {
  const queryClient = useQueryClient();
  const socket = useSocket();
  const userId = useRealtimeUserId();
  const outbox = useOutbox();

  useEffect(() => {
    if (!socket || !outbox || !userId) return;
    const send = (payload: SendPayload) =>
      socket.timeout(SEND_TIMEOUT_MS).emitWithAck('message:send', payload);
    let connectedBefore = socket.connected;
    const up = () => {
      outbox.setSender(send);
      // After a gap, counts and previews may have moved without us. (An open conversation re-reads its own
      // history once it has joined its room again, so nothing falls between the read and the join.)
      if (connectedBefore && !socket.recovered) {
        void queryClient.invalidateQueries({ queryKey: threadKeys.lists() });
        void queryClient.invalidateQueries({ queryKey: threadKeys.latests() });
      }
      connectedBefore = true;
    };
    const down = () => outbox.setSender(null);
    if (socket.connected) outbox.setSender(send);
    socket.on('connect', up);
    socket.on('disconnect', down);
    const delivered = outbox.onDelivered((message) => {
      addMessageToCache(queryClient, message);
      void queryClient.invalidateQueries({ queryKey: threadKeys.lists() });
    });
    // Another tab of the same person queued or delivered something.
    const otherTab = (event: StorageEvent) => {
      if (event.key === outboxStorageKey(userId)) outbox.reloadFromStorage();
    };
    window.addEventListener('storage', otherTab);
    return () => {
      socket.off('connect', up);
      socket.off('disconnect', down);
      window.removeEventListener('storage', otherTab);
      delivered();
      outbox.setSender(null);
    };
  }, [socket, outbox, userId, queryClient]);

  useSocketEvent('message:new', (message) => {
    addMessageToCache(queryClient, message);
    // Our own message, back through the room before the answer came: it is stored, stop sending it.
    if (message.author.id === userId) outbox?.confirm(message);
    void queryClient.invalidateQueries({ queryKey: threadKeys.lists() });
  });

  useSocketEvent('unread:changed', ({ threadId }) => {
    void queryClient.invalidateQueries({ queryKey: threadKeys.lists() });
    void queryClient.invalidateQueries({ queryKey: threadKeys.latest(threadId) });
  });

  useSocketEvent('read', (event) => {
    if (event.userId !== userId) setOtherRead(queryClient, event.threadId, event.messageId);
  });
}

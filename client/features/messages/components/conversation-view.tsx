import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useLayoutEffect, useRef, useState, type ReactNode, type RefObject } from 'react';
import type { JobStatus } from '@shared/schemas/jobs';
import type { Message, MessagePhoto, ThreadSummary } from '@shared/schemas/messages';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { api } from '@client/lib/api-client';
import { cn } from '@client/lib/cn';
import { threadKeys } from '@client/lib/query-keys';
import { useConnectionStatus, useRealtimeUserId, useRoom, useSocket, useSocketEvent, type SocketAck } from '@client/lib/realtime';
import { useOutbox, useOutboxEntries } from '../api/live';
import { chronological, otherReadIndex, useLiveReadMark, useThreadHistory } from '../api/threads';
import type { OutboxEntry } from '../outbox';
import { MessageComposer } from './message-composer';
import { MessagePhotos } from './message-photos';
import { closedWords, fullTime, messageTime } from './message-words';

export interface ConversationViewProps {
  thread: ThreadSummary;
  /** The reader's side of the conversation. */
  side: 'builder' | 'shop';
  /** The job's status, to say why a closed conversation is closed. */
  jobStatus?: JobStatus;
  /** Put the cursor in the composer as the view opens (the person has just chosen this conversation). */
  focusComposer?: boolean;
  /** The id of a heading outside that already names the conversation; without it the view shows its own. */
  labelledBy?: string;
}

const TYPING_SHOWN_MS = 3_000;
const TYPING_SENT_EVERY_MS = 2_000;
/** How long a read receipt waits for the server's answer on the socket before it goes over HTTP. */
const READ_ACK_MS = 5_000;
/** How long before a receipt that failed both ways is tried again. */
const READ_RETRY_MS = 3_000;

/** Whether the tab is in front of the person. */
function usePageVisible(): boolean {
  const [visible, setVisible] = useState(() => document.visibilityState === 'visible');
  useEffect(() => {
    const update = () => setVisible(document.visibilityState === 'visible');
    document.addEventListener('visibilitychange', update);
    return () => document.removeEventListener('visibilitychange', update);
  }, []);
  return visible;
}

/** Whether at least part of the element is inside the window. */
function useOnScreen(ref: RefObject<HTMLElement | null>): boolean {
  const [onScreen, setOnScreen] = useState(false);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    const observer = new IntersectionObserver(([entry]) => setOnScreen(entry.isIntersecting), { threshold: 0.2 });
    observer.observe(element);
    return () => observer.disconnect();
  }, [ref]);
  return onScreen;
}

type ItemState = 'sent' | 'sending' | 'waiting' | 'failed';

function MessageItem(props: { own: boolean; authorName: string; body: string; photos: MessagePhoto[]; at: string; state: ItemState; footer?: ReactNode }) {
  const { own, authorName, body, photos, at, state, footer } = props;
  return (
    <li
      className={cn(
        'flex max-w-[min(85%,40rem)] flex-col gap-1 rounded-lg border-l-4 px-3 py-2 shadow-sm ring-1',
        own ? 'ml-auto border-brass-500 bg-brass-50 ring-brass-100' : 'mr-auto border-slate-500 bg-white ring-slate-200',
        (state === 'sending' || state === 'waiting') && 'border-dashed',
        state === 'failed' && 'border-fail ring-fail/40',
      )}
      data-testid="message"
      data-state={state}
      data-own={own || undefined}
    >
      <p className="flex flex-wrap items-baseline gap-x-2 text-sm">
        <span className="font-bold text-ink">{own ? 'You' : authorName}</span>
        <time dateTime={at} title={fullTime(at)} className="text-ink-soft">
          {messageTime(at)}
        </time>
      </p>
      {body && (
        <p className="whitespace-pre-wrap break-words text-base text-ink" data-testid="message-body">
          {body}
        </p>
      )}
      <MessagePhotos photos={photos} authorName={own ? 'you' : authorName} />
      {footer}
    </li>
  );
}

function PendingFooter({ entry, connected, onRemove, onRetry }: { entry: OutboxEntry; connected: boolean; onRemove: () => void; onRetry: () => void }) {
  if (entry.state === 'failed') {
    const canRetry = entry.errorCode === 'internal' || entry.errorCode === 'unavailable';
    return (
      <div className="flex flex-col gap-1">
        <p className="text-sm font-semibold text-fail">Not sent: {entry.error ?? 'the server refused it.'}</p>
        <div className="flex flex-wrap gap-2">
          {canRetry && (
            <Button variant="secondary" className="min-h-9 px-3 py-1 text-sm" onClick={onRetry}>
              Try again
            </Button>
          )}
          <Button variant="secondary" className="min-h-9 px-3 py-1 text-sm" onClick={onRemove} aria-label="Remove this unsent message">
            Remove
          </Button>
        </div>
      </div>
    );
  }
  const words =
    entry.state === 'waiting' && entry.slowedDown
      ? 'Sending too fast: it goes in a few seconds.'
      : entry.state === 'waiting' && !connected
        ? 'Waiting for the connection. It goes as soon as you are back online.'
        : 'Sending…';
  return (
    <p className="text-sm text-ink-soft" data-testid="message-status">
      {words}
    </p>
  );
}

/**
 * One conversation: its history (older pages on demand), new messages as they
 * arrive, what is still on its way, "is typing…", "Seen" under the last of
 * your messages the other person has read, and the composer, or a notice
 * when the conversation is closed.
 */
export function ConversationView({ thread, side, jobStatus, focusComposer = false, labelledBy }: ConversationViewProps) {
  const queryClient = useQueryClient();
  const socket = useSocket();
  const status = useConnectionStatus();
  const me = useRealtimeUserId();
  const outbox = useOutbox();
  const otherName = side === 'builder' ? thread.shop.name : thread.builder.displayName;
  const headingId = useId();

  // ---- the room: joined before the history is read, so nothing falls between the two ----
  const [joined, setJoined] = useState(false);
  const [joinError, setJoinError] = useState<string | null>(null);
  const [joinedCanWrite, setJoinedCanWrite] = useState<boolean | null>(null);
  useRoom(
    thread.id,
    (s, threadId) => {
      const askedAt = Date.now();
      s.emit('thread:join', { threadId }, (ack: SocketAck<{ canWrite: boolean }>) => {
        if (!ack.ok) {
          setJoinError(ack.error.message);
          return;
        }
        setJoinError(null);
        setJoinedCanWrite(ack.canWrite);
        setJoined(true);
        // A history read before this join (an earlier visit, a lost connection) may miss what came in between.
        const state = queryClient.getQueryState(threadKeys.history(threadId));
        if (state?.data && state.dataUpdatedAt < askedAt) void queryClient.invalidateQueries({ queryKey: threadKeys.history(threadId) });
      });
    },
    (s, threadId) => s.emit('thread:leave', { threadId }),
  );

  // Without a live connection (or when the join was refused, to show why) the history is read over HTTP at once.
  const history = useThreadHistory(thread.id, { enabled: joined || joinError !== null || status !== 'connected' });
  const delivered = chronological(history.data);
  const entries = useOutboxEntries(thread.id);
  const deliveredIds = new Set(delivered.filter((m) => m.author.id === me).map((m) => m.clientId));
  const pending = entries.filter((entry) => !deliveredIds.has(entry.clientId));

  // Messages from before the first page stay out of the live region, so loading older ones is not read out.
  const boundary = useRef<string | null>(null);
  if (boundary.current === null && history.data) boundary.current = delivered[0]?.createdAt ?? '';
  const earlier = delivered.filter((m) => boundary.current && m.createdAt < boundary.current);
  const recent = delivered.filter((m) => !(boundary.current && m.createdAt < boundary.current));

  // ---- "Seen": the last of my messages at or before where the other person has read ----
  const liveRead = useLiveReadMark(thread.id);
  const readIndex = otherReadIndex(delivered, thread.otherLastReadMessageId, liveRead);
  let seenId: string | null = null;
  for (let i = readIndex; i >= 0; i--) {
    if (delivered[i].author.id === me) {
      seenId = delivered[i].id;
      break;
    }
  }

  // ---- typing, both ways ----
  const [typing, setTyping] = useState<{ userId: string; name: string } | null>(null);
  const typingTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useSocketEvent('typing', (event) => {
    if (event.threadId !== thread.id || event.userId === me) return;
    setTyping({ userId: event.userId, name: event.displayName });
    clearTimeout(typingTimer.current);
    typingTimer.current = setTimeout(() => setTyping(null), TYPING_SHOWN_MS);
  });
  useEffect(() => () => clearTimeout(typingTimer.current), []);
  const newest: Message | undefined = delivered[delivered.length - 1];
  useEffect(() => {
    // Their message arrived: they are no longer typing it.
    if (newest && typing && newest.author.id === typing.userId) setTyping(null);
  }, [newest, typing]);
  const lastTypingSent = useRef(0);
  const sendTyping = () => {
    const now = Date.now();
    if (!socket?.connected || now - lastTypingSent.current < TYPING_SENT_EVERY_MS) return;
    lastTypingSent.current = now;
    socket.volatile.emit('typing', { threadId: thread.id });
  };

  // ---- read receipts: tell the server when the newest message is in front of the person ----
  const scroller = useRef<HTMLDivElement>(null);
  const onScreen = useOnScreen(scroller);
  const pageVisible = usePageVisible();
  const readSent = useRef<string | null>(null);
  // Bumped to try a receipt again after it failed both ways.
  const [readRetry, setReadRetry] = useState(0);
  const newestAtOpen = useRef<string | null | undefined>(undefined);
  if (newestAtOpen.current === undefined && history.data) newestAtOpen.current = newest?.id ?? null;
  useEffect(() => {
    if (!newest || newest.author.id === me || !onScreen || !pageVisible) return;
    if (readSent.current === newest.id) return;
    // Opening an already-read conversation needs no receipt.
    if (newest.id === newestAtOpen.current && thread.unread === 0) return;
    readSent.current = newest.id;
    const done = () => void queryClient.invalidateQueries({ queryKey: threadKeys.lists() });
    const failed = () => {
      readSent.current = null;
      window.setTimeout(() => setReadRetry((n) => n + 1), READ_RETRY_MS);
    };
    const overHttp = () => api.post(`/api/threads/${thread.id}/read`, { messageId: newest.id }).then(done, failed);
    // A receipt whose answer never comes (a dropped packet, a connection half gone) goes again over HTTP.
    if (socket?.connected) {
      socket
        .timeout(READ_ACK_MS)
        .emitWithAck('read', { threadId: thread.id, messageId: newest.id })
        .then((ack: SocketAck) => (ack.ok ? done() : overHttp()), overHttp);
    } else void overHttp();
  }, [newest, me, onScreen, pageVisible, thread.id, thread.unread, socket, queryClient, readRetry]);

  // ---- scrolling: stay at the bottom for new messages; keep the place when older ones load ----
  const atBottom = useRef(true);
  const keepFromBottom = useRef<number | null>(null);
  const lastKey = pending.length ? pending[pending.length - 1].clientId : newest?.id;
  const firstKey = delivered[0]?.id;
  useLayoutEffect(() => {
    const el = scroller.current;
    if (el && atBottom.current) el.scrollTop = el.scrollHeight;
  }, [lastKey, typing]);
  useLayoutEffect(() => {
    const el = scroller.current;
    if (el && keepFromBottom.current !== null) {
      el.scrollTop = el.scrollHeight - keepFromBottom.current;
      keepFromBottom.current = null;
    }
  }, [firstKey]);
  const loadOlder = () => {
    const el = scroller.current;
    if (!history.hasNextPage || history.isFetchingNextPage) return;
    if (el) keepFromBottom.current = el.scrollHeight - el.scrollTop;
    void history.fetchNextPage();
  };
  const onScroll = () => {
    const el = scroller.current;
    if (!el) return;
    atBottom.current = el.scrollHeight - el.scrollTop - el.clientHeight < 60;
    if (el.scrollTop < 40 && el.scrollHeight > el.clientHeight) loadOlder();
  };

  const composer = useRef<HTMLTextAreaElement>(null);
  useEffect(() => {
    if (focusComposer) composer.current?.focus();
  }, [focusComposer, thread.id]);

  // A send refused because the conversation closed (the job was just awarded elsewhere) closes the composer at once.
  const closedOnSend = entries.some((entry) => entry.errorCode === 'thread_closed');
  const canWrite = thread.canWrite && joinedCanWrite !== false && !closedOnSend;
  const connected = status === 'connected';
  const renderMessage = (m: Message) => (
    <MessageItem
      key={`${m.author.id}:${m.clientId}`}
      own={m.author.id === me}
      authorName={m.author.displayName}
      body={m.body}
      photos={m.photos ?? []}
      at={m.createdAt}
      state="sent"
      footer={
        m.id === seenId ? (
          <p className="text-sm font-semibold text-slate-700" data-testid="seen">
            Seen<span className="sr-only"> by {otherName}</span>
          </p>
        ) : undefined
      }
    />
  );

  return (
    <section aria-labelledby={labelledBy ?? headingId} className="flex min-w-0 flex-col gap-3" data-testid="conversation" data-thread-id={thread.id}>
      {!labelledBy && (
        <h3 id={headingId} className="text-lg font-bold text-ink">
          With {otherName}
        </h3>
      )}
      {joinError && (
        <Notice tone="error" title="This conversation could not be opened">
          {joinError}
        </Notice>
      )}
      <div className="flex flex-col gap-1">
        <div
          ref={scroller}
          onScroll={onScroll}
          tabIndex={0}
          role="region"
          aria-label={`Messages with ${otherName}`}
          className="flex max-h-[26rem] min-h-40 flex-col gap-2 overflow-y-auto rounded-lg bg-paper-sunk/60 p-3 ring-1 ring-slate-200"
        >
          {history.hasNextPage && (
            <Button variant="quiet" className="min-h-9 self-center px-3 py-1 text-sm" busy={history.isFetchingNextPage} onClick={loadOlder}>
              Show earlier messages
            </Button>
          )}
          {history.isPending && !history.data && <p className="text-ink-soft">Loading the messages …</p>}
          {history.isError && !history.data && (
            <Notice tone="error" title="The messages could not be loaded" onRetry={() => void history.refetch()}>
              {history.error.message}
            </Notice>
          )}
          {earlier.length > 0 && (
            <ol aria-label="Earlier messages" className="flex flex-col gap-2">
              {earlier.map(renderMessage)}
            </ol>
          )}
          {/* The live region wraps the list: a role on the <ol> itself would stop it being a list for its <li> items. */}
          <div role="log" aria-live="polite" aria-relevant="additions" aria-label="Latest messages">
            <ol aria-label="Latest messages" className="flex flex-col gap-2">
              {recent.map(renderMessage)}
              {pending.map((entry) => (
                <MessageItem
                  key={`${me}:${entry.clientId}`}
                  own
                  authorName="You"
                  body={entry.body}
                  photos={entry.photos}
                  at={entry.queuedAt}
                  state={entry.state}
                  footer={<PendingFooter entry={entry} connected={connected} onRemove={() => outbox?.remove(entry.clientId)} onRetry={() => outbox?.retry(entry.clientId)} />}
                />
              ))}
            </ol>
          </div>
          {history.data && delivered.length === 0 && pending.length === 0 && (
            <p className="my-auto text-center text-ink-soft">{canWrite ? 'No messages yet. Write the first one below.' : 'No messages.'}</p>
          )}
        </div>
        <p className="min-h-5 text-sm italic text-ink-soft" data-testid="typing">
          {typing ? `${typing.name} is typing…` : ''}
        </p>
      </div>
      {canWrite ? (
        <MessageComposer
          key={thread.id}
          ref={composer}
          threadId={thread.id}
          recipientName={otherName}
          onTyping={sendTyping}
          onSend={(body, photos) => {
            atBottom.current = true;
            outbox?.enqueue(thread.id, body, photos);
          }}
        />
      ) : (
        <Notice>{closedWords(jobStatus, side)}</Notice>
      )}
    </section>
  );
}

import type { Message, MessagePhoto, SentMessage } from '@shared/schemas/messages';
import type { SocketAck } from '@client/lib/realtime';

/**
 * Outgoing messages, kept until the server has them: nothing lost, nothing twice.
 *
 * Each message gets its id (`clientId`) when the person presses Send. It is
 * written to localStorage at once and stays there until the server
 * acknowledges it, so a message typed while the connection is down, or left
 * behind by a closed tab, goes out on the next connection with the same id.
 * The server stores a (person, clientId) pair once and answers a resend with
 * `duplicate: true`, which counts as delivered. Messages go out one at a
 * time, oldest first, so a conversation keeps its order. Photos are uploaded
 * before Send; the entry keeps their ids, so every resend carries the same
 * photos and the server attaches them once.
 */

export type OutboxState = 'waiting' | 'sending' | 'failed';

export interface OutboxEntry {
  clientId: string;
  threadId: string;
  body: string;
  /** Photos already uploaded to the conversation, sent by id with the message (may be empty). */
  photoIds: string[];
  /** The same photos, to show them while the message waits. */
  photos: MessagePhoto[];
  /** When Send was pressed (ISO). */
  queuedAt: string;
  state: OutboxState;
  /** The server's words when it refused the message (state "failed"). */
  error?: string;
  /** The server's error code, to tell a closed conversation from a passing fault. */
  errorCode?: string;
  /** Not before this moment (ms since 1970): after "too fast", or a fault worth retrying. */
  retryAt?: number;
  /** Set when the last answer was "you are sending too fast". */
  slowedDown?: boolean;
  /** Answers that were server faults, to give up after a few. */
  faults: number;
}

export interface SendPayload {
  threadId: string;
  clientId: string;
  body: string;
  photoIds: string[];
}

export type SendAnswer = SocketAck<SentMessage>;

/** Something that delivers one message and resolves with the server's answer, or rejects when no answer came (connection lost, timed out). */
export type SendMessage = (payload: SendPayload) => Promise<SendAnswer>;

/** Codes after which sending the same message again can work. */
const PASSING_FAULTS = new Set(['internal', 'unavailable']);
const RATE_LIMITED = 'too_many_attempts';
const MAX_FAULTS = 5;
const NO_ANSWER_RETRY_MS = 2_000;
const RATE_LIMIT_WAIT_MS = 5_000;

/** 32 hex digits from the browser's random source (works without a secure context, unlike randomUUID). */
export function newClientId(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

function isEntry(value: unknown): value is OutboxEntry {
  const e = value as OutboxEntry;
  return Boolean(e) && typeof e.clientId === 'string' && typeof e.threadId === 'string' && typeof e.body === 'string' && typeof e.queuedAt === 'string';
}

export class Outbox {
  private entries: OutboxEntry[];
  private readonly listeners = new Set<() => void>();
  private readonly deliveredListeners = new Set<(message: Message) => void>();
  private send: SendMessage | null = null;
  private flushing = false;
  private flushAgain = false;
  private timer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly storageKey: string,
    private readonly storage: Pick<Storage, 'getItem' | 'setItem' | 'removeItem'> | undefined,
    private readonly now: () => number = Date.now,
  ) {
    this.entries = this.read();
  }

  // ---- reading and writing the kept copy ----

  private read(): OutboxEntry[] {
    try {
      const parsed: unknown = JSON.parse(this.storage?.getItem(this.storageKey) ?? '[]');
      if (!Array.isArray(parsed)) return [];
      // A message that was on its way when the page closed may or may not have
      // arrived; sending it again with the same id settles it either way.
      return parsed
        .filter(isEntry)
        .map((e) => ({ ...e, photoIds: e.photoIds ?? [], photos: e.photos ?? [], state: e.state === 'failed' ? 'failed' : 'waiting', faults: e.faults ?? 0 }));
    } catch {
      return [];
    }
  }

  private write() {
    try {
      if (this.entries.length === 0) this.storage?.removeItem(this.storageKey);
      else this.storage?.setItem(this.storageKey, JSON.stringify(this.entries.map((e) => (e.state === 'sending' ? { ...e, state: 'waiting' } : e))));
    } catch {
      // Storage full or blocked: the queue still works for as long as the page is open.
    }
  }

  private replace(next: OutboxEntry[]) {
    this.entries = next;
    this.write();
    for (const listener of this.listeners) listener();
  }

  private update(clientId: string, change: Partial<OutboxEntry>) {
    if (!this.entries.some((e) => e.clientId === clientId)) return;
    this.replace(this.entries.map((e) => (e.clientId === clientId ? { ...e, ...change } : e)));
  }

  /** Another tab changed the kept copy: take its view, keeping what this tab is sending right now. */
  reloadFromStorage() {
    const sending = new Set(this.entries.filter((e) => e.state === 'sending').map((e) => e.clientId));
    this.entries = this.read().map((e) => (sending.has(e.clientId) && e.state === 'waiting' ? { ...e, state: 'sending' } : e));
    for (const listener of this.listeners) listener();
  }

  // ---- for React (useSyncExternalStore) ----

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  getSnapshot = () => this.entries;

  /** Called with each message the server confirmed, so the page can show the stored copy. */
  onDelivered(listener: (message: Message) => void) {
    this.deliveredListeners.add(listener);
    return () => {
      this.deliveredListeners.delete(listener);
    };
  }

  // ---- what the page does ----

  /** Queues a message (the moment Send is pressed) and sends it if the connection is up. */
  enqueue(threadId: string, body: string, photos: MessagePhoto[] = []): OutboxEntry {
    const entry: OutboxEntry = {
      clientId: newClientId(),
      threadId,
      body,
      photoIds: photos.map((photo) => photo.id),
      photos,
      queuedAt: new Date(this.now()).toISOString(),
      state: 'waiting',
      faults: 0,
    };
    this.replace([...this.entries, entry]);
    void this.flush();
    return entry;
  }

  /** Drops a message that will not be sent (the person chose "Remove"). */
  remove(clientId: string) {
    if (!this.entries.some((e) => e.clientId === clientId && e.state !== 'sending')) return;
    this.replace(this.entries.filter((e) => e.clientId !== clientId));
  }

  /** Puts a failed message back in the queue, same id. */
  retry(clientId: string) {
    this.update(clientId, { state: 'waiting', error: undefined, errorCode: undefined, retryAt: undefined, slowedDown: false, faults: 0 });
    void this.flush();
  }

  /** The server has this message (it came back live before the answer did): stop sending it. */
  confirm(message: Message) {
    if (!this.entries.some((e) => e.clientId === message.clientId && e.threadId === message.threadId)) return;
    this.replace(this.entries.filter((e) => !(e.clientId === message.clientId && e.threadId === message.threadId)));
  }

  /** The way out while connected; null while the connection is down (messages wait). */
  setSender(send: SendMessage | null) {
    this.send = send;
    if (!send) return;
    // Back online: what waited only for the connection goes now (a "too fast" wait still holds).
    if (this.entries.some((e) => e.state === 'waiting' && e.retryAt && !e.slowedDown)) {
      this.replace(this.entries.map((e) => (e.state === 'waiting' && !e.slowedDown ? { ...e, retryAt: undefined } : e)));
    }
    void this.flush();
  }

  get connected() {
    return this.send !== null;
  }

  /** Sends waiting messages one at a time, oldest first, while the connection lasts. */
  async flush(): Promise<void> {
    if (this.flushing) {
      this.flushAgain = true;
      return;
    }
    this.flushing = true;
    try {
      do {
        this.flushAgain = false;
        for (;;) {
          const send = this.send;
          if (!send) break;
          const next = this.entries.find((e) => e.state === 'waiting');
          if (!next) break;
          const wait = (next.retryAt ?? 0) - this.now();
          if (wait > 0) {
            this.wakeIn(wait);
            break;
          }
          await this.sendOne(send, next);
        }
      } while (this.flushAgain);
    } finally {
      this.flushing = false;
    }
  }

  private wakeIn(ms: number) {
    clearTimeout(this.timer);
    this.timer = setTimeout(() => void this.flush(), ms);
  }

  private async sendOne(send: SendMessage, entry: OutboxEntry) {
    this.update(entry.clientId, { state: 'sending' });
    let answer: SendAnswer;
    try {
      answer = await send({ threadId: entry.threadId, clientId: entry.clientId, body: entry.body, photoIds: entry.photoIds });
    } catch {
      // No answer: the connection dropped or the server was slow. It may have the message; the same id makes a resend safe.
      this.update(entry.clientId, { state: 'waiting', retryAt: this.now() + NO_ANSWER_RETRY_MS });
      return;
    }
    if (answer.ok) {
      // A duplicate means an earlier try got through: delivered all the same.
      for (const listener of this.deliveredListeners) listener(answer.message);
      this.confirm(answer.message);
      return;
    }
    const { code, message, fields } = answer.error;
    if (code === RATE_LIMITED) {
      this.update(entry.clientId, { state: 'waiting', slowedDown: true, retryAt: this.now() + RATE_LIMIT_WAIT_MS });
    } else if (PASSING_FAULTS.has(code) && entry.faults + 1 < MAX_FAULTS) {
      this.update(entry.clientId, { state: 'waiting', faults: entry.faults + 1, retryAt: this.now() + 1_000 * 2 ** (entry.faults + 1) });
    } else {
      this.update(entry.clientId, { state: 'failed', error: fields?.body ?? fields?.photoIds ?? message, errorCode: code, slowedDown: false });
    }
  }
}

const outboxes = new Map<string, Outbox>();

export const outboxStorageKey = (userId: string) => `tenthmark:outbox:${userId}`;

function localStore(): Storage | undefined {
  try {
    return window.localStorage;
  } catch {
    return undefined;
  }
}

/** The one queue of a signed-in person in this tab (kept per person, so a shared computer never sends one person's words as another's). */
export function outboxFor(userId: string): Outbox {
  let outbox = outboxes.get(userId);
  if (!outbox) {
    outbox = new Outbox(outboxStorageKey(userId), localStore());
    outboxes.set(userId, outbox);
  }
  return outbox;
}

import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { rename, writeFile } from 'node:fs/promises';
import { dirname } from 'node:path';
import type { State } from './types';

export function emptyState(): State {
  return {
    version: 1,
    accounts: {},
    accountLinks: {},
    checkoutSessions: {},
    sessionDetails: {},
    paymentIntents: {},
    charges: {},
    refunds: {},
    transfers: {},
    reversals: {},
    balanceTransactions: {},
    events: {},
    idempotency: {},
    deliveries: {},
    webhook: null,
    delivery: { paused: false, holding: false, duplicateNext: 0, reverseNext: null, queueSeq: 0 },
  };
}

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** An id in the provider's style: a type prefix and 24 random letters and digits. */
export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let out = '';
  for (const byte of bytes) out += ALPHABET[byte % ALPHABET.length];
  return `${prefix}${out}`;
}

/**
 * The whole state lives in one JSON file. Every change is written to a
 * temporary file next to it and renamed over it, so a crash leaves either the
 * old or the new file, never half of one. Writes are queued one behind the
 * other; each writes the state as it is when its turn comes.
 */
export class Store {
  readonly state: State;
  private queue: Promise<void> = Promise.resolve();
  private counter = 0;
  private closed = false;

  constructor(private readonly file: string | undefined) {
    this.state = file ? Store.load(file) : emptyState();
  }

  private static load(file: string): State {
    if (!existsSync(file)) return emptyState();
    const text = readFileSync(file, 'utf8');
    if (!text.trim()) return emptyState();
    const parsed = JSON.parse(text) as Partial<State>;
    if (parsed.version !== 1) throw new Error(`${file}: not a payment stand-in data file (version ${String(parsed.version)})`);
    const base = emptyState();
    return { ...base, ...parsed, delivery: { ...base.delivery, ...parsed.delivery } } as State;
  }

  /** Resolves once a write that includes every change made so far is on disk. */
  save(): Promise<void> {
    const file = this.file;
    if (!file || this.closed) return Promise.resolve();
    const next = this.queue.then(async () => {
      mkdirSync(dirname(file), { recursive: true });
      const temp = `${file}.${process.pid}.${++this.counter}.tmp`;
      await writeFile(temp, JSON.stringify(this.state), 'utf8');
      await rename(temp, file);
    });
    // Keep the queue going after a failed write; the caller still sees the failure.
    this.queue = next.catch(() => undefined);
    return next;
  }

  /** Waits for the writes already queued. */
  flush(): Promise<void> {
    return this.queue;
  }

  /** Writes what is queued, then ignores later changes (as a stopped server would). */
  async close(): Promise<void> {
    this.closed = true;
    await this.queue;
  }
}

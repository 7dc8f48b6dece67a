import { createHmac } from 'node:crypto';
import type { Engine } from './engine';
import { newId } from './store';
import type { Delivery, StripeEvent } from './types';

export interface RetryPolicy {
  /** Wait before the second attempt; doubles after each failure. */
  initialDelayMs: number;
  /** The longest wait between two attempts. */
  maxDelayMs: number;
  /** Stop trying once the first attempt is this old. */
  giveUpAfterMs: number;
  /** How long one attempt may take. */
  timeoutMs: number;
}

export const defaultRetryPolicy: RetryPolicy = {
  initialDelayMs: 1_000,
  maxDelayMs: 5 * 60_000,
  giveUpAfterMs: 3 * 24 * 3600_000,
  timeoutMs: 10_000,
};

/** The provider's scheme: `t=<unix>,v1=<hex HMAC-SHA256 of "t.body" keyed with the whole whsec_ secret>`. */
export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

const HISTORY_LIMIT = 20;

/**
 * Sends stored events to the webhook endpoint, one at a time in queue order,
 * retrying failures with a doubling wait. Deliveries are part of the persisted
 * state, so a restarted stand-in carries on where the last one stopped.
 */
export class WebhookSender {
  private stopped = false;
  private running = false;
  private again = false;
  private timer: NodeJS.Timeout | null = null;
  private readonly abort = new AbortController();

  constructor(
    private readonly engine: Engine,
    private readonly policy: RetryPolicy,
    private readonly log: (line: string) => void,
  ) {
    engine.onEvent((event) => this.enqueue(event));
  }

  private get state() {
    return this.engine.state;
  }

  /** Creates the deliveries for a new event, honouring the test controls. */
  private enqueue(event: StripeEvent) {
    if (!this.state.webhook) return;
    const controls = this.state.delivery;
    let copies = 1;
    if (controls.duplicateNext > 0) {
      controls.duplicateNext -= 1;
      copies = 2;
    }
    const inReverseBatch = controls.reverseNext !== null;
    for (let i = 0; i < copies; i += 1) {
      const delivery: Delivery = {
        id: newId('whd_'),
        eventId: event.id,
        type: event.type,
        status: 'pending',
        held: controls.holding || inReverseBatch,
        queueSeq: ++controls.queueSeq,
        attempts: 0,
        createdAt: Date.now(),
        nextAttemptAt: Date.now(),
        deliveredAt: null,
        history: [],
      };
      this.state.deliveries[delivery.id] = delivery;
    }
    const batch = controls.reverseNext;
    if (batch) {
      batch.batch.push(event.id);
      if (batch.batch.length >= batch.size) {
        const events = new Set(batch.batch);
        controls.reverseNext = null;
        this.releaseWhere((d) => events.has(d.eventId), 'reverse');
      }
    }
  }

  /** Releases held deliveries that match, in creation order or newest first. */
  releaseWhere(match: (d: Delivery) => boolean, order: 'created' | 'reverse') {
    const held = Object.values(this.state.deliveries)
      .filter((d) => d.held && d.status === 'pending' && match(d))
      .sort((a, b) => a.queueSeq - b.queueSeq);
    if (order === 'reverse') held.reverse();
    const now = Date.now();
    for (const delivery of held) {
      delivery.held = false;
      delivery.queueSeq = ++this.state.delivery.queueSeq;
      delivery.nextAttemptAt = now;
    }
  }

  /** Makes every waiting delivery due now (skips the backoff wait). */
  retryNow() {
    const now = Date.now();
    for (const delivery of Object.values(this.state.deliveries)) {
      if (delivery.status === 'pending' && !delivery.held) delivery.nextAttemptAt = now;
    }
  }

  /** Deliveries that will be sent without anyone releasing them. */
  outstanding(): Delivery[] {
    return Object.values(this.state.deliveries).filter((d) => d.status === 'pending' && !d.held);
  }

  start() {
    this.kick();
  }

  /** Stops sending; an attempt in flight is abandoned and stays pending in the file. */
  stop() {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.abort.abort();
  }

  /** Looks for due deliveries now. */
  kick() {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.running = true;
    void this.run().finally(() => {
      this.running = false;
      if (this.stopped) return;
      if (this.again) {
        this.again = false;
        this.kick();
      } else {
        this.schedule();
      }
    });
  }

  private schedule() {
    if (this.stopped || this.state.delivery.paused || !this.state.webhook) return;
    const next = Math.min(...this.outstanding().map((d) => d.nextAttemptAt));
    if (!Number.isFinite(next)) return;
    this.timer = setTimeout(() => this.kick(), Math.max(5, next - Date.now()));
  }

  private nextDue(): Delivery | undefined {
    const now = Date.now();
    let best: Delivery | undefined;
    for (const delivery of this.outstanding()) {
      if (delivery.nextAttemptAt > now) continue;
      if (!best || delivery.queueSeq < best.queueSeq) best = delivery;
    }
    return best;
  }

  private async run() {
    while (!this.stopped && !this.state.delivery.paused && this.state.webhook) {
      this.again = false;
      const delivery = this.nextDue();
      if (!delivery) return;
      await this.attempt(delivery, this.state.webhook);
    }
  }

  private async attempt(delivery: Delivery, endpoint: { url: string; secret: string }) {
    const event = this.state.events[delivery.eventId];
    if (!event) {
      delivery.status = 'failed';
      delivery.history.push({ at: Date.now(), error: 'event missing' });
      await this.engine.store.save();
      return;
    }
    const payload = JSON.stringify(event, null, 2);
    let status: number | undefined;
    let error: string | undefined;
    try {
      const response = await fetch(endpoint.url, {
        method: 'POST',
        headers: {
          'content-type': 'application/json; charset=utf-8',
          'stripe-signature': signatureHeader(payload, endpoint.secret),
          'user-agent': 'Tenthmark-payments-stand-in/1.0',
          'cache-control': 'no-cache',
        },
        body: payload,
        redirect: 'manual',
        signal: AbortSignal.any([this.abort.signal, AbortSignal.timeout(this.policy.timeoutMs)]),
      });
      status = response.status;
      await response.arrayBuffer().catch(() => undefined);
    } catch (cause) {
      error = cause instanceof Error ? (cause.cause instanceof Error ? cause.cause.message : cause.message) : String(cause);
    }
    if (this.stopped) return;
    const now = Date.now();
    delivery.attempts += 1;
    delivery.history = [...delivery.history, { at: now, ...(status !== undefined ? { status } : { error }) }].slice(-HISTORY_LIMIT);
    if (status !== undefined && status >= 200 && status < 300) {
      delivery.status = 'delivered';
      delivery.deliveredAt = now;
      const stillPending = Object.values(this.state.deliveries).some((d) => d.eventId === event.id && d.status === 'pending');
      if (!stillPending) event.pending_webhooks = 0;
      this.log(`webhook ${event.type} ${event.id} delivered (${status})`);
    } else if (now - delivery.createdAt >= this.policy.giveUpAfterMs) {
      delivery.status = 'failed';
      this.log(`webhook ${event.type} ${event.id} given up after ${delivery.attempts} attempts`);
    } else {
      const wait = Math.min(this.policy.initialDelayMs * 2 ** (delivery.attempts - 1), this.policy.maxDelayMs);
      delivery.nextAttemptAt = now + wait;
      this.log(`webhook ${event.type} ${event.id} failed (${status ?? error}); next try in ${wait} ms`);
    }
    await this.engine.store.save().catch((cause) => this.log(`could not save: ${String(cause)}`));
  }
}

import express, { type Request, type Response } from 'express';
import type { Engine } from './engine';
import type { Delivery, StripeEvent } from './types';
import type { WebhookSender } from './webhooks';

/**
 * Knobs for tests. Every method that changes something resolves once the
 * change is saved. The same operations are served over HTTP under /_control/
 * (bearer secret key required), for tests that run the stand-in elsewhere.
 */
export interface PaymentsControl {
  /** The next `count` events are each delivered twice. */
  deliverTwice(count?: number): Promise<void>;
  /** Holds every new event's delivery until release(). */
  hold(): Promise<void>;
  /** Sends what hold() kept back: in creation order, or newest first. */
  release(options?: { order?: 'created' | 'reverse' }): Promise<void>;
  /** Holds the next `count` events, then delivers them newest first. */
  reverseNext(count: number): Promise<void>;
  /** Stops sending (events still queue up) until resume(). */
  pause(): Promise<void>;
  resume(): Promise<void>;
  /** Skips the backoff wait: every pending delivery is tried now. */
  retryNow(): Promise<void>;
  /** Resolves true once nothing is left to send (held ones aside) and the data file holds it, false on timeout. */
  drain(timeoutMs?: number): Promise<boolean>;
  deliveries(): Delivery[];
  events(): StripeEvent[];
  /** Points delivery at another endpoint (or none). */
  setWebhook(endpoint: { url: string; secret: string } | null): Promise<void>;
  /** What submitting the onboarding page does, without the page. */
  completeOnboarding(accountId: string): Promise<void>;
  /** Makes pending balance available now. */
  settleFunds(): Promise<void>;
  /**
   * The next `count` API requests answer with `status` (500 by default) and
   * change nothing; with `path`, only requests whose path contains it count
   * and fail (others go through), so a test can refuse one kind of call while
   * the app's background work makes others.
   */
  failNextRequests(count: number, status?: number, path?: string): Promise<void>;
  /** Every API request waits this long before it runs (0 to stop). */
  setLatency(ms: number): void;
}

export interface ApiFaults {
  failNext: number;
  failStatus: number;
  /** Only requests whose path contains this fail (all when unset). */
  failPath?: string;
  latencyMs: number;
}

const copy = <T>(value: T): T => structuredClone(value);

export function createControl(engine: Engine, sender: WebhookSender, faults: ApiFaults): PaymentsControl {
  const state = () => engine.state;
  const saveAndKick = async () => {
    await engine.store.save();
    sender.kick();
  };
  return {
    async deliverTwice(count = 1) {
      state().delivery.duplicateNext = count;
      await saveAndKick();
    },
    async hold() {
      state().delivery.holding = true;
      await saveAndKick();
    },
    async release(options = {}) {
      state().delivery.holding = false;
      state().delivery.reverseNext = null;
      sender.releaseWhere(() => true, options.order ?? 'created');
      await saveAndKick();
    },
    async reverseNext(count) {
      state().delivery.reverseNext = { size: Math.max(1, count), batch: [] };
      await saveAndKick();
    },
    async pause() {
      state().delivery.paused = true;
      await saveAndKick();
    },
    async resume() {
      state().delivery.paused = false;
      await saveAndKick();
    },
    async retryNow() {
      sender.retryNow();
      await saveAndKick();
    },
    async drain(timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      sender.kick();
      while (sender.outstanding().length > 0) {
        if (Date.now() > deadline) return false;
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
      // Delivered also means written down: wait for the data file writes the deliveries queued.
      await engine.store.flush();
      return true;
    },
    deliveries: () => copy(Object.values(state().deliveries)),
    events: () => copy(Object.values(state().events)),
    async setWebhook(endpoint) {
      state().webhook = endpoint ? { url: endpoint.url, secret: endpoint.secret } : null;
      await saveAndKick();
    },
    async completeOnboarding(accountId) {
      engine.completeOnboarding(engine.account(accountId));
      await saveAndKick();
    },
    async settleFunds() {
      engine.settleFunds();
      await saveAndKick();
    },
    async failNextRequests(count, status = 500, path) {
      faults.failNext = count;
      faults.failStatus = status;
      faults.failPath = path || undefined;
    },
    setLatency(ms) {
      faults.latencyMs = Math.max(0, ms);
    },
  };
}

const num = (value: unknown, fallback: number) => {
  const n = Number(value);
  return value === undefined || value === '' || !Number.isFinite(n) ? fallback : n;
};

/** The /_control/ routes: JSON or form bodies, JSON answers. */
export function controlRouter(control: PaymentsControl, isAuthorised: (req: Request) => boolean) {
  const router = express.Router();
  router.use(express.json(), express.urlencoded({ extended: false }));
  router.use((req, res, next) => {
    if (!isAuthorised(req)) {
      res.status(401).json({ error: { type: 'authentication_error', message: 'The control API needs the secret key as a bearer token.' } });
      return;
    }
    next();
  });
  const body = (req: Request) => (req.body ?? {}) as Record<string, unknown>;
  const ok = (res: Response) => res.json({ ok: true });

  router.get('/deliveries', (_req, res) => {
    res.json({ data: control.deliveries() });
  });
  router.get('/events', (_req, res) => {
    res.json({ data: control.events() });
  });
  router.post('/deliver-twice', async (req, res) => {
    await control.deliverTwice(num(body(req).count, 1));
    ok(res);
  });
  router.post('/hold', async (_req, res) => {
    await control.hold();
    ok(res);
  });
  router.post('/release', async (req, res) => {
    await control.release({ order: body(req).order === 'reverse' ? 'reverse' : 'created' });
    ok(res);
  });
  router.post('/reverse-next', async (req, res) => {
    await control.reverseNext(num(body(req).count, 2));
    ok(res);
  });
  router.post('/pause', async (_req, res) => {
    await control.pause();
    ok(res);
  });
  router.post('/resume', async (_req, res) => {
    await control.resume();
    ok(res);
  });
  router.post('/retry-now', async (_req, res) => {
    await control.retryNow();
    ok(res);
  });
  router.post('/drain', async (req, res) => {
    res.json({ drained: await control.drain(num(body(req).timeout_ms, 10_000)) });
  });
  router.post('/webhook', async (req, res) => {
    const { url, secret } = body(req);
    if (url === undefined || url === '' || url === null) await control.setWebhook(null);
    else if (typeof url === 'string' && typeof secret === 'string' && secret.startsWith('whsec_')) await control.setWebhook({ url, secret });
    else {
      res.status(400).json({ error: { type: 'invalid_request_error', message: 'Give url and a whsec_ secret, or no url to stop delivery.' } });
      return;
    }
    ok(res);
  });
  router.post('/accounts/:id/complete-onboarding', async (req, res) => {
    await control.completeOnboarding(String(req.params.id));
    ok(res);
  });
  router.post('/settle-funds', async (_req, res) => {
    await control.settleFunds();
    ok(res);
  });
  router.post('/fail-next', async (req, res) => {
    const path = body(req).path;
    await control.failNextRequests(num(body(req).count, 1), num(body(req).status, 500), typeof path === 'string' ? path : undefined);
    ok(res);
  });
  router.post('/latency', (req, res) => {
    control.setLatency(num(body(req).ms, 0));
    ok(res);
  });
  return router;
}

import express, { type NextFunction, type Request, type Response } from 'express';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { apiRouter, presentedKey } from './api';
import { controlRouter, createControl, type ApiFaults, type PaymentsControl } from './control';
import { API_VERSION, Engine, TEST_CARDS } from './engine';
import { ApiError } from './errors';
import { pagesRouter } from './pages';
import { Store } from './store';
import { defaultRetryPolicy, signatureHeader, WebhookSender, type RetryPolicy } from './webhooks';

/**
 * A local stand-in for the payment provider's v1 API, enough for the official
 * `stripe` SDK to run this project's money flow without the network: Connect
 * accounts and onboarding, Checkout with a hosted test-card page, payment
 * intents and charges, transfers and reversals, refunds, events and signed
 * webhooks. See shared/payments.md for the subset and its rules.
 */
export { API_VERSION, TEST_CARDS, signatureHeader };
export type { PaymentsControl, RetryPolicy };

export const DEFAULT_SECRET_KEY = 'sk_test_tenthmark_local';

export interface PaymentsStandInOptions {
  /** The JSON file that holds all state; without one, state lives in memory only. */
  dataFile?: string;
  /** The only key accepted; must start with sk_test_. Default 'sk_test_tenthmark_local'. */
  secretKey?: string;
  /** Where to send events, signed with `secret` (whsec_…). Overrides what the data file remembers. */
  webhook?: { url: string; secret: string };
  /** Base address for the pages (session.url, account link url); default: the Host the request came to. */
  publicUrl?: string;
  /** Webhook retry timing; the defaults retry for three days, waiting from 1 s up to 5 min. */
  retry?: Partial<RetryPolicy>;
  /** How long a charge's funds stay pending before they count as available (default two days, as the provider). */
  fundsAvailableAfterSeconds?: number;
  /** Where progress lines go (default: nowhere). */
  log?: (line: string) => void;
}

export interface PaymentsStandIn {
  app: express.Express;
  control: PaymentsControl;
  /** Stops the webhook sender and the timers, and writes what is queued. */
  shutdown(): Promise<void>;
}

export function createPaymentsStandIn(options: PaymentsStandInOptions = {}): PaymentsStandIn {
  const secretKey = options.secretKey ?? DEFAULT_SECRET_KEY;
  if (!/^sk_test_\S+$/.test(secretKey)) throw new Error('The payment stand-in takes a test secret key (sk_test_…) only.');
  if (options.webhook && !options.webhook.secret.startsWith('whsec_')) throw new Error('The webhook secret must start with whsec_.');
  const log = options.log ?? (() => undefined);

  const store = new Store(options.dataFile);
  const engine = new Engine(store, { fundsAvailableAfterSeconds: options.fundsAvailableAfterSeconds ?? 2 * 24 * 3600 });
  const sender = new WebhookSender(engine, { ...defaultRetryPolicy, ...options.retry }, log);
  const faults: ApiFaults = { failNext: 0, failStatus: 500, latencyMs: 0 };
  const control = createControl(engine, sender, faults);

  if (options.webhook) {
    store.state.webhook = { url: options.webhook.url, secret: options.webhook.secret };
    void store.save().catch((error) => log(`could not save: ${String(error)}`));
  }

  const app = express();
  app.disable('x-powered-by');
  app.set('etag', false);
  app.use('/v1', apiRouter(engine, sender, faults, { secretKey, publicUrl: options.publicUrl, log }));
  app.use('/_control', controlRouter(control, (req) => presentedKey(req) === secretKey));
  app.use(pagesRouter(engine, sender, { publicUrl: options.publicUrl }));
  app.get('/', (_req, res) => {
    res
      .type('text')
      .send(`Tenthmark's local payment stand-in (API version ${API_VERSION}). API under /v1, test controls under /_control, pages under /pay and /connect.\n`);
  });
  app.use((error: unknown, _req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) return next(error);
    if (error instanceof ApiError) {
      res.status(error.status).json(error.toJSON());
      return;
    }
    log(`internal error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    res.status(500).json({ error: { type: 'api_error', message: 'The payment stand-in failed; see its log.' } });
  });

  // Housekeeping: sessions past expires_at expire, idempotency records older than a day go.
  const housekeeping = setInterval(() => {
    let changed = engine.expireDueSessions();
    const cutoff = Date.now() - 24 * 3600_000;
    for (const [key, record] of Object.entries(store.state.idempotency)) {
      if (record.createdAt < cutoff) {
        delete store.state.idempotency[key];
        changed = true;
      }
    }
    if (changed) {
      void store.save().then(
        () => sender.kick(),
        (error) => log(`could not save: ${String(error)}`),
      );
    }
  }, 1_000);
  housekeeping.unref();

  sender.start();

  return {
    app,
    control,
    async shutdown() {
      clearInterval(housekeeping);
      sender.stop();
      await store.close();
    },
  };
}

export interface StartedPaymentsStandIn {
  server: Server;
  url: string;
  port: number;
  control: PaymentsControl;
  /** Stops listening, drops open connections, stops delivery and writes the state. */
  close(): Promise<void>;
}

export async function startPaymentsStandIn(options: PaymentsStandInOptions & { port: number }): Promise<StartedPaymentsStandIn> {
  const standIn = createPaymentsStandIn(options);
  const server = createServer(standIn.app);
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(options.port, '127.0.0.1', () => resolve());
    });
  } catch (error) {
    await standIn.shutdown();
    throw error;
  }
  const port = (server.address() as AddressInfo).port;
  let closing: Promise<void> | undefined;
  return {
    server,
    url: `http://127.0.0.1:${port}`,
    port,
    control: standIn.control,
    close: () =>
      (closing ??= (async () => {
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeAllConnections();
        });
        await standIn.shutdown();
      })()),
  };
}

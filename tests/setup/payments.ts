import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type IncomingHttpHeaders } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Stripe from 'stripe';
import { afterEach, beforeEach } from 'vitest';
import {
  DEFAULT_SECRET_KEY,
  startPaymentsStandIn,
  type PaymentsStandInOptions,
  type StartedPaymentsStandIn,
} from '../../server/dev/payments-stand-in';
import { postForm, readForm, submitHostedPage } from '../../server/dev/payments-stand-in/page-client';
import { freePort } from './ports';

/**
 * The payment stand-in's test harness: a stand-in for an app under test
 * (startTestStandIn), or one on its own with an SDK client and a webhook
 * receiver (startHarness) for the stand-in's own tests; its hosted pages
 * filled in as a person would.
 */
export { postForm, readForm, submitHostedPage };

export const TEST_WEBHOOK_SECRET = 'whsec_tenthmark_test_app_secret';

/** A payment stand-in with its state in a temporary file (so it can be restarted), not yet sending webhooks. */
export async function startTestStandIn(options: { port?: number; dataFile?: string } = {}) {
  const dataFile = options.dataFile ?? join(mkdtempSync(join(tmpdir(), 'tenthmark-pay-')), 'state.json');
  const standIn = await startPaymentsStandIn({ port: options.port ?? 0, dataFile, secretKey: 'sk_test_tenthmark_local', retry: { initialDelayMs: 100, maxDelayMs: 1_000 } });
  return { standIn, dataFile };
}

/** Points the stand-in's webhooks at an app's endpoint. */
export function sendWebhooksTo(standIn: Awaited<ReturnType<typeof startPaymentsStandIn>>, appUrl: string) {
  return standIn.control.setWebhook({ url: `${appUrl}/api/payments/webhook`, secret: TEST_WEBHOOK_SECRET });
}

/** Fills in the stand-in's onboarding page as a shop owner would (the page's own form, submitted). */
export async function completeOnboardingPage(url: string): Promise<void> {
  const done = await submitHostedPage(url);
  if (done.status !== 303) throw new Error(`the onboarding page answered ${done.status}`);
}

export const WEBHOOK_SECRET = 'whsec_tenthmark_test_receiver_secret';

export function sdkFor(port: number, key = DEFAULT_SECRET_KEY): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', telemetry: false, maxNetworkRetries: 0 });
}

export interface Received {
  body: string;
  headers: IncomingHttpHeaders;
  /** The event, parsed. */
  event: Stripe.Event;
}

/**
 * A tiny webhook endpoint. `respond` decides each answer's status (200 by
 * default); every request is kept, whatever it was answered.
 */
export async function startReceiver(respond: (attempt: number, received: Received) => number = () => 200, port = 0) {
  const all: Received[] = [];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const received: Received = { body, headers: req.headers, event: JSON.parse(body) as Stripe.Event };
      all.push(received);
      res.statusCode = receiver.respond(all.length, received);
      res.end();
    });
  });
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', () => resolve()));
  const actualPort = (server.address() as AddressInfo).port;
  const receiver = {
    url: `http://127.0.0.1:${actualPort}/webhook`,
    port: actualPort,
    all,
    respond,
    types: () => all.map((r) => r.event.type),
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
  return receiver;
}

export type Receiver = Awaited<ReturnType<typeof startReceiver>>;

export function tempDataFile() {
  const dir = mkdtempSync(join(tmpdir(), 'payments-stand-in-'));
  return { file: join(dir, 'state.json'), remove: () => rmSync(dir, { recursive: true, force: true }) };
}

export interface Harness {
  standIn: StartedPaymentsStandIn;
  stripe: Stripe;
  port: number;
  dataFile: string;
  /** Starts a new stand-in on the same port and data file (after close()). */
  restart(extra?: Partial<PaymentsStandInOptions>): Promise<StartedPaymentsStandIn>;
  cleanup(): Promise<void>;
}

export async function startHarness(options: Partial<PaymentsStandInOptions> = {}): Promise<Harness> {
  const data = tempDataFile();
  const port = await freePort();
  const base: PaymentsStandInOptions & { port: number } = {
    port,
    dataFile: data.file,
    retry: { initialDelayMs: 50, maxDelayMs: 200, timeoutMs: 2_000 },
    ...options,
  };
  const harness: Harness = {
    standIn: await startPaymentsStandIn(base),
    stripe: sdkFor(port, options.secretKey),
    port,
    dataFile: data.file,
    async restart(extra = {}) {
      harness.standIn = await startPaymentsStandIn({ ...base, ...extra });
      return harness.standIn;
    },
    async cleanup() {
      await harness.standIn.close();
      data.remove();
    },
  };
  return harness;
}

/** A stand-in whose webhooks go to a receiver of its own (answering with `respond`); `close` stops both. */
export async function startHarnessWithReceiver(respond?: Parameters<typeof startReceiver>[0]) {
  const receiver = await startReceiver(respond);
  const harness = await startHarness({ webhook: { url: receiver.url, secret: WEBHOOK_SECRET } });
  const close = async () => {
    await harness.cleanup();
    await receiver.close();
  };
  return { receiver, harness, close };
}

/**
 * For a test file: a fresh stand-in and receiver before each test, closed after it.
 * Read `.harness` and `.receiver` inside the tests (they change from test to test).
 */
export function harnessWithReceiverEachTest(): { readonly harness: Harness; readonly receiver: Receiver } {
  let current: Awaited<ReturnType<typeof startHarnessWithReceiver>> | undefined;
  beforeEach(async () => {
    current = await startHarnessWithReceiver();
  });
  afterEach(async () => {
    await current?.close();
    current = undefined;
  });
  const running = () => {
    if (!current) throw new Error('the payments harness runs only inside a test');
    return current;
  };
  return {
    get harness() {
      return running().harness;
    },
    get receiver() {
      return running().receiver;
    },
  };
}

export async function waitFor<T>(check: () => T | undefined | false, timeoutMs = 5_000, what = 'condition'): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = check();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 15));
  }
}


/** Opens the hosted payment page and submits a card; returns the answer (redirects not followed). */
export const payOnPage = (sessionUrl: string, cardNumber: string) => submitHostedPage(sessionUrl, { card_number: cardNumber });

export async function createSession(stripe: Stripe, overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
  return stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [
      {
        quantity: 1,
        price_data: { currency: 'usd', unit_amount: 125_000, product_data: { name: 'Line-bore and hone, 5.3L block' } },
      },
    ],
    payment_intent_data: { transfer_group: 'job_42', metadata: { job_id: 'job_42' } },
    metadata: { job_id: 'job_42' },
    success_url: 'http://127.0.0.1:5999/jobs/42/funded?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://127.0.0.1:5999/jobs/42',
    ...overrides,
  });
}

/** A checkout paid with the success card; returns the session with its intent and charge. */
export async function paidSession(stripe: Stripe, overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
  const session = await createSession(stripe, overrides);
  const answer = await payOnPage(session.url!, '4242424242424242');
  if (answer.status !== 303) throw new Error(`paying answered ${answer.status}`);
  const paid = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] });
  const intent = paid.payment_intent as Stripe.PaymentIntent;
  const charge = intent.latest_charge as Stripe.Charge;
  return { session: paid, intent, charge };
}

/** A payout account that has finished onboarding (through the control API). */
export async function readyAccount(harness: Harness, email = 'shop@example.test') {
  const account = await harness.stripe.accounts.create({
    type: 'express',
    email,
    capabilities: { transfers: { requested: true } },
  });
  await harness.standIn.control.completeOnboarding(account.id);
  return account;
}

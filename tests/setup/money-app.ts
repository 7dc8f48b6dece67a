import Stripe from 'stripe';
import { createDb, createPool, type Database } from '../../server/db/client';
import { startServer, type RunningServer } from '../../server/runtime';
import { bidInput, createJob, createShop, createUser } from '../factories';
import { completeOnboardingPage, sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from './payments';
import { createTestDatabase, signedIn, testConfig } from './test-env';

/** A listening app on its own database with a payment stand-in whose webhooks reach it. */
export async function startMoneyApp(overrides: Record<string, string> = {}) {
  const database = await createTestDatabase();
  const pool = createPool(database.url, 4);
  const db: Database = createDb(pool);
  const pay = await startTestStandIn();
  const server: RunningServer = await startServer(
    testConfig(database.url, { PORT: '0', STRIPE_API_URL: pay.standIn.url, STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET, PLATFORM_FEE_BPS: '800', ...overrides }),
    { migrate: false },
  );
  await sendWebhooksTo(pay.standIn, server.url);
  const url = new URL(pay.standIn.url);
  const stripe = new Stripe('sk_test_tenthmark_local', { host: url.hostname, port: Number(url.port), protocol: 'http', telemetry: false, maxNetworkRetries: 0 });

  async function until<T>(what: string, check: () => Promise<T | undefined | false>, timeoutMs = 8_000): Promise<T> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const value = await check();
      if (value) return value;
      if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  /** A job paid for and held: builder, shop with payouts, accepted bid, paid with the success card on the stand-in's page. */
  async function fundedJob(options: { totalCents?: number; input?: Parameters<typeof createJob>[2] extends infer O ? (O extends { input?: infer I } ? I : never) : never } = {}) {
    const builderUser = await createUser(db);
    const job = await createJob(db, builderUser.id, { input: options.input });
    const { user: shopUser } = await createShop(db, {}, {}, { payouts: false });
    const shop = await signedIn(server.app, shopUser);
    await completeOnboardingPage((await shop.post('/api/shop-profile/payouts')).body.url);
    await until('payouts ready', async () => (await shop.get('/api/shop-profile')).body.shop.payouts === 'ready');
    const bid = await shop.post(`/api/jobs/${job.id}/bids`, bidInput({ lineItems: [{ description: 'The work', quantity: 1, unitPriceCents: options.totalCents ?? 50_000 }] }));
    const builder = await signedIn(server.app, builderUser);
    await builder.post(`/api/bids/${bid.body.bid.id}/accept`);
    const checkout = await builder.post(`/api/jobs/${job.id}/checkout`);
    const page = await (await fetch(checkout.body.url)).text();
    const form = /<form[^>]*action="([^"]*)"/.exec(page)!;
    await fetch(new URL(form[1], checkout.body.url), { method: 'POST', body: new URLSearchParams({ card_number: '4242424242424242', exp: '12 / 34', cvc: '123' }), redirect: 'manual' });
    await until('funded', async () => (await builder.get(`/api/jobs/${job.id}`)).body.job.status === 'funded');
    return { job, builder, builderUser, shop, shopUser };
  }

  let serverClosed = false;
  /** Stops the in-process app (its workers too), keeping the database and the stand-in, e.g. to hand over to another process. */
  async function stopServer() {
    if (serverClosed) return;
    serverClosed = true;
    await server.close();
  }

  return {
    db,
    databaseUrl: database.url,
    server,
    stopServer,
    stripe,
    standIn: pay.standIn,
    until,
    fundedJob,
    async close() {
      await stopServer();
      await pay.standIn.close();
      await pool.end();
      await database.drop();
    },
  };
}

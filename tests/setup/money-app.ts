import Stripe from 'stripe';
import { createDb, createPool, type Database } from '../../server/db/client';
import { startServer, type RunningServer } from '../../server/runtime';
import type { JobInput } from '../../shared/schemas/jobs';
import { createJob, createShop, createUser } from '../factories';
import { apiOf, jobInState, until, type JobState, type JobStateOptions } from './job-states';
import { sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from './payments';
import { createTestDatabase, signedIn, testConfig } from './test-env';

/** A listening app on its own database with a payment stand-in whose webhooks reach it. */
export async function startMoneyApp(overrides: Record<string, string> = {}) {
  const database = await createTestDatabase();
  const pool = createPool(database.url, 4);
  const db: Database = createDb(pool);
  const pay = await startTestStandIn();
  const config = testConfig(database.url, { PORT: '0', STRIPE_API_URL: pay.standIn.url, STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET, PLATFORM_FEE_BPS: '800', ...overrides });
  const server: RunningServer = await startServer(config, { migrate: false });
  await sendWebhooksTo(pay.standIn, server.url);
  const url = new URL(pay.standIn.url);
  const stripe = new Stripe('sk_test_tenthmark_local', { host: url.hostname, port: Number(url.port), protocol: 'http', telemetry: false, maxNetworkRetries: 0 });

  /**
   * A job in `state` (tests/setup/job-states.ts) between a new builder and a new shop whose payouts are set up on
   * the stand-in's page; the shop's bid is one line of `totalCents` (50,000 unless given).
   */
  async function jobIn(state: JobState, options: JobStateOptions & { totalCents?: number; straightIntoDatabase?: boolean } = {}) {
    const builderUser = await createUser(db);
    const { totalCents = 50_000, straightIntoDatabase, ...rest } = options;
    // A job the form refuses (no limits at all) is put open into the database, and goes on from there through the app.
    if (straightIntoDatabase) rest.openJob = await createJob(db, builderUser.id, { input: rest.input });
    const { user: shopUser } = await createShop(db, {}, {}, { payouts: false });
    const [builder, shop] = await Promise.all([signedIn(server.app, builderUser), signedIn(server.app, shopUser)]);
    const made = await jobInState(state, { builder: apiOf(builder), shop: apiOf(shop) }, { bid: { lineItems: [{ description: 'The work', quantity: 1, unitPriceCents: totalCents }] }, ...rest });
    return { job: made.job, bid: made.bid, dispute: made.dispute, builder, builderUser, shop, shopUser };
  }

  /** A job paid for and held: builder, shop with payouts, accepted bid, paid with the success card on the stand-in's page. */
  const fundedJob = (options: { totalCents?: number; input?: Partial<JobInput> } = {}) => jobIn('funded', options);

  let serverClosed = false;
  /** Stops the in-process app (its workers too), keeping the database and the stand-in, e.g. to hand over to another process. */
  async function stopServer() {
    if (serverClosed) return;
    serverClosed = true;
    await server.close();
  }

  return {
    db,
    config,
    databaseUrl: database.url,
    server,
    stopServer,
    stripe,
    standIn: pay.standIn,
    until,
    jobIn,
    fundedJob,
    async close() {
      await stopServer();
      await pay.standIn.close();
      await pool.end();
      await database.drop();
    },
  };
}

import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import { inspectionRecords, jobs, users } from '../../server/db/schema';
import { buildDemoScenario } from '../../server/dev/demo-scenario';
import { demoAccounts, seedIfEmpty } from '../../server/dev/seed';
import { startServer, type RunningServer } from '../../server/runtime';
import { jobBalance } from '../../server/modules/payments/ledger';
import { builderStanding } from '../../server/modules/standing/standing.repository';
import { sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from '../setup/payments';
import { freePort } from '../setup/ports';
import { agentFor, createTestDatabase, signedIn, testConfig } from '../setup/test-env';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let db: Database;
let pay: Awaited<ReturnType<typeof startTestStandIn>>;
let server: RunningServer;
let made = 0;

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url, 4);
  db = createDb(pool);
  await seedIfEmpty(db);
  pay = await startTestStandIn();
  const port = await freePort();
  server = await startServer(
    testConfig(database.url, { PORT: String(port), APP_URL: `http://127.0.0.1:${port}`, STRIPE_API_URL: pay.standIn.url, STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET }),
    { migrate: false },
  );
  await sendWebhooksTo(pay.standIn, server.url);
  made = await buildDemoScenario({ appUrl: server.url, db });
}, 180_000);
afterAll(async () => {
  await server?.close();
  await pay?.standIn.close();
  await pool?.end();
  await database?.drop();
});

describe('the demo scenario', () => {
  it('has jobs in every state, each built through the app', async () => {
    expect(made).toBe(22);
    const rows = await db.select({ status: jobs.status, n: sql<number>`count(*)::int` }).from(jobs).groupBy(jobs.status);
    const byStatus = Object.fromEntries(rows.map((r) => [r.status, r.n]));
    for (const status of ['draft', 'open', 'awarded', 'funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved', 'cancelled']) {
      expect(byStatus[status], status).toBeGreaterThan(0);
    }
  });

  it('places every demo shop and job from a real postal code, so the board and bids show distances', async () => {
    const unplaced = await pool.query(`SELECT 'job' AS kind, title AS name FROM jobs WHERE latitude IS NULL OR postal_code IS NULL
      UNION ALL SELECT 'shop', name FROM shops WHERE latitude IS NULL OR postal_code IS NULL`);
    expect(unplaced.rows).toEqual([]);
  });

  it('keeps the ledger whole on every job: paid in = released + fee + refunded + held', async () => {
    for (const job of await db.select({ id: jobs.id, status: jobs.status }).from(jobs)) {
      const b = await jobBalance(db, job.id);
      expect(b.paidIn, job.status).toBe(b.released + b.fee + b.refunded + b.held);
      if (job.status === 'completed' || job.status === 'resolved') expect(b.held).toBe(0);
      if (job.status === 'funded' || job.status === 'in_work' || job.status === 'disputed') expect(b.held).toBeGreaterThan(0);
    }
  });

  it('gives every demo shop a rating and shows it in the directory', async () => {
    const visitor = await signedIn(server.app, { email: demoAccounts[1].email, password: 'tenthmark-demo' });
    const { body } = await visitor.get('/api/shops?pageSize=50');
    expect(body.shops.length).toBeGreaterThanOrEqual(4);
    for (const shop of body.shops) expect(shop.rating?.count, shop.name).toBeGreaterThan(0);
    expect(body.shops.filter((s: { verified: boolean }) => s.verified).length).toBe(2);
  });

  it('gives Lantern Hill and its builder enough history that their standing shows figures', async () => {
    const { body } = await (await agentFor(server.app)).get('/api/shops?q=Lantern%20Hill');
    const standing = body.shops[0].standing;
    expect(standing.firstTimeAcceptance).toEqual({ count: 5, of: 6, share: 5 / 6 });
    expect(standing.onTime).toEqual({ count: 5, of: 5, share: 1 });
    expect(standing.disputes).toEqual({ opened: 0, completed: 6, outcomes: { release: 0, refund: 0, split: 0, open: 0 } });
    expect(standing.answerTime.of).toBeGreaterThanOrEqual(5);
    const teodor = (await db.select({ id: users.id }).from(users).where(eq(users.email, 'teodor@builders.test')))[0];
    const builder = await builderStanding(db, teodor.id);
    expect(builder.paysOnTime?.count).toBe(builder.paysOnTime?.of);
    expect(builder.answersRecords?.of).toBeGreaterThanOrEqual(5);
  });

  it('stores inspection records whose results the server judged: accepted ones pass, the disputed ones fail', async () => {
    const records = await db.select({ status: inspectionRecords.status, pass: inspectionRecords.pass, jobStatus: jobs.status }).from(inspectionRecords).innerJoin(jobs, eq(jobs.id, inspectionRecords.jobId));
    expect(records.filter((r) => r.status === 'accepted').every((r) => r.pass)).toBe(true);
    expect(records.filter((r) => r.jobStatus === 'disputed' || r.jobStatus === 'resolved').every((r) => !r.pass)).toBe(true);
    expect(records.length).toBeGreaterThanOrEqual(7);
  });

  it('has records for work beyond the bores, each section judged by the server, one of them failing a check', async () => {
    const rows = await db.select({ title: jobs.title, results: inspectionRecords.results }).from(inspectionRecords).innerJoin(jobs, eq(jobs.id, inspectionRecords.jobId));
    const sectionsOf = (words: RegExp) => {
      const row = rows.find((r) => words.test(r.title))!;
      const results = row.results as { verdict: string; sections: Array<{ operation: string; verdict: string }>; checks: Array<{ what: string; verdict: string }> };
      return { verdict: results.verdict, sections: Object.fromEntries(results.sections.map((s) => [s.operation, s.verdict])), failing: results.checks.filter((c) => c.verdict === 'fails').map((c) => c.what) };
    };
    expect(sectionsOf(/line hone the mains/)).toEqual({ verdict: 'fail', sections: { 'line-hone': 'conforms', 'crank-grind': 'fails' }, failing: ['rod journal 6 size'] });
    expect(sectionsOf(/Rotating assembly to balance/)).toEqual({ verdict: 'pass', sections: { balance: 'conforms' }, failing: [] });
    expect(sectionsOf(/aluminium heads/)).toEqual({ verdict: 'pass', sections: { 'head-resurface': 'conforms', 'valve-job': 'conforms' }, failing: [] });
  });

  it('has an open dispute with both sides’ statements in the admin queue', async () => {
    const admin = await signedIn(server.app, { email: 'admin@tenthmark.test', password: 'tenthmark-demo' });
    const { body } = await admin.get('/api/admin/disputes');
    expect(body.disputes).toHaveLength(1);
    expect(body.disputes[0]).toMatchObject({ answered: true, status: 'open' });
    expect(body.disputes[0].heldCents).toBeGreaterThan(0);
  });
});

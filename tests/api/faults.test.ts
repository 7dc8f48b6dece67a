import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { and, eq } from 'drizzle-orm';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb, createPool, runMigrations } from '../../server/db/client';
import { ledgerEntries, moneyMoves } from '../../server/db/schema';
import { HttpSession } from '../../server/dev/http-session';
import { ensureCluster, ensureDatabase, type ClusterOptions } from '../../server/dev/postgres';
import { jobBalance } from '../../server/modules/payments/ledger';
import { startServer } from '../../server/runtime';
import { createUser, TEST_PASSWORD } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { TEST_WEBHOOK_SECRET } from '../setup/payments';
import { freePort } from '../setup/ports';
import { testConfig } from '../setup/test-env';

/**
 * Faults, each made to happen: the database going away and coming back under
 * an app that keeps running, and the app process killed in the middle of
 * paying a shop. (SMTP down is in mail-outbox.test.ts; the payment API down
 * during a release is in payments.test.ts.)
 */
const cleanups: Array<() => unknown> = [];
// Two app processes, a money app with its stand-in and a cluster of its own stop here, one after
// the other: a few seconds on a quiet machine, but once past 60 s on one loaded many times over.
// The project's hook limit (120 s) is a hang detector, so this hook takes that.
afterAll(async () => {
  for (const cleanup of cleanups.splice(0)) await cleanup();
});

const until = async <T>(what: string, check: () => Promise<T | false | undefined>, timeoutMs = 20_000): Promise<T> => {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check().catch(() => undefined);
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
};

describe('the database stops and starts again under a running app', () => {
  it('answers 503 with Retry-After while it is away and recovers without a restart', async () => {
    // A cluster of its own: the shared test cluster must keep serving the other test files.
    const dir = mkdtempSync(join(tmpdir(), 'tenthmark-fault-db-'));
    const options: ClusterOptions = { dir, port: await freePort(), throwaway: true };
    let cluster = ensureCluster(options);
    cleanups.push(() => {
      cluster.stop();
      rmSync(dir, { recursive: true, force: true });
    });
    await ensureDatabase(cluster, 'faults');
    const url = cluster.url('faults');
    await runMigrations(url);
    const pool = createPool(url, 2);
    const user = await createUser(createDb(pool));
    await pool.end();
    const server = await startServer(testConfig(url, { PORT: '0' }), { migrate: false });
    cleanups.unshift(() => server.close());

    const get = (path: string) => fetch(`${server.url}${path}`);
    expect((await get('/api/shops')).status).toBe(200);
    const session = await HttpSession.signIn(server.url, user.email, TEST_PASSWORD);
    expect((await session.call<{ user: { email: string } }>('GET', '/api/auth/me')).user.email).toBe(user.email);

    // Requests in flight when the database stops, and after: never a 500, never a hang.
    const during = Array.from({ length: 20 }, (_, i) => get(i % 2 ? '/api/shops' : `/api/shops?q=${i}`).then((r) => r.status));
    cluster.stop();
    const statuses = await Promise.all(during);
    for (const status of statuses) expect([200, 503]).toContain(status);

    const away = await get('/api/shops');
    expect(away.status).toBe(503);
    expect(away.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(await away.json()).toMatchObject({ error: { code: 'unavailable', message: expect.any(String) } });
    const health = await get('/api/health');
    expect(health.status).toBe(503);
    // A signed-in request whose session cannot be read is answered 503 too, not 401 or 500.
    await expect(session.call('GET', '/api/auth/me')).rejects.toThrow(/answered 503/);

    cluster = ensureCluster(options);
    await until('the app to reach the database again', async () => (await get('/api/shops')).status === 200);
    expect((await get('/api/health')).status).toBe(200);
    // The same session (stored in the database) still works, and writes go through.
    expect((await session.call<{ user: { email: string } }>('GET', '/api/auth/me')).user.email).toBe(user.email);
    const again = await HttpSession.signIn(server.url, user.email, TEST_PASSWORD);
    expect((await again.call<{ user: { email: string } }>('GET', '/api/auth/me')).user.email).toBe(user.email);
  }, 120_000);
});

describe('the app process is killed in the middle of a release and started again', () => {
  const root = fileURLToPath(new URL('../..', import.meta.url));

  function startAppProcess(env: Record<string, string>): ChildProcess {
    // One process (tsx as a loader, not its CLI, which would run the app in a child that SIGKILL would miss).
    const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'server/index.ts')], {
      cwd: root,
      env: { ...process.env, ...env },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr!.on('data', (chunk) => (stderr += String(chunk)));
    child.on('exit', (code, signal) => {
      if (code && signal !== 'SIGKILL') console.error(`app process exited ${code}: ${stderr.slice(-2000)}`);
    });
    cleanups.unshift(() => {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    });
    return child;
  }

  it('makes one transfer: the restarted app finishes the planned payout with the same key', async () => {
    const m = await startMoneyApp();
    cleanups.unshift(() => m.close());
    const funded = await m.fundedJob({ totalCents: 70_000 });
    const admin = await createUser(m.db, { role: 'admin' });
    // From here the job's money is handled by a separate process, which is killed.
    await m.stopServer();

    const port = await freePort();
    const env = {
      NODE_ENV: 'test',
      LOG_LEVEL: 'silent',
      DATABASE_URL: m.databaseUrl,
      PORT: String(port),
      APP_URL: `http://127.0.0.1:${port}`,
      SESSION_SECRET: 'test-session-secret-0123456789',
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(inject('smtpPort')),
      GITHUB_STAND_IN_URL: inject('githubStandInUrl'),
      STRIPE_API_URL: m.standIn.url,
      STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET,
      PLATFORM_FEE_BPS: '800',
      UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'tenthmark-fault-uploads-')),
    };
    const base = `http://127.0.0.1:${port}`;
    const first = startAppProcess(env);
    await until('the app process to answer', async () => (await fetch(`${base}/api/health`)).ok, 60_000);
    const session = await HttpSession.signIn(base, admin.email, TEST_PASSWORD);

    // The payment API takes two seconds to answer: the transfer request is on the wire when the process dies.
    m.standIn.control.setLatency(2_000);
    void session.call('POST', `/api/admin/jobs/${funded.job.id}/release`).catch(() => undefined);
    const [planned] = await until('the payout to be planned', async () => {
      const rows = await m.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, funded.job.id));
      return rows.length > 0 && rows;
    });
    await new Promise((r) => setTimeout(r, 500));
    first.kill('SIGKILL');
    await new Promise((r) => first.once('exit', r));
    // Gone for good: nothing answers on its port any more.
    await expect(fetch(`${base}/api/health`)).rejects.toThrow();
    const [afterKill] = await m.db.select().from(moneyMoves).where(eq(moneyMoves.id, planned.id));
    expect(afterKill.status).toBe('pending');
    expect(await m.db.select().from(ledgerEntries).where(and(eq(ledgerEntries.jobId, funded.job.id), eq(ledgerEntries.kind, 'released')))).toHaveLength(0);

    // The provider finishes the request it received; the app never heard the answer.
    await new Promise((r) => setTimeout(r, 2_500));
    m.standIn.control.setLatency(0);
    expect((await m.stripe.transfers.list({ transfer_group: funded.job.id })).data).toHaveLength(1);

    // Started again, the app's money worker retries the pending payout with the same idempotency key.
    startAppProcess(env);
    const done = await until(
      'the payout to be finished by the restarted app',
      async () => {
        const [row] = await m.db.select().from(moneyMoves).where(eq(moneyMoves.id, planned.id));
        return row.status === 'done' && row;
      },
      60_000,
    );
    const transfers = (await m.stripe.transfers.list({ transfer_group: funded.job.id })).data;
    expect(transfers).toHaveLength(1);
    expect(done.providerId).toBe(transfers[0].id);
    const balance = await jobBalance(m.db, funded.job.id);
    // 8 % of 70,000 is 5,600.
    expect(balance).toMatchObject({ paidIn: 70_000, released: 64_400, fee: 5_600, refunded: 0, held: 0 });
    expect(await m.db.select().from(ledgerEntries).where(and(eq(ledgerEntries.jobId, funded.job.id), eq(ledgerEntries.kind, 'released')))).toHaveLength(1);
  }, 180_000);
});

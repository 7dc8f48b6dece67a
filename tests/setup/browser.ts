import { mkdirSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { vi } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { seedIfEmpty } from '../../server/dev/seed';
import { startServer, type RunningServer } from '../../server/runtime';
import { freePort } from './ports';
import { sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from './payments';
import { createTestDatabase, testConfig } from './test-env';

// A whole flow in a real browser takes 30–40 s on this 2-core machine when it is quiet and twice
// that when other suites load it; the integration default of 60 s cut such flows short on a busy
// machine. Every browser test file imports this module, so this sets its files' limit: a hang
// detector, not a speed check.
vi.setConfig({ testTimeout: 150_000 });

export const artifactsDir = fileURLToPath(new URL('../artifacts', import.meta.url));
// TENTHMARK_CLIENT_DIR lets a second build (another outDir) be tested while dist/ is rebuilt.
const clientDir = process.env.TENTHMARK_CLIENT_DIR ?? fileURLToPath(new URL('../../dist/client', import.meta.url));

/** Debian's Chromium, headless; playwright-core never downloads a browser of its own. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--disable-gpu'] });
}

/**
 * The whole app as a person meets it: the production build of the browser app
 * served by a real HTTP server on a database of its own, with the demo accounts.
 */
/** `env` overrides the test configuration's settings, e.g. a lower rate limit that a test must reach for sure. */
export async function startBrowserApp(
  env: Record<string, string> = {},
): Promise<{ server: RunningServer; payments: Awaited<ReturnType<typeof startTestStandIn>>['standIn']; databaseUrl: string; close: () => Promise<void> }> {
  mkdirSync(artifactsDir, { recursive: true });
  const database = await createTestDatabase();
  const seedPool = createPool(database.url, 2);
  await seedIfEmpty(createDb(seedPool));
  await seedPool.end();
  const payments = await startTestStandIn();
  // The app's own address goes into links the payment pages send the browser back to, so it must be the real one.
  const port = await freePort();
  const config = testConfig(database.url, {
    PORT: String(port),
    APP_URL: `http://localhost:${port}`,
    STRIPE_API_URL: payments.standIn.url,
    STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET,
    ...env,
  });
  const server = await startServer(config, { client: { kind: 'static', dir: clientDir }, migrate: false, mailIntervalMs: 200 });
  await sendWebhooksTo(payments.standIn, server.url);
  return {
    server,
    payments: payments.standIn,
    databaseUrl: database.url,
    close: async () => {
      await server.close();
      await payments.standIn.close();
      await database.drop();
      rmSync(config.uploadsDir, { recursive: true, force: true });
    },
  };
}

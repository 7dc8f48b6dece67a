/**
 * `npm start` and `npm run dev`: everything Tenthmark needs on one machine.
 * A private PostgreSQL cluster under .data/, migrations, demo data, maildev,
 * the GitHub sign-in stand-in, and the app itself. Ctrl-C stops what it started.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createDb, createPool, runMigrations } from '../db/client';
import { loadConfig } from '../env';
import { startServer } from '../runtime';
import { startGithubStandIn } from './github-stand-in';
import { startMaildev } from './maildev';
import { startPaymentsStandIn } from './payments-stand-in';
import { ensureCluster, ensureDatabase } from './postgres';
import { buildDemoScenario } from './demo-scenario';
import { DEMO_PASSWORD, demoAccounts, seedIfEmpty } from './seed';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dev = process.argv.includes('--dev');
const step = (text: string) => console.log(`[tenthmark] ${text}`);

const cleanups: Array<() => unknown> = [];
let stopping = false;
async function stopAll(code: number) {
  if (stopping) return;
  stopping = true;
  step('stopping …');
  for (const cleanup of cleanups.reverse()) {
    try {
      await cleanup();
    } catch (error) {
      console.error(error);
    }
  }
  process.exit(code);
}
process.once('SIGINT', () => void stopAll(0));
process.once('SIGTERM', () => void stopAll(0));

try {
  const config = loadConfig({ NODE_ENV: dev ? 'development' : 'production', SESSION_SECRET: 'local-machine-session-secret', ...process.env });

  step('PostgreSQL: private cluster in .data/ …');
  const databaseName = new URL(config.databaseUrl).pathname.slice(1) || 'tenthmark';
  const cluster = ensureCluster({ dir: `${root}/.data`, port: config.pgPort });
  if (cluster.startedHere) cleanups.push(() => cluster.stop());
  await ensureDatabase(cluster, databaseName);
  const databaseUrl = cluster.url(databaseName);

  step('applying migrations …');
  await runMigrations(databaseUrl);
  const seedPool = createPool(databaseUrl, 2);
  const seeded = await seedIfEmpty(createDb(seedPool));
  await seedPool.end();
  step(seeded ? 'seeded the demo scenario' : 'database already has data; kept it');

  const maildev = await startMaildev({ smtpPort: config.smtp.port, webPort: config.maildevWebPort });
  cleanups.push(() => maildev.stop());

  if (config.github.standIn) {
    const standIn = await startGithubStandIn({
      port: config.githubStandInPort,
      clientId: config.github.clientId,
      clientSecret: config.github.clientSecret,
    });
    cleanups.push(() => standIn.close());
  }

  let paymentsNote = 'the provider (STRIPE_SECRET_KEY)';
  let localPayments = false;
  if (config.payments.apiUrl && config.payments.secretKey === 'sk_test_tenthmark_local') {
    const standIn = await startPaymentsStandIn({
      port: config.payments.standInPort,
      dataFile: `${root}/.data/payments-stand-in.json`,
      secretKey: config.payments.secretKey,
      webhook: { url: `${config.appUrl}/api/payments/webhook`, secret: config.payments.webhookSecret },
    });
    cleanups.push(() => standIn.close());
    paymentsNote = `local stand-in on 127.0.0.1:${config.payments.standInPort}`;
    localPayments = true;
  }

  let client;
  if (dev) {
    const { createServer } = await import('vite');
    const vite = await createServer({ root, server: { middlewareMode: true }, appType: 'custom' });
    cleanups.push(() => vite.close());
    const { readFile } = await import('node:fs/promises');
    client = {
      kind: 'middleware' as const,
      handler: vite.middlewares,
      indexHtml: async (url: string) => vite.transformIndexHtml(url, await readFile(`${root}/index.html`, 'utf8')),
    };
  } else {
    step('building the browser app …');
    const build = spawnSync(process.execPath, [`${root}/node_modules/vite/bin/vite.js`, 'build', '--logLevel', 'warn'], {
      cwd: root,
      stdio: 'inherit',
    });
    if (build.status !== 0) throw new Error('The browser app did not build; see the messages above.');
    client = { kind: 'static' as const, dir: `${root}/dist/client` };
  }

  const app = await startServer({ ...config, databaseUrl }, { client, prettyLogs: process.stdout.isTTY });
  cleanups.push(() => app.close());

  if (seeded && localPayments) {
    // The demo jobs go through the running app and the payment stand-in, like a person's would.
    step('building the demo jobs (every state, about a minute) …');
    const scenarioPool = createPool(databaseUrl, 2);
    const made = await buildDemoScenario({ appUrl: app.url, db: createDb(scenarioPool), log: (line) => step(line) });
    await scenarioPool.end();
    step(`demo scenario ready: ${made} jobs`);
  } else if (seeded) {
    step('demo jobs skipped: they are built only against the local payment stand-in');
  }

  console.log(`
  Tenthmark is running${dev ? ' (development, hot reload)' : ''}.

    App          ${config.appUrl}
    Mail inbox   ${maildev.webUrl}
    GitHub       ${config.github.standIn ? `local stand-in on 127.0.0.1:${config.githubStandInPort}` : 'github.com'}
    Payments     ${paymentsNote} — test card 4242 4242 4242 4242
    Database     ${databaseUrl}

  Demo accounts (password "${DEMO_PASSWORD}"):
${demoAccounts.map((a) => `    ${a.role.padEnd(8)} ${a.email.padEnd(26)} ${a.displayName}`).join('\n')}

  Press Ctrl-C to stop.
`);
} catch (error) {
  console.error(`\n[tenthmark] could not start: ${error instanceof Error ? error.message : String(error)}\n`);
  await stopAll(1);
}

/**
 * `npm start` and `npm run dev`: everything Tenthmark needs on one machine.
 * A private PostgreSQL cluster under .data/, migrations, demo data, maildev,
 * the GitHub sign-in stand-in, and the app itself. Ctrl-C stops what it started,
 * every time: PostgreSQL is stopped (and awaited) before this process exits.
 *
 * `npm run start:cluster` (`--cluster`, `--instances N`, default 3): the same, but
 * the app runs as N instances in processes of their own with photos in the S3
 * stand-in, behind a local reverse proxy on the app's port (server/dev/cluster.ts).
 */
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createDb, createPool, runMigrations } from '../db/client';
import { loadConfig } from '../env';
import { startServer } from '../runtime';
import { startCluster } from './cluster';
import { startGithubStandIn } from './github-stand-in';
import { startMaildev } from './maildev';
import { startPaymentsStandIn } from './payments-stand-in';
import { ensureClusterAsync, ensureDatabase, type Cluster } from './postgres';
import { S3_STAND_IN_CREDENTIALS, startS3StandIn } from './s3-stand-in';
import { buildDemoScenario } from './demo-scenario';
import { DEMO_PASSWORD, demoAccounts, seedIfEmpty } from './seed';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dev = process.argv.includes('--dev');
const instancesAt = process.argv.indexOf('--instances');
/** How many app instances `--cluster` runs (`--instances N`); 0 means one in this process, as `npm start`. */
const clusterSize = process.argv.includes('--cluster') || instancesAt > 0 ? Number(instancesAt > 0 ? process.argv[instancesAt + 1] : 3) : 0;
const step = (text: string) => console.log(`[tenthmark] ${text}`);
const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** The S3 stand-in's bucket for `--cluster`. */
const CLUSTER_BUCKET = 'tenthmark';

/** How long the app, the stand-ins and maildev get to close before PostgreSQL is stopped regardless. */
const CLOSE_DEADLINE_MS = 10_000;

/**
 * Shutdown is one promise. It closes what runs in this process (newest first,
 * until the deadline), then always stops PostgreSQL — a cluster started here or
 * one of ours left by an earlier run — and waits for pg_ctl before exiting.
 * Further signals never end the process early: a later one only cuts the
 * closing short.
 */
const cleanups: Array<() => unknown> = [];
let cluster: Cluster | undefined;
let clusterStarting: Promise<unknown> = Promise.resolve();
let shutdown: Promise<never> | undefined;
let shutdownBegan = 0;
let hurry = () => {};
const hurried = new Promise<void>((resolve) => (hurry = resolve));

class Stopping extends Error {}
/** Between start-up steps: nothing more is started once shutdown has begun. */
function stillStarting() {
  if (shutdown) throw new Stopping('stopping');
}

function stopAll(code: number): Promise<never> {
  shutdown ??= (async () => {
    shutdownBegan = Date.now();
    step('stopping …');
    const closing = (async () => {
      for (let cleanup = cleanups.pop(); cleanup; cleanup = cleanups.pop()) {
        try {
          await cleanup();
        } catch (error) {
          console.error(error);
        }
      }
    })();
    const outcome = await Promise.race([
      closing.then(() => 'closed' as const),
      sleep(CLOSE_DEADLINE_MS).then(() => 'deadline' as const),
      hurried.then(() => 'hurried' as const),
    ]);
    if (outcome === 'deadline') step(`still closing after ${CLOSE_DEADLINE_MS / 1000} s; stopping PostgreSQL regardless`);
    if (outcome === 'hurried') step('not waiting for the rest to close; stopping PostgreSQL');
    // A start of the cluster still under way finishes first, so that what it started can be stopped.
    await clusterStarting.catch(() => {});
    if (cluster) {
      step('stopping PostgreSQL …');
      try {
        await cluster.stopAsync();
      } catch (error) {
        console.error(error);
      }
    }
    step('stopped.');
    process.exit(code);
  })();
  return shutdown;
}

function onSignal(signal: NodeJS.Signals) {
  if (!shutdown) {
    void stopAll(0);
    return;
  }
  // npm, sh and a terminal can each pass the same Ctrl-C on: only a later signal means "hurry".
  if (Date.now() - shutdownBegan < 1_000) return;
  step(`${signal} again: still stopping; PostgreSQL is stopped before this exits`);
  hurry();
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(signal, onSignal);
// A crash of the app must not leave the cluster running either.
process.on('uncaughtException', (error) => {
  console.error(error);
  void stopAll(1);
});
process.on('unhandledRejection', (error) => {
  console.error(error);
  void stopAll(1);
});

try {
  if (clusterSize && (!Number.isInteger(clusterSize) || clusterSize < 1)) throw new Error('--instances takes a whole number of 1 or more.');
  if (clusterSize && dev) throw new Error('--cluster serves the production build; it does not run with --dev.');
  const env = { NODE_ENV: dev ? 'development' : 'production', SESSION_SECRET: 'local-machine-session-secret', ...process.env };
  const config = loadConfig(env);

  step(`PostgreSQL: private cluster in ${config.dataDir} …`);
  const databaseName = new URL(config.databaseUrl).pathname.slice(1) || 'tenthmark';
  const starting = ensureClusterAsync({ dir: config.dataDir, port: config.pgPort }).then((started) => (cluster = started));
  clusterStarting = starting;
  const pgCluster = await starting;
  if (pgCluster.adopted) step('PostgreSQL was already running on this data folder (an earlier run did not stop it); it is stopped on exit');
  stillStarting();
  await ensureDatabase(pgCluster, databaseName);
  const databaseUrl = pgCluster.url(databaseName);

  stillStarting();
  step('applying migrations …');
  await runMigrations(databaseUrl);
  const seedPool = createPool(databaseUrl, 2);
  const seeded = await seedIfEmpty(createDb(seedPool));
  await seedPool.end();
  step(seeded ? 'seeded the demo scenario' : 'database already has data; kept it');

  stillStarting();
  const maildev = await startMaildev({ smtpPort: config.smtp.port, webPort: config.maildevWebPort });
  cleanups.push(() => maildev.stop());

  stillStarting();
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
      dataFile: `${config.dataDir}/payments-stand-in.json`,
      secretKey: config.payments.secretKey,
      webhook: { url: `${config.appUrl}/api/payments/webhook`, secret: config.payments.webhookSecret },
    });
    cleanups.push(() => standIn.close());
    paymentsNote = `local stand-in on 127.0.0.1:${config.payments.standInPort}`;
    localPayments = true;
  }

  stillStarting();
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
  } else if (config.clientDir) {
    step(`serving the existing build in ${config.clientDir} (TENTHMARK_CLIENT_DIR) …`);
    client = { kind: 'static' as const, dir: config.clientDir };
  } else {
    step('building the browser app …');
    const build = spawn(process.execPath, [`${root}/node_modules/vite/bin/vite.js`, 'build', '--logLevel', 'warn'], {
      cwd: root,
      stdio: 'inherit',
    });
    const stopBuild = () => build.kill();
    cleanups.push(stopBuild);
    const status = await new Promise<number | null>((resolve) => {
      build.once('error', () => resolve(-1));
      build.once('exit', (code) => resolve(code));
    });
    cleanups.splice(cleanups.indexOf(stopBuild), 1);
    stillStarting();
    if (status !== 0) throw new Error('The browser app did not build; see the messages above.');
    client = { kind: 'static' as const, dir: `${root}/dist/client` };
  }

  stillStarting();
  let app: { url: string };
  let instancesNote = '';
  if (clusterSize && client.kind === 'static') {
    // Every instance must see every photo: they share the S3 stand-in (its objects last as long as this run).
    const s3 = await startS3StandIn({ buckets: [CLUSTER_BUCKET] });
    cleanups.push(() => s3.stop());
    stillStarting();
    step(`starting ${clusterSize} app instances behind a proxy on port ${config.port} …`);
    const cluster = await startCluster({
      count: clusterSize,
      port: config.port,
      host: config.host,
      appUrl: config.appUrl,
      env: {
        ...env,
        DATABASE_URL: databaseUrl,
        TENTHMARK_CLIENT_DIR: client.dir,
        STORAGE: 's3',
        S3_ENDPOINT: s3.endpoint,
        S3_BUCKET: CLUSTER_BUCKET,
        S3_ACCESS_KEY_ID: S3_STAND_IN_CREDENTIALS.accessKeyId,
        S3_SECRET_ACCESS_KEY: S3_STAND_IN_CREDENTIALS.secretAccessKey,
      },
    });
    cleanups.push(() => cluster.stop());
    app = cluster;
    instancesNote = `\n    Instances    ${cluster.instances.map((instance) => `${instance.id} ${instance.url} (pid ${instance.pid})`).join(', ')}\n    Photos       S3 stand-in at ${s3.endpoint}, bucket ${CLUSTER_BUCKET}`;
  } else {
    const running = await startServer({ ...config, databaseUrl }, { client, prettyLogs: process.stdout.isTTY });
    cleanups.push(() => running.close());
    app = running;
  }

  stillStarting();
  if (seeded && localPayments && config.demoScenario) {
    // The demo jobs go through the running app and the payment stand-in, like a person's would.
    step('building the demo jobs (every state, about a minute) …');
    const scenarioPool = createPool(databaseUrl, 2);
    const made = await buildDemoScenario({ appUrl: app.url, db: createDb(scenarioPool), log: (line) => step(line) });
    await scenarioPool.end();
    step(`demo scenario ready: ${made} jobs`);
  } else if (seeded && !config.demoScenario) {
    step('demo jobs skipped (TENTHMARK_DEMO=off)');
  } else if (seeded) {
    step('demo jobs skipped: they are built only against the local payment stand-in');
  }

  stillStarting();
  console.log(`
  Tenthmark is running${dev ? ' (development, hot reload)' : ''}${clusterSize ? ` as ${clusterSize} instances behind a proxy` : ''}.

    App          ${config.appUrl}
    Mail inbox   ${maildev.webUrl}
    GitHub       ${config.github.standIn ? `local stand-in on 127.0.0.1:${config.githubStandInPort}` : 'github.com'}
    Payments     ${paymentsNote} — test card 4242 4242 4242 4242
    Database     ${databaseUrl}${pgCluster.adopted ? ' (was already running; stopped on exit)' : ''}${instancesNote}

  Demo accounts (password "${DEMO_PASSWORD}"):
${demoAccounts.map((a) => `    ${a.role.padEnd(8)} ${a.email.padEnd(26)} ${a.displayName}`).join('\n')}

  Press Ctrl-C to stop.
`);
} catch (error) {
  if (error instanceof Stopping || shutdown) {
    // Stopped (or stopping) while starting: the shutdown under way finishes the job.
    await shutdown;
  } else {
    console.error(`\n[tenthmark] could not start: ${error instanceof Error ? error.message : String(error)}\n`);
    await stopAll(1);
  }
}

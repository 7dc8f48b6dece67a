import { execFileSync, spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { connect as connectTcp, createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { io as connectSocket, type Socket } from 'socket.io-client';
import { afterEach, describe, expect, it } from 'vitest';
import { ensureCluster, ensurePostgresInstalled, serverOn } from '../../server/dev/postgres';
import { DEMO_PASSWORD, demoAccounts } from '../../server/dev/seed';
import { isRoot } from '../../server/dev/system-packages';
import { freePort } from '../setup/ports';

/**
 * `npm start` stops what it started, every time (issue 14, item 10): the whole
 * `npm start` (npm → sh → node) in a process group of its own, with its own
 * ports and data folder, is signalled the way a terminal's Ctrl-C does it (the
 * whole group at once), and afterwards no PostgreSQL server may be left on its
 * data folder and no port may be held.
 */
const root = fileURLToPath(new URL('../..', import.meta.url));

interface Run {
  child: ChildProcess;
  output: () => string;
  exited: Promise<void>;
}

interface Setup {
  dir: string;
  dataDir: string;
  pgDataDir: string;
  ports: Record<string, number>;
  env: NodeJS.ProcessEnv;
}

const runs: Run[] = [];
const folders: string[] = [];

async function makeSetup(): Promise<Setup> {
  const dir = mkdtempSync(join(tmpdir(), 'tenthmark-start-'));
  folders.push(dir);
  chmodSync(dir, 0o711); // the postgres user has to pass through it
  const dataDir = join(dir, 'data');
  const clientDir = join(dir, 'client');
  mkdirSync(clientDir);
  // A stand-in for the production build: shutdown does not depend on what the pages are.
  writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Tenthmark</title><div id="root"></div>');
  const ports = {
    PORT: await freePort(),
    TENTHMARK_PG_PORT: await freePort(),
    MAILDEV_WEB_PORT: await freePort(),
    SMTP_PORT: await freePort(),
    GITHUB_STAND_IN_PORT: await freePort(),
    PAYMENTS_STAND_IN_PORT: await freePort(),
  };
  const env: NodeJS.ProcessEnv = {};
  for (const [key, value] of Object.entries(process.env)) {
    // As from a terminal: not the test runner's NODE_ENV or its own variables.
    if (key === 'NODE_ENV' || key.startsWith('VITEST') || key === 'TEST') continue;
    env[key] = value;
  }
  Object.assign(env, Object.fromEntries(Object.entries(ports).map(([key, value]) => [key, String(value)])), {
    TENTHMARK_DATA_DIR: dataDir,
    TENTHMARK_CLIENT_DIR: clientDir,
    TENTHMARK_DEMO: 'off',
    UPLOADS_DIR: join(dir, 'uploads'),
    LOG_LEVEL: 'warn',
  });
  return { dir, dataDir, pgDataDir: join(dataDir, 'pg'), ports, env };
}

function startApp(setup: Setup, script: string[] = ['start']): Run {
  // detached: a process group of its own, as a terminal gives `npm start`.
  const child = spawn('npm', script, { cwd: root, env: setup.env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  let text = '';
  child.stdout!.on('data', (chunk) => (text += chunk));
  child.stderr!.on('data', (chunk) => (text += chunk));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const run = { child, output: () => text, exited };
  runs.push(run);
  return run;
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

function groupAlive(pid: number): boolean {
  try {
    process.kill(-pid, 0);
    return true;
  } catch {
    return false;
  }
}

function signalGroup(run: Run, signal: NodeJS.Signals) {
  try {
    process.kill(-run.child.pid!, signal);
  } catch {
    // already gone
  }
}

async function waitForHealth(run: Run, port: number, timeoutMs = 90_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (run.child.exitCode !== null || run.child.signalCode !== null) {
      throw new Error(`npm start ended before answering:\n${run.output()}`);
    }
    try {
      const res = await fetch(`http://127.0.0.1:${port}/api/health`);
      if (res.ok) return;
    } catch {
      // not yet listening
    }
    await sleep(200);
  }
  throw new Error(`npm start did not answer /api/health within ${timeoutMs} ms:\n${run.output()}`);
}

/**
 * Starts `npm <script>` and waits for its health answer. The ports were free when chosen, but tests
 * running beside this one open ports too (instances on port 0 among them): when one was taken in
 * between (EADDRINUSE), the run is tried once more on newly chosen ports.
 */
async function startAnswering(setup: Setup, script?: string[]): Promise<Run> {
  const run = startApp(setup, script);
  try {
    await waitForHealth(run, setup.ports.PORT);
    return run;
  } catch (error) {
    if (!run.output().includes('EADDRINUSE')) throw error;
    await waitForGroupGone(run);
    for (const key of Object.keys(setup.ports) as Array<keyof Setup['ports']>) {
      setup.ports[key] = await freePort();
      setup.env[key] = String(setup.ports[key]);
    }
    const again = startApp(setup, script);
    await waitForHealth(again, setup.ports.PORT);
    return again;
  }
}

/** Every process of the group gone (npm, sh, node and anything they spawned into it). */
async function waitForGroupGone(run: Run, timeoutMs = 30_000) {
  await Promise.race([run.exited, sleep(timeoutMs)]);
  const deadline = Date.now() + timeoutMs;
  while (groupAlive(run.child.pid!) && Date.now() < deadline) await sleep(100);
  if (groupAlive(run.child.pid!)) throw new Error(`npm start was still running ${timeoutMs} ms after the signals:\n${run.output()}`);
}

function pgCtl(pgDataDir: string, args: string[]) {
  const bin = join(ensurePostgresInstalled(), 'pg_ctl');
  const [command, commandArgs] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, '-D', pgDataDir, ...args]] : [bin, ['-D', pgDataDir, ...args]];
  return spawnSync(command, commandArgs, { cwd: '/', encoding: 'utf8' });
}

function portFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

async function expectEverythingStopped(setup: Setup, run: Run) {
  const why = `\n--- npm start said ---\n${run.output()}`;
  expect(existsSync(join(setup.pgDataDir, 'postmaster.pid')), `postmaster.pid left in ${setup.pgDataDir}${why}`).toBe(false);
  const status = pgCtl(setup.pgDataDir, ['status']);
  // pg_ctl status: 3 = no server running.
  expect(status.status, `pg_ctl status: ${status.stdout}${status.stderr}${why}`).toBe(3);
  for (const [name, port] of Object.entries(setup.ports)) {
    expect(await portFree(port), `${name} ${port} still held${why}`).toBe(true);
  }
}

/** Some traffic of the kinds that used to hold shutdown up: keep-alive requests, a socket.io client, a half-sent request. */
async function makeTraffic(port: number) {
  const base = `http://127.0.0.1:${port}`;
  for (const path of ['/api/health', '/', '/board', '/api/auth/csrf', '/api/openapi.json', '/api/jobs']) {
    const res = await fetch(base + path);
    await res.arrayBuffer();
    expect(res.status, path).toBeLessThan(500);
  }
  // A signed-in socket.io client, as an open page has one.
  const cookies = new Map<string, string>();
  const call = async (method: string, path: string, headers: Record<string, string> = {}, body?: unknown) => {
    const res = await fetch(base + path, {
      method,
      headers: { ...headers, cookie: [...cookies].map(([k, v]) => `${k}=${v}`).join('; '), ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    });
    for (const cookie of res.headers.getSetCookie()) {
      const [pair] = cookie.split(';');
      cookies.set(pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1));
    }
    expect(res.status, `${method} ${path}`).toBeLessThan(400);
    return res.json() as Promise<{ csrfToken: string }>;
  };
  const { csrfToken } = await call('GET', '/api/auth/csrf');
  await call('POST', '/api/auth/login', { 'x-csrf-token': csrfToken }, { email: demoAccounts[1].email, password: DEMO_PASSWORD });
  const socket: Socket = connectSocket(base, {
    transports: ['websocket'],
    reconnection: false,
    extraHeaders: { cookie: [...cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
  });
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
  const halfSent = connectTcp(port, '127.0.0.1');
  await new Promise<void>((resolve) => halfSent.once('connect', () => resolve()));
  halfSent.write('GET /api/health HTTP/1.1\r\nHost: 127.0.0.1\r\n');
  halfSent.on('error', () => {});
  return () => {
    socket.disconnect();
    halfSent.destroy();
  };
}

afterEach(async () => {
  for (const run of runs.splice(0)) {
    if (run.child.pid && groupAlive(run.child.pid)) {
      signalGroup(run, 'SIGKILL');
      await sleep(200);
    }
  }
  for (const dir of folders.splice(0)) {
    const pgDataDir = join(dir, 'data', 'pg');
    if (existsSync(join(pgDataDir, 'postmaster.pid'))) pgCtl(pgDataDir, ['-m', 'immediate', '-w', 'stop']);
    rmSync(dir, { recursive: true, force: true });
  }
});

describe('npm start stops what it started', () => {
  // About 15 s each on an idle machine; start-up alone can take much longer when the cores are busy.
  it('stops PostgreSQL, maildev, the stand-ins and the app when a second signal arrives during shutdown', { timeout: 150_000 }, async () => {
    const setup = await makeSetup();
    const run = await startAnswering(setup);
    const closeTraffic = await makeTraffic(setup.ports.PORT);

    // Ctrl-C reaches the whole group at once; then a SIGTERM while it is stopping, and Ctrl-C
    // again and again until it is gone, so that some land in every phase, pg_ctl stop included.
    signalGroup(run, 'SIGINT');
    await sleep(300);
    signalGroup(run, 'SIGTERM');
    let signals = 2;
    const again = setInterval(() => {
      signals += 1;
      signalGroup(run, 'SIGINT');
    }, 250);
    try {
      await waitForGroupGone(run);
    } finally {
      clearInterval(again);
      closeTraffic();
    }
    expect(signals, 'signals sent during shutdown').toBeGreaterThan(2);

    expect(run.output()).toContain('stopping');
    await expectEverythingStopped(setup, run);
  });

  it('stops a cluster on its data folder left running by an earlier run', { timeout: 150_000 }, async () => {
    const setup = await makeSetup();
    // An earlier run that crashed (kill -9) left its cluster running on the same data folder.
    const earlier = ensureCluster({ dir: setup.dataDir, port: setup.ports.TENTHMARK_PG_PORT });
    expect(earlier.startedHere).toBe(true);
    expect(existsSync(join(setup.pgDataDir, 'postmaster.pid'))).toBe(true);

    const run = await startAnswering(setup);
    const health = await fetch(`http://127.0.0.1:${setup.ports.PORT}/api/health`);
    expect(health.status).toBe(200);

    signalGroup(run, 'SIGINT');
    await waitForGroupGone(run);

    await expectEverythingStopped(setup, run);
  });

  it('npm run start:cluster: stops the instances, the proxy, the stand-ins and PostgreSQL on Ctrl-C', { timeout: 150_000 }, async () => {
    const setup = await makeSetup();
    const run = await startAnswering(setup, ['run', 'start:cluster', '--', '--instances', '2']);
    // The same traffic through the proxy: pages, a sign-in, a socket.io client over a websocket, a half-sent request.
    const closeTraffic = await makeTraffic(setup.ports.PORT);
    expect(run.output()).toContain('as 2 instances behind a proxy');

    signalGroup(run, 'SIGINT');
    try {
      await waitForGroupGone(run);
    } finally {
      closeTraffic();
    }
    await expectEverythingStopped(setup, run);
  });

  it("neither adopts nor stops another folder's server when that server's lock file was copied in", async () => {
    const other = await makeSetup();
    const setup = await makeSetup();
    const theirs = ensureCluster({ dir: other.dataDir, port: other.ports.TENTHMARK_PG_PORT });
    ensureCluster({ dir: setup.dataDir, port: setup.ports.TENTHMARK_PG_PORT }).stop();
    // As `cp -a` of a folder whose server was running would leave it: their pid, their data directory.
    const lockFile = join(setup.pgDataDir, 'postmaster.pid');
    copyFileSync(join(other.pgDataDir, 'postmaster.pid'), lockFile);
    if (isRoot()) execFileSync('chown', ['postgres:postgres', lockFile]);
    expect(serverOn(setup.pgDataDir).state).toBe('stale');

    const ours = ensureCluster({ dir: setup.dataDir, port: setup.ports.TENTHMARK_PG_PORT });
    expect(ours.adopted).toBe(false);
    expect(ours.startedHere).toBe(true);
    const theirsNow = serverOn(other.pgDataDir);
    const oursNow = serverOn(setup.pgDataDir);
    expect(theirsNow.state).toBe('running');
    expect(oursNow.state).toBe('running');
    if (theirsNow.state === 'running' && oursNow.state === 'running') expect(oursNow.pid).not.toBe(theirsNow.pid);

    ours.stop();
    expect(serverOn(other.pgDataDir).state, 'stopping ours stopped theirs').toBe('running');
    theirs.stop();
  });
});

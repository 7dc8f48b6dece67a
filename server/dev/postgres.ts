import { execFileSync, spawn, spawnSync, type SpawnSyncOptionsWithStringEncoding } from 'node:child_process';
import {
  accessSync,
  appendFileSync,
  chmodSync,
  constants,
  existsSync,
  mkdirSync,
  readFileSync,
  readdirSync,
  readlinkSync,
  realpathSync,
  rmSync,
  statSync,
} from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import pg from 'pg';
import { ensureDebianPackage, isRoot } from './system-packages';

/**
 * A private PostgreSQL cluster from Debian's packages, listening on loopback
 * only. PostgreSQL refuses to run as root, so as root every server command runs
 * as the unprivileged "postgres" user.
 */
export interface ClusterOptions {
  /** Folder that holds the cluster's data directory and log. */
  dir: string;
  port: number;
  /** Throwaway clusters (tests) trade durability for speed. */
  throwaway?: boolean;
}

export interface Cluster {
  dir: string;
  dataDir: string;
  port: number;
  /** True when this call started the server (so the caller should stop it). */
  startedHere: boolean;
  /**
   * True when a server was already running on this very data directory (an
   * earlier run that crashed or was killed) and was taken over as it is.
   */
  adopted: boolean;
  url(database: string): string;
  stop(): void;
  /**
   * The same without blocking the event loop: `pg_ctl stop -m fast`, then
   * `-m immediate` if that did not stop it. One promise, however often called.
   */
  stopAsync(): Promise<void>;
}

function findBinDir(): string | undefined {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return undefined;
  const versions = readdirSync(base)
    .filter((name) => existsSync(join(base, name, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], 'bin') : undefined;
}

export function ensurePostgresInstalled(): string {
  const existing = findBinDir();
  if (existing) return existing;
  ensureDebianPackage({
    pkg: 'postgresql',
    probe: ['/usr/lib/postgresql'],
    purpose: 'Tenthmark keeps its data in PostgreSQL',
  });
  const bin = findBinDir();
  if (!bin) throw new Error('PostgreSQL was installed but no pg_ctl was found under /usr/lib/postgresql/*/bin.');
  return bin;
}

function ownerCommand(bin: string, args: string[]): [string, string[]] {
  return isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
}

// Every server command runs detached, in a process group of its own: a terminal's Ctrl-C goes to
// the whole foreground group at once and must not kill initdb or pg_ctl half-way through.
function runAsOwner(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const [command, commandArgs] = ownerCommand(bin, args);
  // Node honours `detached` in spawnSync too; its typings leave it out.
  const result = spawnSync(command, commandArgs, { cwd: '/', encoding: 'utf8', detached: true } as SpawnSyncOptionsWithStringEncoding);
  if (result.status !== 0 && !opts.quiet) {
    throw new Error(`${bin} ${args.join(' ')} failed:\n${result.stdout}\n${result.stderr}`);
  }
  return result;
}

/** The same, awaited without blocking the event loop (so signals keep being handled meanwhile). */
function runAsOwnerAsync(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const [command, commandArgs] = ownerCommand(bin, args);
  return new Promise<{ status: number | null; stdout: string; stderr: string }>((resolvePromise, reject) => {
    const child = spawn(command, commandArgs, { cwd: '/', detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.once('error', reject);
    child.once('close', (status) => {
      if (status !== 0 && !opts.quiet) reject(new Error(`${bin} ${args.join(' ')} failed:\n${stdout}\n${stderr}`));
      else resolvePromise({ status, stdout, stderr });
    });
  });
}

function samePath(a: string, b: string): boolean {
  try {
    return realpathSync(a) === realpathSync(b);
  } catch {
    return false;
  }
}

type ServerState = { state: 'stopped' } | { state: 'running'; pid: number; port: number } | { state: 'stale'; pid: number; why: string };

/**
 * Is a server running on this data directory? Read from its postmaster.pid and
 * checked against the process it names: only a postgres process whose data
 * directory (and working directory) is this one counts. A lock file copied
 * along with the folder, or naming a pid now used by something else, is stale.
 */
export function serverOn(dataDir: string): ServerState {
  let lines: string[];
  try {
    lines = readFileSync(join(dataDir, 'postmaster.pid'), 'utf8').split('\n');
  } catch {
    return { state: 'stopped' };
  }
  const pid = Number(lines[0]);
  const port = Number(lines[3]);
  if (!Number.isInteger(pid) || pid <= 0) return { state: 'stopped' }; // being written or empty: PostgreSQL itself decides
  try {
    process.kill(pid, 0);
  } catch (error) {
    // EPERM: alive but not ours to signal, which a server of ours never is.
    if ((error as NodeJS.ErrnoException).code === 'ESRCH') return { state: 'stopped' }; // PostgreSQL removes such a file itself
    return { state: 'stale', pid, why: 'it belongs to another user' };
  }
  if (!samePath(lines[1] ?? '', dataDir)) return { state: 'stale', pid, why: `its lock file names another data directory (${lines[1]})` };
  if (existsSync(`/proc/${pid}`)) {
    let command: string;
    let cwd: string;
    try {
      command = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0')[0] ?? '';
      cwd = readlinkSync(`/proc/${pid}/cwd`);
    } catch {
      return { state: 'stale', pid, why: 'it cannot be inspected' };
    }
    if (!/(^|\/)postgres$/.test(command)) return { state: 'stale', pid, why: `it is not PostgreSQL (${command})` };
    if (!samePath(cwd, dataDir)) return { state: 'stale', pid, why: `it serves ${cwd}` };
  }
  return { state: 'running', pid, port: Number.isInteger(port) ? port : 0 };
}

/** Every parent folder must be enterable by the postgres user. */
function checkTraversable(dir: string) {
  if (!isRoot()) return;
  let current = resolve(dir);
  while (true) {
    const parent = dirname(current);
    if (parent === current) break;
    current = parent;
    const mode = statSync(current).mode;
    if ((mode & 0o001) === 0) {
      throw new Error(
        `The folder ${current} cannot be entered by the "postgres" user, so PostgreSQL cannot reach ${dir}.\n` +
          `Allow it with:  chmod o+x ${current}`,
      );
    }
  }
}

interface Prepared {
  bin: string;
  dir: string;
  dataDir: string;
  logFile: string;
  pgCtl: string;
  /** initdb arguments and the settings appended afterwards, when the data directory is new. */
  init?: { args: string[]; settings: string };
}

function prepare(options: ClusterOptions): Prepared {
  const bin = ensurePostgresInstalled();
  const dir = resolve(options.dir);
  const dataDir = join(dir, 'pg');
  const logFile = join(dir, 'pg.log');
  const pgCtl = join(bin, 'pg_ctl');

  mkdirSync(dir, { recursive: true });
  checkTraversable(dir);
  if (isRoot()) {
    execFileSync('chown', ['-R', 'postgres:postgres', dir]);
    chmodSync(dir, 0o700);
  } else {
    accessSync(dir, constants.W_OK);
  }

  if (existsSync(join(dataDir, 'PG_VERSION'))) return { bin, dir, dataDir, logFile, pgCtl };
  const settings = [
    `listen_addresses = '127.0.0.1'`,
    `port = ${options.port}`,
    `unix_socket_directories = ''`,
    `max_connections = 200`,
    // Solid-state storage: random reads cost little more than sequential ones (the default 4 assumes spinning disks).
    `random_page_cost = 1.1`,
  ];
  if (options.throwaway) settings.push('fsync = off', 'synchronous_commit = off', 'full_page_writes = off');
  return {
    bin,
    dir,
    dataDir,
    logFile,
    pgCtl,
    init: { args: ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--no-locale'], settings: `\n# Tenthmark\n${settings.join('\n')}\n` },
  };
}

/**
 * What to do about a server found on the data directory: a stale lock file is
 * removed (PostgreSQL would refuse to start over it), a server of ours on
 * another port is restarted on the configured one, a server of ours on the
 * configured port is adopted.
 */
function existingServer(p: Prepared, port: number): { adopt: boolean; restart: boolean } {
  const found = serverOn(p.dataDir);
  if (found.state === 'stale') {
    console.warn(`[postgres] removing a stale postmaster.pid in ${p.dataDir}: process ${found.pid} is not its server (${found.why})`);
    rmSync(join(p.dataDir, 'postmaster.pid'), { force: true });
    return { adopt: false, restart: false };
  }
  if (found.state === 'running') return { adopt: found.port === port, restart: found.port !== port };
  return { adopt: false, restart: false };
}

const stopArgs = (dataDir: string, mode: 'fast' | 'immediate') => ['-D', dataDir, '-m', mode, '-w', '-t', mode === 'fast' ? '60' : '20', 'stop'];
const startArgs = (p: Prepared, port: number) =>
  // Port given on the command line too, so an existing cluster follows the configured port.
  ['-D', p.dataDir, '-l', p.logFile, '-o', `-p ${port}`, '-w', '-t', '60', 'start'];

function makeCluster(p: Prepared, port: number, startedHere: boolean, adopted: boolean): Cluster {
  let stopping: Promise<void> | undefined;
  const stopAsync = () =>
    (stopping ??= (async () => {
      const fast = await runAsOwnerAsync(p.pgCtl, stopArgs(p.dataDir, 'fast'), { quiet: true });
      if (fast.status !== 0 && serverOn(p.dataDir).state === 'running') {
        console.error(`[postgres] pg_ctl stop -m fast did not stop the server in ${p.dataDir}:\n${fast.stdout}${fast.stderr}`);
        await runAsOwnerAsync(p.pgCtl, stopArgs(p.dataDir, 'immediate'), { quiet: true });
      }
    })());
  return {
    dir: p.dir,
    dataDir: p.dataDir,
    port,
    startedHere,
    adopted,
    url: (database) => `postgres://postgres@127.0.0.1:${port}/${database}`,
    stop() {
      if (stopping) return;
      stopping = Promise.resolve();
      runAsOwner(p.pgCtl, stopArgs(p.dataDir, 'fast'), { quiet: true });
    },
    stopAsync,
  };
}

export function ensureCluster(options: ClusterOptions): Cluster {
  const p = prepare(options);
  if (p.init) {
    runAsOwner(join(p.bin, 'initdb'), p.init.args);
    appendFileSync(join(p.dataDir, 'postgresql.conf'), p.init.settings);
  }
  const { adopt, restart } = existingServer(p, options.port);
  if (restart) runAsOwner(p.pgCtl, stopArgs(p.dataDir, 'fast'));
  if (!adopt) runAsOwner(p.pgCtl, startArgs(p, options.port));
  return makeCluster(p, options.port, !adopt, adopt);
}

/**
 * ensureCluster without blocking the event loop, for `npm start`: a signal that
 * arrives meanwhile is handled at once, and the caller can wait for this to
 * settle before stopping the server it started.
 */
export async function ensureClusterAsync(options: ClusterOptions): Promise<Cluster> {
  const p = prepare(options);
  if (p.init) {
    await runAsOwnerAsync(join(p.bin, 'initdb'), p.init.args);
    appendFileSync(join(p.dataDir, 'postgresql.conf'), p.init.settings);
  }
  const { adopt, restart } = existingServer(p, options.port);
  if (restart) await runAsOwnerAsync(p.pgCtl, stopArgs(p.dataDir, 'fast'));
  const cluster = makeCluster(p, options.port, !adopt, adopt);
  if (!adopt) {
    try {
      await runAsOwnerAsync(p.pgCtl, startArgs(p, options.port));
    } catch (error) {
      // pg_ctl gave up waiting, but the server may still be coming up: it is ours, so stop it.
      if (serverOn(p.dataDir).state === 'running') await cluster.stopAsync();
      throw error;
    }
  }
  return cluster;
}

export async function ensureDatabase(cluster: Cluster, database: string): Promise<void> {
  const client = new pg.Client({ connectionString: cluster.url('postgres') });
  await client.connect();
  try {
    const found = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
    if (found.rowCount === 0) await client.query(`CREATE DATABASE "${database.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

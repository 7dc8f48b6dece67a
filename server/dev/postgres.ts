import { execFileSync, spawnSync } from 'node:child_process';
import { accessSync, appendFileSync, chmodSync, constants, existsSync, mkdirSync, readdirSync, statSync } from 'node:fs';
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
  url(database: string): string;
  stop(): void;
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

function runAsOwner(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const [command, commandArgs] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  const result = spawnSync(command, commandArgs, { cwd: '/', encoding: 'utf8' });
  if (result.status !== 0 && !opts.quiet) {
    throw new Error(`${bin} ${args.join(' ')} failed:\n${result.stdout}\n${result.stderr}`);
  }
  return result;
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

export function ensureCluster(options: ClusterOptions): Cluster {
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

  if (!existsSync(join(dataDir, 'PG_VERSION'))) {
    runAsOwner(join(bin, 'initdb'), ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--no-locale']);
    const settings = [
      `listen_addresses = '127.0.0.1'`,
      `port = ${options.port}`,
      `unix_socket_directories = ''`,
      `max_connections = 200`,
      // Solid-state storage: random reads cost little more than sequential ones (the default 4 assumes spinning disks).
      `random_page_cost = 1.1`,
    ];
    if (options.throwaway) settings.push('fsync = off', 'synchronous_commit = off', 'full_page_writes = off');
    appendFileSync(join(dataDir, 'postgresql.conf'), `\n# Tenthmark\n${settings.join('\n')}\n`);
  }

  const running = runAsOwner(pgCtl, ['-D', dataDir, 'status'], { quiet: true }).status === 0;
  if (!running) {
    // Port given on the command line too, so an existing cluster follows the configured port.
    runAsOwner(pgCtl, ['-D', dataDir, '-l', logFile, '-o', `-p ${options.port}`, '-w', '-t', '60', 'start']);
  }

  let stopped = false;
  return {
    dir,
    dataDir,
    port: options.port,
    startedHere: !running,
    url: (database) => `postgres://postgres@127.0.0.1:${options.port}/${database}`,
    stop() {
      if (stopped) return;
      stopped = true;
      runAsOwner(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', '-t', '60', 'stop'], { quiet: true });
    },
  };
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

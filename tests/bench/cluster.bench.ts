/**
 * `npm run bench:cluster`: requests per second for the board's newest page and
 * for posting a message with 1, 2 and 3 app instances behind the cluster's
 * proxy (server/dev/cluster.ts, as `npm run start:cluster` runs them), on one
 * seeded PostgreSQL; and one instance reached without the proxy, so the
 * proxy's own cost shows. The load comes from a child process (this file with
 * `--load`), so it does not share an event loop with the proxy. Prints, for
 * each layout, p50 / p99 and requests per second, then the CPU each kind of
 * process (instances, proxy, load, database) used per board request and how
 * busy the machine was. Asserts nothing.
 * BENCH_SECONDS (per case, default 10), BENCH_CONNECTIONS (default 50),
 * BENCH_COUNTS (instance counts, default 1,2,3).
 */
import autocannon from 'autocannon';
import { fork } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startCluster, type Cluster } from '../../server/dev/cluster';
import { createDb, createPool } from '../../server/db/client';
import { BENCH_JOBS, benchCluster, benchEnv, loadOptions, migratedBenchDatabase, seedMarketplace, signInAsShop } from './bench-app';

const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const COUNTS = (process.env.BENCH_COUNTS ?? '1,2,3').split(',').map(Number);

/** What the load child is asked to do, and what it answers. */
interface LoadAsk {
  url: string;
  cookie: string;
  token: string;
  post: boolean;
  /** The load's length; BENCH_SECONDS without it. */
  seconds?: number;
}
interface LoadAnswer {
  /** CPU seconds the load process itself used. */
  cpu: number;
  rate: number;
  p50: number;
  p99: number;
  errors: number;
}

async function load(ask: LoadAsk): Promise<LoadAnswer> {
  const started = process.cpuUsage();
  const result = await autocannon(loadOptions({ ...ask, connections: CONNECTIONS, seconds: ask.seconds ?? DURATION_S }));
  if (result.errors + result.non2xx) console.error(ask.url, JSON.stringify({ errors: result.errors, timeouts: result.timeouts, non2xx: result.non2xx, codes: result.statusCodeStats }));
  const used = process.cpuUsage(started);
  return { cpu: (used.user + used.system) / 1e6, rate: result.requests.total / result.duration, p50: result.latency.p50, p99: result.latency.p99, errors: result.errors + result.non2xx };
}

if (process.argv.includes('--load')) {
  process.once('message', (ask: LoadAsk) => {
    void load(ask).then((answer) => {
      process.send!(answer);
      process.disconnect();
    });
  });
} else {
  await main();
}

/** Runs one load in a child process; resolves to its figures. */
function loadFromChild(ask: LoadAsk): Promise<LoadAnswer> {
  const child = fork(fileURLToPath(import.meta.url), ['--load'], { execArgv: ['--import', 'tsx'] });
  child.send(ask);
  return new Promise((resolve, reject) => {
    child.once('message', (answer: LoadAnswer) => resolve(answer));
    child.once('exit', (code) => reject(new Error(`the load process ended (${code})`)));
  });
}

/** CPU seconds used so far by these processes (Linux /proc), by pid. */
async function cpuSeconds(pids: number[]): Promise<Map<number, number>> {
  const { readFile } = await import('node:fs/promises');
  const ticks = 100; // USER_HZ on Linux
  const out = new Map<number, number>();
  for (const pid of pids) {
    const stat = await readFile(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    out.set(pid, (Number(fields[11]) + Number(fields[12])) / ticks);
  }
  return out;
}

/** Busy and total CPU seconds of the whole machine so far (/proc/stat, all cores). */
async function machineSeconds(): Promise<{ busy: number; total: number }> {
  const { readFile } = await import('node:fs/promises');
  const [first] = (await readFile('/proc/stat', 'utf8')).split('\n');
  const [user, nice, system, idle, iowait, ...rest] = first.split(/\s+/).slice(1).map(Number);
  const total = [user, nice, system, idle, iowait, ...rest.slice(0, 3)].reduce((a, b) => a + b, 0) / 100;
  return { busy: total - (idle + iowait) / 100, total };
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'tenthmark-cluster-bench-'));
  const pg = await benchCluster(dir);
  let cluster: Cluster | undefined;
  try {
    const url = await migratedBenchDatabase(pg);
    const pool = createPool(url, 2);
    console.log(`seeding ${BENCH_JOBS.toLocaleString()} open jobs …`);
    const { threadId } = await seedMarketplace(createDb(pool), BENCH_JOBS);
    await pool.end();
    const env = benchEnv(url, { RATE_LIMIT_SIGNIN_MAX: '1000', RATE_LIMIT_MESSAGES_PER_10S: '1000000' });

    console.log(`\n${CONNECTIONS} connections, ${DURATION_S} s per case, ${cpus().length} cores; latencies in ms`);
    console.log(
      'layout'.padEnd(34),
      'board req/s'.padStart(12), 'p50'.padStart(5), 'p99'.padStart(5),
      'message req/s'.padStart(14), 'p50'.padStart(5), 'p99'.padStart(5),
    );
    const cpuLines: string[] = [];
    for (const count of COUNTS) {
      cluster = await startCluster({ count, env });
      const layouts: Array<{ name: string; base: string }> = [{ name: `${count} instance${count > 1 ? 's' : ''} behind the proxy`, base: cluster.url }];
      if (count === 1) layouts.unshift({ name: '1 instance, no proxy', base: cluster.instances[0].url });
      for (const layout of layouts) {
        const { cookie, token } = await signInAsShop(layout.base);
        // A short load first, unmeasured: the instances' code is compiled and their statements prepared before the figures count.
        await loadFromChild({ url: `${layout.base}/api/jobs?pageSize=20`, cookie, token, post: false, seconds: 2 });
        const pids = [...cluster.instances.map((i) => i.pid), process.pid];
        const [before, machineBefore] = [await cpuSeconds(pids), await machineSeconds()];
        const board = await loadFromChild({ url: `${layout.base}/api/jobs?pageSize=20`, cookie, token, post: false });
        const [after, machineAfter] = [await cpuSeconds(pids), await machineSeconds()];
        const message = await loadFromChild({ url: `${layout.base}/api/threads/${threadId}/messages`, cookie, token, post: true });
        console.log(
          layout.name.padEnd(34),
          board.rate.toFixed(0).padStart(12), String(board.p50).padStart(5), String(board.p99).padStart(5),
          message.rate.toFixed(0).padStart(14), String(message.p50).padStart(5), String(message.p99).padStart(5),
          board.errors + message.errors ? `  errors: ${board.errors + message.errors}` : '',
        );
        // Where the CPU went while the board was loaded, in ms per board request.
        const requests = board.rate * DURATION_S;
        const used = (pid: number) => after.get(pid)! - before.get(pid)!;
        const instances = cluster.instances.reduce((sum, i) => sum + used(i.pid), 0);
        const proxy = layout.base === cluster.url ? used(process.pid) : 0;
        const busy = machineAfter.busy - machineBefore.busy;
        const perRequest = (seconds: number) => ((seconds * 1000) / requests).toFixed(2).padStart(9);
        cpuLines.push(
          [
            layout.name.padEnd(34),
            perRequest(instances),
            perRequest(proxy),
            perRequest(board.cpu),
            perRequest(Math.max(0, busy - instances - proxy - board.cpu)),
            `${((busy / (machineAfter.total - machineBefore.total)) * 100).toFixed(0)} %`.padStart(10),
          ].join(' '),
        );
      }
      await cluster.stop();
      cluster = undefined;
    }
    console.log('\nCPU per board request (ms), by process, and how busy the machine was during the board case');
    console.log('layout'.padEnd(34), 'instances'.padStart(9), 'proxy'.padStart(9), 'load'.padStart(9), 'database'.padStart(9), 'machine'.padStart(10));
    console.log(cpuLines.join('\n'));
    console.log('("database" is everything else on the machine in that time: PostgreSQL first of all.)');
  } finally {
    await cluster?.stop();
    pg.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

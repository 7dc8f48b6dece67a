/**
 * Several app instances, each a process of its own (server/dev/instance-process.ts),
 * behind a small local reverse proxy on http-proxy: what `npm run start:cluster`
 * runs, what tests/cluster/journey.test.ts drives, and how the realtime bench
 * starts its instances. The database must be migrated before (instances never
 * migrate), and every instance gets the same settings.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { Agent, createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo, Socket } from 'node:net';
import { Readable } from 'node:stream';
import httpProxy from 'http-proxy';
import type { InstanceAnswer, InstanceAsk } from './instance-process';

/** How long an instance gets to close before it is killed. */
const CLOSE_DEADLINE_MS = 8_000;

/** One forked app instance. */
export interface Instance {
  id: string;
  /** Where it listens itself, e.g. http://127.0.0.1:40123 (the proxy's target). */
  url: string;
  pid: number;
  /** Resolves once the process has ended, however. */
  exited: Promise<void>;
  alive(): boolean;
  /** Socket.io clients connected to it. */
  clients(): Promise<number>;
  /** Runs the scheduler's due tasks now (or as if at `now`); how many it ran. */
  runDue(now?: Date): Promise<number>;
  /** Closes it as a shutdown does (connections, workers, pools) and waits for the process to end. */
  close(): Promise<void>;
  /** SIGKILL: the process ends at once, as in a crash; nothing of it closes. */
  kill(): Promise<void>;
}

/**
 * Forks one instance with these settings (raw, as the environment would give them);
 * resolves once it listens. `PORT` 0 lets the kernel choose its port.
 */
export async function forkInstance(id: string, env: Record<string, string | undefined>): Promise<Instance> {
  const child: ChildProcess = fork(new URL('./instance-process.ts', import.meta.url), {
    execArgv: ['--import', 'tsx'],
    env: { ...process.env, TENTHMARK_INSTANCE_ENV: JSON.stringify(env) },
  });
  let ended = false;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  void exited.then(() => (ended = true));
  const answer = <K extends string>(key: K) =>
    new Promise<unknown>((resolve, reject) => {
      const onMessage = (message: InstanceAnswer) => {
        if ('failed' in message) reject(new Error(`instance ${id}: ${message.failed}`));
        else if (!(key in message)) return;
        else resolve((message as Record<string, unknown>)[key]);
        child.off('message', onMessage);
      };
      child.on('message', onMessage);
      void exited.then(() => reject(new Error(`instance ${id} exited`)));
    });
  const ask = (message: InstanceAsk) => child.send(message);
  const { host, port } = (await answer('listening')) as { host: string; port: number };
  return {
    id,
    url: `http://${host.includes(':') ? `[${host}]` : host}:${port}`,
    pid: child.pid!,
    exited,
    alive: () => !ended,
    clients: () => {
      const count = answer('clients') as Promise<number>;
      ask({ ask: 'count' });
      return count;
    },
    runDue: (now) => {
      const ran = answer('ran') as Promise<number>;
      ask({ ask: 'run-due', now: now?.toISOString() });
      return ran;
    },
    close: async () => {
      if (ended) return;
      ask({ ask: 'close' });
      // An instance that cannot close (a pool waiting on a database already gone) is ended.
      const stuck = setTimeout(() => child.kill('SIGKILL'), CLOSE_DEADLINE_MS);
      await exited;
      clearTimeout(stuck);
    },
    kill: async () => {
      if (!ended) child.kill('SIGKILL');
      await exited;
    },
  };
}

/** How long the proxy keeps an unused connection to an instance: under the instances' own 5 s. */
const IDLE_CONNECTION_MS = 4_000;
/** GET and the like may be sent again to another instance when the first could not be reached; a POST may have been acted on. */
const SAFE_TO_RETRY = new Set(['GET', 'HEAD', 'OPTIONS']);
/** An instance that failed to answer is passed over for this long (it is removed for good when its process ends). */
const PASS_OVER_MS = 2_000;
/**
 * Socket.io's long-polling fallback sends each connection's requests as separate HTTP requests that
 * must all reach the instance holding that connection, so the proxy keeps a /socket.io/ client on one
 * instance with a cookie of its own (as a load balancer's "sticky sessions" do). The browser app asks for
 * a websocket first (client/lib/realtime.ts), which is one connection and needs nothing; polling is kept
 * for networks that block websockets, and this is what lets it work behind several instances.
 */
const STICKY_COOKIE = 'tenthmark_instance';

interface Target {
  id: string;
  url: string;
  passedOverUntil: number;
}

/**
 * The reverse proxy: round robin over the instances added and not passed over, websocket
 * upgrades passed through, an unreachable instance skipped. A request no instance could take
 * gets 502 with the app's error shape. `served` counts the answers per instance id.
 */
export async function startProxy(options: { port?: number; host?: string } = {}) {
  // Connections to the instances are kept open and reused. Without an agent, http-proxy asks each instance to close
  // its connection after the answer, and passes that "Connection: close" on to the client, so every request cost two
  // new connections, and under load requests already sent on a closing connection were sent again.
  // A connection left unused is closed by the proxy before the instance would close it (Node's server does after 5 s,
  // its keepAliveTimeout): else a request could leave on a connection the instance was closing that moment, and a POST
  // so lost is answered 502 (the bench saw one in 2,400 messages across three instances).
  const agent = new Agent({ keepAlive: true, timeout: IDLE_CONNECTION_MS });
  const proxy = httpProxy.createProxyServer({ xfwd: true, agent });
  const targets: Target[] = [];
  const served = new Map<string, number>();
  const chosen = new WeakMap<IncomingMessage, Target>();
  let turn = 0;

  const sticky = (req: IncomingMessage) => {
    if (!req.url?.startsWith('/socket.io/')) return undefined;
    const id = /(?:^|;\s*)tenthmark_instance=([\w-]+)/.exec(req.headers.cookie ?? '')?.[1];
    return targets.find((target) => target.id === id && target.passedOverUntil <= Date.now());
  };
  const choose = (req: IncomingMessage, tried: Set<Target>): Target | undefined => {
    const kept = sticky(req);
    if (kept && !tried.has(kept)) return kept;
    const now = Date.now();
    for (let step = 0; step < targets.length; step += 1) {
      const target = targets[turn++ % targets.length];
      if (!tried.has(target) && target.passedOverUntil <= now) return target;
    }
    return undefined;
  };
  const count = (target: Target) => served.set(target.id, (served.get(target.id) ?? 0) + 1);

  proxy.on('proxyRes', (proxyRes, req) => {
    const target = chosen.get(req);
    if (!target) return;
    count(target);
    if (req.url?.startsWith('/socket.io/') && sticky(req) !== target) {
      const cookie = `${STICKY_COOKIE}=${target.id}; Path=/socket.io/; HttpOnly; SameSite=Lax`;
      const existing = proxyRes.headers['set-cookie'] ?? [];
      proxyRes.headers['set-cookie'] = [...existing, cookie];
    }
  });

  const unreachable = (res: ServerResponse) => {
    if (res.headersSent) {
      res.destroy();
      return;
    }
    res.writeHead(502, { 'Content-Type': 'application/json; charset=utf-8' });
    res.end(JSON.stringify({ error: { code: 'bad_gateway', message: 'No app instance could answer. Try again in a moment.' } }));
  };

  const forward = (req: IncomingMessage, res: ServerResponse, tried = new Set<Target>()) => {
    const target = choose(req, tried);
    if (!target) return unreachable(res);
    tried.add(target);
    chosen.set(req, target);
    // A request sent again has had its body read already: it goes with an empty one (only bodiless methods are sent again).
    const again = tried.size > 1 ? { buffer: Readable.from([]) } : {};
    proxy.web(req, res, { target: target.url, ...again }, () => {
      target.passedOverUntil = Date.now() + PASS_OVER_MS;
      if (SAFE_TO_RETRY.has(req.method ?? '') && !res.headersSent) forward(req, res, tried);
      else unreachable(res);
    });
  };

  const server = createServer((req, res) => forward(req, res));
  server.on('upgrade', (req: IncomingMessage, socket: Socket, head: Buffer) => {
    const target = choose(req, new Set());
    if (!target) return socket.destroy();
    count(target);
    // The client sees the socket close and connects again, through the proxy, to an instance that answers.
    // A websocket is a connection of its own for as long as it lives: not one from the pool of reused ones.
    proxy.ws(req, socket, head, { target: target.url, agent: false }, () => {
      // The error is the instance's only while the client's side is still there (a browser that went away is not the instance's fault).
      if (!socket.destroyed) target.passedOverUntil = Date.now() + PASS_OVER_MS;
      socket.destroy();
    });
  });
  // Upgraded sockets are no longer tracked by the HTTP server: kept here so close() can end them.
  const sockets = new Set<Socket>();
  server.on('connection', (socket) => {
    sockets.add(socket);
    socket.once('close', () => sockets.delete(socket));
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, options.host ?? '127.0.0.1', () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const host = options.host ?? '127.0.0.1';
  return {
    url: `http://${host.includes(':') ? `[${host}]` : host}:${port}`,
    port,
    /** Answers (and websocket upgrades) per instance id since the start. */
    served,
    add(instance: { id: string; url: string }) {
      targets.push({ ...instance, passedOverUntil: 0 });
    },
    remove(id: string) {
      const at = targets.findIndex((target) => target.id === id);
      if (at >= 0) targets.splice(at, 1);
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        for (const socket of sockets) socket.destroy();
        proxy.close();
        agent.destroy();
      }),
  };
}

export type Proxy = Awaited<ReturnType<typeof startProxy>>;

/**
 * `count` instances with the same settings behind one proxy (on `port`, default any free
 * one). Each instance listens on a port of its own on loopback; APP_URL is `appUrl` (the
 * address people use), by default the proxy's, and the instances trust the proxy's X-Forwarded-* headers (TRUST_PROXY=loopback).
 * An instance whose process ends leaves the rotation.
 */
export async function startCluster(options: { count: number; env: Record<string, string | undefined>; port?: number; host?: string; appUrl?: string }) {
  const proxy = await startProxy({ port: options.port, host: options.host });
  const env = { TRUST_PROXY: 'loopback', ...options.env, APP_URL: options.appUrl ?? proxy.url, PORT: '0', HOST: '127.0.0.1' };
  const started = await Promise.allSettled(Array.from({ length: options.count }, (_, n) => forkInstance(`i${n + 1}`, env)));
  const instances = started.flatMap((outcome) => (outcome.status === 'fulfilled' ? [outcome.value] : []));
  const stop = async () => {
    await Promise.all(instances.map((instance) => instance.close()));
    await proxy.close();
  };
  const failed = started.find((outcome) => outcome.status === 'rejected');
  if (failed) {
    await stop();
    throw (failed as PromiseRejectedResult).reason;
  }
  for (const instance of instances) {
    proxy.add(instance);
    void instance.exited.then(() => proxy.remove(instance.id));
  }
  return {
    url: proxy.url,
    proxy,
    instances,
    /** SIGKILLs one instance and waits until the proxy no longer sends to it. */
    async kill(id: string) {
      const instance = instances.find((one) => one.id === id);
      if (!instance) throw new Error(`no instance ${id}`);
      await instance.kill();
      proxy.remove(id);
    },
    stop,
  };
}

export type Cluster = Awaited<ReturnType<typeof startCluster>>;

import { rmSync } from 'node:fs';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import { startServer, type RunningServer } from '../../server/runtime';
import { agentFor, signedIn } from './api-session';
import { createTestDatabase, testConfig, type TestContext } from './test-env';

/** A signed-in (or visiting) HTTP session: its cookie and a CSRF token for it. */
export type Auth = { cookie: string; csrf: string };

/** What the helpers below need of an app: where it listens (one instance, or a proxy in front of several). */
type Reachable = Pick<RunningServer, 'url'>;

/** Signs in over HTTP (the shared API-session helper) and returns the session cookie and a CSRF token for it. */
export async function session(server: Reachable, user: { email: string; password: string }): Promise<Auth> {
  const client = await signedIn(server.url, user);
  return { cookie: client.cookie!, csrf: client.token };
}

/** A signed-out visitor's cookie and token, for the public routes. */
export async function visitor(server: Reachable): Promise<Auth> {
  const client = await agentFor(server.url);
  return { cookie: client.cookie!, csrf: client.token };
}

/** POSTs JSON with the session's cookie and token; the status and the parsed body (empty when none). */
export async function post(server: Reachable, auth: Auth, path: string, body: unknown = {}) {
  const res = await fetch(`${server.url}${path}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: auth.cookie, 'X-CSRF-Token': auth.csrf },
    body: JSON.stringify(body),
  });
  return { status: res.status, body: (await res.json().catch(() => ({}))) as Record<string, any> };
}

/**
 * A socket to `server` with the given cookie (and Origin, when a test plays another site), no
 * automatic reconnection; it goes into `sockets` so the test file can close them after each test.
 */
export function socketFor(sockets: Socket[], server: Reachable, cookie?: string, origin?: string): Socket {
  const headers: Record<string, string> = {};
  if (cookie) headers.cookie = cookie;
  if (origin) headers.origin = origin;
  const socket = connect(server.url, { transports: ['websocket'], extraHeaders: headers, reconnection: false, forceNew: true });
  sockets.push(socket);
  return socket;
}

export const connected = (socket: Socket) =>
  new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });

export const emit = <T = any>(socket: Socket, event: string, payload: unknown) => socket.timeout(5_000).emitWithAck(event, payload) as Promise<T>;

/** The next `event` the socket hears, within five seconds. */
export const next = <T = any>(socket: Socket, event: string) =>
  new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no ${event} within 5 s`)), 5_000);
    socket.once(event, (payload: T) => {
      clearTimeout(timer);
      resolve(payload);
    });
  });

/**
 * For a realtime test file: a database of its own and two app instances on it (as behind
 * a load balancer, the adapter carrying events between them), started before the file's
 * tests and stopped after them; `env` adds to the test configuration. Sockets opened with
 * `socketFor` are closed after each test. Read the fields inside the tests.
 */
export function twoInstances(env: Record<string, string> = {}) {
  let database: Awaited<ReturnType<typeof createTestDatabase>> | undefined;
  let pool: ReturnType<typeof createPool> | undefined;
  let db: Database | undefined;
  let instances: RunningServer[] = [];
  let config: TestContext['config'] | undefined;
  const sockets: Socket[] = [];

  beforeAll(async () => {
    database = await createTestDatabase();
    pool = createPool(database.url, 4);
    db = createDb(pool);
    config = testConfig(database.url, { PORT: '0', ...env });
    instances = await Promise.all([startServer(config, { migrate: false }), startServer(config, { migrate: false })]);
  });
  afterEach(() => {
    for (const socket of sockets.splice(0)) socket.disconnect();
  });
  afterAll(async () => {
    for (const instance of instances) await instance.close();
    await pool?.end();
    await database?.drop();
    if (config) rmSync(config.uploadsDir, { recursive: true, force: true });
  });

  const started = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('the realtime instances run only inside the tests');
    return value;
  };
  return {
    get db() {
      return started(db);
    },
    get instanceA() {
      return started(instances[0]);
    },
    get instanceB() {
      return started(instances[1]);
    },
    get config() {
      return started(config);
    },
    socketFor: (server: RunningServer, cookie?: string, origin?: string) => socketFor(sockets, server, cookie, origin),
  };
}

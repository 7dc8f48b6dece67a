import { io as connect, type Socket } from 'socket.io-client';
import type { RunningServer } from '../../server/runtime';
import { agentFor, signedIn } from './api-session';

/** A signed-in (or visiting) HTTP session: its cookie and a CSRF token for it. */
export type Auth = { cookie: string; csrf: string };

/** Signs in over HTTP (the shared API-session helper) and returns the session cookie and a CSRF token for it. */
export async function session(server: RunningServer, user: { email: string; password: string }): Promise<Auth> {
  const client = await signedIn(server.url, user);
  return { cookie: client.cookie!, csrf: client.token };
}

/** A signed-out visitor's cookie and token, for the public routes. */
export async function visitor(server: RunningServer): Promise<Auth> {
  const client = await agentFor(server.url);
  return { cookie: client.cookie!, csrf: client.token };
}

/** POSTs JSON with the session's cookie and token; the status and the parsed body (empty when none). */
export async function post(server: RunningServer, auth: Auth, path: string, body: unknown = {}) {
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
export function socketFor(sockets: Socket[], server: RunningServer, cookie?: string, origin?: string): Socket {
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

import { useQueryClient } from '@tanstack/react-query';
import { createContext, createElement, useContext, useEffect, useRef, useState, type ReactNode } from 'react';
import type { Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '@shared/realtime-events';
import { jobChangeKeys } from './query-keys';

/**
 * The live connection: one socket.io connection for the signed-in person,
 * opened when someone signs in and closed when they sign out. The socket
 * authenticates with the session cookie (same origin), so there is nothing
 * to pass but the path.
 */

/** connecting: the first attempt; connected; reconnecting: it was up and is trying again; offline: the browser has no network, or the server refused the session. */
export type ConnectionStatus = 'connecting' | 'connected' | 'reconnecting' | 'offline';

export type { SocketAck } from '@shared/realtime-events';

/** The browser's socket, typed with the events declared in shared/realtime-events.ts. */
export type AppSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

interface RealtimeValue {
  socket: AppSocket | null;
  status: ConnectionStatus;
  /** Whose connection it is; the outgoing message queue is kept per person. */
  userId: string | null;
}

const RealtimeContext = createContext<RealtimeValue>({ socket: null, status: 'offline', userId: null });

export interface RealtimeProviderProps {
  /** The signed-in person's id; no id, no connection. */
  userId: string | null | undefined;
  /** The server refused the session (signed out elsewhere, suspended): the app should re-check who is signed in. */
  onUnauthenticated?: () => void;
  children: ReactNode;
}

export function RealtimeProvider({ userId, onUnauthenticated, children }: RealtimeProviderProps) {
  const [socket, setSocket] = useState<AppSocket | null>(null);
  const [status, setStatus] = useState<ConnectionStatus>('connecting');
  const refused = useRef(onUnauthenticated);
  refused.current = onUnauthenticated;

  useEffect(() => {
    if (!userId) {
      setSocket(null);
      setStatus('offline');
      return;
    }
    // socket.io-client is loaded only once someone is signed in: signed-out pages never need it.
    let s: AppSocket | undefined;
    let cancelled = false;
    let everConnected = false;
    setStatus(navigator.onLine ? 'connecting' : 'offline');

    const onConnect = () => {
      everConnected = true;
      setStatus('connected');
    };
    const onDisconnect = (reason: Socket.DisconnectReason) => {
      setStatus(navigator.onLine ? 'reconnecting' : 'offline');
      // The server closed this socket on purpose, as it does when the session ends (signed out
      // elsewhere, the password changed or reset, the account suspended); socket.io does not come
      // back by itself then. Ask once: the handshake refuses a session that has ended, and the
      // refusal tells the app the person is signed out.
      if (reason === 'io server disconnect') s?.connect();
    };
    const onConnectError = (error: Error & { data?: { code?: string } }) => {
      if (error.data?.code === 'unauthenticated') {
        // socket.io does not retry a refusal by the server's middleware.
        setStatus('offline');
        refused.current?.();
        return;
      }
      setStatus(!navigator.onLine ? 'offline' : everConnected ? 'reconnecting' : 'connecting');
    };
    // A socket can stay open for a long while after the network has gone (until
    // the heartbeat notices); when the browser says it is offline, believe it,
    // so waiting messages show as waiting, and come back as soon as it is online.
    const wentOffline = () => {
      s?.disconnect();
      setStatus('offline');
    };
    const cameOnline = () => {
      if (s && !s.connected) {
        setStatus('reconnecting');
        s.connect();
      }
    };
    const open = () => {
      import('socket.io-client').then(
        ({ io }) => {
          if (cancelled) return;
          s = io({ path: '/socket.io', transports: ['websocket', 'polling'], withCredentials: true });
          s.on('connect', onConnect);
          s.on('disconnect', onDisconnect);
          s.on('connect_error', onConnectError);
          window.addEventListener('offline', wentOffline);
          window.addEventListener('online', cameOnline);
          setSocket(s);
        },
        () => {
          // The library itself could not be fetched (the network went): try again once the browser is back online.
          if (cancelled) return;
          setStatus('offline');
          window.addEventListener('online', open, { once: true });
        },
      );
    };
    open();
    return () => {
      cancelled = true;
      window.removeEventListener('online', open);
      setSocket(null);
      if (!s) return;
      window.removeEventListener('offline', wentOffline);
      window.removeEventListener('online', cameOnline);
      s.off('connect', onConnect);
      s.off('disconnect', onDisconnect);
      s.off('connect_error', onConnectError);
      s.disconnect();
    };
  }, [userId]);

  return createElement(RealtimeContext.Provider, { value: { socket, status, userId: userId ?? null } }, children);
}

/** The live connection, or null when nobody is signed in. */
export function useSocket(): AppSocket | null {
  return useContext(RealtimeContext).socket;
}

export function useConnectionStatus(): ConnectionStatus {
  return useContext(RealtimeContext).status;
}

/** The id of the person the connection belongs to. */
export function useRealtimeUserId(): string | null {
  return useContext(RealtimeContext).userId;
}

/** Listens to a server event for as long as the component is mounted; the handler may change between renders. */
export function useSocketEvent<E extends keyof ServerToClientEvents>(event: E, handler: (payload: Parameters<ServerToClientEvents[E]>[0]) => void) {
  const socket = useSocket();
  const latest = useRef(handler);
  latest.current = handler;
  useEffect(() => {
    if (!socket) return;
    // TypeScript cannot resolve socket.io's listener type for an event not yet known; each call names one.
    const listener = ((payload: Parameters<ServerToClientEvents[E]>[0]) => latest.current(payload)) as Parameters<typeof socket.on<E>>[1];
    socket.on(event, listener);
    return () => {
      socket.off(event, listener);
    };
  }, [socket, event]);
}

/**
 * Membership of a server room named by `key` (a job, a conversation): `join`
 * runs now if the socket is up and again after every reconnect (a room joined
 * before a lost connection must be joined again), `leave` when the key
 * changes or the component unmounts. A null key joins nothing.
 */
export function useRoom(key: string | null, join: (socket: AppSocket, key: string) => void, leave: (socket: AppSocket, key: string) => void) {
  const socket = useSocket();
  const handlers = useRef({ join, leave });
  handlers.current = { join, leave };
  useEffect(() => {
    if (!socket || key === null) return;
    const run = () => handlers.current.join(socket, key);
    if (socket.connected) run();
    socket.on('connect', run);
    return () => {
      socket.off('connect', run);
      if (socket.connected) handlers.current.leave(socket, key);
    };
  }, [socket, key]);
}

/**
 * Keeps an open job page current: the page joins the job's room, and every
 * change to the job (a bid placed, revised or withdrawn, an award, a status
 * change) refreshes the queries that show it.
 */
export function useWatchJob(jobId: string | undefined) {
  const queryClient = useQueryClient();
  useRoom(
    jobId || null,
    (socket, id) => socket.emit('job:watch', { jobId: id }),
    (socket, id) => socket.emit('job:unwatch', { jobId: id }),
  );
  useSocketEvent('job:changed', (event) => {
    if (!jobId || event.jobId !== jobId) return;
    for (const queryKey of jobChangeKeys(jobId)) void queryClient.invalidateQueries({ queryKey });
  });
}

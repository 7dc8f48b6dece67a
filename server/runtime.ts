import { createServer, type Server } from 'node:http';
import type { AddressInfo, Socket } from 'node:net';
import { createApp, type AppDeps } from './app';
import { createDb, createPool, runMigrations } from './db/client';
import { appUrlHostWarning, type AppConfig } from './env';
import { createLogger } from './lib/logger';
import { createOutboxWorker } from './lib/mail/outbox';
import { createTransport } from './lib/mail/transport';
import { startDigestWorker } from './modules/messages/digest';
import { startMoneyWorker } from './modules/payments/payments.service';
import { inspectionTaskHandlers } from './modules/inspections/inspections.service';
import { checkoutTaskHandlers } from './modules/payments/open-checkouts';
import { createScheduler, type Scheduler } from './lib/scheduler';
import { unattachedPhotoSweep } from './lib/unattached-photos';
import { attachRealtime } from './realtime/socket-server';

export interface RunningServer {
  server: Server;
  url: string;
  port: number;
  io: import('socket.io').Server;
  app: ReturnType<typeof createApp>;
  scheduler: Scheduler;
  close(): Promise<void>;
}

/**
 * Starts one app instance: database pool, HTTP server and the mail outbox
 * worker. Used by server/index.ts, by `npm start` and by the browser tests.
 */
export async function startServer(
  config: AppConfig,
  options: {
    client?: AppDeps['client'];
    migrate?: boolean;
    mailIntervalMs?: number;
    prettyLogs?: boolean;
    /** How long close() lets running requests finish before cutting their connections. */
    closeGraceMs?: number;
  } = {},
): Promise<RunningServer> {
  const logger = createLogger(config, { pretty: options.prettyLogs });
  const hostWarning = appUrlHostWarning(config.appUrl, config.host);
  if (hostWarning) logger.warn(hostWarning);
  if (options.migrate ?? true) await runMigrations(config.databaseUrl);
  const pool = createPool(config.databaseUrl);
  const db = createDb(pool);
  const app = createApp({ config, db, pool, logger, client: options.client });
  // Every instance asks; the first to ask schedules this hour's sweep, and each sweep schedules the next.
  const photoSweep = unattachedPhotoSweep({ db, storage: app.storage });
  await photoSweep.schedule();
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  // Every TCP connection, also those upgraded to websockets (which the HTTP server no longer tracks).
  const sockets = new Set<Socket>();
  server.on('connection', (socket) => {
    sockets.add(socket);
    socket.once('close', () => sockets.delete(socket));
  });

  // The live channel's own two connections (one listening, one publishing), so a publication never
  // waits behind requests for a pooled connection.
  const realtimePool = createPool(config.databaseUrl, 2);
  const io = attachRealtime({
    server,
    sessionMiddleware: app.sessionMiddleware,
    db,
    pool: realtimePool,
    hub: app.hub,
    logger,
    appUrl: config.appUrl,
    messagesPer10s: config.rateLimits.messagesPer10s,
  });
  const digests = startDigestWorker({ db, appUrl: config.appUrl, logger });
  const money = startMoneyWorker(app.paymentDeps);
  const scheduler = createScheduler({ db, handlers: { ...inspectionTaskHandlers(app.workDeps), ...checkoutTaskHandlers(app.paymentDeps), ...photoSweep.handlers }, logger });
  scheduler.start(30_000);

  const transport = createTransport(config.smtp);
  const worker = createOutboxWorker({ db, transport, from: config.mailFrom, logger });
  worker.start(options.mailIntervalMs ?? 1_000);

  return {
    server,
    port,
    url: `http://localhost:${port}`,
    io,
    app,
    scheduler,
    async close() {
      digests.stop();
      money.stop();
      await scheduler.stop();
      // No new connections; idle keep-alive ones go now, socket.io clients are told goodbye, and
      // requests still running get a moment before every connection left is cut, so that an open
      // page, a keep-alive client or a half-sent request cannot hold shutdown up.
      const httpClosed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      const cut = setTimeout(() => {
        server.closeAllConnections();
        for (const socket of sockets) socket.destroy();
      }, options.closeGraceMs ?? 1_000);
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await httpClosed;
      clearTimeout(cut);
      await worker.stop();
      app.sessionStore.close();
      transport.close();
      await app.storage.close();
      // The session store touches a session after its response has gone out; let the last ones land.
      await new Promise((resolve) => setTimeout(resolve, 100));
      await Promise.all([pool.end(), realtimePool.end()]);
    },
  };
}

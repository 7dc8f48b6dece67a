import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp, type AppDeps } from './app';
import { createDb, createPool, runMigrations } from './db/client';
import type { AppConfig } from './env';
import { createLogger } from './lib/logger';
import { createOutboxWorker } from './lib/mail/outbox';
import { createTransport } from './lib/mail/transport';
import { startDigestWorker } from './modules/messages/digest';
import { startMoneyWorker } from './modules/payments/payments.service';
import { inspectionTaskHandlers } from './modules/inspections/inspections.service';
import { createScheduler, type Scheduler } from './lib/scheduler';
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
  options: { client?: AppDeps['client']; migrate?: boolean; mailIntervalMs?: number; prettyLogs?: boolean } = {},
): Promise<RunningServer> {
  const logger = createLogger(config, { pretty: options.prettyLogs });
  if (options.migrate ?? true) await runMigrations(config.databaseUrl);
  const pool = createPool(config.databaseUrl);
  const db = createDb(pool);
  const app = createApp({ config, db, pool, logger, client: options.client });
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;

  const io = attachRealtime({
    server,
    sessionMiddleware: app.sessionMiddleware,
    db,
    pool,
    hub: app.hub,
    logger,
    messagesPer10s: config.rateLimits.messagesPer10s,
  });
  const digests = startDigestWorker({ db, appUrl: config.appUrl, logger });
  const money = startMoneyWorker(app.paymentDeps);
  const scheduler = createScheduler({ db, handlers: inspectionTaskHandlers(app.workDeps), logger });
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
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await worker.stop();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      app.sessionStore.close();
      transport.close();
      // The session store touches a session after its response has gone out; let the last ones land.
      await new Promise((resolve) => setTimeout(resolve, 100));
      await pool.end();
    },
  };
}

import { csrfSync } from 'csrf-sync';
import express, { type RequestHandler } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type pg from 'pg';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import type { Database } from './db/client';
import type { AppConfig } from './env';
import { requireRole } from './lib/auth/guards';
import { createPassport } from './lib/auth/passport';
import { errorHandler, notFoundApi } from './lib/errors';
import { createPaymentsClient, type PaymentsClient } from './lib/payments-client';
import { RealtimeHub } from './realtime/hub';
import { messageRateLimit } from './modules/messages/messages.service';
import { createSessionStore } from './lib/session-store';
import { createStorage, type FileStorage } from './lib/storage';
import { jsonBody } from './lib/json-body';
import { uploadLimiter } from './lib/photo-upload';
import { ROUGHNESS_BODY_LIMIT } from './modules/calculations/calculations.routes';
import { openApiDocument } from './openapi';
import { routeModules } from './api-routes';
import { mountRoutes, type RouteDef } from './lib/http/routes';
import { builtPageHtml } from './lib/http/page-html';
import { compressAnswers, setBuiltFileCaching } from './lib/http/transfer';
import { isPagePath } from '../shared/page-paths';

export const SESSION_COOKIE = 'tm.sid';

export interface AppDeps {
  config: AppConfig;
  db: Database;
  pool: pg.Pool;
  logger: Logger;
  /** The payment API client; made from the configuration unless given. */
  payments?: PaymentsClient;
  /** Where photos go; a folder on disk unless an object store is given. */
  storage?: FileStorage;
  /** How the browser app is served: built files, Vite's dev middleware, or not at all (API tests). */
  client?: { kind: 'static'; dir: string } | { kind: 'middleware'; handler: RequestHandler; indexHtml: (url: string) => Promise<string> };
}

/** Builds the Express app without listening, so tests can drive it directly. */
export function createApp(deps: AppDeps) {
  const { config, db, pool, logger } = deps;
  const app = express();
  // Only the proxies named by TRUST_PROXY may say who the client is; by default none, so a
  // forged X-Forwarded-For header cannot give one client many addresses.
  app.set('trust proxy', config.trustProxy);
  app.disable('x-powered-by');

  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const incoming = req.headers['x-request-id'];
        const id = typeof incoming === 'string' && /^[\w-]{8,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      // One compact line per request: no headers (they cost serializing on every request and are
      // where cookies and tokens travel); the request id ties it to anything else logged for it.
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );

  app.use(compressAnswers());

  const devClient = deps.client?.kind === 'middleware';
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // Vite's dev server injects an inline preamble for hot reload; the built app has no inline script.
          scriptSrc: devClient ? ["'self'", "'unsafe-inline'"] : ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: devClient ? ["'self'", 'ws:', 'wss:'] : ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          objectSrc: ["'none'"],
          upgradeInsecureRequests: null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  // Every route whose declaration needs it gets this check first (server/lib/http/routes.ts); a route declared
  // `csrf: false` (the calculations, which change nothing stored and use no session; the signed webhook) does not.
  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.get('x-csrf-token'),
    errorConfig: { statusCode: 403, code: 'EBADCSRFTOKEN', message: 'invalid csrf token' },
  });
  const mount = <D>(routes: readonly RouteDef<D>[], routeDeps: D) =>
    mountRoutes(app, routes, routeDeps, { check: config.responseCheck, csrf: csrfSynchronisedProtection });
  mount(routeModules.health, { pool });

  // The payment webhook reads its raw body and proves itself by signature: before the JSON parser, sessions and CSRF.
  const paymentsClient = deps.payments ?? createPaymentsClient(config.payments);
  const hub = new RealtimeHub();
  const paymentDeps = { db, payments: paymentsClient, appUrl: config.appUrl, hub };
  mount(routeModules.paymentsWebhook, { ...paymentDeps, webhookSecret: config.payments.webhookSecret });

  const store = createSessionStore(pool, db);
  const secure = config.appUrl.startsWith('https://');
  const sessionMiddleware = session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      proxy: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: 14 * 24 * 60 * 60_000, path: '/' },
    });
  app.use(sessionMiddleware);

  const passport = createPassport({ db, appUrl: config.appUrl, github: config.github });
  app.use(passport.initialize());
  app.use(passport.session());

  // A roughness profile may be large; every other body stays small. Every JSON body is also refused past 64 levels of nesting.
  app.use('/api/calculations/roughness', jsonBody({ limit: ROUGHNESS_BODY_LIMIT }));
  // An inspection record may carry a surface trace of up to 200,000 heights.
  app.use(/^\/api\/jobs\/[^/]+\/inspection(\/draft)?$/, jsonBody({ limit: '8mb' }));
  app.use('/api', jsonBody({ limit: '200kb' }));


  mount(routeModules.auth, {
    db,
    appUrl: config.appUrl,
    rateLimits: config.rateLimits,
    passport,
    generateCsrfToken: generateToken,
    sessionCookieName: SESSION_COOKIE,
    hub,
  });

  mount(routeModules.account, { db, appUrl: config.appUrl, hub, sessionCookieName: SESSION_COOKIE, rateLimits: config.rateLimits });
  mount(routeModules.calculations, { db, perMinute: config.rateLimits.calculationsPerMinute });
  mount(routeModules.catalogue, {});
  mount(routeModules.help, { supportEmail: config.supportEmail });
  const storage = deps.storage ?? createStorage(config.storage);
  // One count of photo uploads per person, whichever route they go to.
  const uploadLimit = uploadLimiter(db, config.rateLimits.uploadsPer10Min);
  mount(routeModules.shops, { db });
  mount(routeModules.jobs, { db, appUrl: config.appUrl, storage, hub, uploadLimit, payments: paymentsClient });
  mount(routeModules.bids, { db, appUrl: config.appUrl, hub, platformFeeBps: config.payments.platformFeeBps });
  mount(routeModules.payments, paymentDeps);
  mount(routeModules.documents, { db, appUrl: config.appUrl, storage });
  mount(routeModules.messages, { db, hub, storage, uploadLimit, rateLimit: messageRateLimit(db, config.rateLimits.messagesPer10s) });
  const workDeps = { ...paymentDeps, storage, reviewWindowMs: config.reviewWindowDays * 24 * 60 * 60_000 };
  mount(routeModules.milestones, { db, hub, storage, uploadLimit });
  mount(routeModules.shipping, { db, hub });
  mount(routeModules.inspections, workDeps);
  mount(routeModules.disputes, paymentDeps);
  mount(routeModules.reviews, paymentDeps);
  mount(routeModules.notifications, { db, hub });
  mount(routeModules.admin, { ...paymentDeps, defaultFeeBps: config.payments.platformFeeBps, supportEmail: config.supportEmail });
  // Any other address under /api/admin is refused as before to all but admins (admins get the 404 below).
  app.use('/api/admin', requireRole('admin'));
  mount(routeModules.openapi, { document: openApiDocument });

  app.use('/api', notFoundApi);

  if (deps.client?.kind === 'static') {
    const dir = deps.client.dir;
    const indexFile = join(dir, 'index.html');
    if (!existsSync(indexFile)) throw new Error(`The browser app is not built (no ${indexFile}). Run: npm run build`);
    app.use(express.static(dir, { index: false, cacheControl: false, setHeaders: (res, path) => setBuiltFileCaching(res, path, dir) }));
    // The app's HTML for every address, naming the page's own code to fetch at once; a status of 404 where
    // the app has no page (it shows its not-found page).
    const pageHtml = builtPageHtml(dir);
    app.get('/{*splat}', (req, res) => res.status(pageStatus(req.path)).set('Cache-Control', 'no-cache').type('html').send(pageHtml(req.path)));
  } else if (deps.client?.kind === 'middleware') {
    const { handler, indexHtml } = deps.client;
    app.use(handler);
    app.get('/{*splat}', async (req, res) => {
      res.status(pageStatus(req.path)).type('html').send(await indexHtml(req.originalUrl));
    });
  }

  app.use(errorHandler);
  return Object.assign(app, { sessionStore: store, sessionMiddleware, hub, paymentDeps, workDeps, storage });
}

export type App = ReturnType<typeof createApp>;

const pageStatus = (path: string) => (isPagePath(path) ? 200 : 404);

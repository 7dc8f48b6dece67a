import type { Request, RequestHandler, Response, Router } from 'express';
import { isDeepStrictEqual } from 'node:util';
import type { z } from 'zod';
import type { Role } from '../../../shared/schemas/auth';
import { requireRole, requireUser } from '../auth/guards';
import { AppError } from '../errors';

/**
 * Routes as data. Each API route is declared once, in its module, as a
 * `RouteDef`: method, path, who may call it, the request schemas, what a
 * success answers, a summary and the handler. The Express router
 * (`mountRoutes`), the OpenAPI document (`server/openapi.ts`) and the
 * authorization matrix's list of routes are all read from these declarations.
 * docs/decisions/routes-as-data.md says why.
 */

/**
 * Who may call a route: anyone, anyone signed in, or the roles named
 * ('shop', 'shop or admin'). The guard runs before any parsing: 401 signed
 * out, 403 for another role. Whether the job or thing is the caller's is the
 * services' business (server/modules/jobs/job-access.ts).
 */
export type Access = 'public' | 'signed-in' | Role | `${Role} or ${Role}`;

/** The roles a route is for; null when any signed-in person (or anyone) may call it. */
export function rolesOf(access: Access): Role[] | null {
  if (access === 'public' || access === 'signed-in') return null;
  return access.split(' or ') as Role[];
}

export type Method = 'get' | 'post' | 'put' | 'delete';

/** What a success answers. */
export type Reply =
  /** A JSON body described by a schema of its wire form (dates as ISO strings, no transforms). */
  | { status?: number; description?: string; json: z.ZodType }
  /** A file the handler sends itself (image, PDF, CSV), of this content type. */
  | { status?: 200; description: string; file: string }
  /** A redirect the handler sends itself. */
  | { status: 302; description: string; redirect: true }
  /** A status with no body, sent by the router once the handler returns. */
  | { status: 202 | 204; description: string; empty: true };

type Parsed<T> = T extends z.ZodType ? z.output<T> : undefined;
type UserFor<A extends Access> = A extends 'public' ? Express.User | undefined : Express.User;

/**
 * What a handler may return for a JSON reply: the schema's wire form, where a
 * Date stands for any string (it is sent as its ISO text). The response check
 * (see `ResponseCheck`) holds the real answer to the schema at run time.
 */
export type Wire<T> = T extends string
  ? T | Date
  : T extends Date
    ? T
    : T extends readonly unknown[]
      ? { [K in keyof T]: Wire<T[K]> }
      : T extends object
        ? { [K in keyof T]: Wire<T[K]> }
        : T;

type HandlerResult<R extends Reply> = R extends { json: infer S extends z.ZodType } ? Wire<z.input<S>> : void;

export interface RouteContext<D, A extends Access, P, Q, B> {
  deps: D;
  req: Request;
  res: Response;
  /** The signed-in person; always there unless the route is public. */
  user: UserFor<A>;
  params: P;
  query: Q;
  body: B;
}

interface RouteSpec<D, A extends Access, P, Q, B, R extends Reply> {
  method: Method;
  /** The full path in Express's form: /api/jobs/:jobId */
  path: string;
  summary: string;
  tag: string;
  access: A;
  params?: P;
  query?: Q;
  body?: B;
  reply: R;
  /** A state-changing request needs the X-CSRF-Token header unless this says false (the app's CSRF check reads it). */
  csrf?: boolean;
  /**
   * Middleware that runs after the access guard and before parsing (uploads,
   * rate limits). Called once per mounted route list with the same function,
   * so a limiter several routes share is one limiter.
   */
  use?: (deps: D) => RequestHandler[];
  handler: (ctx: RouteContext<D, A, Parsed<P>, Parsed<Q>, Parsed<B>>) => Promise<HandlerResult<R>> | HandlerResult<R>;
}

/** One declared route with its types erased, as routers, documents and tests read it. */
export interface RouteDef<D = never> {
  method: Method;
  path: string;
  summary: string;
  tag: string;
  access: Access;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  reply: Reply;
  csrf?: boolean;
  use?: (deps: D) => RequestHandler[];
  handler: (ctx: RouteContext<D, Access, unknown, unknown, unknown>) => unknown;
}

/**
 * Declares routes for a module whose handlers need `D`:
 * `const route = routesFor<BidDeps>('Bids'); export const bidRoutes = [route({...}), ...]`.
 */
export function routesFor<D>(tag: string) {
  return <
    A extends Access,
    R extends Reply,
    P extends z.ZodType | undefined = undefined,
    Q extends z.ZodType | undefined = undefined,
    B extends z.ZodType | undefined = undefined,
  >(
    spec: Omit<RouteSpec<D, A, P, Q, B, R>, 'tag'> & { tag?: string },
  ): RouteDef<D> => ({ ...spec, tag: spec.tag ?? tag }) as unknown as RouteDef<D>;
}

/** The success status of a route. */
export function successStatus(reply: Reply): number {
  return reply.status ?? 200;
}

/** Whether a route needs the CSRF header: state-changing methods, unless declared otherwise. */
export function needsCsrf(route: Pick<RouteDef, 'method' | 'csrf'>): boolean {
  return route.method !== 'get' && route.csrf !== false;
}

/** The path in OpenAPI's form: /api/jobs/{jobId} */
export function openApiPath(path: string): string {
  return path.replace(/:(\w+)/g, '{$1}');
}

/**
 * Whether answers are held to their declared schema: `strict` (tests) turns a
 * mismatch into a 500 so the test that met it fails; `log` (development) logs
 * it and sends the answer; `off` (production) sends without looking.
 */
export type ResponseCheck = 'off' | 'log' | 'strict';

export interface MountOptions {
  check: ResponseCheck;
  /**
   * The CSRF check, run first on every route that needs it (`needsCsrf`). A
   * route list with such a route cannot be mounted without one, so a
   * state-changing route never goes unguarded by accident.
   */
  csrf?: RequestHandler;
}

/** The guard of a route's access, from server/lib/auth/guards.ts (401 signed out, 403 for another role). */
function accessGuard(access: Access): RequestHandler[] {
  if (access === 'public') return [];
  const allowed = rolesOf(access);
  return [allowed ? requireRole(...allowed) : requireUser];
}

/**
 * Holds a JSON answer to its schema: it must parse, and parsing must not drop
 * anything (a field the schema does not declare is a mismatch too).
 */
export function responseMismatch(schema: z.ZodType, body: unknown): string | null {
  const wire = body === undefined ? undefined : JSON.parse(JSON.stringify(body));
  const parsed = schema.safeParse(wire);
  if (!parsed.success) {
    return parsed.error.issues
      .slice(0, 5)
      .map((issue) => `${issue.path.join('.') || '(body)'}: ${issue.message}`)
      .join('; ');
  }
  if (!isDeepStrictEqual(parsed.data, wire)) return 'the answer has fields the schema does not declare';
  return null;
}

/** Adds each declared route to the router, in order, behind its access guard. */
export function mountRoutes<D>(router: Router, routes: readonly RouteDef<D>[], deps: D, options: MountOptions): void {
  const middleware = new Map<(deps: D) => RequestHandler[], RequestHandler[]>();
  for (const route of routes) {
    let extra: RequestHandler[] = [];
    if (route.use) {
      if (!middleware.has(route.use)) middleware.set(route.use, route.use(deps));
      extra = middleware.get(route.use) ?? [];
    }
    if (needsCsrf(route) && !options.csrf) throw new Error(`${route.method.toUpperCase()} ${route.path} needs the CSRF check, and none was given to mount it with.`);
    const csrf = needsCsrf(route) && options.csrf ? [options.csrf] : [];
    router[route.method](route.path, ...csrf, ...accessGuard(route.access), ...extra, async (req: Request, res: Response) => {
      const params = route.params ? route.params.parse(req.params) : undefined;
      const query = route.query ? route.query.parse(req.query) : undefined;
      const body = route.body ? route.body.parse(req.body) : undefined;
      const { reply } = route;
      // The declared status goes first, so a handler may set another for an answer of the same shape
      // (503 from the health check; 200 for a message whose clientId was sent before).
      if ('json' in reply) res.status(successStatus(reply));
      const result = await route.handler({ deps, req, res, user: req.user as Express.User, params, query, body });
      if ('json' in reply) {
        if (options.check !== 'off') {
          const mismatch = responseMismatch(reply.json, result);
          if (mismatch) {
            const message = `${route.method.toUpperCase()} ${route.path} answered what its declaration does not: ${mismatch}`;
            if (options.check === 'strict') throw new AppError('response_not_as_declared', message, 500);
            req.log?.warn(message);
          }
        }
        res.json(result);
      } else if ('empty' in reply) {
        res.status(reply.status).end();
      }
      // A file or a redirect: the handler answered.
    });
  }
}

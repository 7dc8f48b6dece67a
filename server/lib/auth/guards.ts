import type { Request, RequestHandler } from 'express';
import type { Role } from '../../../shared/schemas/auth';
import { forbidden, unauthorized } from '../errors';

/** Only signed-in people pass. */
export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(unauthorized());
  next();
};

/** Only signed-in people with one of these roles pass (401 signed out, 403 wrong role). */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(unauthorized());
    if (!allowed.includes(req.user.role)) {
      return next(forbidden(`This is for ${allowed.map((r) => `${r}s`).join(' and ')} only.`));
    }
    next();
  };
}

/** The signed-in user; for handlers behind requireUser or requireRole. */
export function currentUser(req: Request) {
  if (!req.user) throw unauthorized();
  return req.user;
}

import type { Request, RequestHandler } from 'express';
import type { Role } from '../../../shared/schemas/auth';
import { AppError, forbidden, unauthorized } from '../errors';

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

/** What each use of assertEmailConfirmed is about, in the words of the refusal. */
export type TrustedAction = 'publish a job' | 'bid' | 'pay';

/**
 * Publishing, bidding and paying need a confirmed e-mail address, so the other
 * side of a job can rely on reaching this person. The one definition of that
 * rule; the services that publish, bid and open checkouts call it first.
 * (A GitHub sign-up counts as confirmed: GitHub vouched for the address.)
 */
export function assertEmailConfirmed(user: { emailVerifiedAt: Date | null }, action: TrustedAction): void {
  if (user.emailVerifiedAt) return;
  throw new AppError(
    'email_unconfirmed',
    `Confirm your e-mail address before you ${action}: shops and builders rely on reaching you about the job. Follow the link we e-mailed you, or ask for a new link from your home page.`,
    403,
  );
}

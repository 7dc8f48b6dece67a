import type { Request, Response } from 'express';
import { z } from 'zod';
import {
  changePasswordSchema,
  csrfTokenSchema,
  emailVerifiedSchema,
  githubCompleteSchema,
  mailQueuedSchema,
  meAnswerSchema,
  passwordChangedSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  pendingGithubAnswerSchema,
  sessionAnswerSchema,
  signedInSchema,
  signInSchema,
  signUpSchema,
  verifyEmailSchema,
} from '../../../shared/schemas/auth';
import type { Database } from '../../db/client';
import type { User } from '../../db/schema';
import type { AppConfig } from '../../env';
import type { AppPassport } from '../../lib/auth/passport';
import { currentUser } from '../../lib/auth/guards';
import { AppError, notFound } from '../../lib/errors';
import { routesFor } from '../../lib/http/routes';
import { createLimiter } from '../../lib/rate-limit';
import { safeReturnPath } from '../../../shared/paths';
import type { RealtimeHub } from '../../realtime/hub';
import { toMe } from '../users/users.repository';
import {
  changePassword,
  completeGithubSignUp,
  confirmPasswordReset,
  endLiveSession,
  githubSignIn,
  requestPasswordReset,
  resendVerification,
  signUp,
  verifyEmail,
  type GithubProfile,
} from './auth.service';

export interface AuthRouteDeps {
  db: Database;
  /** Where the links in the mail point. */
  appUrl: string;
  rateLimits: AppConfig['rateLimits'];
  passport: AppPassport;
  generateCsrfToken: (req: Request, overwrite?: boolean) => string;
  sessionCookieName: string;
  /** Ends live connections when the session behind them ends. */
  hub: RealtimeHub;
}

const logIn = (req: Request, user: User) =>
  new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));

/**
 * Signs the person in on this session (passport gives it a new id, so a
 * planted id is worthless) and answers who they are with the new session's
 * CSRF token.
 */
async function signedIn(deps: AuthRouteDeps, req: Request, user: User) {
  await logIn(req, user);
  return { user: toMe(user), csrfToken: deps.generateCsrfToken(req, true) };
}

/** Ends the session this request came on: signed out, its row deleted, its sockets closed, its cookie cleared. */
export async function signOutHere(deps: Pick<AuthRouteDeps, 'hub' | 'sessionCookieName'>, req: Request, res: Response): Promise<void> {
  // passport gives the session a new id as it signs out: the old one names the sockets to close.
  const sid = req.sessionID;
  await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
  await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
  endLiveSession(deps, sid);
  res.clearCookie(deps.sessionCookieName, { path: '/' });
}

/**
 * Waits for passport middleware run inside a handler: it resolves with what
 * `run` hands back, or with undefined once passport has answered the request
 * itself (the redirect to GitHub). Passport handing on to the next middleware
 * rejects, with its error when it has one.
 */
function untilAnswered<T>(res: Response, run: (done: (value: T) => void, next: (error?: unknown) => void) => void): Promise<T | undefined> {
  return new Promise((resolve, reject) => {
    res.once('finish', () => resolve(undefined));
    run(resolve, (error) => reject(error ?? new Error('Passport handed on without answering.')));
  });
}

/**
 * The account a request names, whatever address it comes from, so limits per
 * account cannot be reset by changing address. Only a string counts as the
 * e-mail: String() of a deeply nested array overflows the stack.
 */
const emailKey = (req: Request) => {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return `account|${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
};

const fifteenMinutes = 15 * 60_000;
const hour = 60 * 60_000;

/** Failed sign-ins, per address and per account. */
const signInLimits = ({ db, rateLimits }: AuthRouteDeps) => [
  createLimiter({
    db,
    name: 'signin-ip',
    windowMs: fifteenMinutes,
    limit: rateLimits.signInMax * 5,
    skipSuccessfulRequests: true,
    message: 'Too many failed sign-in attempts from your network. Wait 15 minutes and try again.',
  }),
  createLimiter({
    db,
    name: 'signin-account',
    windowMs: fifteenMinutes,
    limit: rateLimits.signInMax,
    skipSuccessfulRequests: true,
    keyGenerator: emailKey,
    message: 'Too many failed sign-in attempts for this account. Wait 15 minutes, or reset your password.',
  }),
];

/** New accounts per address. */
const signUpLimits = ({ db, rateLimits }: AuthRouteDeps) => [
  createLimiter({
    db,
    name: 'signup-ip',
    windowMs: hour,
    limit: rateLimits.signUpMax,
    message: 'Too many new accounts from your network. Try again in an hour.',
  }),
];

/** Reset requests, per address and per account. */
const resetLimits = ({ db, rateLimits }: AuthRouteDeps) => [
  createLimiter({
    db,
    name: 'reset-ip',
    windowMs: hour,
    limit: rateLimits.resetPerAddress,
    message: 'Too many reset requests from your network. Try again in an hour.',
  }),
  createLimiter({
    db,
    name: 'reset-account',
    windowMs: hour,
    limit: 5,
    keyGenerator: emailKey,
    message: 'Too many reset requests for this address. Check your inbox, or try again in an hour.',
  }),
];

/** Wrong current passwords, per person. */
export const passwordChangeLimits = ({ db, rateLimits }: Pick<AuthRouteDeps, 'db' | 'rateLimits'>) => [
  createLimiter({
    db,
    name: 'password-change',
    windowMs: fifteenMinutes,
    limit: rateLimits.signInMax,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `user|${currentUser(req).id}`,
    message: 'Too many wrong current passwords. Wait 15 minutes, or reset your password.',
  }),
];

/** The GitHub sign-in waiting in this session for the person to choose a role. */
function pendingGithub(req: Request) {
  const pending = req.session.pendingGithub;
  if (!pending) throw notFound('There is no GitHub sign-in waiting. Start again from the sign-in page.');
  return pending;
}

/** No GitHub sign-in waiting is a 404 before the body is read, so a bad body without one is a 404 too. */
const pendingGithubFirst = () => [
  (req: Request, _res: Response, next: () => void) => {
    pendingGithub(req);
    next();
  },
];

const route = routesFor<AuthRouteDeps>('Sign-in');

/** Accounts and sessions: sign-up, sign-in (password or GitHub), sign-out, e-mail confirmation and passwords. */
export const authRoutes = [
  route({
    method: 'get',
    path: '/api/auth/csrf',
    summary: 'A CSRF token for this session',
    access: 'public',
    reply: { json: csrfTokenSchema, description: 'The token to send as X-CSRF-Token' },
    handler: ({ deps, req }) => ({ csrfToken: deps.generateCsrfToken(req) }),
  }),
  route({
    method: 'get',
    path: '/api/auth/me',
    summary: 'The signed-in person',
    access: 'signed-in',
    reply: { json: meAnswerSchema, description: 'The person as they see themselves' },
    handler: ({ user }) => ({ user: toMe(user) }),
  }),
  route({
    method: 'get',
    path: '/api/auth/session',
    summary: 'Who is signed in on this session, if anyone',
    access: 'public',
    reply: { json: sessionAnswerSchema, description: 'The person as they see themselves, or null when signed out' },
    handler: ({ user }) => ({ user: user ? toMe(user) : null }),
  }),
  route({
    method: 'post',
    path: '/api/auth/signup',
    summary: 'Create an account (builder or shop) and sign in',
    access: 'public',
    body: signUpSchema,
    use: signUpLimits,
    reply: { status: 201, json: signedInSchema, description: 'Created and signed in' },
    handler: async ({ deps, req, body }) => {
      return signedIn(deps, req, await signUp(deps, body));
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/login',
    summary: 'Sign in with e-mail and password',
    access: 'public',
    body: signInSchema,
    use: signInLimits,
    reply: { json: signedInSchema, description: 'Signed in' },
    handler: async ({ deps, req, res }) => {
      const user = await new Promise<User>((resolve, reject) => {
        deps.passport.authenticate('local', { session: false }, (err: unknown, found: User | false) => {
          if (err) return reject(err);
          if (!found) return reject(new AppError('wrong_credentials', 'That e-mail and password do not match an account.', 401));
          resolve(found);
        })(req, res, reject);
      });
      return signedIn(deps, req, user);
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/logout',
    summary: 'Sign out and end the session',
    access: 'public',
    reply: { status: 204, empty: true, description: 'Signed out' },
    handler: ({ deps, req, res }) => signOutHere(deps, req, res),
  }),
  route({
    method: 'post',
    path: '/api/auth/password',
    summary: 'Change the password (the current one proves it is you); ends every other session',
    access: 'signed-in',
    body: changePasswordSchema,
    use: passwordChangeLimits,
    reply: { json: passwordChangedSchema, description: 'Changed' },
    handler: async ({ deps, req, user, body }) => {
      await changePassword(deps, user, body, req.sessionID);
      return { changed: true as const };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/verify-email',
    summary: 'Confirm an e-mail address with the mailed token',
    access: 'public',
    body: verifyEmailSchema,
    reply: { json: emailVerifiedSchema, description: 'Confirmed' },
    handler: async ({ deps, body }) => {
      const user = await verifyEmail(deps, body.token);
      return { email: user.email, verified: true as const };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/verify-email/resend',
    summary: 'Send the confirmation link again',
    access: 'signed-in',
    reply: { status: 202, json: mailQueuedSchema, description: 'Queued' },
    handler: async ({ deps, user }) => {
      await resendVerification(deps, user);
      return { sent: true as const };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/password-reset/request',
    summary: 'Mail a password reset link',
    access: 'public',
    body: passwordResetRequestSchema,
    use: resetLimits,
    reply: { status: 202, json: mailQueuedSchema, description: 'Queued when the account exists' },
    handler: async ({ deps, body }) => {
      await requestPasswordReset(deps, body.email);
      // The same answer whether or not the account exists.
      return { sent: true as const };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/password-reset/confirm',
    summary: 'Set a new password with the mailed token',
    access: 'public',
    body: passwordResetConfirmSchema,
    reply: { json: passwordChangedSchema, description: 'Changed; every session of the account ends' },
    handler: async ({ deps, body }) => {
      await confirmPasswordReset(deps, body.token, body.password);
      return { changed: true as const };
    },
  }),
  // GitHub sign-in: the stand-in provider locally, GitHub itself when configured.
  route({
    method: 'get',
    path: '/api/auth/github',
    summary: 'Start a GitHub sign-in (redirects)',
    access: 'public',
    // A returnTo that is not one plain string (given twice, say) falls back to the dashboard like any other unsafe one;
    // the document shows it as the string it should be (the OpenAPI generator cannot describe a catch).
    query: z.object({ returnTo: z.string().optional().catch(undefined).meta({ type: 'string' }) }),
    reply: { status: 302, redirect: true, description: 'To the provider' },
    handler: async ({ deps, req, res, query }) => {
      req.session.returnTo = safeReturnPath(query.returnTo);
      await untilAnswered(res, (_done, next) => deps.passport.authenticate('github')(req, res, next));
    },
  }),
  route({
    method: 'get',
    path: '/api/auth/github/callback',
    summary: 'Where the provider sends the browser back (redirects)',
    access: 'public',
    reply: { status: 302, redirect: true, description: 'Into the app' },
    handler: async ({ deps, req, res }) => {
      const fail = (code: string) => res.redirect(`/signin?error=${encodeURIComponent(code)}`);
      const outcome = await untilAnswered<{ err: unknown; profile: GithubProfile | false }>(res, (done, next) =>
        deps.passport.authenticate('github', { session: false }, (err: unknown, profile: GithubProfile | false) => done({ err, profile }))(req, res, next),
      );
      // Passport answered: without a code it sends the browser to the provider first.
      if (!outcome) return;
      const { err, profile } = outcome;
      if (err || !profile) {
        req.log?.warn({ err }, 'GitHub sign-in failed');
        return fail('github_failed');
      }
      await githubSignIn(deps, profile)
        .then(async (signIn) => {
          const returnTo = req.session.returnTo ?? '/dashboard';
          if (signIn.kind === 'signed-in') {
            await logIn(req, signIn.user);
            return res.redirect(returnTo);
          }
          req.session.pendingGithub = signIn.pending;
          res.redirect('/welcome/github');
        })
        .catch((error: unknown) => fail(error instanceof AppError ? error.code : 'github_failed'));
    },
  }),
  route({
    method: 'get',
    path: '/api/auth/github/pending',
    summary: 'A first GitHub sign-in waiting for a role',
    access: 'public',
    reply: { json: pendingGithubAnswerSchema, description: 'Who GitHub says the person is' },
    handler: ({ req }) => {
      const pending = pendingGithub(req);
      return { pending: { login: pending.login, email: pending.email, displayName: pending.displayName } };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/github/complete',
    summary: 'Choose a role and create the account',
    access: 'public',
    body: githubCompleteSchema,
    use: pendingGithubFirst,
    reply: { status: 201, json: signedInSchema, description: 'Created and signed in' },
    handler: async ({ deps, req, body }) => {
      return signedIn(deps, req, await completeGithubSignUp(deps, pendingGithub(req), body.role));
    },
  }),
];

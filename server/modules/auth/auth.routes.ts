import { Router, type Request } from 'express';
import {
  changePasswordSchema,
  githubCompleteSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  signInSchema,
  signUpSchema,
  verifyEmailSchema,
} from '../../../shared/schemas/auth';
import type { Database } from '../../db/client';
import type { User } from '../../db/schema';
import type { AppConfig } from '../../env';
import type { AppPassport } from '../../lib/auth/passport';
import { currentUser, requireUser } from '../../lib/auth/guards';
import { AppError, notFound } from '../../lib/errors';
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

export interface AuthRouterDeps {
  db: Database;
  config: AppConfig;
  passport: AppPassport;
  generateCsrfToken: (req: Request, overwrite?: boolean) => string;
  sessionCookieName: string;
  /** Ends live connections when the session behind them ends. */
  hub: RealtimeHub;
}

const logIn = (req: Request, user: User) =>
  new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));

/**
 * The account a request names, whatever address it comes from, so limits per
 * account cannot be reset by changing address. Only a string counts as the
 * e-mail: String() of a deeply nested array overflows the stack.
 */
const emailKey = (req: Request) => {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return `account|${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
};

export function authRouter(deps: AuthRouterDeps) {
  const { db, config, passport } = deps;
  const serviceDeps = { db, appUrl: config.appUrl, hub: deps.hub };
  const router = Router();

  const fifteenMinutes = 15 * 60_000;
  const hour = 60 * 60_000;
  const signInPerAccount = createLimiter({
    db,
    name: 'signin-account',
    windowMs: fifteenMinutes,
    limit: config.rateLimits.signInMax,
    skipSuccessfulRequests: true,
    keyGenerator: emailKey,
    message: 'Too many failed sign-in attempts for this account. Wait 15 minutes, or reset your password.',
  });
  const signInPerAddress = createLimiter({
    db,
    name: 'signin-ip',
    windowMs: fifteenMinutes,
    limit: config.rateLimits.signInMax * 5,
    skipSuccessfulRequests: true,
    message: 'Too many failed sign-in attempts from your network. Wait 15 minutes and try again.',
  });
  const signUpLimiter = createLimiter({
    db,
    name: 'signup-ip',
    windowMs: hour,
    limit: config.rateLimits.signUpMax,
    message: 'Too many new accounts from your network. Try again in an hour.',
  });
  const resetLimiter = createLimiter({
    db,
    name: 'reset-account',
    windowMs: hour,
    limit: 5,
    keyGenerator: emailKey,
    message: 'Too many reset requests for this address. Check your inbox, or try again in an hour.',
  });
  const resetPerAddress = createLimiter({
    db,
    name: 'reset-ip',
    windowMs: hour,
    limit: config.rateLimits.resetPerAddress,
    message: 'Too many reset requests from your network. Try again in an hour.',
  });

  const passwordChanges = createLimiter({
    db,
    name: 'password-change',
    windowMs: fifteenMinutes,
    limit: config.rateLimits.signInMax,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `user|${currentUser(req).id}`,
    message: 'Too many wrong current passwords. Wait 15 minutes, or reset your password.',
  });

  router.get('/csrf', (req, res) => {
    res.json({ csrfToken: deps.generateCsrfToken(req) });
  });

  router.get('/me', (req, res) => {
    if (!req.user) throw new AppError('unauthenticated', 'You are not signed in.', 401);
    res.json({ user: toMe(req.user) });
  });

  router.post('/signup', signUpLimiter, async (req, res) => {
    const input = signUpSchema.parse(req.body);
    const user = await signUp(serviceDeps, input);
    await logIn(req, user);
    res.status(201).json({ user: toMe(user), csrfToken: deps.generateCsrfToken(req, true) });
  });

  router.post('/login', signInPerAddress, signInPerAccount, async (req, res, next) => {
    signInSchema.parse(req.body);
    const user = await new Promise<User>((resolve, reject) => {
      passport.authenticate('local', { session: false }, (err: unknown, found: User | false) => {
        if (err) return reject(err);
        if (!found) return reject(new AppError('wrong_credentials', 'That e-mail and password do not match an account.', 401));
        resolve(found);
      })(req, res, next);
    });
    // passport regenerates the session id here, so a planted id is worthless.
    await logIn(req, user);
    res.json({ user: toMe(user), csrfToken: deps.generateCsrfToken(req, true) });
  });

  router.post('/logout', async (req, res) => {
    // passport gives the session a new id as it signs out: the old one names the sockets to close.
    const sid = req.sessionID;
    await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
    await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    endLiveSession(serviceDeps, sid);
    res.clearCookie(deps.sessionCookieName, { path: '/' });
    res.status(204).end();
  });

  router.post('/password', requireUser, passwordChanges, async (req, res) => {
    const input = changePasswordSchema.parse(req.body);
    await changePassword(serviceDeps, currentUser(req), input, req.sessionID);
    res.json({ changed: true });
  });

  router.post('/verify-email', async (req, res) => {
    const { token } = verifyEmailSchema.parse(req.body);
    const user = await verifyEmail(serviceDeps, token);
    res.json({ email: user.email, verified: true });
  });

  router.post('/verify-email/resend', requireUser, async (req, res) => {
    await resendVerification(serviceDeps, req.user!);
    res.status(202).json({ sent: true });
  });

  router.post('/password-reset/request', resetPerAddress, resetLimiter, async (req, res) => {
    const { email } = passwordResetRequestSchema.parse(req.body);
    await requestPasswordReset(serviceDeps, email);
    // The same answer whether or not the account exists.
    res.status(202).json({ sent: true });
  });

  router.post('/password-reset/confirm', async (req, res) => {
    const { token, password } = passwordResetConfirmSchema.parse(req.body);
    await confirmPasswordReset(serviceDeps, token, password);
    res.json({ changed: true });
  });

  // GitHub sign-in: the stand-in provider locally, GitHub itself when configured.
  router.get('/github', (req, res, next) => {
    req.session.returnTo = safeReturnPath(req.query.returnTo);
    passport.authenticate('github')(req, res, next);
  });

  router.get('/github/callback', (req, res, next) => {
    const fail = (code: string) => res.redirect(`/signin?error=${encodeURIComponent(code)}`);
    passport.authenticate('github', { session: false }, (err: unknown, profile: GithubProfile | false) => {
      if (err || !profile) {
        req.log?.warn({ err }, 'GitHub sign-in failed');
        return fail('github_failed');
      }
      githubSignIn(serviceDeps, profile)
        .then(async (outcome) => {
          const returnTo = req.session.returnTo ?? '/dashboard';
          if (outcome.kind === 'signed-in') {
            await logIn(req, outcome.user);
            return res.redirect(returnTo);
          }
          req.session.pendingGithub = outcome.pending;
          res.redirect('/welcome/github');
        })
        .catch((error: unknown) => fail(error instanceof AppError ? error.code : 'github_failed'));
    })(req, res, next);
  });

  router.get('/github/pending', (req, res) => {
    const pending = req.session.pendingGithub;
    if (!pending) throw notFound('There is no GitHub sign-in waiting. Start again from the sign-in page.');
    res.json({ pending: { login: pending.login, email: pending.email, displayName: pending.displayName } });
  });

  router.post('/github/complete', async (req, res) => {
    const pending = req.session.pendingGithub;
    if (!pending) throw notFound('There is no GitHub sign-in waiting. Start again from the sign-in page.');
    const { role } = githubCompleteSchema.parse(req.body);
    const user = await completeGithubSignUp(serviceDeps, pending, role);
    await logIn(req, user);
    res.status(201).json({ user: toMe(user), csrfToken: deps.generateCsrfToken(req, true) });
  });

  return router;
}

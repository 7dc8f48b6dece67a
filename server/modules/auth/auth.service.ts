import type { Database, Executor } from '../../db/client';
import type { User } from '../../db/schema';
import type { ChangePasswordInput, PendingGithub, Role, SignUpInput } from '../../../shared/schemas/auth';
import { AppError, badRequest, conflict } from '../../lib/errors';
import { hashPassword, verifyPassword } from '../../lib/auth/passwords';
import { enqueueMail } from '../../lib/mail/outbox';
import { passwordChangedMail, passwordResetMail, verifyEmailMail } from '../../lib/mail/templates';
import {
  deleteSessionsOfUser,
  findUserByEmail,
  findUserByGithubId,
  findUserById,
  insertUser,
  updateUser,
} from '../users/users.repository';
import type { RealtimeHub } from '../../realtime/hub';
import { consumeToken, issueToken, spendAllTokens } from './tokens';
import { TERMS_VERSION } from '../../../shared/legal';

export const VERIFY_TTL_MS = 48 * 60 * 60_000;
export const RESET_TTL_MS = 60 * 60_000;

export interface AuthDeps {
  db: Database;
  appUrl: string;
  /** Closes the live connections of sessions that end (absent in scripts without live clients). */
  hub?: RealtimeHub;
}

export async function sendVerification(deps: AuthDeps, tx: Parameters<Parameters<Database['transaction']>[0]>[0], user: User) {
  const token = await issueToken(tx, user.id, 'verify_email', VERIFY_TTL_MS);
  const url = `${deps.appUrl}/verify-email?token=${token}`;
  await enqueueMail(tx, user.email, verifyEmailMail({ displayName: user.displayName, url, hours: VERIFY_TTL_MS / 3_600_000 }));
}

/** The consent a new account records: now, to the terms as they stand (shared/legal.ts). */
const consentNow = () => ({ termsAcceptedAt: new Date(), termsVersion: TERMS_VERSION });

/** An address that already has an account: the same words at sign-up and at a change of address, so neither tells more. */
export const emailTaken = (field: string) =>
  new AppError('email_taken', 'An account with this e-mail address already exists.', 409, {
    [field]: 'An account with this e-mail address already exists. Sign in instead, or reset your password.',
  });

/**
 * Holds a change to the account to the person's current password; an
 * account without one (GitHub only) is told how to set one first.
 */
export async function proveCurrentPassword(user: User, currentPassword: string): Promise<void> {
  if (!user.passwordHash) {
    await verifyPassword(undefined, currentPassword);
    throw new AppError('no_password', 'Your account signs in with GitHub and has no password yet. Use “Forgot your password?” on the sign-in page to set one.', 400, {
      currentPassword: 'Your account has no password yet.',
    });
  }
  if (!(await verifyPassword(user.passwordHash, currentPassword))) {
    throw new AppError('wrong_password', 'Your current password is not right.', 400, { currentPassword: 'This is not your current password.' });
  }
}

/** Someone signed out: the live connections of that session end, on every instance; their other sessions go on. */
export function endLiveSession(deps: Pick<AuthDeps, 'hub'>, sid: string): void {
  deps.hub?.endSession(sid);
}

/** Creates the account and queues the verification mail in one transaction. */
export async function signUp(deps: AuthDeps, input: SignUpInput): Promise<User> {
  const passwordHash = await hashPassword(input.password);
  return deps.db.transaction(async (tx) => {
    const user = await insertUser(tx, {
      email: input.email,
      displayName: input.displayName,
      role: input.role,
      passwordHash,
      ...consentNow(),
    });
    if (!user) throw emailTaken('email');
    await sendVerification(deps, tx, user);
    return user;
  });
}

/** The sign-in page shows how to reach us beside this message (the help page and the support address). */
const suspendedError = () => new AppError('suspended', 'This account is suspended. To ask why or to have it reinstated, write to us: the help page says how.', 403);

/** Checks e-mail and password; the same answer whether the e-mail or the password was wrong. */
export async function authenticate(deps: AuthDeps, email: string, password: string): Promise<User> {
  const user = await findUserByEmail(deps.db, email);
  const ok = await verifyPassword(user?.passwordHash, password);
  if (!user || !ok) throw new AppError('wrong_credentials', 'That e-mail and password do not match an account.', 401);
  if (user.status === 'suspended') {
    throw suspendedError();
  }
  return user;
}

/** Queues a reset link when the account exists; says nothing either way. */
export async function requestPasswordReset(deps: AuthDeps, email: string): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const user = await findUserByEmail(tx, email);
    if (!user || user.status === 'suspended') return;
    const token = await issueToken(tx, user.id, 'reset_password', RESET_TTL_MS);
    const url = `${deps.appUrl}/reset-password?token=${token}`;
    await enqueueMail(tx, user.email, passwordResetMail({ displayName: user.displayName, url, minutes: RESET_TTL_MS / 60_000 }));
  });
}

export const expiredLink = () =>
  new AppError('link_expired', 'This link has expired or was already used. Ask for a new one.', 400, {
    token: 'This link has expired or was already used.',
  });

/**
 * A new password ends what the old one may have started: every reset link
 * still out and a move to another address not yet confirmed (whoever asked
 * for it may be why the password changed; the person can ask again).
 */
async function spendLinksOfOldPassword(tx: Executor, userId: string): Promise<void> {
  await spendAllTokens(tx, userId, 'reset_password');
  await spendAllTokens(tx, userId, 'change_email');
}

/** Spends the reset link and every other one still out, sets the password, ends every session of the account. */
export async function confirmPasswordReset(deps: AuthDeps, token: string, password: string): Promise<User> {
  const passwordHash = await hashPassword(password);
  const changed = await deps.db.transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'reset_password');
    if (!userId) throw expiredLink();
    // Following the link proves the person reads that mailbox.
    const user = await findUserById(tx, userId);
    const updated = await updateUser(tx, userId, { passwordHash, pendingEmail: null, emailVerifiedAt: user?.emailVerifiedAt ?? new Date() });
    if (!updated) throw expiredLink();
    await spendLinksOfOldPassword(tx, userId);
    await deleteSessionsOfUser(tx, userId);
    await enqueueMail(tx, updated.email, passwordChangedMail({ displayName: updated.displayName }));
    return updated;
  });
  deps.hub?.signOut(changed.id);
  return changed;
}

/**
 * A signed-in person changes their password: the current one must be right.
 * Every reset link still out is spent and every other session of the account
 * ends; the session that asked (`keepSid`) stays signed in.
 */
export async function changePassword(deps: AuthDeps, user: User, input: ChangePasswordInput, keepSid: string): Promise<User> {
  await proveCurrentPassword(user, input.currentPassword);
  const passwordHash = await hashPassword(input.newPassword);
  const changed = await deps.db.transaction(async (tx) => {
    const updated = await updateUser(tx, user.id, { passwordHash, pendingEmail: null });
    if (!updated) throw new AppError('unauthenticated', 'You are not signed in.', 401);
    await spendLinksOfOldPassword(tx, user.id);
    await deleteSessionsOfUser(tx, user.id, keepSid);
    await enqueueMail(tx, updated.email, passwordChangedMail({ displayName: updated.displayName }));
    return updated;
  });
  deps.hub?.signOut(changed.id, keepSid);
  return changed;
}

export async function verifyEmail(deps: AuthDeps, token: string): Promise<User> {
  return deps.db.transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'verify_email');
    if (!userId) throw expiredLink();
    const user = await updateUser(tx, userId, { emailVerifiedAt: new Date() });
    if (!user) throw expiredLink();
    return user;
  });
}

export async function resendVerification(deps: AuthDeps, user: User): Promise<void> {
  if (user.emailVerifiedAt) throw conflict('Your e-mail address is already confirmed.', 'already_verified');
  await deps.db.transaction((tx) => sendVerification(deps, tx, user));
}

export interface GithubProfile {
  githubId: string;
  login: string;
  displayName: string;
  /** The primary address GitHub has verified, if any. */
  email?: string;
}

export type GithubOutcome = { kind: 'signed-in'; user: User } | { kind: 'needs-role'; pending: PendingGithub & { githubId: string } };

/** A known GitHub account signs in; a new one must first choose a role. */
export async function githubSignIn(deps: AuthDeps, profile: GithubProfile): Promise<GithubOutcome> {
  const known = await findUserByGithubId(deps.db, profile.githubId);
  if (known) {
    if (known.status === 'suspended') {
      throw suspendedError();
    }
    return { kind: 'signed-in', user: known };
  }
  if (!profile.email) {
    throw badRequest('Your GitHub account has no verified e-mail address. Add one on GitHub, or sign up with e-mail.');
  }
  if (await findUserByEmail(deps.db, profile.email)) {
    throw conflict(
      'An account with the e-mail address of this GitHub account already exists. Sign in with your password.',
      'email_taken',
    );
  }
  return {
    kind: 'needs-role',
    pending: { githubId: profile.githubId, login: profile.login, email: profile.email, displayName: profile.displayName },
  };
}

export async function completeGithubSignUp(
  deps: AuthDeps,
  pending: PendingGithub & { githubId: string },
  role: Extract<Role, 'builder' | 'shop'>,
): Promise<User> {
  const user = await insertUser(deps.db, {
    email: pending.email,
    displayName: pending.displayName,
    role,
    githubId: pending.githubId,
    // GitHub told us this address is verified.
    emailVerifiedAt: new Date(),
    // The role step asks for consent to the terms before the account is made.
    ...consentNow(),
  });
  if (!user) throw conflict('An account for this GitHub user or e-mail address already exists.', 'email_taken');
  return user;
}

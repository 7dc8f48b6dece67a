import { z } from 'zod';

/** Roles a person can choose at sign-up; admin accounts come only from an admin. */
export const selfServiceRoles = ['builder', 'shop'] as const;
export const roles = ['builder', 'shop', 'admin'] as const;
export type Role = (typeof roles)[number];

export const emailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const newPasswordSchema = z
  .string({ error: 'Choose a password.' })
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

const role = z.enum(selfServiceRoles, { error: 'Choose whether you build engines or run a machine shop.' });

/** Consent to the terms and the privacy notice: a new account needs the box ticked (the version accepted is stored with the time). */
export const acceptTermsSchema = z.literal(true, { error: 'Tick the box to accept the terms and the privacy notice.' });

export const signUpSchema = z.object({
  displayName: z
    .string({ error: 'Enter your name or your business name.' })
    .trim()
    .min(1, 'Enter your name or your business name.')
    .max(80, 'Use at most 80 characters.'),
  email: emailSchema,
  password: newPasswordSchema,
  role,
  acceptTerms: acceptTermsSchema,
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200, 'That password is too long.'),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema });
export type PasswordResetRequestInput = z.infer<typeof passwordResetRequestSchema>;

export const tokenSchema = z.string({ error: 'The link is incomplete.' }).regex(/^[A-Za-z0-9_-]{20,100}$/, 'The link is incomplete or damaged.');

export const passwordResetConfirmSchema = z.object({ token: tokenSchema, password: newPasswordSchema });
export type PasswordResetConfirmInput = z.infer<typeof passwordResetConfirmSchema>;

export const verifyEmailSchema = z.object({ token: tokenSchema });

/** The current password, proving it is the person themselves before a change to the account. */
export const currentPasswordSchema = z
  .string({ error: 'Enter your current password.' })
  .min(1, 'Enter your current password.')
  .max(200, 'That password is too long.');

/** A signed-in person changing their password: the current one proves it is them. */
export const changePasswordSchema = z
  .object({
    currentPassword: currentPasswordSchema,
    newPassword: newPasswordSchema,
  })
  .refine((value) => value.newPassword !== value.currentPassword, {
    path: ['newPassword'],
    message: 'Choose a password different from your current one.',
  });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const githubCompleteSchema = z.object({ role, acceptTerms: acceptTermsSchema });
export type GithubCompleteInput = z.infer<typeof githubCompleteSchema>;

/** The signed-in person as the API shows them to themselves. */
export const meSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(roles),
  emailVerified: z.boolean(),
  hasPassword: z.boolean(),
  githubLinked: z.boolean(),
  /** An address the person asked to move to, waiting for its link to be followed. */
  pendingEmail: z.string().nullable(),
});
export type Me = z.infer<typeof meSchema>;

/** A GitHub sign-in waiting for the person to choose a role. */
export const pendingGithubSchema = z.object({ login: z.string(), email: z.string(), displayName: z.string() });
export type PendingGithub = z.infer<typeof pendingGithubSchema>;

// Answers of /api/auth: the JSON on the wire.

/** GET /api/auth/csrf: the token to send as X-CSRF-Token with every change. */
export const csrfTokenSchema = z.object({ csrfToken: z.string() });
export type CsrfToken = z.infer<typeof csrfTokenSchema>;

/** GET /api/auth/me. */
export const meAnswerSchema = z.object({ user: meSchema });
export type MeAnswer = z.infer<typeof meAnswerSchema>;

/**
 * GET /api/auth/session: who is signed in on this session, or null. A signed-out
 * visitor is an answer here, not an error, so the browser logs no failed request.
 */
export const sessionAnswerSchema = z.object({ user: meSchema.nullable() });
export type SessionAnswer = z.infer<typeof sessionAnswerSchema>;

/** Signed in (sign-up, sign-in, a finished GitHub sign-up): the person, and a new CSRF token for the new session. */
export const signedInSchema = z.object({ user: meSchema, csrfToken: z.string() });
export type SignedIn = z.infer<typeof signedInSchema>;

/** A password changed or set again with a reset link. */
export const passwordChangedSchema = z.object({ changed: z.literal(true) });
export type PasswordChanged = z.infer<typeof passwordChangedSchema>;

/** The address a confirmation link confirmed. */
export const emailVerifiedSchema = z.object({ email: z.string(), verified: z.literal(true) });
export type EmailVerified = z.infer<typeof emailVerifiedSchema>;

/** A mail queued (a confirmation link, or a reset link whether or not the account exists). */
export const mailQueuedSchema = z.object({ sent: z.literal(true) });
export type MailQueued = z.infer<typeof mailQueuedSchema>;

/** GET /api/auth/github/pending. */
export const pendingGithubAnswerSchema = z.object({ pending: pendingGithubSchema });
export type PendingGithubAnswer = z.infer<typeof pendingGithubAnswerSchema>;

import { z } from 'zod';
import { currentPasswordSchema, emailSchema, tokenSchema } from './auth';

// The signed-in person's own account: a new e-mail address, their data, closing the account.

/** A move to a new address: the current password proves it is them; the link goes to the new address. */
export const changeEmailSchema = z.object({ newEmail: emailSchema, currentPassword: currentPasswordSchema });
export type ChangeEmailInput = z.infer<typeof changeEmailSchema>;

/** The link mailed to the new address. */
export const confirmEmailChangeSchema = z.object({ token: tokenSchema });

/** Closing the account, with the current password. */
export const deleteAccountSchema = z.object({ currentPassword: currentPasswordSchema });
export type DeleteAccountInput = z.infer<typeof deleteAccountSchema>;

// Answers: the JSON on the wire.

/** POST /api/me/email: the link went to this address; nothing changes until it is followed. */
export const emailChangeRequestedSchema = z.object({ pendingEmail: z.string() });

/** POST /api/me/email/confirm: the account's address now. */
export const emailChangedSchema = z.object({ email: z.string(), changed: z.literal(true) });

/** Something that must be settled before the account can be deleted, with the job it is about. */
export const deletionBlockerSchema = z.object({ jobId: z.string(), jobTitle: z.string(), reason: z.string() });
export type DeletionBlocker = z.infer<typeof deletionBlockerSchema>;

/** GET /api/me/deletion: what stands in the way, and what deleting would also do. */
export const deletionCheckSchema = z.object({
  allowed: z.boolean(),
  blockers: z.array(deletionBlockerSchema),
  /** Things deleting does on the way (bids withdrawn), in words. */
  alsoHappens: z.array(z.string()),
});
export type DeletionCheck = z.infer<typeof deletionCheckSchema>;

/** POST /api/me/delete. */
export const accountDeletedSchema = z.object({ deleted: z.literal(true) });

const rows = z.array(z.record(z.string(), z.unknown()));

/**
 * GET /api/me/export: what Tenthmark keeps about the person. Rows are the
 * stored records of the jobs they took part in; other people appear by
 * name only (never their e-mail address or anything of their sign-in).
 */
export const accountExportSchema = z.object({
  exportedAt: z.string(),
  profile: z.object({
    id: z.string(),
    email: z.string(),
    displayName: z.string(),
    role: z.string(),
    emailConfirmedAt: z.string().nullable(),
    githubLinked: z.boolean(),
    termsAcceptedAt: z.string().nullable(),
    termsVersion: z.string().nullable(),
    createdAt: z.string(),
  }),
  shop: z.record(z.string(), z.unknown()).nullable(),
  jobs: rows,
  bids: rows,
  messages: rows,
  milestones: rows,
  inspectionRecords: rows,
  changeOrders: rows,
  disputes: rows,
  reviews: rows,
  payments: rows,
  ledger: rows,
});
export type AccountExport = z.infer<typeof accountExportSchema>;

import { z } from 'zod';
import { roles } from './auth';
import { ledgerEntryKindSchema, ledgerKinds, moneyHistoryRowSchema } from './payments';
import { publicShopSchema } from './shops';

export const createAdminSchema = z.object({
  displayName: z.string({ error: 'Enter the person’s name.' }).trim().min(1, 'Enter the person’s name.').max(80, 'Use at most 80 characters.'),
  email: z
    .string({ error: 'Enter an e-mail address.' })
    .trim()
    .max(254, 'That e-mail address is too long.')
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
});
export type CreateAdminInput = z.infer<typeof createAdminSchema>;

export const userSearchSchema = z.object({
  q: z.string().trim().max(100, 'Use at most 100 characters.').optional(),
  role: z.enum(roles, { error: 'Choose builder, shop or admin.' }).optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int().min(1).max(100).default(50),
  offset: z.coerce.number({ error: 'Give a whole number.' }).int().min(0).default(0),
});
export type UserSearchInput = z.infer<typeof userSearchSchema>;

export const shopSearchSchema = z.object({
  q: z.string().trim().max(100, 'Use at most 100 characters.').optional(),
  verified: z.enum(['yes', 'no'], { error: 'Choose yes or no.' }).optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int().min(1).max(100).default(50),
  offset: z.coerce.number({ error: 'Give a whole number.' }).int().min(0).default(0),
});
export type ShopSearchInput = z.infer<typeof shopSearchSchema>;

export const verifyShopSchema = z.object({ verified: z.boolean({ error: 'Say whether the shop is verified.' }) });
export type VerifyShopInput = z.infer<typeof verifyShopSchema>;

export const suspendUserSchema = z.object({
  reason: z.string({ error: 'Write why.' }).trim().min(5, 'Write why in at least 5 characters.').max(1000, 'Use at most 1,000 characters.'),
});
export type SuspendUserInput = z.infer<typeof suspendUserSchema>;

/** The platform fee as a percentage with up to two decimals (basis points on the wire). */
export const platformFeeSchema = z.object({
  feeBps: z
    .number({ error: 'Give the fee in basis points.' })
    .int('Give the fee in whole basis points (0.01 %).')
    .min(0, 'The fee cannot be negative.')
    .max(3000, 'The fee can be at most 30 %.'),
});
export type PlatformFeeInput = z.infer<typeof platformFeeSchema>;

export { ledgerKinds };

export const ledgerQuerySchema = z.object({
  kind: z.enum(ledgerKinds, { error: 'Choose paid in, released, fee or refunded.' }).optional(),
  jobId: z.uuid({ error: 'That job id is not valid.' }).optional(),
  from: z.iso.date({ error: 'Give a date like 2027-03-31.' }).optional(),
  to: z.iso.date({ error: 'Give a date like 2027-03-31.' }).optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int().min(1).max(200).default(50),
  offset: z.coerce.number({ error: 'Give a whole number.' }).int().min(0).default(0),
});
export type LedgerQuery = z.infer<typeof ledgerQuerySchema>;

export const auditQuerySchema = z.object({
  action: z.string().trim().max(60).optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int().min(1).max(200).default(50),
  offset: z.coerce.number({ error: 'Give a whole number.' }).int().min(0).default(0),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

// --- answers ------------------------------------------------------------------

const accountStatusSchema = z.enum(['active', 'suspended', 'closed']);
const pageTotal = z.number().int();

/** An account as the console lists it (never its password hash). */
export const adminUserRowSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(roles),
  status: accountStatusSchema,
  emailVerifiedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
});
export type AdminUserRow = z.infer<typeof adminUserRowSchema>;

export const adminUserPageSchema = z.object({ users: z.array(adminUserRowSchema), total: pageTotal });
export type AdminUserPage = z.infer<typeof adminUserPageSchema>;

/** A suspended or reinstated account. */
export const adminUserAnswerSchema = z.object({ user: adminUserRowSchema });
export type AdminUserAnswer = z.infer<typeof adminUserAnswerSchema>;

/** A shop as the console lists it: the owner's e-mail and state beside the public facts. */
export const adminShopRowSchema = z.object({
  id: z.uuid(),
  userId: z.uuid(),
  name: z.string(),
  email: z.string(),
  city: z.string(),
  region: z.string(),
  country: z.string(),
  verified: z.boolean(),
  payoutsReady: z.boolean(),
  ownerStatus: accountStatusSchema,
  rating: publicShopSchema.shape.rating,
  createdAt: z.iso.datetime(),
});
export type AdminShopRow = z.infer<typeof adminShopRowSchema>;

export const adminShopPageSchema = z.object({ shops: z.array(adminShopRowSchema), total: pageTotal });
export type AdminShopPage = z.infer<typeof adminShopPageSchema>;

export const adminShopAnswerSchema = z.object({ shop: adminShopRowSchema });
export type AdminShopAnswer = z.infer<typeof adminShopAnswerSchema>;

/** The fee for new awards: what an administrator last set (by whom, when), or the configured default (both null). */
export const platformFeeSettingSchema = z.object({
  feeBps: z.number().int(),
  updatedAt: z.iso.datetime().nullable(),
  updatedBy: z.string().nullable(),
});
export type PlatformFee = z.infer<typeof platformFeeSettingSchema>;

export type LedgerKind = z.infer<typeof ledgerEntryKindSchema>;

/** A line of the platform ledger: a money-history row with its provider reference and payment. */
export const ledgerRowSchema = moneyHistoryRowSchema.extend({ reference: z.string(), paymentId: z.string().nullable() });
export type LedgerRow = z.infer<typeof ledgerRowSchema>;

export const ledgerPageSchema = z.object({
  rows: z.array(ledgerRowSchema),
  total: pageTotal,
  /** Sums over every row the filters match, not just this page. */
  totals: z.object({ paid_in: z.number().int(), released: z.number().int(), fee: z.number().int(), refunded: z.number().int() }),
});
export type LedgerPage = z.infer<typeof ledgerPageSchema>;

export const auditRowSchema = z.object({
  id: z.number().int(),
  at: z.iso.datetime(),
  admin: z.object({ id: z.uuid(), displayName: z.string() }),
  action: z.string(),
  targetType: z.string(),
  targetId: z.string(),
  details: z.record(z.string(), z.unknown()),
});
export type AuditRow = z.infer<typeof auditRowSchema>;

export const auditPageSchema = z.object({ entries: z.array(auditRowSchema), total: pageTotal });
export type AuditPage = z.infer<typeof auditPageSchema>;

// --- disputes as the console sees them ------------------------------------------
//
// The queue, the case with its evidence timeline and a decision's answer are the
// disputes schemas' (shared/schemas/disputes.ts); the console's names for them:

export type { DisputeCase, DisputeQueueAnswer, DisputeDecision as DisputeDecided } from './disputes';

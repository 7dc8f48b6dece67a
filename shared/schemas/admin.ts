import { z } from 'zod';
import { roles } from './auth';
import { boreInspectionAnswerSchema, appliedFilterSchema } from './calculations';
import { disputeOutcomes, disputeReasons } from './disputes';
import { ledgerEntryKindSchema, ledgerKinds } from './payments';
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

const accountStatusSchema = z.enum(['active', 'suspended']);
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

export const ledgerRowSchema = z.object({
  id: z.number().int(),
  createdAt: z.iso.datetime(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  kind: ledgerEntryKindSchema,
  amountCents: z.number().int(),
  reference: z.string(),
  paymentId: z.string().nullable(),
});
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
// The queue, the case with its evidence timeline, and a decision's answer.
// The evidence items describe shapes other domains own (a dispute, a photo, a
// job's money, an inspection's results): they are written here until those
// domains have answer schemas of their own, then these become references.

const sideSchema = z.enum(['builder', 'shop']);
const disputeStatusSchema = z.enum(['open', 'resolved']);

export const disputeQueueRowSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  builderName: z.string(),
  shopName: z.string(),
  openedBy: sideSchema,
  reason: z.enum(disputeReasons),
  status: disputeStatusSchema,
  openedAt: z.iso.datetime(),
  /** Paid in and not yet paid out or refunded, in cents. */
  heldCents: z.number().int(),
  answered: z.boolean(),
});

export type DisputeQueueRow = z.infer<typeof disputeQueueRowSchema>;

export const disputeQueueAnswerSchema = z.object({ disputes: z.array(disputeQueueRowSchema) });
export type DisputeQueueAnswer = z.infer<typeof disputeQueueAnswerSchema>;

/** The dispute itself (shared/schemas/disputes.ts `Dispute`). */
export const evidenceDisputeSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  status: disputeStatusSchema,
  openedBy: sideSchema,
  reason: z.enum(disputeReasons),
  statement: z.string(),
  openedAt: z.iso.datetime(),
  response: z.object({ by: sideSchema, statement: z.string(), at: z.iso.datetime() }).nullable(),
  resolution: z
    .object({ outcome: z.enum(disputeOutcomes), shopCents: z.number().int(), refundCents: z.number().int(), decision: z.string(), at: z.iso.datetime() })
    .nullable(),
});

/** A photo of the job, a message or a milestone, re-encoded as WebP. */
export const evidencePhotoSchema = z.object({
  id: z.uuid(),
  width: z.number().int(),
  height: z.number().int(),
  thumbUrl: z.string(),
  largeUrl: z.string(),
});

/** The job's money: ledger balance, movements still on their way, payments (shared/schemas/payments.ts `MoneyView`). */
export const evidenceMoneySchema = z.object({
  balance: z.object({ paidIn: z.number().int(), released: z.number().int(), fee: z.number().int(), refunded: z.number().int(), held: z.number().int() }),
  pending: z.array(
    z.object({ kind: z.enum(['release', 'refund', 'late_refund']), amountCents: z.number().int(), attempts: z.number().int(), lastError: z.string().nullable() }),
  ),
  payments: z.array(
    z.object({
      id: z.uuid(),
      kind: z.enum(['bid', 'change_order']),
      amountCents: z.number().int(),
      status: z.enum(['pending', 'paid', 'failed', 'expired', 'refunded']),
      failureMessage: z.string().nullable(),
      paidAt: z.iso.datetime().nullable(),
    }),
  ),
});

const checkVerdictSchema = z.enum(['conforms', 'fails', 'not-proven']);
const materialSchema = z.enum(['cast-iron', 'aluminium']);
const thrustAxial = z.object({ thrust: z.number(), axial: z.number() });

/** What the server worked out from an inspection record (shared/schemas/inspection.ts `InspectionResults`). */
export const evidenceInspectionResultsSchema = z.object({
  bores: boreInspectionAnswerSchema.omit({ unit: true }),
  deck: z.object({ outOfFlat: z.number(), limit: z.number(), pass: z.boolean(), limitSource: z.string() }).optional(),
  finish: z
    .object({
      raUm: z.number(),
      rqUm: z.number().optional(),
      rzUm: z.number().optional(),
      rkUm: z.number().optional(),
      rpkUm: z.number().optional(),
      rvkUm: z.number().optional(),
      mr1: z.number().optional(),
      mr2: z.number().optional(),
      filter: appliedFilterSchema.optional(),
    })
    .optional(),
  crosshatch: z.object({ includedAngleDeg: z.number() }).optional(),
  checks: z.array(
    z.object({
      what: z.string(),
      value: z.number(),
      allowed: z.string(),
      pass: z.boolean(),
      verdict: checkVerdictSchema.optional(),
      limit: z.string().optional(),
      cylinder: z.number().int().optional(),
      note: z.string().optional(),
    }),
  ),
  pass: z.boolean(),
  verdict: z.enum(['pass', 'fail', 'not-fully-judged', 'not-proven']).optional(),
  notJudged: z.array(z.object({ what: z.string(), why: z.string() })).optional(),
  decisionRule: z
    .object({
      rule: z.enum(['simple', 'guarded']),
      name: z.string(),
      words: z.string(),
      uncertainty: z.number(),
      uncertaintySource: z.enum(['entered', 'gauge-resolution']),
      uncertaintyWords: z.string(),
    })
    .optional(),
  temperature: z
    .object({
      measuredC: z.number(),
      enteredUnit: z.enum(['C', 'F']),
      referenceC: z.number(),
      block: z.object({ material: materialSchema, alpha: z.number(), words: z.string() }),
      piston: z.object({ material: materialSchema, alpha: z.number(), words: z.string() }),
      source: z.string(),
    })
    .optional(),
  corrected: z
    .array(z.object({ top: thrustAxial, middle: thrustAxial, bottom: thrustAxial, piston: z.number().optional(), pistonSource: z.enum(['record', 'job']).optional() }))
    .optional(),
  statements: z.array(z.string()).optional(),
});

/** One thing that happened on a disputed job, by its kind. */
export const evidenceItemSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('dispute_opened'), at: z.iso.datetime(), by: sideSchema, reason: z.enum(disputeReasons), statement: z.string() }),
  z.object({ kind: z.literal('dispute_answered'), at: z.iso.datetime(), by: sideSchema, statement: z.string() }),
  /** A message between the builder and the shop doing the work (shared/schemas/messages.ts `Message`, as evidence). */
  z.object({ kind: z.literal('message'), at: z.iso.datetime(), by: sideSchema, authorName: z.string(), body: z.string(), photos: z.array(evidencePhotoSchema) }),
  /** A progress entry of the shop's (shared/schemas/inspection.ts `Milestone`, as evidence). */
  z.object({
    kind: z.literal('milestone'),
    at: z.iso.datetime(),
    milestone: z.string(),
    operation: z.string().nullable(),
    note: z.string(),
    carrier: z.string().nullable(),
    trackingNumber: z.string().nullable(),
    photos: z.array(evidencePhotoSchema),
  }),
  /** One inspection record version (shared/schemas/inspection.ts `InspectionVersion`, without its input). */
  z.object({
    kind: z.literal('inspection'),
    at: z.iso.datetime(),
    version: z.number().int(),
    status: z.string(),
    pass: z.boolean(),
    results: evidenceInspectionResultsSchema,
    decidedAt: z.iso.datetime().nullable(),
    rejectReasons: z.string().nullable(),
  }),
  /** Extra work proposed (shared/schemas/payments.ts `ChangeOrder`, as evidence). */
  z.object({
    kind: z.literal('change_order'),
    at: z.iso.datetime(),
    description: z.string(),
    amountCents: z.number().int(),
    status: z.enum(['proposed', 'approved', 'paid', 'declined']),
  }),
  /** A ledger entry on the job. */
  z.object({ kind: z.literal('money'), at: z.iso.datetime(), entry: ledgerEntryKindSchema, amountCents: z.number().int(), reference: z.string() }),
  z.object({ kind: z.literal('job_photo'), at: z.iso.datetime(), photos: z.array(evidencePhotoSchema) }),
]);
export type EvidenceItem = z.infer<typeof evidenceItemSchema>;

/** A dispute with everything that happened on its job, for the administrator who decides it. */
export const disputeCaseSchema = z.object({
  dispute: evidenceDisputeSchema,
  job: z.object({
    id: z.uuid(),
    title: z.string(),
    status: z.string(),
    engineFamily: z.string(),
    cylinders: z.number().int(),
    acceptedTotalCents: z.number().int().nullable(),
    feeBps: z.number().int().nullable(),
  }),
  builder: z.object({ id: z.uuid(), name: z.string(), email: z.string() }),
  shop: z.object({ id: z.uuid(), userId: z.uuid(), name: z.string(), email: z.string() }).nullable(),
  money: evidenceMoneySchema,
  /** Everything that happened on the job, oldest first. */
  timeline: z.array(evidenceItemSchema),
});
export type DisputeCase = z.infer<typeof disputeCaseSchema>;

/** A decided dispute and the job's money after the decision was carried out. */
export const disputeDecidedSchema = z.object({ dispute: evidenceDisputeSchema, money: evidenceMoneySchema });
export type DisputeDecided = z.infer<typeof disputeDecidedSchema>;

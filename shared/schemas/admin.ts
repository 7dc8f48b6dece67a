import { z } from 'zod';
import { roles } from './auth';

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

export const suspendUserSchema = z.object({
  reason: z.string({ error: 'Write why.' }).trim().min(5, 'Write why in at least 5 characters.').max(1000, 'Use at most 1,000 characters.'),
});

/** The platform fee as a percentage with up to two decimals (basis points on the wire). */
export const platformFeeSchema = z.object({
  feeBps: z
    .number({ error: 'Give the fee in basis points.' })
    .int('Give the fee in whole basis points (0.01 %).')
    .min(0, 'The fee cannot be negative.')
    .max(3000, 'The fee can be at most 30 %.'),
});

export const ledgerKinds = ['paid_in', 'released', 'fee', 'refunded'] as const;

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

export interface AdminUserRow {
  id: string;
  email: string;
  displayName: string;
  role: 'builder' | 'shop' | 'admin';
  status: 'active' | 'suspended';
  emailVerifiedAt: string | null;
  createdAt: string;
}

export interface AdminShopRow {
  id: string;
  userId: string;
  name: string;
  email: string;
  city: string;
  region: string;
  country: string;
  verified: boolean;
  payoutsReady: boolean;
  ownerStatus: 'active' | 'suspended';
  rating: { average: number; count: number } | null;
  createdAt: string;
}

export interface LedgerRow {
  id: number;
  createdAt: string;
  jobId: string;
  jobTitle: string;
  kind: (typeof ledgerKinds)[number];
  amountCents: number;
  reference: string;
  paymentId: string | null;
}

export interface LedgerPage {
  rows: LedgerRow[];
  total: number;
  /** Sums over every row the filters match, not just this page. */
  totals: Record<(typeof ledgerKinds)[number], number>;
}

export interface AuditRow {
  id: number;
  at: string;
  admin: { id: string; displayName: string };
  action: string;
  targetType: string;
  targetId: string;
  details: Record<string, unknown>;
}

export interface PlatformFee {
  feeBps: number;
  updatedAt: string | null;
  updatedBy: string | null;
}

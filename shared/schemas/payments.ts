import { z } from 'zod';
import { ledgerKinds } from './values';
import { centsSchema, queryInt } from './common';

export const changeOrderInputSchema = z.object({
  description: z.string({ error: 'Describe the extra work.' }).trim().min(4, 'Describe the extra work.').max(1000, 'Use at most 1,000 characters.'),
  amountCents: centsSchema('Price').min(1, 'Price must be more than $0.'),
});
export type ChangeOrderInput = z.infer<typeof changeOrderInputSchema>;

export const splitSchema = z.object({ shopCents: centsSchema('The shop’s share') });

/** A page of the payment provider (or its local stand-in) the browser is sent to: a checkout or the payout onboarding. */
export const providerLinkSchema = z.object({ url: z.url() });
export type ProviderLink = z.infer<typeof providerLinkSchema>;

/** What the webhook answers the provider: received, and whether the event had been applied before. */
export const webhookReceiptSchema = z.object({ received: z.literal(true), duplicate: z.literal(true).optional() });

export { ledgerKinds };
export const ledgerEntryKindSchema = z.enum(ledgerKinds);
export type LedgerEntryKind = z.infer<typeof ledgerEntryKindSchema>;

/** A job's ledger summed up, in cents; `held` is what is paid in and not yet paid out or refunded. */
export const jobBalanceSchema = z.object({
  paidIn: z.number().int(),
  released: z.number().int(),
  fee: z.number().int(),
  refunded: z.number().int(),
  held: z.number().int(),
});

/** A payout or refund planned and not yet taken by the provider (the worker retries it). */
export const pendingMoveSchema = z.object({
  /** late_refund: a payment that arrived when it could no longer be used, on its way back to the builder. */
  kind: z.enum(['release', 'refund', 'late_refund']),
  amountCents: z.number().int(),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
});

/** A payment for the job: the accepted bid or extra work. */
export const jobPaymentSchema = z.object({
  id: z.uuid(),
  kind: z.enum(['bid', 'change_order']),
  amountCents: z.number().int(),
  /** refunded: the payment arrived when it could no longer be used (job cancelled, already paid, extra work declined) and was sent back in full. */
  status: z.enum(['pending', 'paid', 'failed', 'expired', 'refunded']),
  failureMessage: z.string().nullable(),
  paidAt: z.iso.datetime().nullable(),
  /** The receipt's number once paid (its PDF: /api/payments/:id/receipt.pdf, for the builder and admins). */
  receiptNumber: z.string().nullable(),
});

/** A job's money as its page shows it: the balance, movements still on their way, and its payments. */
export const moneyViewSchema = z.object({
  balance: jobBalanceSchema,
  pending: z.array(pendingMoveSchema),
  payments: z.array(jobPaymentSchema),
  /** Tenthmark's fee rate fixed on the job when its bid was accepted (basis points); null before. */
  feeBps: z.number().int().nullable(),
});
export type MoneyView = z.infer<typeof moneyViewSchema>;

/** Extra work the awarded shop proposed, with its price. */
export const changeOrderSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  description: z.string(),
  amountCents: z.number().int(),
  status: z.enum(['proposed', 'approved', 'paid', 'declined']),
  createdAt: z.iso.datetime(),
});
export type ChangeOrder = z.infer<typeof changeOrderSchema>;

export const changeOrderListSchema = z.object({ changeOrders: z.array(changeOrderSchema) });
export type ChangeOrderList = z.infer<typeof changeOrderListSchema>;
export const changeOrderAnswerSchema = z.object({ changeOrder: changeOrderSchema });
export type ChangeOrderAnswer = z.infer<typeof changeOrderAnswerSchema>;

/**
 * One ledger entry on a job, with the job's title: a line of a builder's or
 * shop's money history (the admin ledger's rows add the provider reference
 * and the payment).
 */
export const moneyHistoryRowSchema = z.object({
  id: z.number().int(),
  createdAt: z.iso.datetime(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  kind: ledgerEntryKindSchema,
  amountCents: z.number().int(),
});
export type MoneyHistoryRow = z.infer<typeof moneyHistoryRowSchema>;

/**
 * A builder's or shop's money over a period: paid in, released to the shop,
 * the platform's fee, refunded, in the period; held at its end (paid in and
 * not yet paid out); and for a shop its net, what reached its payout account.
 */
export const moneyTotalsSchema = jobBalanceSchema.extend({ net: z.number().int() });
export type MoneyTotals = z.infer<typeof moneyTotalsSchema>;

/** A line of the money page: on a builder's payment in, its receipt (the payment and the receipt's number), null otherwise. */
export const moneyPageRowSchema = moneyHistoryRowSchema.extend({ receipt: z.object({ paymentId: z.uuid(), number: z.string() }).nullable() });
export type MoneyPageRow = z.infer<typeof moneyPageRowSchema>;

export const moneyHistorySchema = z.object({ rows: z.array(moneyPageRowSchema), total: z.number().int(), totals: moneyTotalsSchema });
export type MoneyHistory = z.infer<typeof moneyHistorySchema>;

/** A period of whole days (UTC), either end open; the last day may not come before the first. */
const periodFields = {
  from: z.iso.date({ error: 'Give the first day as a date like 2027-03-31.' }).optional(),
  to: z.iso.date({ error: 'Give the last day as a date like 2027-03-31.' }).optional(),
};
const inOrder = (p: { from?: string; to?: string }) => !p.from || !p.to || p.from <= p.to;
const outOfOrder = { path: ['to'], message: 'The last day cannot come before the first day.' };

export const moneyPeriodSchema = z.object(periodFields).refine(inOrder, outOfOrder);
export type MoneyPeriod = z.infer<typeof moneyPeriodSchema>;

/** Which page of the money history, newest first, over which period. */
export const moneyHistoryQuerySchema = z
  .object({ limit: queryInt('limit', 1, 100).default(25), offset: queryInt('offset', 0, 1_000_000).default(0), ...periodFields })
  .refine(inOrder, outOfOrder);

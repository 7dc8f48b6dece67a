import { z } from 'zod';
import { centsSchema } from './common';

export const changeOrderInputSchema = z.object({
  description: z.string({ error: 'Describe the extra work.' }).trim().min(4, 'Describe the extra work.').max(1000, 'Use at most 1,000 characters.'),
  amountCents: centsSchema('Price').min(1, 'Price must be more than $0.'),
});
export type ChangeOrderInput = z.infer<typeof changeOrderInputSchema>;

export const splitSchema = z.object({ shopCents: centsSchema('The shop’s share') });

export interface MoneyView {
  balance: { paidIn: number; released: number; fee: number; refunded: number; held: number };
  /** late_refund: a payment that arrived when it could no longer be used, on its way back to the builder. */
  pending: Array<{ kind: 'release' | 'refund' | 'late_refund'; amountCents: number; attempts: number; lastError: string | null }>;
  /** refunded: the payment arrived when it could no longer be used (job cancelled, already paid, extra work declined) and was sent back in full. */
  payments: Array<{ id: string; kind: 'bid' | 'change_order'; amountCents: number; status: 'pending' | 'paid' | 'failed' | 'expired' | 'refunded'; failureMessage: string | null; paidAt: string | null }>;
}

export interface ChangeOrder {
  id: string;
  jobId: string;
  description: string;
  amountCents: number;
  status: 'proposed' | 'approved' | 'paid' | 'declined';
  createdAt: string;
}

/** One line of a builder's or shop's money history: a ledger entry on one of their jobs. */
export interface MoneyHistoryRow {
  id: number;
  createdAt: string;
  jobId: string;
  jobTitle: string;
  kind: 'paid_in' | 'released' | 'fee' | 'refunded';
  amountCents: number;
}

export interface MoneyHistory {
  rows: MoneyHistoryRow[];
  total: number;
}

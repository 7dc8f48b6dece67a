import { JOB_STATUS, NAMES } from '@shared/glossary';
import type { DisputeOutcome } from '@shared/schemas/disputes';
import type { LedgerKind } from '../api/admin-ledger';

/** A moment as the reader's date, time and zone ("3 Mar 2027, 14:05 UTC"), or date only. */
export { formatDateTime as formatMoment, formatDate } from '@client/lib/dates';

export const plural = (count: number, one: string, many = `${one}s`) => `${count} ${count === 1 ? one : many}`;

/** How long ago something started, in the largest whole unit: "3 days", "5 hours", "under an hour". */
export function formatAge(since: string, now: Date = new Date()): string {
  const hours = Math.floor((now.getTime() - new Date(since).getTime()) / 3_600_000);
  if (hours < 1) return 'under an hour';
  if (hours < 24) return plural(hours, 'hour');
  return plural(Math.floor(hours / 24), 'day');
}

export const sideWords: Record<'builder' | 'shop', string> = { builder: 'Builder', shop: 'Shop' };

export const ledgerKindWords: Record<LedgerKind, string> = {
  paid_in: 'Paid in',
  released: 'Paid to the shop',
  fee: NAMES.fee,
  refunded: 'Refunded',
};

export const outcomeWords: Record<DisputeOutcome, string> = {
  release: 'Released in full to the shop',
  refund: 'Refunded in full to the builder',
  split: 'Split between the shop and the builder',
};

/** A fee in basis points as a percentage with two decimals: 750 → "7.50 %". */
export const formatFee = (feeBps: number) => `${(feeBps / 100).toFixed(2)} %`;

/** A job's status by its name in the glossary. */
export const jobStatusWords: Record<string, string> = Object.fromEntries(Object.entries(JOB_STATUS).map(([status, term]) => [status, term.label]));

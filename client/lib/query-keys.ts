import type { QueryKey } from '@tanstack/react-query';
import type { BoardQuery, JobStatus } from '@shared/schemas/jobs';
import type { ShopDirectoryQuery } from '@shared/schemas/shops';

/**
 * Query-key factories, one per feature, kept in the shared layer so one
 * feature can refresh another's data (a new bid changes the job's bid count)
 * without importing that feature.
 */
export type BoardFilters = Partial<BoardQuery>;
export type DirectoryFilters = Partial<Omit<ShopDirectoryQuery, 'takesShipped'>> & { takesShipped?: 'true' | 'false' };

export const jobKeys = {
  all: ['jobs'] as const,
  boards: () => [...jobKeys.all, 'board'] as const,
  board: (filters: BoardFilters) => [...jobKeys.boards(), filters] as const,
  mineAll: () => [...jobKeys.all, 'mine'] as const,
  mine: (status?: JobStatus) => [...jobKeys.mineAll(), status ?? 'all'] as const,
  details: () => [...jobKeys.all, 'detail'] as const,
  detail: (id: string) => [...jobKeys.details(), id] as const,
};

export const bidKeys = {
  all: ['bids'] as const,
  forJob: (jobId: string) => [...bidKeys.all, 'job', jobId] as const,
  mine: () => [...bidKeys.all, 'mine'] as const,
  detail: (id: string) => [...bidKeys.all, 'detail', id] as const,
  feeRate: () => [...bidKeys.all, 'fee-rate'] as const,
  /** The shop's won jobs not finished yet. */
  queue: () => [...bidKeys.all, 'queue'] as const,
};

export const shopKeys = {
  all: ['shops'] as const,
  lists: () => [...shopKeys.all, 'list'] as const,
  list: (filters: DirectoryFilters) => [...shopKeys.lists(), filters] as const,
  details: () => [...shopKeys.all, 'detail'] as const,
  detail: (id: string) => [...shopKeys.details(), id] as const,
  own: () => [...shopKeys.all, 'own'] as const,
};

/** Conversations: the lists (with unread counts), each thread's history, and the newest message of a thread for previews. */
export const threadKeys = {
  all: ['threads'] as const,
  lists: () => [...threadKeys.all, 'list'] as const,
  mine: () => [...threadKeys.lists(), 'mine'] as const,
  forJob: (jobId: string) => [...threadKeys.lists(), 'job', jobId] as const,
  histories: () => [...threadKeys.all, 'history'] as const,
  history: (threadId: string) => [...threadKeys.histories(), threadId] as const,
  latests: () => [...threadKeys.all, 'latest'] as const,
  latest: (threadId: string) => [...threadKeys.latests(), threadId] as const,
  /** The other person's read mark as live events last moved it; outside the lists, so refetching them leaves it be. */
  otherRead: (threadId: string) => [...threadKeys.all, 'other-read', threadId] as const,
};

/** A job's money (payments, ledger balance, payouts on their way) and its change orders. */
export const paymentKeys = {
  all: (jobId: string) => ['payments', jobId] as const,
  money: (jobId: string) => [...paymentKeys.all(jobId), 'money'] as const,
  changeOrders: (jobId: string) => [...paymentKeys.all(jobId), 'change-orders'] as const,
};

/** A job's timeline of milestones (parts received, operations, shipping both ways). */
export const milestoneKeys = {
  all: ['milestones'] as const,
  forJob: (jobId: string) => [...milestoneKeys.all, 'job', jobId] as const,
};

/** A job's shipping: the shop's receiving address once paid, the return address, both trips. */
export const shippingKeys = {
  all: ['shipping'] as const,
  forJob: (jobId: string) => [...shippingKeys.all, 'job', jobId] as const,
};

/** A job's inspection record: its versions, the shop's draft and the review deadline. */
export const inspectionKeys = {
  all: ['inspections'] as const,
  forJob: (jobId: string) => [...inspectionKeys.all, 'job', jobId] as const,
};

/** A job's dispute (opened, answered, decided) and the reviews left after it ended. */
export const disputeKeys = {
  all: ['disputes'] as const,
  forJob: (jobId: string) => [...disputeKeys.all, 'job', jobId] as const,
};

export const reviewKeys = {
  all: ['reviews'] as const,
  forJob: (jobId: string) => [...reviewKeys.all, 'job', jobId] as const,
};

/** A signed-in builder's or shop's own money history across their jobs. */
export const moneyHistoryKeys = {
  all: ['money-history'] as const,
  page: (offset: number, period: { from?: string; to?: string } = {}) => [...moneyHistoryKeys.all, period, offset] as const,
};

/** The admin console: dispute queue and cases, shops, ledger, audit log, fee. */
export const adminKeys = {
  all: ['admin'] as const,
  disputes: (status: string) => [...adminKeys.all, 'disputes', status] as const,
  disputeCase: (id: string) => [...adminKeys.all, 'dispute', id] as const,
  shops: (filters: Record<string, unknown>) => [...adminKeys.all, 'shops', filters] as const,
  ledger: (filters: Record<string, unknown>) => [...adminKeys.all, 'ledger', filters] as const,
  audit: (filters: Record<string, unknown>) => [...adminKeys.all, 'audit', filters] as const,
  fee: () => [...adminKeys.all, 'fee'] as const,
};

/** The signed-in person's notices (pages and unread count), what needs them, and their e-mail choices. */
export const notificationKeys = {
  all: ['notifications'] as const,
  lists: () => [...notificationKeys.all, 'list'] as const,
  unread: () => [...notificationKeys.all, 'unread'] as const,
  needsYou: () => [...notificationKeys.all, 'needs-you'] as const,
  preferences: () => [...notificationKeys.all, 'preferences'] as const,
};

/**
 * Every query a change to one job can make stale: the job and the lists it
 * shows in, its bids, its conversations (an award or a cancellation closes
 * them), its money and change orders, its milestones and inspection record,
 * its dispute and reviews, the money history and what needs the person. Mutations that change a job
 * and the live-update handler both refresh this list; only the queries on
 * screen fetch again.
 */
export function jobChangeKeys(jobId: string): QueryKey[] {
  return [
    jobKeys.detail(jobId),
    jobKeys.boards(),
    jobKeys.mineAll(),
    bidKeys.forJob(jobId),
    bidKeys.mine(),
    bidKeys.queue(),
    threadKeys.forJob(jobId),
    paymentKeys.all(jobId),
    milestoneKeys.forJob(jobId),
    shippingKeys.forJob(jobId),
    inspectionKeys.forJob(jobId),
    disputeKeys.forJob(jobId),
    reviewKeys.forJob(jobId),
    moneyHistoryKeys.all,
    notificationKeys.needsYou(),
  ];
}

/**
 * Tenthmark's glossary: the one place that names, for people, every status a
 * job, a bid, an inspection record, a dispute, a payment and extra work can
 * have, and the things the screens and e-mails keep talking about (the fee,
 * extra work, progress, each role's home page). Screens, e-mails, notices and
 * PDFs read their words from here, so one thing has one name everywhere.
 *
 * Only the words shown to people live here: enum values, API fields and
 * route paths keep their own names (`in_work`, `change_order`, `milestone`,
 * `/dashboard`). Change a name here and every screen follows; the glossary
 * test (tests/unit/glossary.test.ts) fails if a status lacks a name, if two
 * statuses of one kind share a name, or if a retired name comes back.
 */
import type { BidStatus } from './schemas/bids';
import type { JobStatus } from './schemas/jobs';

/**
 * How a status looks: `success` (done, good), `warning` (someone must act),
 * `danger` (something went wrong or is contested), `neutral` (settled, no
 * colour), `active` (under way, nothing to do) and `quiet` (not live: drafts,
 * replaced or withdrawn things).
 */
export type Tone = 'success' | 'warning' | 'danger' | 'neutral' | 'active' | 'quiet';

export interface Term {
  /** The name on a badge, in a list, in a subject line. */
  label: string;
  tone: Tone;
  /** One sentence saying what it means, where a screen shows one. */
  explain?: string;
}

type Glossary<K extends string> = Readonly<Record<K, Term>>;

// --- things ---------------------------------------------------------------------

/** The names of things, each the same on every screen, e-mail and document. */
export const NAMES = {
  /** What Tenthmark keeps from each payment to the shop (never "platform fee", "service fee" or "commission"). */
  fee: 'Tenthmark fee',
  /** Work agreed and paid for after the bid (the API and database call it a change order). */
  extraWork: 'Extra work',
  /** A step the shop logs on the job (the API and database call it a milestone). */
  progress: 'Progress',
  /** The measured results the shop sends for the builder to accept. */
  record: 'Inspection record',
} as const;

/** Each role's home page (the path is `/dashboard` for all three), as the menu names it. */
export const HOME_PAGE_NAMES = { builder: 'Workbench', shop: 'Shop floor', admin: 'Operations' } as const;
export type HomePageRole = keyof typeof HOME_PAGE_NAMES;

/** The home page inside a sentence: "your workbench", "your shop floor", "the operations page". */
const HOME_PAGE_IN_SENTENCE: Readonly<Record<HomePageRole, string>> = { builder: 'your workbench', shop: 'your shop floor', admin: 'the operations page' };

/** The home page in a sentence or a link: "Back to your workbench"; "your home page" when the role is not known. */
export function homePageName(role: HomePageRole | undefined): string {
  return role ? HOME_PAGE_IN_SENTENCE[role] : 'your home page';
}

/** The home page's heading: "Your workbench", "Your shop floor", "Operations". */
export function homePageTitle(role: HomePageRole): string {
  return role === 'admin' ? HOME_PAGE_NAMES.admin : `${homePageName(role).charAt(0).toUpperCase()}${homePageName(role).slice(1)}`;
}

// --- statuses -------------------------------------------------------------------

/** A job's status, as its owner reads it. */
export const JOB_STATUS: Glossary<JobStatus> = {
  draft: { label: 'Draft', tone: 'quiet', explain: 'Only you can see it. Publish it when it is ready for shops.' },
  open: { label: 'Open for bids', tone: 'active', explain: 'Shops can see it on the job board and bid.' },
  awarded: {
    label: 'Awarded, payment due',
    tone: 'warning',
    explain: 'You accepted a bid. Pay next: the payment is held until you accept the inspection record.',
  },
  funded: { label: 'Paid and held', tone: 'success', explain: 'Your payment is held by Tenthmark until you accept the inspection record; the shop may start.' },
  in_work: { label: 'In the shop', tone: 'success', explain: 'The shop has the parts and is working on them.' },
  inspection_submitted: { label: 'Results to review', tone: 'warning', explain: 'The shop sent its measured results for you to check.' },
  completed: { label: 'Completed', tone: 'success', explain: 'You accepted the results and the shop was paid.' },
  disputed: { label: 'In dispute', tone: 'danger', explain: 'An administrator is looking at the disagreement.' },
  resolved: { label: 'Dispute decided', tone: 'neutral', explain: 'An administrator decided the dispute.' },
  cancelled: { label: 'Cancelled', tone: 'quiet', explain: 'This job was cancelled.' },
};

/** A bid's status. */
export const BID_STATUS: Glossary<BidStatus> = {
  active: { label: 'Active', tone: 'active', explain: 'The builder can still accept it.' },
  accepted: { label: 'Accepted', tone: 'success', explain: 'The builder accepted this bid.' },
  declined: { label: 'Declined', tone: 'quiet', explain: 'The builder declined this bid, or accepted another.' },
  withdrawn: { label: 'Withdrawn', tone: 'quiet', explain: 'The shop withdrew this bid.' },
};

/** An inspection record version's status: the same on the job page, the certificates and the evidence. */
export const RECORD_STATUS: Glossary<'submitted' | 'accepted' | 'rejected'> = {
  submitted: { label: 'Waiting for the builder’s answer', tone: 'warning' },
  accepted: { label: 'Accepted', tone: 'success' },
  rejected: { label: 'Changes asked', tone: 'danger', explain: 'The builder asked the shop to change the record.' },
};

/** A dispute's status. */
export const DISPUTE_STATUS: Glossary<'open' | 'resolved'> = {
  open: { label: 'Open', tone: 'warning', explain: 'An administrator decides; until then the payment stays held.' },
  resolved: { label: 'Decided', tone: 'neutral', explain: 'An administrator decided the dispute.' },
};

/** A payment's status (the payment for the bid, or for extra work). */
export const PAYMENT_STATUS: Glossary<'pending' | 'paid' | 'failed' | 'expired' | 'refunded'> = {
  pending: { label: 'Waiting', tone: 'warning', explain: 'The payment page is open; the money has not arrived.' },
  paid: { label: 'Paid', tone: 'success' },
  failed: { label: 'Failed', tone: 'danger' },
  expired: { label: 'Expired', tone: 'quiet', explain: 'The payment page closed before anything was paid.' },
  refunded: { label: 'Refunded', tone: 'neutral', explain: 'It arrived when it could no longer be used, and was refunded in full.' },
};

/** Extra work's status. */
export const EXTRA_WORK_STATUS: Glossary<'proposed' | 'approved' | 'paid' | 'declined'> = {
  proposed: { label: 'Waiting for the builder', tone: 'warning' },
  approved: { label: 'Agreed, waiting for payment', tone: 'warning' },
  paid: { label: 'Paid and held', tone: 'success' },
  declined: { label: 'Declined', tone: 'quiet' },
};

/** A job's status in the lower-case words a sentence needs: "Job in the shop", "Job awarded, payment due". */
export function jobStatusInSentence(status: string): string {
  const term = (JOB_STATUS as Readonly<Record<string, Term | undefined>>)[status];
  return term ? term.label.toLowerCase() : status;
}

/**
 * Names no screen or e-mail uses any more, each with the name that replaced
 * it. The glossary test looks for them in the client's and the mail's string
 * literals; keep a retired name here so it stays retired.
 */
export const RETIRED_NAMES: ReadonlyArray<{ retired: RegExp; use: string }> = [
  { retired: /\bin work\b/i, use: JOB_STATUS.in_work.label },
  { retired: /\bDispute settled\b/i, use: JOB_STATUS.resolved.label },
  { retired: /\bRejected by the builder\b|\b(reject|rejects|rejected|sent back) (it|this|the|version|with)\b/i, use: `${RECORD_STATUS.rejected.label} (to ask: “Ask for changes”)` },
  { retired: /\bchange orders?\b/i, use: NAMES.extraWork },
  { retired: /\bmilestones?\b/i, use: NAMES.progress },
  { retired: /\b(platform|service) fee\b|\bcommission\b|Tenthmark[’']s fee/i, use: NAMES.fee },
  { retired: /^Rejected\b|\bFee kept\b/, use: `${RECORD_STATUS.rejected.label}; ${NAMES.fee}` },
  { retired: /\bdashboard\b/i, use: 'the role’s home page name (HOME_PAGE_NAMES)' },
];

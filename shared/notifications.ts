/**
 * The kinds of notice Tenthmark gives: what shows in a person's notification
 * centre, and which e-mails they may turn off. One place decides which mails
 * must always go (money receipts, dispute decisions, the account's own mail).
 */

/** Notices in the notification centre, each written with the change it tells of. */
export const noticeKinds = [
  'bid_received',
  'bid_accepted',
  'results_submitted',
  'review_window_ending',
  'record_accepted',
  'record_rejected',
  'payment_held',
  'payment_released',
  'refund_sent',
  'dispute_opened',
  'dispute_answered',
  'dispute_decided',
] as const;
export type NoticeKind = (typeof noticeKinds)[number];

interface MailTopic {
  /** What the person reads beside the switch. */
  label: string;
  /** False for mail that must reach the person whatever they chose. */
  optional: boolean;
  /** The outbox templates (server/lib/mail/templates.ts) this topic covers. */
  templates: readonly string[];
}

/** Groups of e-mail a person can choose about, in the order the settings list them. */
export const mailTopics = {
  bids_on_my_jobs: { label: 'A shop bids on my job or revises its bid', optional: true, templates: ['new_bid', 'bid_revised'] },
  my_bids_decided: { label: 'A builder accepts or declines my bid', optional: true, templates: ['bid_accepted', 'bid_declined'] },
  jobs_i_bid_on: { label: 'A job I bid on is changed or cancelled', optional: true, templates: ['job_changed', 'job_cancelled'] },
  matching_jobs: { label: 'A new job matches my shop', optional: true, templates: ['matching_job'] },
  results_to_review: { label: 'Inspection results wait for my review, or the review window is held', optional: true, templates: ['inspection_submitted', 'review_window_held'] },
  review_window_ending: { label: 'The review window is about to close', optional: true, templates: ['review_reminder'] },
  results_decided: { label: 'Inspection results are accepted, or changes are asked', optional: true, templates: ['inspection_decided'] },
  unread_messages: { label: 'Messages I have not read', optional: true, templates: ['unread_digest'] },
  disputes_opened_and_answered: { label: 'A dispute is opened or answered', optional: true, templates: ['dispute_opened', 'dispute_answered'] },
  reviews_of_me: { label: 'Someone reviews me', optional: true, templates: ['new_review'] },
  money_receipts: {
    label: 'Receipts: payments held, payouts sent and refunds',
    optional: false,
    templates: ['payment_receipt', 'payout_sent', 'refund_sent', 'late_payment_refunded'],
  },
  dispute_decisions: { label: 'Decisions on disputes', optional: false, templates: ['dispute_decided'] },
  account_and_security: {
    label: 'My account: e-mail confirmation, password reset and changes, invitations, suspension',
    optional: false,
    templates: ['verify_email', 'reset_password', 'password_changed', 'admin_invite', 'account_suspended'],
  },
} as const satisfies Record<string, MailTopic>;
export type MailTopicKind = keyof typeof mailTopics;

export const mailTopicKinds = Object.keys(mailTopics) as [MailTopicKind, ...MailTopicKind[]];

/** The topic a template belongs to; undefined for a template no topic names (it always goes). */
export function mailTopicOf(template: string): MailTopicKind | undefined {
  return mailTopicKinds.find((kind) => (mailTopics[kind].templates as readonly string[]).includes(template));
}

/** The topics a person may turn off; every other mail always goes. */
export const optionalMailTopics = mailTopicKinds.filter((kind) => mailTopics[kind].optional);

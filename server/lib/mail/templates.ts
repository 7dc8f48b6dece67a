/**
 * E-mail templates in the product's look: a plain-text part and an HTML part
 * built from the same words. Inline styles only, since mail clients drop <style>.
 * Statuses and the names of things come from the glossary (shared/glossary.ts).
 */
import { NAMES, RECORD_STATUS } from '../../../shared/glossary';

export interface RenderedMail {
  template: string;
  subject: string;
  text: string;
  html: string;
}

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!);

interface Layout {
  template: string;
  subject: string;
  greeting: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
}

function render(layout: Layout): RenderedMail {
  const text = [
    layout.greeting,
    '',
    ...layout.paragraphs.flatMap((p) => [p, '']),
    ...(layout.action ? [`${layout.action.label}: ${layout.action.url}`, ''] : []),
    ...(layout.footnote ? [layout.footnote, ''] : []),
    '— Tenthmark, machining jobs measured and paid on acceptance',
  ].join('\n');

  const button = layout.action
    ? `<p style="margin:24px 0"><a href="${escapeHtml(layout.action.url)}" style="background:#1d4e6b;color:#ffffff;text-decoration:none;font-weight:700;padding:12px 20px;border-radius:6px;display:inline-block">${escapeHtml(layout.action.label)}</a></p>
<p style="font-size:13px;color:#4a5a66">If the button does not work, paste this address into your browser:<br><span style="word-break:break-all">${escapeHtml(layout.action.url)}</span></p>`
    : '';
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(layout.subject)}</title></head>
<body style="margin:0;background:#f3f1ec;font-family:Manrope,Segoe UI,Helvetica,Arial,sans-serif;color:#16232d">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="padding:24px 0"><tr><td align="center">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="background:#ffffff;border-radius:10px;border-top:6px solid #b8741a">
<tr><td style="padding:28px 32px 8px;font-size:20px;font-weight:800;letter-spacing:0.02em;color:#1d4e6b">Tenthmark</td></tr>
<tr><td style="padding:8px 32px 28px;font-size:15px;line-height:1.6">
<p>${escapeHtml(layout.greeting)}</p>
${layout.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
${button}
${layout.footnote ? `<p style="font-size:13px;color:#4a5a66">${escapeHtml(layout.footnote)}</p>` : ''}
</td></tr></table>
<p style="font-size:12px;color:#4a5a66">Tenthmark: machining jobs measured and paid on acceptance.</p>
</td></tr></table></body></html>`;
  return { template: layout.template, subject: layout.subject, text, html };
}

export function verifyEmailMail(input: { displayName: string; url: string; hours: number }): RenderedMail {
  return render({
    template: 'verify_email',
    subject: 'Confirm your e-mail address for Tenthmark',
    greeting: `Hello ${input.displayName},`,
    paragraphs: ['Please confirm that this is your e-mail address, so shops and builders can reach you about your jobs.'],
    action: { label: 'Confirm my e-mail address', url: input.url },
    footnote: `The link works once and expires in ${input.hours} hours. If you did not sign up, ignore this message.`,
  });
}

export function passwordResetMail(input: { displayName: string; url: string; minutes: number }): RenderedMail {
  return render({
    template: 'reset_password',
    subject: 'Choose a new Tenthmark password',
    greeting: `Hello ${input.displayName},`,
    paragraphs: ['Someone asked to reset the password of your Tenthmark account. If it was you, choose a new password here.'],
    action: { label: 'Choose a new password', url: input.url },
    footnote: `The link works once and expires in ${input.minutes} minutes. If you did not ask, ignore this message; your password stays as it is.`,
  });
}

export function passwordChangedMail(input: { displayName: string }): RenderedMail {
  return render({
    template: 'password_changed',
    subject: 'Your Tenthmark password was changed',
    greeting: `Hello ${input.displayName},`,
    paragraphs: [
      'The password of your Tenthmark account was just changed, and every other signed-in device was signed out.',
      'If this was not you, reset your password straight away and tell us.',
    ],
  });
}

/** Sent to the new address: the change happens only when this link is followed. */
export function confirmNewEmailMail(input: { displayName: string; url: string; hours: number }): RenderedMail {
  return render({
    template: 'confirm_new_email',
    subject: 'Confirm your new e-mail address for Tenthmark',
    greeting: `Hello ${input.displayName},`,
    paragraphs: ['You asked to move your Tenthmark account to this e-mail address. It changes once you confirm here; until then your old address stays in use.'],
    action: { label: 'Use this address', url: input.url },
    footnote: `The link works once and expires in ${input.hours} hours. If you did not ask for this, ignore this message.`,
  });
}

/** Sent to the old address once the change is confirmed. */
export function emailChangedMail(input: { displayName: string; newEmail: string }): RenderedMail {
  return render({
    template: 'email_changed',
    subject: 'Your Tenthmark e-mail address was changed',
    greeting: `Hello ${input.displayName},`,
    paragraphs: [
      `Your Tenthmark account now uses ${input.newEmail}. Mail about your jobs goes there from now on, and you sign in with it.`,
      'If this was not you, reset your password from the sign-in page straight away and write to us from the help page.',
    ],
  });
}

/** Sent to the address an account had, once the person has deleted it. */
export function accountClosedMail(input: { displayName: string }): RenderedMail {
  return render({
    template: 'account_closed',
    subject: 'Your Tenthmark account is deleted',
    greeting: `Hello ${input.displayName},`,
    paragraphs: [
      'Your Tenthmark account is deleted: your name, e-mail address and password are removed and every signed-in device is signed out.',
      'The jobs, records, reviews and money records you took part in stay, under the name "Deleted account", for the other party and for the books.',
      'This is the last message we send to this address.',
    ],
  });
}

export function adminInviteMail(input: { displayName: string; invitedBy: string; url: string; hours: number }): RenderedMail {
  return render({
    template: 'admin_invite',
    subject: 'You have a Tenthmark staff account',
    greeting: `Hello ${input.displayName},`,
    paragraphs: [`${input.invitedBy} made you an administrator of Tenthmark. Choose a password to start.`],
    action: { label: 'Choose my password', url: input.url },
    footnote: `The link works once and expires in ${input.hours} hours.`,
  });
}

const money = (cents: number) => new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100);

export function newBidMail(input: { builderName: string; shopName: string; jobTitle: string; totalCents: number; turnaroundDays: number; url: string }): RenderedMail {
  return render({
    template: 'new_bid',
    subject: `New bid on “${input.jobTitle}”`,
    greeting: `Hello ${input.builderName},`,
    paragraphs: [`${input.shopName} bid ${money(input.totalCents)} with a turnaround of ${input.turnaroundDays} working days on your job “${input.jobTitle}”.`],
    action: { label: 'Compare the bids', url: input.url },
  });
}

export function bidRevisedMail(input: { builderName: string; shopName: string; jobTitle: string; totalCents: number; turnaroundDays: number; url: string }): RenderedMail {
  return render({
    template: 'bid_revised',
    subject: `A bid on “${input.jobTitle}” changed`,
    greeting: `Hello ${input.builderName},`,
    paragraphs: [`${input.shopName} revised its bid on “${input.jobTitle}”: now ${money(input.totalCents)}, ${input.turnaroundDays} working days.`],
    action: { label: 'Compare the bids', url: input.url },
  });
}

export function bidAcceptedMail(input: { shopName: string; jobTitle: string; totalCents: number; url: string }): RenderedMail {
  return render({
    template: 'bid_accepted',
    subject: `Your bid on “${input.jobTitle}” was accepted`,
    greeting: `Hello ${input.shopName},`,
    paragraphs: [
      `The builder accepted your bid of ${money(input.totalCents)} on “${input.jobTitle}”.`,
      'The builder pays next; the payment is held until they accept your inspection record. Wait for the payment before you start work.',
    ],
    action: { label: 'Open the job', url: input.url },
  });
}

export function bidDeclinedMail(input: { shopName: string; jobTitle: string; reason?: string; url: string }): RenderedMail {
  return render({
    template: 'bid_declined',
    subject: `Your bid on “${input.jobTitle}” was not chosen`,
    greeting: `Hello ${input.shopName},`,
    paragraphs: [
      `The builder of “${input.jobTitle}” did not choose your bid.`,
      ...(input.reason ? [`Their note: ${input.reason}`] : []),
      'Thank you for bidding; there are more jobs on the board.',
    ],
    action: { label: 'Open the job board', url: input.url },
  });
}

export function jobChangedMail(input: { shopName: string; jobTitle: string; url: string }): RenderedMail {
  return render({
    template: 'job_changed',
    subject: `“${input.jobTitle}” was changed`,
    greeting: `Hello ${input.shopName},`,
    paragraphs: [`The builder changed the job “${input.jobTitle}” that you bid on. Check the new details; revise your bid if the work changed.`],
    action: { label: 'See the job', url: input.url },
  });
}

export function jobCancelledMail(input: { shopName: string; jobTitle: string }): RenderedMail {
  return render({
    template: 'job_cancelled',
    subject: `“${input.jobTitle}” was cancelled`,
    greeting: `Hello ${input.shopName},`,
    paragraphs: [`The builder cancelled the job “${input.jobTitle}” that you bid on. Your bid is closed; nothing more is needed from you.`],
  });
}

export function matchingJobMail(input: { shopName: string; jobTitle: string; summary: string; url: string }): RenderedMail {
  return render({
    template: 'matching_job',
    subject: `A new job that fits your shop: “${input.jobTitle}”`,
    greeting: `Hello ${input.shopName},`,
    paragraphs: [`A builder just posted work your shop does: ${input.summary}.`],
    action: { label: 'See the job', url: input.url },
    footnote: 'You get these because your shop profile asks for matching jobs. Turn them off there at any time.',
  });
}

export function unreadDigestMail(input: { displayName: string; otherName: string; jobTitle: string; unread: number; url: string }): RenderedMail {
  const count = input.unread === 1 ? 'a message' : `${input.unread} messages`;
  return render({
    template: 'unread_digest',
    subject: `${input.otherName} sent you ${count} about “${input.jobTitle}”`,
    greeting: `Hello ${input.displayName},`,
    paragraphs: [`You have ${count} from ${input.otherName} about “${input.jobTitle}” waiting unread.`],
    action: { label: 'Read and reply', url: input.url },
    footnote: 'We send one reminder per conversation, not one per message.',
  });
}

export function paymentReceiptMail(input: { name: string; side: 'builder' | 'shop'; jobTitle: string; amountCents: number; what: string; url: string }): RenderedMail {
  return render({
    template: 'payment_receipt',
    subject: `Payment received for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs:
      input.side === 'builder'
        ? [`We received your payment of ${money(input.amountCents)} for ${input.what} on “${input.jobTitle}”.`, 'It is held until you accept the shop’s inspection record; then it goes to the shop.']
        : [`The builder paid ${money(input.amountCents)} for ${input.what} on “${input.jobTitle}”.`, 'Tenthmark holds it while you work. When the builder accepts your inspection record (or the review window ends without an answer), it goes to your payout account, less the Tenthmark fee.'],
    action: { label: 'Open the job', url: input.url },
  });
}

export function payoutSentMail(input: { name: string; jobTitle: string; amountCents: number; feeCents: number; url: string }): RenderedMail {
  return render({
    template: 'payout_sent',
    subject: `${money(input.amountCents)} is on its way for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [`We sent ${money(input.amountCents)} to your payout account for “${input.jobTitle}” (${NAMES.fee}: ${money(input.feeCents)}).`],
    action: { label: 'Open the job', url: input.url },
  });
}

export function refundSentMail(input: { name: string; jobTitle: string; amountCents: number; url: string }): RenderedMail {
  return render({
    template: 'refund_sent',
    subject: `${money(input.amountCents)} refunded for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [`We refunded ${money(input.amountCents)} to your card for “${input.jobTitle}”. Banks take a few days to show it.`],
    action: { label: 'Open the job', url: input.url },
  });
}

/** Why a payment that came in could not be used. */
export type LatePaymentReason = 'job_cancelled' | 'job_finished' | 'already_paid' | 'change_order_declined';

const latePaymentWhy: Record<LatePaymentReason, string> = {
  job_cancelled: 'after the job was cancelled',
  job_finished: 'after the job’s money was already settled',
  already_paid: 'for something that was already paid',
  change_order_declined: 'for extra work that had been declined',
};

export function latePaymentRefundedMail(input: {
  name: string;
  side: 'builder' | 'shop';
  jobTitle: string;
  amountCents: number;
  what: string;
  reason: LatePaymentReason;
  url: string;
}): RenderedMail {
  const why = latePaymentWhy[input.reason];
  return render({
    template: 'late_payment_refunded',
    subject: `Payment of ${money(input.amountCents)} for “${input.jobTitle}” refunded`,
    greeting: `Hello ${input.name},`,
    paragraphs:
      input.side === 'builder'
        ? [
            `A payment of ${money(input.amountCents)} for ${input.what} on “${input.jobTitle}” reached us ${why}, so it cannot be used.`,
            'We are sending all of it back to the card you paid with; Tenthmark keeps nothing. Banks take a few days to show a refund.',
          ]
        : [
            `The builder’s payment of ${money(input.amountCents)} for ${input.what} on “${input.jobTitle}” reached us ${why}, so we are sending it back to the builder in full.`,
            'Nothing else changes for you, and there is nothing you need to do.',
          ],
    action: { label: 'Open the job', url: input.url },
  });
}

export function inspectionSubmittedMail(input: { name: string; shopName: string; jobTitle: string; version: number; pass: boolean; autoAccept?: boolean; dueText: string; url: string }): RenderedMail {
  return render({
    template: 'inspection_submitted',
    subject: `Inspection record ${input.version > 1 ? `version ${input.version} ` : ''}for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [
      `${input.shopName} submitted the measured inspection record for “${input.jobTitle}”. By the job’s limits it ${input.pass ? 'passes every check' : 'fails at least one check'}.`,
      input.autoAccept === false
        ? `Accept it to release the held payment to the shop, or ask for changes, with your reasons. Because at least one check does not conform, it is never accepted without you: after ${input.dueText} it still waits for your answer.`
        : `Accept it to release the held payment to the shop, or ask for changes, with your reasons. With no answer by ${input.dueText}, it counts as accepted.`,
    ],
    action: { label: 'Review the record', url: input.url },
  });
}

export function reviewReminderMail(input: { name: string; jobTitle: string; dueText: string; autoAccept?: boolean; url: string }): RenderedMail {
  return render({
    template: 'review_reminder',
    subject: `Reminder: the inspection record for “${input.jobTitle}” is waiting`,
    greeting: `Hello ${input.name},`,
    paragraphs: [
      input.autoAccept === false
        ? `The review window for the inspection record for “${input.jobTitle}” ends on ${input.dueText}. At least one check does not conform, so it is not accepted without you: please accept it (naming those checks) or ask for changes, with your reasons.`
        : `The inspection record for “${input.jobTitle}” counts as accepted on ${input.dueText} unless you answer before then.`,
    ],
    action: { label: 'Review the record', url: input.url },
  });
}

/**
 * The review window ended on a record with a check that does not conform: it
 * was not accepted by itself. The builder, the shop and every admin are told.
 */
export function reviewWindowHeldMail(input: { name: string; reader: 'builder' | 'shop' | 'admin'; jobTitle: string; checks: string[]; url: string }): RenderedMail {
  const list = input.checks.join('; ');
  const next = {
    builder: 'The record waits for you: accept it, confirming each of those checks, or ask for changes, with your reasons. The payment stays held until then.',
    shop: 'The record waits for the builder’s answer and the payment stays held. You may talk it over with the builder on the job page.',
    admin: 'Nothing was paid out. The record waits for the builder; look in if it stays unanswered.',
  }[input.reader];
  return render({
    template: 'review_window_held',
    subject: `Not accepted by itself: the inspection record for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [
      `The review window for the inspection record for “${input.jobTitle}” has ended. It was not accepted automatically, because these checks do not conform: ${list}.`,
      next,
    ],
    action: { label: 'Open the job', url: input.url },
  });
}

export function inspectionDecidedMail(input: { name: string; jobTitle: string; decision: 'accepted' | 'accepted_by_window' | 'rejected'; reasons?: string; url: string }): RenderedMail {
  const words = {
    accepted: 'The builder accepted your inspection record. The held payment is on its way to your payout account, less the Tenthmark fee.',
    accepted_by_window: 'The review window ended with no answer, so your inspection record counts as accepted. The held payment is on its way to your payout account, less the Tenthmark fee.',
    rejected: 'The builder did not accept your inspection record yet and asks for another look.',
  }[input.decision];
  return render({
    template: `inspection_${input.decision}`,
    subject: input.decision === 'rejected' ? `${RECORD_STATUS.rejected.label} on “${input.jobTitle}”` : `“${input.jobTitle}” is accepted`,
    greeting: `Hello ${input.name},`,
    paragraphs: [words, ...(input.reasons ? [`Their reasons: ${input.reasons}`] : [])],
    action: { label: 'Open the job', url: input.url },
  });
}

const sideWords = { builder: 'the builder', shop: 'the shop' } as const;

export function disputeOpenedMail(input: { name: string; openedBy: 'builder' | 'shop'; isOpener: boolean; jobTitle: string; reason: string; url: string }): RenderedMail {
  return render({
    template: 'dispute_opened',
    subject: `A dispute is open on “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [
      input.isOpener
        ? `You opened a dispute on “${input.jobTitle}”: ${input.reason}.`
        : `${sideWords[input.openedBy][0].toUpperCase()}${sideWords[input.openedBy].slice(1)} opened a dispute on “${input.jobTitle}”: ${input.reason}.`,
      'The payment stays held by Tenthmark until an administrator decides. Nothing is paid out or refunded before then.',
      input.isOpener ? 'The other side can now answer. An administrator reads both sides and the job’s record before deciding.' : 'Please answer with your side of it on the job page; an administrator reads both sides and the job’s record before deciding.',
    ],
    action: { label: 'Open the job', url: input.url },
  });
}

export function disputeAnsweredMail(input: { name: string; jobTitle: string; url: string }): RenderedMail {
  return render({
    template: 'dispute_answered',
    subject: `Your dispute on “${input.jobTitle}” has an answer`,
    greeting: `Hello ${input.name},`,
    paragraphs: [`The other side answered your dispute on “${input.jobTitle}”. An administrator will decide with both statements and the job’s record in front of them.`],
    action: { label: 'Read the answer', url: input.url },
  });
}

export function disputeDecidedMail(input: { name: string; jobTitle: string; outcome: 'release' | 'refund' | 'split'; shopCents: number; refundCents: number; decision: string; url: string }): RenderedMail {
  const result =
    input.outcome === 'release'
      ? `The held payment of ${money(input.shopCents)} goes to the shop (less the Tenthmark fee).`
      : input.outcome === 'refund'
        ? `The held payment of ${money(input.refundCents)} goes back to the builder.`
        : `The held payment is split: ${money(input.shopCents)} to the shop (less the Tenthmark fee) and ${money(input.refundCents)} back to the builder.`;
  return render({
    template: 'dispute_decided',
    subject: `The dispute on “${input.jobTitle}” is decided`,
    greeting: `Hello ${input.name},`,
    paragraphs: [result, 'The administrator’s decision:', input.decision],
    action: { label: 'Open the job', url: input.url },
    footnote: 'Receipts for the money follow as each payment or refund is made.',
  });
}

export function accountSuspendedMail(input: { name: string; reason: string; helpUrl: string; supportEmail: string }): RenderedMail {
  return render({
    template: 'account_suspended',
    subject: 'Your Tenthmark account is suspended',
    greeting: `Hello ${input.name},`,
    paragraphs: [
      `An administrator suspended your account: ${input.reason}`,
      `You have been signed out and cannot sign in until the account is reinstated. If you think this is a mistake, write to ${input.supportEmail}; replies to this e-mail are not read.`,
    ],
    action: { label: 'How to reach us', url: input.helpUrl },
  });
}

export function newReviewMail(input: { name: string; authorName: string; jobTitle: string; rating: number; url: string }): RenderedMail {
  return render({
    template: 'new_review',
    subject: `${input.authorName} reviewed you for “${input.jobTitle}”`,
    greeting: `Hello ${input.name},`,
    paragraphs: [`${input.authorName} gave you ${input.rating} of 5 for “${input.jobTitle}”.`],
    action: { label: 'Read the review', url: input.url },
  });
}

import { and, eq, ne } from 'drizzle-orm';
import { netOf } from '../../../shared/money';
import type { Bid, BidLine } from '../../../shared/schemas/bids';
import type { Database } from '../../db/client';
import { changeOrders, moneyMoves, payments, type User } from '../../db/schema';
import { conflict, notFound } from '../../lib/errors';
import { storedDocument } from '../../lib/pdf/stored';
import type { FileStorage } from '../../lib/storage';
import { bidWithHistory } from '../bids/bids.service';
import { mustSeeWork, partiesOf, type JobParties } from '../jobs/job-access';
import { invoiceNumberOf, receiptNumberOf } from '../payments/document-numbers';
import { jobBalance } from '../payments/ledger';
import { invoicePdf, quotePdf, receiptPdf, type DocumentParties } from './documents.pdf';

export interface DocumentDeps {
  db: Database;
  appUrl: string;
  /** Where printed receipts and invoices are kept (server/lib/pdf/stored.ts). */
  storage: FileStorage;
}

/** The bid's lines and shop, read as `user` (who has already been let see the job's work or the bid). */
const bidOf = async (deps: DocumentDeps, user: User, bidId: string): Promise<Bid> => (await bidWithHistory(deps, user, bidId)).bid;

function partiesFor(parties: JobParties, bid: Bid): DocumentParties {
  return {
    jobId: parties.job.id,
    jobTitle: parties.job.title,
    builderName: parties.builder.displayName,
    builderEmail: parties.builder.email,
    shopName: bid.shop.name,
    shopPlace: [bid.shop.city, bid.shop.region].filter(Boolean).join(', '),
  };
}

const orderLine = (order: { description: string; amountCents: number }): BidLine => ({
  operation: null,
  description: `Extra work: ${order.description}`,
  quantity: 1,
  unitPriceCents: order.amountCents,
  amountCents: order.amountCents,
});

/**
 * The receipt of one paid payment, for the builder who paid and admins; to
 * anyone else (the shop included) there is no such payment. Its number was
 * given when the payment was recorded (or is given now, once, for a payment
 * recorded before receipts had numbers).
 */
export async function receiptFor(deps: DocumentDeps, user: User, paymentId: string): Promise<{ number: string; pdf: Buffer }> {
  const [payment] = await deps.db.select().from(payments).where(eq(payments.id, paymentId));
  if (!payment) throw notFound('No payment with that id.');
  const parties = await partiesOf(deps.db, payment.jobId, { payment });
  if (user.role !== 'admin' && parties.builder.id !== user.id) throw notFound('No payment with that id.');
  if (payment.status !== 'paid' || !payment.paidAt) throw conflict('This payment has not been made, so it has no receipt.', 'not_paid');
  const [order] = payment.changeOrderId ? await deps.db.select().from(changeOrders).where(eq(changeOrders.id, payment.changeOrderId)) : [];
  const bidId = payment.bidId ?? parties.job.awardedBidId;
  if (!bidId) throw conflict('This job has no accepted bid.', 'job_not_awarded');
  const bid = await bidOf(deps, user, bidId);
  const number = await receiptNumberOf(deps.db, payment.id);
  const data = {
    ...partiesFor(parties, bid),
    number,
    paidAt: payment.paidAt,
    what: payment.kind,
    lines: order ? [orderLine(order)] : bid.lineItems,
    totalCents: payment.amountCents,
    currency: payment.currency,
    heldCents: (await jobBalance(deps.db, payment.jobId)).held,
  };
  const pdf = await storedDocument(deps.storage, 'receipts', payment.id, data, receiptPdf);
  return { number, pdf };
}

/**
 * The shop's invoice for a finished job: for its builder, the shop that did
 * the work and admins, once the job is completed or a dispute ended with
 * money to the shop (409 before). The shop's and an admin's copies show the
 * fee and the net payout, taken from the movements that paid the shop out.
 */
export async function invoiceFor(deps: DocumentDeps, user: User, jobId: string): Promise<{ number: string; pdf: Buffer }> {
  const parties = await partiesOf(deps.db, jobId);
  mustSeeWork(parties, user);
  const { job } = parties;
  const moves = await deps.db.select().from(moneyMoves).where(and(eq(moneyMoves.jobId, jobId), ne(moneyMoves.kind, 'late_refund')));
  const releases = moves.filter((m) => m.kind === 'release');
  const finished = job.status === 'completed' || (job.status === 'resolved' && releases.length > 0);
  if (!finished || !job.awardedBidId) throw conflict('The invoice is issued once the job is completed.', 'job_not_finished');
  const [bid, paid, orders] = await Promise.all([
    bidOf(deps, user, job.awardedBidId),
    deps.db.select().from(payments).where(and(eq(payments.jobId, jobId), eq(payments.status, 'paid'))),
    deps.db.select().from(changeOrders).where(and(eq(changeOrders.jobId, jobId), eq(changeOrders.status, 'paid'))),
  ]);
  const totalPaidCents = paid.reduce((sum, p) => sum + p.amountCents, 0);
  const refundedCents = moves.filter((m) => m.kind === 'refund').reduce((sum, m) => sum + m.amountCents, 0);
  const feeBps = job.feeBps ?? 0;
  // The fee and net the release took; a job marked finished before its release shows what the release will take, by the same rule.
  const shopCopy =
    user.role === 'builder'
      ? null
      : releases.length > 0
        ? { feeBps, feeCents: releases.reduce((sum, m) => sum + m.feeCents, 0), netCents: releases.reduce((sum, m) => sum + m.amountCents, 0) }
        : { feeBps, ...netOf(totalPaidCents - refundedCents, feeBps) };
  const { number, issuedAt } = await invoiceNumberOf(deps.db, jobId);
  const data = {
    ...partiesFor(parties, bid),
    number,
    issuedAt,
    finishedAt: job.updatedAt,
    lines: [...bid.lineItems, ...orders.map(orderLine)],
    totalPaidCents,
    refundedCents,
    currency: paid[0]?.currency ?? 'usd',
    shopCopy,
  };
  // The builder's copy and the shop's (with the fee) differ in their data, so each is kept under its own key.
  const pdf = await storedDocument(deps.storage, 'invoices', jobId, data, invoicePdf);
  return { number, pdf };
}

/**
 * A bid as the shop's quote, for the bid's shop, the job's builder and admins
 * (404 to anyone else, as the bid itself). Printed on each request, not
 * stored: it follows a bid still open to change (its status, its validity),
 * where receipts, invoices and certificates record what is settled.
 */
export async function quoteFor(deps: DocumentDeps, user: User, bidId: string): Promise<Buffer> {
  const bid = await bidOf(deps, user, bidId);
  const parties = await partiesOf(deps.db, bid.jobId);
  return quotePdf({
    ...partiesFor(parties, bid),
    version: bid.version,
    status: bid.status,
    createdAt: new Date(bid.updatedAt),
    lines: bid.lineItems,
    totalCents: bid.totalCents,
    turnaroundDays: bid.turnaroundDays,
    validUntil: bid.validUntil,
    note: bid.note,
  });
}

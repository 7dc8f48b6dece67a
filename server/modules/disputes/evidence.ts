import { asc, eq, inArray } from 'drizzle-orm';
import type { DisputeCase, EvidenceItem } from '../../../shared/schemas/disputes';
import type { InspectionResults } from '../../../shared/schemas/inspection';
import type { Database } from '../../db/client';
import { bids, changeOrders, inspectionRecords, ledgerEntries, messages, milestones, threads } from '../../db/schema';
import { photosOf, photoUrl } from '../jobs/jobs.repository';
import { partiesOf } from '../jobs/job-access';
import { photosOfMessages } from '../messages/message-photos.repository';
import { photosOfMilestones } from '../milestones/milestone-photos';
import { moneyView } from '../payments/payments.service';
import { findDispute, toDispute } from './disputes.service';

/**
 * Everything that happened on a disputed job, in one timeline for the admin:
 * the dispute itself, the conversation between the two sides, the shop's
 * progress log, every inspection version with its results, change orders,
 * photos and each movement of money.
 */
export async function disputeCase(db: Database, disputeId: string): Promise<DisputeCase> {
  const row = await findDispute(db, disputeId);
  const dispute = toDispute(row);
  const parties = await partiesOf(db, row.jobId);
  const { job, builder, shop } = parties;
  const sideOfAuthor = (authorId: string) => (authorId === builder.id ? 'builder' : 'shop') as 'builder' | 'shop';

  const threadRows = shop
    ? await db.select({ id: threads.id }).from(threads).where(eq(threads.jobId, job.id)).then((rows) => rows.map((r) => r.id))
    : [];
  const [messageRows, milestoneRows, recordRows, orderRows, ledgerRows, jobPhotoRows, money, acceptedBid] = await Promise.all([
    threadRows.length
      ? db.select().from(messages).where(inArray(messages.threadId, threadRows)).orderBy(asc(messages.createdAt))
      : Promise.resolve([] as Array<typeof messages.$inferSelect>),
    db.select().from(milestones).where(eq(milestones.jobId, job.id)).orderBy(asc(milestones.createdAt)),
    db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id)).orderBy(asc(inspectionRecords.version)),
    db.select().from(changeOrders).where(eq(changeOrders.jobId, job.id)).orderBy(asc(changeOrders.createdAt)),
    db.select().from(ledgerEntries).where(eq(ledgerEntries.jobId, job.id)).orderBy(asc(ledgerEntries.id)),
    photosOf(db, job.id),
    moneyView(db, job.id),
    job.awardedBidId ? db.select({ totalCents: bids.totalCents }).from(bids).where(eq(bids.id, job.awardedBidId)).then((r) => r[0]) : Promise.resolve(undefined),
  ]);
  // Only the conversation between the builder and the shop doing the work is evidence; other bidders' threads are not.
  const partyMessages = messageRows.filter((m) => m.authorId === builder.id || m.authorId === shop?.userId);
  const [messagePhotos, milestonePhotos] = await Promise.all([photosOfMessages(db, partyMessages.map((m) => m.id)), photosOfMilestones(db, milestoneRows.map((m) => m.id))]);

  const timeline: EvidenceItem[] = [];
  if (jobPhotoRows.length) {
    timeline.push({
      kind: 'job_photo',
      at: (job.publishedAt ?? job.createdAt).toISOString(),
      photos: jobPhotoRows.map((p) => ({ id: p.id, width: p.width, height: p.height, thumbUrl: photoUrl(job.id, p.id, 'thumb'), largeUrl: photoUrl(job.id, p.id, 'large') })),
    });
  }
  for (const m of partyMessages) {
    const by = sideOfAuthor(m.authorId);
    timeline.push({ kind: 'message', at: m.createdAt.toISOString(), by, authorName: by === 'builder' ? builder.displayName : shop!.name, body: m.body, photos: messagePhotos.get(m.id) ?? [] });
  }
  for (const m of milestoneRows) {
    timeline.push({ kind: 'milestone', at: m.createdAt.toISOString(), milestone: m.kind, operation: m.operation, note: m.note, carrier: m.carrier, trackingNumber: m.trackingNumber, photos: milestonePhotos.get(m.id) ?? [] });
  }
  for (const r of recordRows) {
    timeline.push({
      kind: 'inspection',
      at: r.submittedAt.toISOString(),
      version: r.version,
      status: r.status,
      pass: r.pass,
      results: r.results as InspectionResults,
      decidedAt: r.decidedAt?.toISOString() ?? null,
      rejectReasons: r.rejectReasons,
    });
  }
  for (const o of orderRows) timeline.push({ kind: 'change_order', at: o.createdAt.toISOString(), description: o.description, amountCents: o.amountCents, status: o.status });
  for (const l of ledgerRows) timeline.push({ kind: 'money', at: l.createdAt.toISOString(), entry: l.kind, amountCents: l.amountCents, reference: l.reference });
  timeline.push({ kind: 'dispute_opened', at: dispute.openedAt, by: dispute.openedBy, reason: dispute.reason, statement: dispute.statement });
  if (dispute.response) timeline.push({ kind: 'dispute_answered', at: dispute.response.at, by: dispute.response.by, statement: dispute.response.statement });
  timeline.sort((a, b) => a.at.localeCompare(b.at));

  return {
    dispute,
    job: { id: job.id, title: job.title, status: job.status, engineFamily: job.engineFamily, cylinders: job.cylinders, acceptedTotalCents: acceptedBid?.totalCents ?? null, feeBps: job.feeBps },
    builder: { id: builder.id, name: builder.displayName, email: builder.email },
    shop: shop ? { id: shop.id, userId: shop.userId, name: shop.name, email: shop.email } : null,
    money,
    timeline,
  };
}

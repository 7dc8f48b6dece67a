import { and, asc, desc, eq, gt, sql } from 'drizzle-orm';
import { checksNotConforming, recordConforms } from '../../../shared/calc/conformance';
import { evaluateInspection } from '../../../shared/calc/inspection-record';
import { boreOperationCodes, findOperation, type OperationCode } from '../../../shared/catalogue';
import { formatDateTime } from '../../../shared/dates';
import type { AcceptInspectionInput, InspectionInput, InspectionResults, InspectionVersion, RejectInspectionInput } from '../../../shared/schemas/inspection';
import { HOT_TANK_ON_ALUMINIUM, SECTION_INPUT_KEYS, cleanMethodsFor, type InspectionSections } from '../../../shared/schemas/inspection-sections';
import type { JobInput } from '../../../shared/schemas/jobs';
import type { Database, Executor } from '../../db/client';
import { inspectionDrafts, inspectionRecords, jobs, milestones, users, type User } from '../../db/schema';
import { AppError, conflict } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { inspectionDecidedMail, inspectionSubmittedMail, reviewReminderMail, reviewWindowHeldMail } from '../../lib/mail/templates';
import { storedDocument } from '../../lib/pdf/stored';
import { scheduleTask } from '../../lib/scheduler';
import type { FileStorage } from '../../lib/storage';
import { releaseJob, type PaymentDeps } from '../payments/payments.service';
import { certificatePdf } from './certificate';
import { attachMilestonePhotos } from '../milestones/milestone-photos';
import { Notices } from '../notifications/notify';
import { mustBeJobsBuilder, mustBeWorkingShop, mustSeeWork, partiesOf, sideOf } from '../jobs/job-access';

export interface InspectionDeps extends PaymentDeps {
  reviewWindowMs: number;
  /** Where printed certificates are kept (server/lib/pdf/stored.ts). */
  storage: FileStorage;
}

type RecordRow = typeof inspectionRecords.$inferSelect;

/** A version as answered; `replacedBy` is the number of the version sent after it, when there is one. */
const toVersion = (row: RecordRow, replacedBy: number | null = null): InspectionVersion => ({
  id: row.id,
  version: row.version,
  status: row.status,
  input: row.input as InspectionInput,
  results: row.results as InspectionResults,
  submittedAt: row.submittedAt.toISOString(),
  decidedAt: row.decidedAt?.toISOString() ?? null,
  rejectReasons: row.rejectReasons,
  replacedBy,
});

export async function inspectionView(db: Database, user: User, jobId: string) {
  const parties = await partiesOf(db, jobId);
  mustSeeWork(parties, user);
  const rows = await db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, jobId)).orderBy(desc(inspectionRecords.version));
  let draft: Record<string, unknown> | null = null;
  if (sideOf(parties, user) === 'shop') {
    const [row] = await db.select().from(inspectionDrafts).where(eq(inspectionDrafts.jobId, jobId));
    draft = (row?.draft as Record<string, unknown>) ?? null;
  }
  const open = rows.find((r) => r.status === 'submitted');
  // A record with a check that does not conform is never accepted by the window; once the window has ended it simply waits for the builder.
  const autoAccept = open ? recordConforms(open.results as InspectionResults) : null;
  const reviewWindowEnded = open ? open.reviewDueAt.getTime() <= Date.now() : false;
  // Who did the work, for the certificate page (the same lines as the PDF).
  const shopPlace = await placeOfShop(db, parties.job.awardedBidId);
  const shop = parties.shop ? { name: parties.shop.name, place: shopPlace } : null;
  // Newest first: each version was replaced by the one listed before it.
  return { versions: rows.map((row, i) => toVersion(row, rows[i - 1]?.version ?? null)), draft, reviewDueAt: open?.reviewDueAt.toISOString() ?? null, autoAccept, reviewWindowEnded, shop };
}

/** The section of the record each kind of work has, in the input's `sections`. */
const SECTION_KEYS: Partial<Record<OperationCode, keyof InspectionSections>> = SECTION_INPUT_KEYS;

/**
 * A record answers the job it is for: the bore grid when the job orders bore
 * work (one row per cylinder), no section for work the job does not order, no
 * cleaning method that attacks the job's metal, and no record at all while a crack test has found a crack: that stops the work
 * until the builder agrees what to do, through extra work the shop proposes.
 */
function mustCoverTheJob(input: InspectionInput, spec: JobInput, cylinders: number) {
  const ordered = new Set<string>(spec.operations.map((op) => op.code));
  if (input.sections?.crackTest?.result === 'crack-found') {
    throw new AppError(
      'crack_found',
      'The crack test found a crack, so the record stops here. Propose extra work to the builder (what the repair or replacement takes and costs) and finish the record once it is agreed and done.',
      409,
      { 'sections.crackTest.result': 'A crack was found: propose extra work to the builder first.' },
    );
  }
  const clean = input.sections?.clean;
  if (clean && !cleanMethodsFor(spec.blockMaterial).includes(clean.method)) {
    throw new AppError('invalid_input', HOT_TANK_ON_ALUMINIUM, 400, { 'sections.clean.method': HOT_TANK_ON_ALUMINIUM });
  }
  const boreWork = spec.operations.some((op) => boreOperationCodes.includes(op.code));
  if (boreWork && !input.cylinders) {
    throw new AppError('invalid_input', 'This job orders work on the bores: enter the bore readings.', 400, { cylinders: `Enter readings for all ${cylinders} cylinders.` });
  }
  if (input.cylinders && input.cylinders.length !== cylinders) {
    throw new AppError('invalid_input', `This job has ${cylinders} cylinders; the record has ${input.cylinders.length}.`, 400, {
      cylinders: `Enter readings for all ${cylinders} cylinders.`,
    });
  }
  for (const [code, key] of Object.entries(SECTION_KEYS)) {
    if (input.sections?.[key] !== undefined && !ordered.has(code)) {
      throw new AppError('invalid_input', `This job does not ask for ${findOperation(code)!.name.toLowerCase()}; leave that section out.`, 400, { [`sections.${key}`]: 'The job does not ask for this work.' });
    }
  }
}

export async function saveDraft(db: Database, user: User, jobId: string, draft: Record<string, unknown>) {
  const parties = await partiesOf(db, jobId);
  mustBeWorkingShop(parties, user);
  // Only while the record is being written: a late save after submitting must not bring a draft back.
  if (parties.job.status !== 'in_work') throw conflict('There is no record being written for this job now.', 'job_not_in_work');
  if (JSON.stringify(draft).length > 2_000_000) throw new AppError('too_large', 'The draft is too large.', 413);
  const [row] = await db
    .insert(inspectionDrafts)
    .values({ jobId, draft })
    .onConflictDoUpdate({ target: inspectionDrafts.jobId, set: { draft, savedAt: new Date() } })
    .returning();
  return { savedAt: row.savedAt.toISOString() };
}

/**
 * The shop submits its readings. Everything is worked out again here from
 * the raw readings (nothing computed by a browser is taken), judged against
 * the job's spec, and stored with the readings as a new version.
 */
export async function submitInspection(deps: InspectionDeps, user: User, jobId: string, input: InspectionInput) {
  const notices = new Notices();
  const version = await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    mustBeWorkingShop(parties, user);
    const { job } = parties;
    if (job.status !== 'in_work') {
      throw conflict(
        job.status === 'inspection_submitted' ? 'A record is already waiting for the builder.' : 'Log “parts received” before the inspection record.',
        'job_not_in_work',
      );
    }
    const spec = job.spec as JobInput;
    mustCoverTheJob(input, spec, job.cylinders);
    const results = evaluateInspection(input, spec);
    const [{ next }] = await tx.select({ next: sql<number>`coalesce(max(${inspectionRecords.version}), 0)::int + 1` }).from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    const reviewDueAt = new Date(Date.now() + deps.reviewWindowMs);
    const [row] = await tx
      .insert(inspectionRecords)
      .values({ jobId: job.id, version: next, input, results, pass: results.pass, submittedBy: user.id, reviewDueAt })
      .returning();
    await tx.update(jobs).set({ status: 'inspection_submitted' }).where(eq(jobs.id, job.id));
    await tx.delete(inspectionDrafts).where(eq(inspectionDrafts.jobId, job.id));
    const [milestone] = await tx
      .insert(milestones)
      .values({ jobId: job.id, authorId: user.id, kind: 'inspection_submitted', note: `Version ${next}: ${results.pass ? 'within every limit' : 'outside at least one limit'}.` })
      .returning({ id: milestones.id });
    // The cleaning and crack-test photos go out with the record's own milestone, checked like any milestone photo.
    const photoIds = [...(input.sections?.clean?.photoIds ?? []), ...(input.sections?.crackTest?.photoIds ?? [])];
    if (photoIds.length > 0) await attachMilestonePhotos(tx, { jobId: job.id, userId: user.id, milestoneId: milestone.id, photoIds });
    const url = `${deps.appUrl}/jobs/${job.id}`;
    await enqueueMail(
      tx,
      parties.builder.email,
      inspectionSubmittedMail({ name: parties.builder.displayName, shopName: parties.shop!.name, jobTitle: job.title, version: next, pass: results.pass, autoAccept: recordConforms(results), dueText: formatDateTime(reviewDueAt), url }),
    );
    await notices.add(tx, parties.builder.id, 'results_submitted', {
      jobId: job.id,
      text: `${parties.shop!.name} submitted inspection results for “${job.title}” (version ${next}): review them by ${formatDateTime(reviewDueAt)}.`,
      href: `/jobs/${job.id}`,
    });
    const reminderAt = new Date(Math.max(Date.now(), reviewDueAt.getTime() - 24 * 60 * 60_000));
    await scheduleTask(tx, { kind: 'review-reminder', key: `review-reminder-${row.id}`, payload: { recordId: row.id }, runAt: reminderAt });
    await scheduleTask(tx, { kind: 'review-window-ended', key: `review-window-${row.id}`, payload: { recordId: row.id }, runAt: reviewDueAt });
    return toVersion(row);
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return version;
}

/** The newest version still waiting for the builder's answer, if any. */
async function waitingRecord(tx: Executor, jobId: string) {
  const [record] = await tx
    .select()
    .from(inspectionRecords)
    .where(and(eq(inspectionRecords.jobId, jobId), eq(inspectionRecords.status, 'submitted')))
    .orderBy(desc(inspectionRecords.version))
    .limit(1);
  return record;
}

const nothingToReview = () => conflict('There is no inspection record waiting for an answer.', 'nothing_to_review');

/**
 * Accepting (by the builder, or by the window running out) marks the record
 * accepted and the job completed in one transaction, then releases the held
 * payment; the release is keyed by payment, so it happens once.
 */
async function accept(deps: InspectionDeps, jobId: string, how: { by?: User; answer?: AcceptInspectionInput; window?: { recordId: string } }) {
  const notices = new Notices();
  const accepted = await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    const record = await waitingRecord(tx, jobId);
    if (parties.job.status !== 'inspection_submitted' || !record) {
      if (how.window) return null; // answered in time; nothing to do
      throw nothingToReview();
    }
    if (how.window && record.id !== how.window.recordId) return null;
    if (how.answer) mustBeTheVersionConfirmed(record, how.answer);
    const [row] = await tx
      .update(inspectionRecords)
      .set({ status: 'accepted', decidedAt: new Date(), decidedBy: how.by?.id ?? null, decidedHow: how.by ? 'builder' : 'review window' })
      .where(eq(inspectionRecords.id, record.id))
      .returning();
    await tx.update(jobs).set({ status: 'completed' }).where(eq(jobs.id, jobId));
    const url = `${deps.appUrl}/jobs/${jobId}`;
    const decision = how.by ? 'accepted' : 'accepted_by_window';
    if (parties.shop) await enqueueMail(tx, parties.shop.email, inspectionDecidedMail({ name: parties.shop.name, jobTitle: parties.job.title, decision, url }));
    if (!how.by) await enqueueMail(tx, parties.builder.email, inspectionDecidedMail({ name: parties.builder.displayName, jobTitle: parties.job.title, decision, url }));
    const accepted = how.by ? 'The builder accepted' : 'The review window closed and accepted';
    const notice = { jobId, text: `${accepted} the inspection results for “${parties.job.title}”.`, href: `/jobs/${jobId}` };
    if (parties.shop) await notices.add(tx, parties.shop.userId, 'record_accepted', notice);
    if (!how.by) await notices.add(tx, parties.builder.id, 'record_accepted', notice);
    return row;
  });
  notices.announce(deps.hub);
  if (!accepted) return null;
  await releaseJob(deps, jobId);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return toVersion(accepted);
}

/**
 * The builder's accept covers the version they read and the checks they
 * confirmed: another version waiting now (the record was answered and sent
 * again meanwhile) or a check that does not conform left unnamed is refused,
 * and nothing is paid.
 */
function mustBeTheVersionConfirmed(record: { version: number; results: unknown }, answer: AcceptInspectionInput) {
  mustBeTheVersionRead(record, answer.version, 'accept');
  const confirmed = new Set(answer.confirmedChecks ?? []);
  const missing = checksNotConforming(record.results as InspectionResults).filter((name) => !confirmed.has(name));
  if (missing.length > 0) {
    throw new AppError('checks_not_confirmed', `Confirm each check that does not conform before you accept: ${missing.join('; ')}.`, 409, {
      confirmedChecks: `Not confirmed: ${missing.join('; ')}.`,
    });
  }
}

/** The builder's answer (accept or ask for changes) covers the version they read: another version waiting now is refused (409 version_changed). */
function mustBeTheVersionRead(record: { version: number }, version: number, verb: 'accept' | 'answer') {
  if (record.version !== version) {
    throw new AppError('version_changed', `Version ${record.version} of the record is the one waiting now, not version ${version}: read it before you ${verb}.`, 409, {
      version: `Version ${record.version} is waiting now.`,
    });
  }
}

export async function acceptInspection(deps: InspectionDeps, user: User, jobId: string, answer: AcceptInspectionInput) {
  mustBeJobsBuilder(await partiesOf(deps.db, jobId), user, 'Only the builder who posted the job accepts its inspection record.');
  return (await accept(deps, jobId, { by: user, answer }))!;
}

export async function rejectInspection(deps: InspectionDeps, user: User, jobId: string, { version: read, reasons }: RejectInspectionInput) {
  const notices = new Notices();
  const version = await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    mustBeJobsBuilder(parties, user, 'Only the builder who posted the job rejects its inspection record.');
    const record = await waitingRecord(tx, jobId);
    if (parties.job.status !== 'inspection_submitted' || !record) throw nothingToReview();
    mustBeTheVersionRead(record, read, 'answer');
    const [row] = await tx
      .update(inspectionRecords)
      .set({ status: 'rejected', decidedAt: new Date(), decidedBy: user.id, decidedHow: 'builder', rejectReasons: reasons })
      .where(eq(inspectionRecords.id, record.id))
      .returning();
    await tx.update(jobs).set({ status: 'in_work' }).where(eq(jobs.id, jobId));
    if (parties.shop) {
      await enqueueMail(tx, parties.shop.email, inspectionDecidedMail({ name: parties.shop.name, jobTitle: parties.job.title, decision: 'rejected', reasons, url: `${deps.appUrl}/jobs/${jobId}` }));
      await notices.add(tx, parties.shop.userId, 'record_rejected', { jobId, text: `The builder asked for changes to the inspection results for “${parties.job.title}”: ${reasons}`, href: `/jobs/${jobId}` });
    }
    return toVersion(row);
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return version;
}

/**
 * The window ended on a record that does not conform: nothing is accepted or
 * paid; the builder, the shop and every admin get a mail naming the checks,
 * written in the transaction that saw the record still waiting.
 */
async function holdAfterWindow(deps: InspectionDeps, jobId: string, recordId: string) {
  await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    const [record] = await tx.select().from(inspectionRecords).where(eq(inspectionRecords.id, recordId));
    if (parties.job.status !== 'inspection_submitted' || !record || record.status !== 'submitted') return; // answered in time
    const checks = checksNotConforming(record.results as InspectionResults);
    if (checks.length === 0) checks.push('the overall result');
    const url = `${deps.appUrl}/jobs/${jobId}`;
    const jobTitle = parties.job.title;
    await enqueueMail(tx, parties.builder.email, reviewWindowHeldMail({ name: parties.builder.displayName, reader: 'builder', jobTitle, checks, url }));
    if (parties.shop) await enqueueMail(tx, parties.shop.email, reviewWindowHeldMail({ name: parties.shop.name, reader: 'shop', jobTitle, checks, url }));
    const admins = await tx
      .select({ email: users.email, displayName: users.displayName })
      .from(users)
      .where(and(eq(users.role, 'admin'), eq(users.status, 'active')));
    for (const admin of admins) await enqueueMail(tx, admin.email, reviewWindowHeldMail({ name: admin.displayName, reader: 'admin', jobTitle, checks, url }));
  });
  deps.hub?.jobChanged(jobId, 'job_updated');
}

/** Scheduled-task handlers: the reminder before the review window ends, and acceptance when it does. */
export function inspectionTaskHandlers(deps: InspectionDeps) {
  return {
    'review-reminder': async (payload: Record<string, unknown>) => {
      const [record] = await deps.db.select().from(inspectionRecords).where(eq(inspectionRecords.id, String(payload.recordId)));
      if (!record || record.status !== 'submitted') return;
      const notices = new Notices();
      await deps.db.transaction(async (tx: Executor) => {
        const parties = await partiesOf(tx, record.jobId);
        await notices.add(tx, parties.builder.id, 'review_window_ending', {
          jobId: record.jobId,
          text: `The review window for “${parties.job.title}” closes ${formatDateTime(record.reviewDueAt)}: accept the results or ask for changes.`,
          href: `/jobs/${record.jobId}`,
        });
        await enqueueMail(
          tx,
          parties.builder.email,
          reviewReminderMail({ name: parties.builder.displayName, jobTitle: parties.job.title, dueText: formatDateTime(record.reviewDueAt), autoAccept: recordConforms(record.results as InspectionResults), url: `${deps.appUrl}/jobs/${record.jobId}` }),
        );
      });
      notices.announce(deps.hub);
    },
    'review-window-ended': async (payload: Record<string, unknown>, now: Date) => {
      const [record] = await deps.db.select().from(inspectionRecords).where(eq(inspectionRecords.id, String(payload.recordId)));
      if (!record || record.status !== 'submitted' || record.reviewDueAt > now) return;
      // Only a record whose every check conforms is accepted without the builder; any other waits, and everyone concerned is told.
      if (recordConforms(record.results as InspectionResults)) await accept(deps, record.jobId, { window: { recordId: record.id } });
      else await holdAfterWindow(deps, record.jobId, record.id);
    },
  };
}

/** "City, Region" of the shop whose bid was accepted; empty before an award. */
async function placeOfShop(db: Executor, awardedBidId: string | null): Promise<string> {
  if (!awardedBidId) return '';
  const { rows } = await db.execute<{ city: string; region: string }>(sql`SELECT s.city, s.region FROM bids b JOIN shops s ON s.id = b.shop_id WHERE b.id = ${awardedBidId}`);
  return rows[0] ? `${rows[0].city}, ${rows[0].region}` : '';
}

/** The PDF certificate of one version, for the builder, the shop doing the work and admins. */
export async function certificateFor(deps: { db: Database; storage: FileStorage }, user: User, jobId: string, version: number): Promise<Buffer> {
  const { db } = deps;
  const parties = await partiesOf(db, jobId);
  mustSeeWork(parties, user);
  const [row] = await db.select().from(inspectionRecords).where(and(eq(inspectionRecords.jobId, jobId), eq(inspectionRecords.version, version)));
  if (!row) throw new AppError('not_found', 'No inspection record with that version.', 404);
  const [next] = await db
    .select({ version: inspectionRecords.version })
    .from(inspectionRecords)
    .where(and(eq(inspectionRecords.jobId, jobId), gt(inspectionRecords.version, version)))
    .orderBy(asc(inspectionRecords.version))
    .limit(1);
  const shopPlace = await placeOfShop(db, parties.job.awardedBidId);
  const data = {
    jobTitle: parties.job.title,
    jobId,
    engineFamily: parties.job.engineFamily,
    builderName: parties.builder.displayName,
    shopName: parties.shop?.name ?? '',
    shopPlace,
    version: row.version,
    status: row.status,
    replacedBy: next?.version ?? null,
    submittedAt: row.submittedAt,
    spec: parties.job.spec as JobInput,
    input: row.input as InspectionInput,
    results: row.results as InspectionResults,
  };
  // A version's status and "replaced by" change its certificate, and so its key.
  return storedDocument(deps.storage, 'certificates', `${jobId}-v${version}`, data, certificatePdf);
}

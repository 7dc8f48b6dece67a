import { and, arrayContains, eq, inArray, sql } from 'drizzle-orm';
import { NEEDED_BY_PAST_MESSAGE, neededByHasPassed, type BoardPage, type BoardQuery, type JobDetail, type JobInput } from '../../../shared/schemas/jobs';
import type { Database, Executor } from '../../db/client';
import { bids, jobPhotos, jobs, shops, users, type User } from '../../db/schema';
import { assertEmailConfirmed } from '../../lib/auth/guards';
import { AppError, badRequest, conflict, notFound } from '../../lib/errors';
import { withStoredPhotos, type PhotoSource } from '../../lib/images';
import { enqueueMail } from '../../lib/mail/outbox';
import { jobCancelledMail, jobChangedMail, matchingJobMail } from '../../lib/mail/templates';
import type { FileStorage, StoredFile } from '../../lib/storage';
import type { PaymentsClient } from '../../lib/payments-client';
import type { RealtimeHub } from '../../realtime/hub';
import { closeOpenCheckouts, expireOpenCheckouts } from '../payments/open-checkouts';
import { findShopByUser } from '../shops/shops.repository';
import { jobForViewer, mustOwnJob } from './job-access';
import { boardPage, columnsFromInput, findJob, insertJob, photosOf, photoUrl, type BoardOrigin, type JobRow } from './jobs.repository';
import { distanceUnitFor, POSTAL_CODE_NOT_FOUND, type DistanceUnit } from '../../../shared/distance';
import { distanceBetween, placeAt } from '../../db/earth';
import { locateAnyPostalCode } from '../../lib/postal-codes';
import { builderStanding } from '../standing/standing.repository';

export const MAX_PHOTOS_PER_JOB = 12;

export interface JobDeps {
  db: Database;
  appUrl: string;
  storage: FileStorage;
  /** The payment API, to expire a cancelled job's open payment pages (without it they are left to the task runner). */
  payments?: PaymentsClient;
  /** Open pages of the job hear of each change (absent in scripts without live clients). */
  hub?: RealtimeHub;
}

const jobUrl = (deps: { appUrl: string }, id: string) => `${deps.appUrl}/jobs/${id}`;

/** The job with its row lock, for a change by its builder. */
async function ownJobForUpdate(tx: Executor, jobId: string, user: User): Promise<JobRow> {
  return mustOwnJob(await findJob(tx, jobId, { forUpdate: true }), user);
}

export async function createJob(deps: JobDeps, user: User, input: JobInput): Promise<JobRow> {
  return insertJob(deps.db, user.id, input);
}

/** The job page's data, for whoever may see the job. */
export async function jobDetailFor(deps: JobDeps, user: User, jobId: string): Promise<JobDetail> {
  return jobDetail(deps, await jobForViewer(deps.db, jobId, user), user);
}

export async function jobDetail(deps: JobDeps, job: JobRow, user: User): Promise<JobDetail> {
  const [photos, [builder], standing] = await Promise.all([
    photosOf(deps.db, job.id),
    deps.db.select({ id: users.id, displayName: users.displayName }).from(users).where(eq(users.id, job.builderId)),
    builderStanding(deps.db, job.builderId),
  ]);
  let canBid = false;
  let myBidId: string | null = null;
  let distance: { value: number; unit: DistanceUnit } | null = null;
  if (user.role === 'shop') {
    const shop = await findShopByUser(deps.db, user.id);
    if (shop) {
      const [[mine], value] = await Promise.all([
        deps.db
          .select({ id: bids.id })
          .from(bids)
          .where(and(eq(bids.jobId, job.id), eq(bids.shopId, shop.id), eq(bids.status, 'active'))),
        distanceBetween(deps.db, distanceUnitFor(shop.country), placeAt(shop), placeAt(job)),
      ]);
      myBidId = mine?.id ?? null;
      canBid = job.status === 'open' && !mine;
      distance = value === null ? null : { value, unit: distanceUnitFor(shop.country) };
    }
  }
  return {
    id: job.id,
    title: job.title,
    status: job.status,
    engineFamily: job.engineFamily,
    cylinders: job.cylinders,
    blockMaterial: job.blockMaterial as JobDetail['blockMaterial'],
    operations: job.operations,
    logistics: job.logistics as JobDetail['logistics'],
    country: job.country,
    region: job.region,
    city: job.city,
    neededBy: job.neededBy,
    bidCount: job.bidCount,
    publishedAt: job.publishedAt?.toISOString() ?? null,
    createdAt: job.createdAt.toISOString(),
    placeFound: job.latitude !== null,
    distance: distance?.value ?? null,
    distanceUnit: distance?.unit ?? null,
    updatedAt: job.updatedAt.toISOString(),
    thumbUrl: photos[0] ? photoUrl(job.id, photos[0].id, 'thumb') : null,
    builder: { id: builder.id, displayName: builder.displayName, standing },
    // The postal code is the builder's own: others see the town, the region and the distance.
    spec: job.builderId === user.id ? (job.spec as JobInput) : { ...(job.spec as JobInput), postalCode: undefined },
    photos: photos.map((p) => ({ id: p.id, width: p.width, height: p.height, thumbUrl: photoUrl(job.id, p.id, 'thumb'), largeUrl: photoUrl(job.id, p.id, 'large') })),
    awardedBidId: job.awardedBidId,
    viewer: { isOwner: job.builderId === user.id, canBid, myBidId },
  };
}

/** Shops with an active bid, and their account e-mail, for telling them about a change. */
async function activeBidders(tx: Executor, jobId: string) {
  return tx
    .select({ shopName: shops.name, email: users.email })
    .from(bids)
    .innerJoin(shops, eq(shops.id, bids.shopId))
    .innerJoin(users, eq(users.id, shops.userId))
    .where(and(eq(bids.jobId, jobId), eq(bids.status, 'active')));
}

/** A draft changes quietly; an open job's bidders are told by e-mail. */
export async function updateJob(deps: JobDeps, user: User, jobId: string, input: JobInput): Promise<JobRow> {
  const columns = await columnsFromInput(input);
  const updated = await deps.db.transaction(async (tx) => {
    const job = await ownJobForUpdate(tx, jobId, user);
    if (job.status !== 'draft' && job.status !== 'open') {
      throw conflict('This job can no longer be edited: a bid was already accepted.', 'job_not_editable');
    }
    const [updated] = await tx
      .update(jobs)
      .set({ ...columns, revision: job.revision + 1 })
      .where(eq(jobs.id, job.id))
      .returning();
    if (job.status === 'open') {
      for (const bidder of await activeBidders(tx, job.id)) {
        await enqueueMail(tx, bidder.email, jobChangedMail({ shopName: bidder.shopName, jobTitle: updated.title, url: jobUrl(deps, job.id) }));
      }
    }
    return updated;
  });
  deps.hub?.jobChanged(jobId, 'job_updated');
  return updated;
}

/** Draft to open; shops that asked for matching jobs and can do all the work are told. */
export async function publishJob(deps: JobDeps, user: User, jobId: string): Promise<JobRow> {
  assertEmailConfirmed(user, 'publish a job');
  const published = await deps.db.transaction(async (tx) => {
    const job = await ownJobForUpdate(tx, jobId, user);
    if (job.status !== 'draft') throw conflict('Only a draft can be published; this job is already out.', 'job_not_draft');
    if (neededByHasPassed(job.neededBy)) {
      throw new AppError('needed_by_passed', 'The date you need the work by has passed since the draft was saved. Edit the job and pick a new date, then publish.', 400, {
        neededBy: NEEDED_BY_PAST_MESSAGE,
      });
    }
    const [published] = await tx
      .update(jobs)
      .set({ status: 'open', publishedAt: new Date() })
      .where(eq(jobs.id, job.id))
      .returning();
    const matching = await tx
      .select({ shopName: shops.name, email: users.email })
      .from(shops)
      .innerJoin(users, eq(users.id, shops.userId))
      .where(and(eq(shops.notifyMatchingJobs, true), arrayContains(shops.capabilities, job.operations), eq(users.status, 'active')));
    const summary = `${job.engineFamily}, ${job.cylinders} cylinders, ${job.operations.join(', ')}, ${job.city}, ${job.region}`;
    for (const shop of matching) {
      await enqueueMail(tx, shop.email, matchingJobMail({ shopName: shop.shopName, jobTitle: job.title, summary, url: jobUrl(deps, job.id) }));
    }
    return published;
  });
  deps.hub?.jobChanged(jobId, 'job_published');
  return published;
}

/**
 * Before payment a job can be cancelled freely; its open bids close and their
 * shops are told. A payment page the builder still has open is expired at the
 * provider once the cancel is saved (see open-checkouts.ts).
 */
export async function cancelJob(deps: JobDeps, user: User, jobId: string): Promise<JobRow> {
  const cancelled = await deps.db.transaction(async (tx) => {
    const job = await ownJobForUpdate(tx, jobId, user);
    if (!['draft', 'open', 'awarded'].includes(job.status)) {
      throw conflict('A paid job cannot be cancelled here; ask for a refund instead.', 'job_not_cancellable');
    }
    const affected = await tx
      .select({ shopName: shops.name, email: users.email })
      .from(bids)
      .innerJoin(shops, eq(shops.id, bids.shopId))
      .innerJoin(users, eq(users.id, shops.userId))
      .where(and(eq(bids.jobId, job.id), inArray(bids.status, ['active', 'accepted'])));
    await tx
      .update(bids)
      .set({ status: 'declined', decidedAt: new Date(), declineReason: 'The job was cancelled.' })
      .where(and(eq(bids.jobId, job.id), inArray(bids.status, ['active', 'accepted'])));
    const [cancelled] = await tx
      .update(jobs)
      .set({ status: 'cancelled', cancelledAt: new Date(), awardedBidId: null })
      .where(eq(jobs.id, job.id))
      .returning();
    for (const shop of affected) await enqueueMail(tx, shop.email, jobCancelledMail({ shopName: shop.shopName, jobTitle: job.title }));
    await closeOpenCheckouts(tx, { jobId: job.id });
    return cancelled;
  });
  if (deps.payments) await expireOpenCheckouts({ db: deps.db, payments: deps.payments }, jobId);
  deps.hub?.jobChanged(jobId, 'job_cancelled');
  return cancelled;
}

const photoKey = (jobId: string, id: string, size: 'large' | 'thumb') => `jobs/${jobId}/${id}-${size}.webp`;

/**
 * Refuses, before any bytes are read, anyone but the job's builder (404 for
 * someone else's draft, 403 otherwise) and a job that no longer takes photos.
 * addPhotos checks again under the job's row lock.
 */
export async function assertMayAddPhotos(db: Executor, user: User, jobId: string): Promise<void> {
  const job = mustOwnJob(await findJob(db, jobId), user);
  if (!['draft', 'open'].includes(job.status)) throw conflict('Photos can be added only while the job is a draft or open.', 'job_not_editable');
}

/**
 * Adds photos to a job. Every file is checked, re-encoded and stored before
 * the job is touched (withStoredPhotos removes the files again if the save
 * fails); the count limit is checked under the job's row lock so two uploads
 * at once cannot pass 12 together.
 */
export async function addPhotos(deps: JobDeps, user: User, jobId: string, files: PhotoSource[]) {
  const photos = await withStoredPhotos(deps.storage, files, (id, size) => photoKey(jobId, id, size), (stored) =>
    deps.db.transaction(async (tx) => {
      const job = await ownJobForUpdate(tx, jobId, user);
      if (!['draft', 'open'].includes(job.status)) throw conflict('Photos can be added only while the job is a draft or open.', 'job_not_editable');
      const [{ count }] = await tx.select({ count: sql<number>`count(*)::int` }).from(jobPhotos).where(eq(jobPhotos.jobId, job.id));
      if (count + stored.length > MAX_PHOTOS_PER_JOB) {
        throw conflict(`A job can have at most ${MAX_PHOTOS_PER_JOB} photos; this one has ${count}.`, 'too_many_photos');
      }
      const rows = stored.map((photo, index) => ({ ...photo, jobId: job.id, uploadedBy: user.id, storageKey: `jobs/${job.id}/${photo.id}`, position: count + index }));
      const inserted = await tx.insert(jobPhotos).values(rows).returning();
      return inserted.map((p) => ({ id: p.id, width: p.width, height: p.height, thumbUrl: photoUrl(job.id, p.id, 'thumb'), largeUrl: photoUrl(job.id, p.id, 'large') }));
    }),
  );
  deps.hub?.jobChanged(jobId, 'photos_changed');
  return photos;
}

export async function readPhoto(deps: JobDeps, user: User, jobId: string, photoId: string, size: 'large' | 'thumb'): Promise<StoredFile> {
  const job = await jobForViewer(deps.db, jobId, user);
  const [photo] = await deps.db.select().from(jobPhotos).where(and(eq(jobPhotos.id, photoId), eq(jobPhotos.jobId, job.id)));
  if (!photo) throw notFound('No such photo.');
  const data = await deps.storage.get(photoKey(job.id, photo.id, size));
  if (!data) throw notFound('The photo file is missing.');
  return data;
}

export async function removePhoto(deps: JobDeps, user: User, jobId: string, photoId: string): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const job = await ownJobForUpdate(tx, jobId, user);
    if (!['draft', 'open'].includes(job.status)) throw conflict('Photos can be removed only while the job is a draft or open.', 'job_not_editable');
    const [photo] = await tx.delete(jobPhotos).where(and(eq(jobPhotos.id, photoId), eq(jobPhotos.jobId, job.id))).returning();
    if (!photo) throw notFound('No such photo.');
  });
  await Promise.all((['large', 'thumb'] as const).map((size) => deps.storage.remove(photoKey(jobId, photoId, size))));
  deps.hub?.jobChanged(jobId, 'photos_changed');
}

/**
 * The board as this person sees it: distances measured from the `near` postal code
 * when given, else from the shop's own place; an admin without `near` gets none.
 * Filtering `within` or sorting by distance needs something to measure from.
 */
export async function boardFor(deps: JobDeps, user: User, query: BoardQuery): Promise<BoardPage> {
  const shop = user.role === 'shop' ? await findShopByUser(deps.db, user.id) : undefined;
  let origin: BoardOrigin | null = null;
  if (query.near !== undefined) {
    const at = await locateAnyPostalCode(query.near);
    if (!at) throw badRequest(`That postal code was not found (${POSTAL_CODE_NOT_FOUND}).`, { near: 'Postal code not found.' });
    origin = { unit: query.unit ?? at.unit, postalCode: query.near, at, region: null };
  } else if (shop) {
    const at = placeAt(shop);
    origin = { unit: query.unit ?? distanceUnitFor(shop.country), postalCode: shop.postalCode, at, region: { country: shop.country, region: shop.region } };
  }
  if (!origin && (query.within !== undefined || query.sort === 'distance')) {
    throw badRequest('Give a postal code to measure the distance from.', { near: 'Give a postal code to measure the distance from.' });
  }
  return boardPage(deps.db, query, origin);
}

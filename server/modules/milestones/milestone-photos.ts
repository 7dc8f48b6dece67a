import { and, asc, eq, inArray, isNull } from 'drizzle-orm';
import type { MilestonePhoto } from '../../../shared/schemas/milestones';
import type { Database, Executor } from '../../db/client';
import { milestonePhotos, type User } from '../../db/schema';
import { AppError, notFound } from '../../lib/errors';
import { withStoredPhotos, type PhotoSource } from '../../lib/images';
import type { FileStorage, StoredFile } from '../../lib/storage';
import { mustSeeWork, mustBeWorkingShop, partiesOf } from '../jobs/job-access';

export interface MilestonePhotoDeps {
  db: Database;
  storage: FileStorage;
}

type MilestonePhotoRow = typeof milestonePhotos.$inferSelect;
export type PhotoSize = 'thumb' | 'large';

export const milestonePhotoUrl = (jobId: string, photoId: string, size: PhotoSize) => `/api/jobs/${jobId}/milestone-photos/${photoId}/${size}`;

/** Where the file of one size lives in FileStorage. */
export const milestonePhotoKey = (jobId: string, photoId: string, size: PhotoSize) => `milestones/${jobId}/${photoId}-${size}.webp`;

const toMilestonePhoto = (row: Pick<MilestonePhotoRow, 'id' | 'jobId' | 'width' | 'height'>): MilestonePhoto => ({
  id: row.id,
  width: row.width,
  height: row.height,
  thumbUrl: milestonePhotoUrl(row.jobId, row.id, 'thumb'),
  largeUrl: milestonePhotoUrl(row.jobId, row.id, 'large'),
});

/** Refuses, before any bytes are read, anyone but the shop doing the work. */
export async function assertMayUploadMilestonePhotos(db: Database, user: User, jobId: string): Promise<void> {
  mustBeWorkingShop(await partiesOf(db, jobId), user);
}

/**
 * Stores photos for a milestone not yet logged, through the shared pipeline
 * (type sniffed from the bytes, re-encoded to WebP, metadata dropped, pixel
 * limit). They wait, visible to the uploader alone, until a milestone carries them.
 */
export async function addMilestonePhotos(deps: MilestonePhotoDeps, user: User, jobId: string, files: PhotoSource[]): Promise<MilestonePhoto[]> {
  await assertMayUploadMilestonePhotos(deps.db, user, jobId);
  return withStoredPhotos(deps.storage, files, (id, size) => milestonePhotoKey(jobId, id, size), async (photos) => {
    const inserted = await deps.db
      .insert(milestonePhotos)
      .values(photos.map((photo) => ({ ...photo, jobId, uploadedBy: user.id, storageKey: `milestones/${jobId}/${photo.id}` })))
      .returning();
    return inserted.map(toMilestonePhoto);
  });
}

/** A photo's file, for people who may see the job's work; until it is attached, only its uploader sees it. */
export async function readMilestonePhoto(deps: MilestonePhotoDeps, user: User, jobId: string, photoId: string, size: PhotoSize): Promise<StoredFile> {
  mustSeeWork(await partiesOf(deps.db, jobId), user);
  const [photo] = await deps.db
    .select()
    .from(milestonePhotos)
    .where(and(eq(milestonePhotos.id, photoId), eq(milestonePhotos.jobId, jobId)));
  if (!photo || (photo.milestoneId === null && photo.uploadedBy !== user.id)) throw notFound('No such photo.');
  const data = await deps.storage.get(milestonePhotoKey(jobId, photo.id, size));
  if (!data) throw notFound('The photo file is missing.');
  return data;
}

/** The photos of each milestone, in the order attached, in one query. */
export async function photosOfMilestones(db: Executor, milestoneIds: string[]): Promise<Map<string, MilestonePhoto[]>> {
  const byMilestone = new Map<string, MilestonePhoto[]>();
  if (milestoneIds.length === 0) return byMilestone;
  const rows = await db
    .select()
    .from(milestonePhotos)
    .where(inArray(milestonePhotos.milestoneId, milestoneIds))
    .orderBy(asc(milestonePhotos.milestoneId), asc(milestonePhotos.position));
  for (const row of rows) {
    const list = byMilestone.get(row.milestoneId!) ?? [];
    list.push(toMilestonePhoto(row));
    byMilestone.set(row.milestoneId!, list);
  }
  return byMilestone;
}

/**
 * Attaches photos to a new milestone, in the order given. Only photos this
 * person uploaded to this job and not yet attached qualify; anything else is
 * refused (400) and the caller's transaction rolls back. `milestone_id IS NULL`
 * also settles two requests racing for the same photo.
 */
export async function attachMilestonePhotos(tx: Executor, input: { jobId: string; userId: string; milestoneId: string; photoIds: string[] }) {
  for (const [position, photoId] of input.photoIds.entries()) {
    const [attached] = await tx
      .update(milestonePhotos)
      .set({ milestoneId: input.milestoneId, position })
      .where(
        and(
          eq(milestonePhotos.id, photoId),
          eq(milestonePhotos.jobId, input.jobId),
          eq(milestonePhotos.uploadedBy, input.userId),
          isNull(milestonePhotos.milestoneId),
        ),
      )
      .returning({ id: milestonePhotos.id });
    if (!attached) {
      const which = input.photoIds.length === 1 ? 'That photo' : `Photo ${position + 1}`;
      const words = `${which} is not one you uploaded to this job, or it is already on a milestone.`;
      throw new AppError('invalid_input', words, 400, { photoIds: words });
    }
  }
}

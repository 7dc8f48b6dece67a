import { and, inArray, isNull, lt, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db/client';
import { inspectionDrafts, messagePhotos, milestonePhotos } from '../db/schema';
import { photoFileKeys } from './images';
import { recurringTask } from './scheduler';
import type { FileStorage } from './storage';

/** A photo uploaded for a message or a milestone and not attached within this long is removed. */
export const UNATTACHED_PHOTO_LIFETIME_MS = 24 * 60 * 60_000;

/** How often the sweep runs: a photo goes between one day and one day and an hour after its upload. */
export const PHOTO_SWEEP_EVERY_MS = 60 * 60_000;

/** Rows removed per transaction, so one sweep never holds many locks or waits on many stored files at once. */
const BATCH = 100;

/**
 * The photo tables with an "uploaded, not yet attached" state: a message or a
 * milestone carries them later, or nothing does. Job photos belong to their
 * job from the upload on, so they are never unattached. A cleaning or
 * crack-test photo waits unattached in the shop's saved inspection draft until
 * the record goes out (which attaches it to the record's milestone), however
 * many days the record takes: a photo whose id the job's draft holds is kept.
 */
const UNATTACHED: Array<{ table: typeof messagePhotos | typeof milestonePhotos; attachedTo: typeof messagePhotos.messageId | typeof milestonePhotos.milestoneId; kept?: SQL }> = [
  { table: messagePhotos, attachedTo: messagePhotos.messageId },
  {
    table: milestonePhotos,
    attachedTo: milestonePhotos.milestoneId,
    kept: sql`EXISTS (SELECT 1 FROM ${inspectionDrafts} WHERE ${inspectionDrafts.jobId} = ${milestonePhotos.jobId} AND strpos(${inspectionDrafts.draft}::text, ${milestonePhotos.id}::text) > 0)`,
  },
];

/**
 * Removes every photo uploaded before `now` less a day and never attached:
 * its row and both stored sizes, on disk or in the object store. The rows are
 * locked and deleted first, then the files are removed, and only then is the
 * deletion committed: a store that fails rolls the rows back, so the next run
 * finds them again instead of leaving files no row names. An attach racing the
 * sweep either wins (the row is no longer unattached and is skipped) or waits
 * for the sweep and then finds no photo (400, as for any photo that is not
 * the sender's to attach). Answers how many photos were removed.
 */
export async function sweepUnattachedPhotos(deps: { db: Database; storage: FileStorage }, now: Date): Promise<number> {
  const before = new Date(now.getTime() - UNATTACHED_PHOTO_LIFETIME_MS);
  let removed = 0;
  for (const { table, attachedTo, kept } of UNATTACHED) {
    for (;;) {
      const batch = await deps.db.transaction(async (tx) => {
        const due = tx
          .select({ id: table.id })
          .from(table)
          .where(and(isNull(attachedTo), lt(table.createdAt, before), kept ? sql`NOT ${kept}` : undefined))
          .limit(BATCH)
          .for('update', { skipLocked: true });
        const rows = await tx
          .delete(table)
          .where(and(inArray(table.id, due), isNull(attachedTo)))
          .returning({ storageKey: table.storageKey });
        await Promise.all(rows.flatMap((row) => photoFileKeys(row.storageKey).map((key) => deps.storage.remove(key))));
        return rows.length;
      });
      removed += batch;
      if (batch < BATCH) break;
    }
  }
  return removed;
}

/** The sweep as a recurring scheduled task: its handler for the scheduler, and `schedule` for start-up. */
export function unattachedPhotoSweep(deps: { db: Database; storage: FileStorage }) {
  return recurringTask({
    db: deps.db,
    kind: 'sweep-unattached-photos',
    everyMs: PHOTO_SWEEP_EVERY_MS,
    run: async (now) => {
      await sweepUnattachedPhotos(deps, now);
    },
  });
}

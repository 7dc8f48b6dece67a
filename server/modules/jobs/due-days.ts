import { and, eq, inArray, sql } from 'drizzle-orm';
import { dueDayOf } from '../../../shared/due-day';
import type { Executor } from '../../db/client';
import { bids, jobs, milestones } from '../../db/schema';

/**
 * The due day (YYYY-MM-DD) of each of these awarded jobs, by the one rule in
 * shared/due-day.ts: the accepted bid's working days from the parts' arrival
 * (the first "parts received"), or from the award until they arrive. Jobs
 * with no accepted bid are left out.
 */
export async function dueDaysOf(db: Executor, jobIds: string[]): Promise<Map<string, string>> {
  if (jobIds.length === 0) return new Map();
  const rows = await db
    .select({
      jobId: jobs.id,
      turnaroundDays: bids.turnaroundDays,
      awardedAt: bids.decidedAt,
      partsReceivedAt: sql<Date | null>`(SELECT min(${milestones.createdAt}) FROM ${milestones} WHERE ${milestones.jobId} = ${jobs.id} AND ${milestones.kind} = 'block_received')`.mapWith(
        (value: string | Date | null) => (value === null ? null : new Date(value)),
      ),
    })
    .from(jobs)
    .innerJoin(bids, and(eq(bids.id, jobs.awardedBidId), eq(bids.status, 'accepted')))
    .where(inArray(jobs.id, jobIds));
  const due = new Map<string, string>();
  for (const row of rows) {
    const day = dueDayOf(row, row.partsReceivedAt);
    if (day) due.set(row.jobId, day);
  }
  return due;
}

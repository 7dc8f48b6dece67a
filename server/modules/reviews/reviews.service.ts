import { asc, eq } from 'drizzle-orm';
import type { JobReviews, Review, ReviewInput } from '../../../shared/schemas/reviews';
import type { Database } from '../../db/client';
import { reviews, type User } from '../../db/schema';
import { conflict, forbidden } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { newReviewMail } from '../../lib/mail/templates';
import { mustSeeWork, partiesOf, sideOf, type JobParties } from '../jobs/job-access';

/** A job can be reviewed once it has ended with work done: accepted, or decided after a dispute. */
const REVIEWABLE = new Set(['completed', 'resolved']);

function authorName(parties: JobParties, side: 'builder' | 'shop') {
  return side === 'builder' ? parties.builder.displayName : (parties.shop?.name ?? '');
}

export async function reviewsFor(db: Database, user: User, jobId: string): Promise<JobReviews> {
  const parties = await partiesOf(db, jobId);
  mustSeeWork(parties, user);
  const rows = await db.select().from(reviews).where(eq(reviews.jobId, jobId)).orderBy(asc(reviews.createdAt));
  const side = sideOf(parties, user);
  return {
    reviews: rows.map((r): Review => ({ id: r.id, jobId: r.jobId, by: r.authorSide, authorName: authorName(parties, r.authorSide), rating: r.rating, comment: r.comment, createdAt: r.createdAt.toISOString() })),
    canReview: Boolean(side && REVIEWABLE.has(parties.job.status) && !rows.some((r) => r.authorId === user.id)),
  };
}

/** The builder rates the shop and the shop rates the builder, once each, after the job has ended. */
export async function leaveReview(deps: { db: Database; appUrl: string }, user: User, jobId: string, input: ReviewInput): Promise<Review> {
  return deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId);
    const side = sideOf(parties, user);
    if (!side) {
      mustSeeWork(parties, user);
      throw forbidden('Only the builder and the shop that did the work can review each other.');
    }
    if (!REVIEWABLE.has(parties.job.status)) throw conflict('Reviews open once the job is completed.', 'job_not_finished');
    const subjectId = side === 'builder' ? parties.shop!.userId : parties.builder.id;
    const [row] = await tx
      .insert(reviews)
      .values({ jobId, authorId: user.id, authorSide: side, subjectId, rating: input.rating, comment: input.comment })
      .onConflictDoNothing()
      .returning();
    if (!row) throw conflict('You have already reviewed this job.', 'already_reviewed');
    const subject = side === 'builder' ? { email: parties.shop!.email, name: parties.shop!.name } : { email: parties.builder.email, name: parties.builder.displayName };
    await enqueueMail(tx, subject.email, newReviewMail({ name: subject.name, authorName: authorName(parties, side), jobTitle: parties.job.title, rating: input.rating, url: `${deps.appUrl}/jobs/${jobId}` }));
    return { id: row.id, jobId, by: side, authorName: authorName(parties, side), rating: row.rating, comment: row.comment, createdAt: row.createdAt.toISOString() };
  });
}

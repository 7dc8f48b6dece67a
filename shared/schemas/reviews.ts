import { z } from 'zod';

export const reviewInputSchema = z.object({
  rating: z
    .number({ error: 'Choose 1 to 5 stars.' })
    .int('Choose 1 to 5 stars.')
    .min(1, 'Choose 1 to 5 stars.')
    .max(5, 'Choose 1 to 5 stars.'),
  comment: z.string({ error: 'Write a comment.' }).trim().min(10, 'Write at least 10 characters.').max(2000, 'Use at most 2,000 characters.'),
});
export type ReviewInput = z.infer<typeof reviewInputSchema>;

export const reviewSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  /** Who wrote it: the job's builder about the shop, or the shop about the builder. */
  by: z.enum(['builder', 'shop']),
  authorName: z.string(),
  rating: z.number().int(),
  comment: z.string(),
  createdAt: z.iso.datetime(),
});
export type Review = z.infer<typeof reviewSchema>;

export const reviewAnswerSchema = z.object({ review: reviewSchema });
export type ReviewAnswer = z.infer<typeof reviewAnswerSchema>;

/** The reviews on one job, and whether the viewer may still write theirs. */
export const jobReviewsSchema = z.object({
  reviews: z.array(reviewSchema),
  canReview: z.boolean(),
});
export type JobReviews = z.infer<typeof jobReviewsSchema>;

/** A person's or shop's standing from the reviews they received. */
export const ratingSummarySchema = z.object({ average: z.number(), count: z.number().int() });
export type RatingSummary = z.infer<typeof ratingSummarySchema>;

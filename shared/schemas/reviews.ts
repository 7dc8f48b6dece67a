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

export interface Review {
  id: string;
  jobId: string;
  /** Who wrote it: the job's builder about the shop, or the shop about the builder. */
  by: 'builder' | 'shop';
  authorName: string;
  rating: number;
  comment: string;
  createdAt: string;
}

/** The reviews on one job, and whether the viewer may still write theirs. */
export interface JobReviews {
  reviews: Review[];
  canReview: boolean;
}

/** A person's or shop's standing from the reviews they received. */
export interface RatingSummary {
  average: number;
  count: number;
}

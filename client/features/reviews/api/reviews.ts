import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobReviews, Review, ReviewAnswer, ReviewInput } from '@shared/schemas/reviews';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { bidKeys, reviewKeys, shopKeys } from '@client/lib/query-keys';

export const reviewQueries = {
  forJob: (jobId: string) => queryOptions({ queryKey: reviewKeys.forJob(jobId), queryFn: () => api.get<JobReviews>(`/api/jobs/${jobId}/reviews`) }),
};

export const useJobReviews = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...reviewQueries.forJob(jobId), ...options });

/**
 * The builder reviews the shop, or the shop the builder. A new review changes
 * the shop's rating, which shop pages and bid comparisons show.
 */
export const useSubmitReview = (jobId: string, options?: MutationOptions<Review, ReviewInput>) =>
  useApiMutation(
    (input: ReviewInput) => api.post<ReviewAnswer>(`/api/jobs/${jobId}/reviews`, input).then((r) => r.review),
    { refreshes: () => [reviewKeys.forJob(jobId), shopKeys.all, bidKeys.forJob(jobId)] },
    options?.mutationConfig,
  );

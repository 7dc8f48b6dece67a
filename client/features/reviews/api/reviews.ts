import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { JobReviews, Review, ReviewAnswer, ReviewInput } from '@shared/schemas/reviews';
import { api, type ApiError } from '@client/lib/api-client';
import { bidKeys, reviewKeys, shopKeys } from '@client/lib/query-keys';

export const reviewQueries = {
  forJob: (jobId: string) => queryOptions({ queryKey: reviewKeys.forJob(jobId), queryFn: () => api.get<JobReviews>(`/api/jobs/${jobId}/reviews`) }),
};

export const useJobReviews = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...reviewQueries.forJob(jobId), ...options });

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/**
 * The builder reviews the shop, or the shop the builder. A new review changes
 * the shop's rating, which shop pages and bid comparisons show.
 */
export function useSubmitReview(jobId: string, options?: { mutationConfig?: Config<Review, ReviewInput> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<Review, ApiError, ReviewInput>({
    ...rest,
    mutationFn: (input) => api.post<ReviewAnswer>(`/api/jobs/${jobId}/reviews`, input).then((r) => r.review),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: reviewKeys.forJob(jobId) });
      void queryClient.invalidateQueries({ queryKey: shopKeys.all });
      void queryClient.invalidateQueries({ queryKey: bidKeys.forJob(jobId) });
      return onSuccess?.(...args);
    },
  });
}

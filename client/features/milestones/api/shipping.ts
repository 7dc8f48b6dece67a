import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MilestoneAnswer } from '@shared/schemas/milestones';
import type { PostalAddress, SentToShopInput, ShippingAnswer } from '@shared/schemas/shipping';
import { api } from '@client/lib/api-client';
import { useApiMutation } from '@client/lib/mutation';
import { jobChangeKeys, shippingKeys } from '@client/lib/query-keys';

export const shippingQueries = {
  forJob: (jobId: string) =>
    queryOptions({
      queryKey: shippingKeys.forJob(jobId),
      queryFn: () => api.get<ShippingAnswer>(`/api/jobs/${jobId}/shipping`).then((r) => r.shipping),
    }),
};

export const useShipping = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...shippingQueries.forJob(jobId), ...options });

/** The builder logs the parts sent to the shop; it lands on the timeline. */
export const useSendToShop = (jobId: string) =>
  useApiMutation((input: SentToShopInput) => api.post<MilestoneAnswer>(`/api/jobs/${jobId}/sent-to-shop`, input).then((r) => r.milestone), { refreshes: () => jobChangeKeys(jobId) });

/** The builder gives where the parts come back to. */
export const useSetReturnAddress = (jobId: string) =>
  useApiMutation((input: PostalAddress) => api.put<ShippingAnswer>(`/api/jobs/${jobId}/return-address`, input).then((r) => r.shipping), { refreshes: () => jobChangeKeys(jobId) });

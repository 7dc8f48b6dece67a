import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DisputeCase, DisputeDecided, DisputeQueueAnswer } from '@shared/schemas/admin';
import type { disputeQueueSchema, ResolveDisputeInput } from '@shared/schemas/disputes';
import { api, type ApiError } from '@client/lib/api-client';
import { adminKeys, disputeKeys, jobKeys, paymentKeys } from '@client/lib/query-keys';

export type DisputeQueueStatus = z.infer<typeof disputeQueueSchema>['status'];

export const adminDisputeQueries = {
  queue: (status: DisputeQueueStatus) =>
    queryOptions({
      queryKey: adminKeys.disputes(status),
      queryFn: () => api.get<DisputeQueueAnswer>(`/api/admin/disputes?status=${status}`).then((r) => r.disputes),
      placeholderData: keepPreviousData,
    }),
  case: (disputeId: string) =>
    queryOptions({
      queryKey: adminKeys.disputeCase(disputeId),
      queryFn: () => api.get<DisputeCase>(`/api/admin/disputes/${encodeURIComponent(disputeId)}`),
    }),
};

export const useDisputeQueue = (status: DisputeQueueStatus) => useQuery(adminDisputeQueries.queue(status));

export const useDisputeCase = (disputeId: string) => useQuery(adminDisputeQueries.case(disputeId));

/** The decided dispute and the job's money after the decision was carried out. */
export type ResolveDisputeResult = DisputeDecided;

/**
 * Carries out the administrator's decision. The case is updated from the
 * answer at once; the queue, ledger, audit log and the job's own pages are
 * refreshed after.
 */
export function useResolveDispute(
  disputeId: string,
  options?: { mutationConfig?: Omit<UseMutationOptions<ResolveDisputeResult, ApiError, ResolveDisputeInput>, 'mutationFn'> },
) {
  const queryClient = useQueryClient();
  const { onSuccess, onError, ...rest } = options?.mutationConfig ?? {};
  return useMutation<ResolveDisputeResult, ApiError, ResolveDisputeInput>({
    ...rest,
    onError: (...args) => {
      // Someone else decided first: show the case as it now stands.
      if (args[0].code === 'already_resolved') void queryClient.invalidateQueries({ queryKey: adminKeys.disputeCase(disputeId) });
      return onError?.(...args);
    },
    mutationFn: (input) => api.post<ResolveDisputeResult>(`/api/admin/disputes/${encodeURIComponent(disputeId)}/resolve`, input),
    onSuccess: (...args) => {
      const [result] = args;
      queryClient.setQueryData<DisputeCase>(adminKeys.disputeCase(disputeId), (current) =>
        current ? { ...current, dispute: result.dispute, money: result.money } : current,
      );
      void queryClient.invalidateQueries({ queryKey: adminKeys.all });
      void queryClient.invalidateQueries({ queryKey: disputeKeys.forJob(result.dispute.jobId) });
      void queryClient.invalidateQueries({ queryKey: paymentKeys.all(result.dispute.jobId) });
      void queryClient.invalidateQueries({ queryKey: jobKeys.detail(result.dispute.jobId) });
      return onSuccess?.(...args);
    },
  });
}

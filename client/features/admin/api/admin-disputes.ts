import { keepPreviousData, queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DisputeCase, DisputeDecided, DisputeQueueAnswer } from '@shared/schemas/admin';
import type { disputeQueueSchema, ResolveDisputeInput } from '@shared/schemas/disputes';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { adminKeys, jobChangeKeys } from '@client/lib/query-keys';

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

export type ResolveDisputeResult = DisputeDecided;

/**
 * Carries out the administrator's decision. The case is updated from the
 * answer at once; the queue, ledger, audit log and the job's own pages are
 * refreshed after.
 */
export function useResolveDispute(disputeId: string, options?: MutationOptions<ResolveDisputeResult, ResolveDisputeInput>) {
  const queryClient = useQueryClient();
  const { onError, ...rest } = options?.mutationConfig ?? {};
  return useApiMutation(
    (input: ResolveDisputeInput) => api.post<ResolveDisputeResult>(`/api/admin/disputes/${encodeURIComponent(disputeId)}/resolve`, input),
    {
      update: (client, result) =>
        client.setQueryData<DisputeCase>(adminKeys.disputeCase(disputeId), (current) => (current ? { ...current, dispute: result.dispute, money: result.money } : current)),
      refreshes: (result) => [adminKeys.all, ...jobChangeKeys(result.dispute.jobId)],
    },
    {
      ...rest,
      onError: (...args) => {
        // Someone else decided first: show the case as it now stands.
        if (args[0].code === 'already_resolved') void queryClient.invalidateQueries({ queryKey: adminKeys.disputeCase(disputeId) });
        return onError?.(...args);
      },
    },
  );
}

import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { Dispute, DisputeAnswer, DisputeResponseInput, DisputeView, OpenDisputeInput } from '@shared/schemas/disputes';
import { api, type ApiError } from '@client/lib/api-client';
import { disputeKeys, jobKeys, paymentKeys } from '@client/lib/query-keys';

export const disputeQueries = {
  forJob: (jobId: string) => queryOptions({ queryKey: disputeKeys.forJob(jobId), queryFn: () => api.get<DisputeView>(`/api/jobs/${jobId}/dispute`) }),
};

export const useJobDispute = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...disputeQueries.forJob(jobId), ...options });

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** Opening or answering a dispute changes the job's status and keeps its money held: refresh all three. */
export function useRefreshAfterDispute(jobId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: disputeKeys.forJob(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.mineAll() });
    void queryClient.invalidateQueries({ queryKey: paymentKeys.all(jobId) });
  };
}

function useDisputeMutation<TVars>(jobId: string, run: (vars: TVars) => Promise<Dispute>, config?: Config<Dispute, TVars>) {
  const refresh = useRefreshAfterDispute(jobId);
  const { onSuccess, ...rest } = config ?? {};
  return useMutation<Dispute, ApiError, TVars>({
    ...rest,
    mutationFn: run,
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

/** The builder or the awarded shop opens a dispute; the job becomes 'disputed' and its payment stays held. */
export const useOpenDispute = (jobId: string, options?: { mutationConfig?: Config<Dispute, OpenDisputeInput> }) =>
  useDisputeMutation(
    jobId,
    (input: OpenDisputeInput) => api.post<DisputeAnswer>(`/api/jobs/${jobId}/dispute`, input).then((r) => r.dispute),
    options?.mutationConfig,
  );

/** The other side answers, once. */
export const useRespondToDispute = (jobId: string, options?: { mutationConfig?: Config<Dispute, DisputeResponseInput> }) =>
  useDisputeMutation(
    jobId,
    (input: DisputeResponseInput) => api.post<DisputeAnswer>(`/api/jobs/${jobId}/dispute/response`, input).then((r) => r.dispute),
    options?.mutationConfig,
  );

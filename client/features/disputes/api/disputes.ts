import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Dispute, DisputeAnswer, DisputeResponseInput, DisputeView, OpenDisputeInput } from '@shared/schemas/disputes';
import { api } from '@client/lib/api-client';
import { type MutationConfig, type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { disputeKeys, jobChangeKeys } from '@client/lib/query-keys';

export const disputeQueries = {
  forJob: (jobId: string) => queryOptions({ queryKey: disputeKeys.forJob(jobId), queryFn: () => api.get<DisputeView>(`/api/jobs/${jobId}/dispute`) }),
};

export const useJobDispute = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...disputeQueries.forJob(jobId), ...options });

/** Opening or answering a dispute changes the job's status and keeps its money held. */
const useDisputeMutation = <TVars>(jobId: string, run: (vars: TVars) => Promise<Dispute>, config?: MutationConfig<Dispute, TVars>) =>
  useApiMutation(run, { refreshes: () => jobChangeKeys(jobId) }, config);

/** The builder or the awarded shop opens a dispute; the job becomes 'disputed' and its payment stays held. */
export const useOpenDispute = (jobId: string, options?: MutationOptions<Dispute, OpenDisputeInput>) =>
  useDisputeMutation(
    jobId,
    (input: OpenDisputeInput) => api.post<DisputeAnswer>(`/api/jobs/${jobId}/dispute`, input).then((r) => r.dispute),
    options?.mutationConfig,
  );

/** The other side answers, once. */
export const useRespondToDispute = (jobId: string, options?: MutationOptions<Dispute, DisputeResponseInput>) =>
  useDisputeMutation(
    jobId,
    (input: DisputeResponseInput) => api.post<DisputeAnswer>(`/api/jobs/${jobId}/dispute/response`, input).then((r) => r.dispute),
    options?.mutationConfig,
  );

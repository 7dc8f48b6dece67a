import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { DraftSaved, InspectionInput, InspectionVersion, InspectionVersionAnswer, InspectionView, RejectInspectionInput } from '@shared/schemas/inspection';
import { api, type ApiError } from '@client/lib/api-client';
import { inspectionKeys, jobKeys, milestoneKeys, paymentKeys } from '@client/lib/query-keys';

export const inspectionQueries = {
  forJob: (jobId: string) =>
    queryOptions({ queryKey: inspectionKeys.forJob(jobId), queryFn: () => api.get<InspectionView>(`/api/jobs/${jobId}/inspection`) }),
};

export type { InspectionView };

export const useInspection = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...inspectionQueries.forJob(jobId), ...options });

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** Saves the shop's unfinished entry; nothing is judged. The cache is not refreshed: the form holds the newer state. */
export const useSaveInspectionDraft = (jobId: string, options?: { mutationConfig?: Config<DraftSaved, Record<string, unknown>> }) =>
  useMutation<DraftSaved, ApiError, Record<string, unknown>>({
    ...options?.mutationConfig,
    mutationFn: (draft) => api.put<DraftSaved>(`/api/jobs/${jobId}/inspection/draft`, { draft }),
  });

/** Submitting, accepting or rejecting changes the job's state, its money and possibly its timeline. */
function useRefreshAfterDecision(jobId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: inspectionKeys.forJob(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.mineAll() });
    void queryClient.invalidateQueries({ queryKey: paymentKeys.all(jobId) });
    void queryClient.invalidateQueries({ queryKey: milestoneKeys.forJob(jobId) });
  };
}

function useVersionMutation<TVars>(jobId: string, run: (vars: TVars) => Promise<InspectionVersion>, config?: Config<InspectionVersion, TVars>) {
  const refresh = useRefreshAfterDecision(jobId);
  const { onSuccess, ...rest } = config ?? {};
  return useMutation<InspectionVersion, ApiError, TVars>({
    ...rest,
    mutationFn: run,
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

export const useSubmitInspection = (jobId: string, options?: { mutationConfig?: Config<InspectionVersion, InspectionInput> }) =>
  useVersionMutation(
    jobId,
    (input: InspectionInput) => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection`, input).then((r) => r.version),
    options?.mutationConfig,
  );

export const useAcceptInspection = (jobId: string, options?: { mutationConfig?: Config<InspectionVersion, void> }) =>
  useVersionMutation(jobId, () => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection/accept`).then((r) => r.version), options?.mutationConfig);

export const useRejectInspection = (jobId: string, options?: { mutationConfig?: Config<InspectionVersion, RejectInspectionInput> }) =>
  useVersionMutation(
    jobId,
    (body: RejectInspectionInput) => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection/reject`, body).then((r) => r.version),
    options?.mutationConfig,
  );

/** The draft fetcher on its own, for a last save as the page closes (a mutation's callbacks would not run then). */
export const putInspectionDraft = (jobId: string, draft: Record<string, unknown>) => api.put<DraftSaved>(`/api/jobs/${jobId}/inspection/draft`, { draft });

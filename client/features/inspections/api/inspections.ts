import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AcceptInspectionInput, DraftSaved, InspectionInput, InspectionVersion, InspectionVersionAnswer, InspectionView, RejectInspectionInput } from '@shared/schemas/inspection';
import { api } from '@client/lib/api-client';
import { type MutationConfig, type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { inspectionKeys, jobChangeKeys } from '@client/lib/query-keys';

export const inspectionQueries = {
  forJob: (jobId: string) =>
    queryOptions({ queryKey: inspectionKeys.forJob(jobId), queryFn: () => api.get<InspectionView>(`/api/jobs/${jobId}/inspection`) }),
};

export type { InspectionView };

export const useInspection = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...inspectionQueries.forJob(jobId), ...options });

/** Saves the shop's unfinished entry; nothing is judged. The cache is not refreshed: the form holds the newer state. */
export const useSaveInspectionDraft = (jobId: string, options?: MutationOptions<DraftSaved, Record<string, unknown>>) =>
  useApiMutation((draft: Record<string, unknown>) => putInspectionDraft(jobId, draft), {}, options?.mutationConfig);

/** Submitting, accepting or rejecting changes the job's state, its money and possibly its timeline. */
const useVersionMutation = <TVars>(jobId: string, run: (vars: TVars) => Promise<InspectionVersion>, config?: MutationConfig<InspectionVersion, TVars>) =>
  useApiMutation(run, { refreshes: () => jobChangeKeys(jobId) }, config);

export const useSubmitInspection = (jobId: string, options?: MutationOptions<InspectionVersion, InspectionInput>) =>
  useVersionMutation(
    jobId,
    (input: InspectionInput) => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection`, input).then((r) => r.version),
    options?.mutationConfig,
  );

/** Accepts the version the builder read, naming each check of it that does not conform. */
export const useAcceptInspection = (jobId: string, options?: MutationOptions<InspectionVersion, AcceptInspectionInput>) =>
  useVersionMutation(
    jobId,
    (body: AcceptInspectionInput) => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection/accept`, body).then((r) => r.version),
    options?.mutationConfig,
  );

export const useRejectInspection = (jobId: string, options?: MutationOptions<InspectionVersion, RejectInspectionInput>) =>
  useVersionMutation(
    jobId,
    (body: RejectInspectionInput) => api.post<InspectionVersionAnswer>(`/api/jobs/${jobId}/inspection/reject`, body).then((r) => r.version),
    options?.mutationConfig,
  );

/** The draft fetcher on its own, for a last save as the page closes (a mutation's callbacks would not run then). */
export const putInspectionDraft = (jobId: string, draft: Record<string, unknown>) => api.put<DraftSaved>(`/api/jobs/${jobId}/inspection/draft`, { draft });

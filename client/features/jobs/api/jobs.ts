import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { BoardPage, JobAnswer, JobDetail, JobInput, JobListAnswer, JobPhoto, JobStatus } from '@shared/schemas/jobs';
import { api } from '@client/lib/api-client';
import { type MutationConfig, type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { type BoardFilters, jobChangeKeys, jobKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export const jobQueries = {
  board: (filters: BoardFilters) =>
    queryOptions({ queryKey: jobKeys.board(filters), queryFn: () => api.get<BoardPage>(`/api/jobs${toSearch(filters)}`), placeholderData: keepPreviousData }),
  mine: (status?: JobStatus) =>
    queryOptions({ queryKey: jobKeys.mine(status), queryFn: () => api.get<JobListAnswer>(`/api/jobs/mine${toSearch({ status })}`).then((r) => r.jobs) }),
  detail: (id: string) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: () => api.get<JobAnswer>(`/api/jobs/${id}`).then((r) => r.job) }),
};

export const useBoard = (filters: BoardFilters) => useQuery(jobQueries.board(filters));
export const useMyJobs = (status?: JobStatus) => useQuery(jobQueries.mine(status));
export const useJob = (id: string) => useQuery(jobQueries.detail(id));

/** A mutation whose answer is the job: the cache gets it, and everything that shows the job refreshes. */
const useJobMutation = <TVars>(run: (vars: TVars) => Promise<JobDetail>, config?: MutationConfig<JobDetail, TVars>) =>
  useApiMutation(run, { update: (queryClient, job) => queryClient.setQueryData(jobKeys.detail(job.id), job), refreshes: (job) => jobChangeKeys(job.id) }, config);

export const useCreateJob = (options?: MutationOptions<JobDetail, JobInput>) =>
  useJobMutation((input: JobInput) => api.post<JobAnswer>('/api/jobs', input).then((r) => r.job), options?.mutationConfig);

export const useUpdateJob = (options?: MutationOptions<JobDetail, { id: string; input: JobInput }>) =>
  useJobMutation(({ id, input }: { id: string; input: JobInput }) => api.put<JobAnswer>(`/api/jobs/${id}`, input).then((r) => r.job), options?.mutationConfig);

export const usePublishJob = (options?: MutationOptions<JobDetail, string>) =>
  useJobMutation((id: string) => api.post<JobAnswer>(`/api/jobs/${id}/publish`).then((r) => r.job), options?.mutationConfig);

export const useCancelJob = (options?: MutationOptions<JobDetail, string>) =>
  useJobMutation((id: string) => api.post<JobAnswer>(`/api/jobs/${id}/cancel`).then((r) => r.job), options?.mutationConfig);

export const useRemovePhoto = (jobId: string, options?: MutationOptions<void, string>) =>
  useApiMutation((photoId: string) => api.delete<void>(`/api/jobs/${jobId}/photos/${photoId}`), { refreshes: () => [jobKeys.detail(jobId)] }, options?.mutationConfig);

export type { BoardFilters, BoardPage, JobPhoto };
export { jobKeys };

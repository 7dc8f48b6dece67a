import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { BoardPage, JobDetail, JobInput, JobPhoto, JobStatus, JobSummary } from '@shared/schemas/jobs';
import { api, type ApiError } from '@client/lib/api-client';
import { jobKeys, type BoardFilters } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export const jobQueries = {
  board: (filters: BoardFilters) =>
    queryOptions({ queryKey: jobKeys.board(filters), queryFn: () => api.get<BoardPage>(`/api/jobs${toSearch(filters)}`), placeholderData: keepPreviousData }),
  mine: (status?: JobStatus) =>
    queryOptions({ queryKey: jobKeys.mine(status), queryFn: () => api.get<{ jobs: JobSummary[] }>(`/api/jobs/mine${toSearch({ status })}`).then((r) => r.jobs) }),
  detail: (id: string) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: () => api.get<{ job: JobDetail }>(`/api/jobs/${id}`).then((r) => r.job) }),
};

export const useBoard = (filters: BoardFilters) => useQuery(jobQueries.board(filters));
export const useMyJobs = (status?: JobStatus) => useQuery(jobQueries.mine(status));
export const useJob = (id: string) => useQuery(jobQueries.detail(id));

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** A mutation whose answer is the job: the cache gets it, and lists refresh. */
function useJobMutation<TVars>(run: (vars: TVars) => Promise<JobDetail>, config?: Config<JobDetail, TVars>) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config ?? {};
  return useMutation<JobDetail, ApiError, TVars>({
    ...rest,
    mutationFn: run,
    onSuccess: (job, ...args) => {
      queryClient.setQueryData(jobKeys.detail(job.id), job);
      void queryClient.invalidateQueries({ queryKey: jobKeys.mineAll() });
      void queryClient.invalidateQueries({ queryKey: jobKeys.boards() });
      return onSuccess?.(job, ...args);
    },
  });
}

export const useCreateJob = (options?: { mutationConfig?: Config<JobDetail, JobInput> }) =>
  useJobMutation((input: JobInput) => api.post<{ job: JobDetail }>('/api/jobs', input).then((r) => r.job), options?.mutationConfig);

export const useUpdateJob = (options?: { mutationConfig?: Config<JobDetail, { id: string; input: JobInput }> }) =>
  useJobMutation(({ id, input }: { id: string; input: JobInput }) => api.put<{ job: JobDetail }>(`/api/jobs/${id}`, input).then((r) => r.job), options?.mutationConfig);

export const usePublishJob = (options?: { mutationConfig?: Config<JobDetail, string> }) =>
  useJobMutation((id: string) => api.post<{ job: JobDetail }>(`/api/jobs/${id}/publish`).then((r) => r.job), options?.mutationConfig);

export const useCancelJob = (options?: { mutationConfig?: Config<JobDetail, string> }) =>
  useJobMutation((id: string) => api.post<{ job: JobDetail }>(`/api/jobs/${id}/cancel`).then((r) => r.job), options?.mutationConfig);

export function useRemovePhoto(jobId: string, options?: { mutationConfig?: Config<void, string> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<void, ApiError, string>({
    ...rest,
    mutationFn: (photoId) => api.delete<void>(`/api/jobs/${jobId}/photos/${photoId}`),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
      return onSuccess?.(...args);
    },
  });
}

export type { BoardFilters, BoardPage, JobPhoto };
export { jobKeys };

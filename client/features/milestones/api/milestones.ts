import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { MilestoneInput } from '@shared/schemas/inspection';
import type { Milestone, MilestoneAnswer, MilestoneList } from '@shared/schemas/milestones';
import { api, type ApiError } from '@client/lib/api-client';
import { jobKeys, milestoneKeys } from '@client/lib/query-keys';

export const milestoneQueries = {
  /** The job's timeline, oldest first. */
  forJob: (jobId: string) =>
    queryOptions({
      queryKey: milestoneKeys.forJob(jobId),
      queryFn: () => api.get<MilestoneList>(`/api/jobs/${jobId}/milestones`).then((r) => r.milestones),
    }),
};

export const useMilestones = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...milestoneQueries.forJob(jobId), ...options });

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** The awarded shop logs progress; "block received" also moves the job into the shop's hands, so the job refreshes too. */
export function useLogMilestone(jobId: string, options?: { mutationConfig?: Config<Milestone, MilestoneInput> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<Milestone, ApiError, MilestoneInput>({
    ...rest,
    mutationFn: (input) => api.post<MilestoneAnswer>(`/api/jobs/${jobId}/milestones`, input).then((r) => r.milestone),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: milestoneKeys.forJob(jobId) });
      void queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
      void queryClient.invalidateQueries({ queryKey: jobKeys.mineAll() });
      return onSuccess?.(...args);
    },
  });
}

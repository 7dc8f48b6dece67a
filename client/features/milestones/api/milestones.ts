import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MilestoneInput } from '@shared/schemas/inspection';
import type { Milestone, MilestoneAnswer, MilestoneList } from '@shared/schemas/milestones';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { jobChangeKeys, milestoneKeys } from '@client/lib/query-keys';

export const milestoneQueries = {
  /** The job's timeline, oldest first. */
  forJob: (jobId: string) =>
    queryOptions({
      queryKey: milestoneKeys.forJob(jobId),
      queryFn: () => api.get<MilestoneList>(`/api/jobs/${jobId}/milestones`).then((r) => r.milestones),
    }),
};

export const useMilestones = (jobId: string, options: { enabled?: boolean } = {}) => useQuery({ ...milestoneQueries.forJob(jobId), ...options });

/** The awarded shop logs progress; "parts received" also moves the job into the shop's hands, so the job refreshes too. */
export const useLogMilestone = (jobId: string, options?: MutationOptions<Milestone, MilestoneInput>) =>
  useApiMutation(
    (input: MilestoneInput) => api.post<MilestoneAnswer>(`/api/jobs/${jobId}/milestones`, input).then((r) => r.milestone),
    { refreshes: () => jobChangeKeys(jobId) },
    options?.mutationConfig,
  );

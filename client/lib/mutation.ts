import { type QueryClient, type QueryKey, type UseMutationOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiError } from './api-client';
import { jobChangeKeys } from './query-keys';

/** What a caller may add to a feature's mutation: its own callbacks and settings; the request itself is the feature's. */
export type MutationConfig<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** The options every feature mutation hook takes. */
export interface MutationOptions<TData, TVars> {
  mutationConfig?: MutationConfig<TData, TVars>;
}

export interface ApiMutationSetup<TData, TVars> {
  /** The queries this change makes stale, from the answer and what was sent. */
  refreshes?: (data: TData, vars: TVars) => readonly QueryKey[];
  /** Anything else the cache needs first, such as the answer put in place. */
  update?: (queryClient: QueryClient, data: TData, vars: TVars) => void;
}

/**
 * A request that changes something: once it succeeds, the cache is updated,
 * every query the change touches is refreshed, and then the caller's own
 * `onSuccess` runs. A failure goes to the caller's `onError` (forms put field
 * messages beside their inputs; others toast).
 */
export function useApiMutation<TData, TVars = void>(
  mutationFn: (vars: TVars) => Promise<TData>,
  setup: ApiMutationSetup<TData, TVars> = {},
  config?: MutationConfig<TData, TVars>,
) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config ?? {};
  const { refreshes, update } = setup;
  return useMutation<TData, ApiError, TVars>({
    ...rest,
    mutationFn,
    onSuccess: (...args) => {
      const [data, vars] = args;
      update?.(queryClient, data, vars);
      for (const queryKey of refreshes?.(data, vars) ?? []) void queryClient.invalidateQueries({ queryKey });
      return onSuccess?.(...args);
    },
  });
}

/** Refreshes everything a change to the job shows in (see jobChangeKeys), for a change learnt some other way, such as a 409. */
export function useRefreshJob(jobId: string) {
  const queryClient = useQueryClient();
  return () => {
    for (const queryKey of jobChangeKeys(jobId)) void queryClient.invalidateQueries({ queryKey });
  };
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlatformFee, PlatformFeeInput } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { adminKeys } from '@client/lib/query-keys';

export const platformFeeQueries = {
  current: () =>
    queryOptions({
      queryKey: adminKeys.fee(),
      queryFn: () => api.get<PlatformFee>('/api/admin/fee'),
    }),
};

export const usePlatformFee = () => useQuery(platformFeeQueries.current());

/** Sets the fee for bids accepted from now on; jobs already accepted keep theirs. */
export const useSetPlatformFee = (options?: MutationOptions<PlatformFee, PlatformFeeInput>) =>
  useApiMutation(
    (input: PlatformFeeInput) => api.put<PlatformFee>('/api/admin/fee', input),
    { update: (queryClient, fee) => queryClient.setQueryData(adminKeys.fee(), fee), refreshes: () => [adminKeys.all] },
    options?.mutationConfig,
  );

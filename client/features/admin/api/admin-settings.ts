import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { PlatformFee, PlatformFeeInput } from '@shared/schemas/admin';
import { api, type ApiError } from '@client/lib/api-client';
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
export function useSetPlatformFee(options?: { mutationConfig?: Omit<UseMutationOptions<PlatformFee, ApiError, PlatformFeeInput>, 'mutationFn'> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<PlatformFee, ApiError, PlatformFeeInput>({
    ...rest,
    mutationFn: (input) => api.put<PlatformFee>('/api/admin/fee', input),
    onSuccess: (...args) => {
      queryClient.setQueryData(adminKeys.fee(), args[0]);
      void queryClient.invalidateQueries({ queryKey: adminKeys.all });
      return onSuccess?.(...args);
    },
  });
}

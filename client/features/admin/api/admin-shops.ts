import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { AdminShopAnswer, AdminShopPage, AdminShopRow, ShopSearchInput, VerifyShopInput } from '@shared/schemas/admin';
import { api, type ApiError } from '@client/lib/api-client';
import { adminKeys, shopKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export type AdminShopFilters = ShopSearchInput;
export type { AdminShopPage };

export const adminShopQueries = {
  list: (filters: AdminShopFilters) =>
    queryOptions({
      queryKey: adminKeys.shops({ ...filters }),
      queryFn: () => api.get<AdminShopPage>(`/api/admin/shops${toSearch({ ...filters })}`),
      placeholderData: keepPreviousData,
    }),
};

export const useAdminShops = (filters: AdminShopFilters) => useQuery(adminShopQueries.list(filters));

export type SetVerificationInput = { shopId: string } & VerifyShopInput;

/** Marks a shop verified or takes the mark away; the directory and shop pages show it, so they refresh too. */
export function useSetShopVerification(options?: {
  mutationConfig?: Omit<UseMutationOptions<AdminShopRow, ApiError, SetVerificationInput>, 'mutationFn'>;
}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<AdminShopRow, ApiError, SetVerificationInput>({
    ...rest,
    mutationFn: ({ shopId, verified }) =>
      api.post<AdminShopAnswer>(`/api/admin/shops/${encodeURIComponent(shopId)}/verification`, { verified }).then((r) => r.shop),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: adminKeys.all });
      void queryClient.invalidateQueries({ queryKey: shopKeys.all });
      return onSuccess?.(...args);
    },
  });
}

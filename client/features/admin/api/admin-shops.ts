import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AdminShopAnswer, AdminShopPage, AdminShopRow, ShopSearchInput, VerifyShopInput } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
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
export const useSetShopVerification = (options?: MutationOptions<AdminShopRow, SetVerificationInput>) =>
  useApiMutation(
    ({ shopId, verified }: SetVerificationInput) =>
      api.post<AdminShopAnswer>(`/api/admin/shops/${encodeURIComponent(shopId)}/verification`, { verified }).then((r) => r.shop),
    { refreshes: () => [adminKeys.all, shopKeys.all] },
    options?.mutationConfig,
  );

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OwnShop, OwnShopAnswer, ShopAnswer, ShopDirectoryPage, ShopProfileInput } from '@shared/schemas/shops';
import { ApiError, api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { shopKeys, type DirectoryFilters } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export type { OwnShop };

export const shopQueries = {
  list: (filters: DirectoryFilters) =>
    queryOptions({
      queryKey: shopKeys.list(filters),
      queryFn: () => api.get<ShopDirectoryPage>(`/api/shops${toSearch(filters)}`),
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({ queryKey: shopKeys.detail(id), queryFn: () => api.get<ShopAnswer>(`/api/shops/${id}`).then((r) => r.shop) }),
  /** The signed-in shop's profile, or null before it is set up. */
  own: () =>
    queryOptions({
      queryKey: shopKeys.own(),
      queryFn: async () => {
        try {
          return (await api.get<OwnShopAnswer>('/api/shop-profile')).shop;
        } catch (error) {
          if (error instanceof ApiError && error.status === 404) return null;
          throw error;
        }
      },
    }),
};

export type { DirectoryFilters };

export const useShops = (filters: DirectoryFilters, { enabled = true } = {}) => useQuery({ ...shopQueries.list(filters), enabled });
export const useShop = (id: string) => useQuery(shopQueries.detail(id));
export const useOwnShop = (options: { refetchInterval?: (data: OwnShop | null | undefined) => number | false } = {}) =>
  useQuery({
    ...shopQueries.own(),
    refetchInterval: (query) => (options.refetchInterval ? options.refetchInterval(query.state.data as OwnShop | null | undefined) : false),
  });

export const useSaveShopProfile = (options?: MutationOptions<OwnShop, ShopProfileInput>) =>
  useApiMutation(
    (input: ShopProfileInput) => api.put<OwnShopAnswer>('/api/shop-profile', input).then((r) => r.shop),
    { update: (queryClient, shop) => queryClient.setQueryData(shopKeys.own(), shop), refreshes: (shop) => [shopKeys.lists(), shopKeys.detail(shop.id)] },
    options?.mutationConfig,
  );

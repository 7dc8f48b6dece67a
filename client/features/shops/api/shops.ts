import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { OwnShop, PublicShop, ShopDirectoryPage, ShopProfileInput } from '@shared/schemas/shops';
import { ApiError, api } from '@client/lib/api-client';
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
    queryOptions({ queryKey: shopKeys.detail(id), queryFn: () => api.get<{ shop: PublicShop }>(`/api/shops/${id}`).then((r) => r.shop) }),
  /** The signed-in shop's profile, or null before it is set up. */
  own: () =>
    queryOptions({
      queryKey: shopKeys.own(),
      queryFn: async () => {
        try {
          return (await api.get<{ shop: OwnShop }>('/api/shop-profile')).shop;
        } catch (error) {
          if (error instanceof ApiError && error.status === 404) return null;
          throw error;
        }
      },
    }),
};

export type { DirectoryFilters };

export const useShops = (filters: DirectoryFilters) => useQuery(shopQueries.list(filters));
export const useShop = (id: string) => useQuery(shopQueries.detail(id));
export const useOwnShop = (options: { refetchInterval?: (data: OwnShop | null | undefined) => number | false } = {}) =>
  useQuery({
    ...shopQueries.own(),
    refetchInterval: (query) => (options.refetchInterval ? options.refetchInterval(query.state.data as OwnShop | null | undefined) : false),
  });

export function useSaveShopProfile(options?: { mutationConfig?: Omit<UseMutationOptions<OwnShop, ApiError, ShopProfileInput>, 'mutationFn'> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<OwnShop, ApiError, ShopProfileInput>({
    ...rest,
    mutationFn: (input) => api.put<{ shop: OwnShop }>('/api/shop-profile', input).then((r) => r.shop),
    onSuccess: (shop, ...args) => {
      queryClient.setQueryData(shopKeys.own(), shop);
      void queryClient.invalidateQueries({ queryKey: shopKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: shopKeys.detail(shop.id) });
      return onSuccess?.(shop, ...args);
    },
  });
}

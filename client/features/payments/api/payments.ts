import { queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { ChangeOrder, ChangeOrderAnswer, ChangeOrderInput, ChangeOrderList, MoneyView, ProviderLink } from '@shared/schemas/payments';
import { api, type ApiError } from '@client/lib/api-client';
import { jobKeys, paymentKeys, shopKeys } from '@client/lib/query-keys';

export const paymentQueries = {
  money: (jobId: string) => queryOptions({ queryKey: paymentKeys.money(jobId), queryFn: () => api.get<MoneyView>(`/api/jobs/${jobId}/money`) }),
  changeOrders: (jobId: string) =>
    queryOptions({
      queryKey: paymentKeys.changeOrders(jobId),
      queryFn: () => api.get<ChangeOrderList>(`/api/jobs/${jobId}/change-orders`).then((r) => r.changeOrders),
    }),
};

export const useMoney = (jobId: string, options: { enabled?: boolean; refetchInterval?: number | false } = {}) =>
  useQuery({ ...paymentQueries.money(jobId), ...options });
export const useChangeOrders = (jobId: string, enabled = true) => useQuery({ ...paymentQueries.changeOrders(jobId), enabled });

type Config<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** Leaves for the payment provider's page (or the local stand-in's). */
const goTo = (result: ProviderLink) => {
  window.location.assign(result.url);
};

export const useStartCheckout = (jobId: string, options?: { mutationConfig?: Config<ProviderLink, void> }) =>
  useMutation<ProviderLink, ApiError, void>({ onSuccess: goTo, ...options?.mutationConfig, mutationFn: () => api.post(`/api/jobs/${jobId}/checkout`) });

export const useStartPayouts = (options?: { mutationConfig?: Config<ProviderLink, void> }) =>
  useMutation<ProviderLink, ApiError, void>({ onSuccess: goTo, ...options?.mutationConfig, mutationFn: () => api.post('/api/shop-profile/payouts') });

export const useApproveChangeOrder = (options?: { mutationConfig?: Config<ProviderLink, string> }) =>
  useMutation<ProviderLink, ApiError, string>({ onSuccess: goTo, ...options?.mutationConfig, mutationFn: (id) => api.post(`/api/change-orders/${id}/approve`) });

function useRefreshJobMoney(jobId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: paymentKeys.all(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
    void queryClient.invalidateQueries({ queryKey: jobKeys.mineAll() });
  };
}

export function useProposeChangeOrder(jobId: string, options?: { mutationConfig?: Config<ChangeOrder, ChangeOrderInput> }) {
  const refresh = useRefreshJobMoney(jobId);
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<ChangeOrder, ApiError, ChangeOrderInput>({
    ...rest,
    mutationFn: (input) => api.post<ChangeOrderAnswer>(`/api/jobs/${jobId}/change-orders`, input).then((r) => r.changeOrder),
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

export function useDeclineChangeOrder(jobId: string, options?: { mutationConfig?: Config<ChangeOrder, string> }) {
  const refresh = useRefreshJobMoney(jobId);
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<ChangeOrder, ApiError, string>({
    ...rest,
    mutationFn: (id) => api.post<ChangeOrderAnswer>(`/api/change-orders/${id}/decline`).then((r) => r.changeOrder),
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

export function useCancelAndRefund(jobId: string, options?: { mutationConfig?: Config<MoneyView, void> }) {
  const refresh = useRefreshJobMoney(jobId);
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<MoneyView, ApiError, void>({
    ...rest,
    mutationFn: () => api.post<MoneyView>(`/api/jobs/${jobId}/cancel-and-refund`),
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

export { shopKeys };

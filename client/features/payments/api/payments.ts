import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChangeOrder, ChangeOrderAnswer, ChangeOrderInput, ChangeOrderList, MoneyView, ProviderLink } from '@shared/schemas/payments';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { jobChangeKeys, paymentKeys, shopKeys } from '@client/lib/query-keys';

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

/** Leaves for the payment provider's page (or the local stand-in's). */
const goTo = (result: ProviderLink) => {
  window.location.assign(result.url);
};

export const useStartCheckout = (jobId: string, options?: MutationOptions<ProviderLink, void>) =>
  useApiMutation(() => api.post<ProviderLink>(`/api/jobs/${jobId}/checkout`), {}, { onSuccess: goTo, ...options?.mutationConfig });

export const useStartPayouts = (options?: MutationOptions<ProviderLink, void>) =>
  useApiMutation(() => api.post<ProviderLink>('/api/shop-profile/payouts'), {}, { onSuccess: goTo, ...options?.mutationConfig });

export const useApproveChangeOrder = (options?: MutationOptions<ProviderLink, string>) =>
  useApiMutation((id: string) => api.post<ProviderLink>(`/api/change-orders/${id}/approve`), {}, { onSuccess: goTo, ...options?.mutationConfig });

export const useProposeChangeOrder = (jobId: string, options?: MutationOptions<ChangeOrder, ChangeOrderInput>) =>
  useApiMutation(
    (input: ChangeOrderInput) => api.post<ChangeOrderAnswer>(`/api/jobs/${jobId}/change-orders`, input).then((r) => r.changeOrder),
    { refreshes: () => jobChangeKeys(jobId) },
    options?.mutationConfig,
  );

export const useDeclineChangeOrder = (jobId: string, options?: MutationOptions<ChangeOrder, string>) =>
  useApiMutation(
    (id: string) => api.post<ChangeOrderAnswer>(`/api/change-orders/${id}/decline`).then((r) => r.changeOrder),
    { refreshes: () => jobChangeKeys(jobId) },
    options?.mutationConfig,
  );

export const useCancelAndRefund = (jobId: string, options?: MutationOptions<MoneyView, void>) =>
  useApiMutation(() => api.post<MoneyView>(`/api/jobs/${jobId}/cancel-and-refund`), { refreshes: () => jobChangeKeys(jobId) }, options?.mutationConfig);

export { shopKeys };

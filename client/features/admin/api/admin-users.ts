import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { AdminUserAnswer, AdminUserPage, AdminUserRow, CreateAdminInput, SuspendUserInput as SuspendUserBody, UserSearchInput } from '@shared/schemas/admin';
import type { Me, MeAnswer } from '@shared/schemas/auth';
import { api, type ApiError } from '@client/lib/api-client';
import { adminKeys } from '@client/lib/query-keys';

export type { AdminUserRow };

export type UserFilters = Pick<UserSearchInput, 'q' | 'role'>;

export const adminUserKeys = {
  all: ['admin-users'] as const,
  lists: () => [...adminUserKeys.all, 'list'] as const,
  list: (filters: UserFilters) => [...adminUserKeys.lists(), filters] as const,
};

function toQuery(filters: UserFilters) {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.role) params.set('role', filters.role);
  return params.toString();
}

export const adminUserQueries = {
  list: (filters: UserFilters) =>
    queryOptions({
      queryKey: adminUserKeys.list(filters),
      queryFn: () => api.get<AdminUserPage>(`/api/admin/users?${toQuery(filters)}`),
      placeholderData: keepPreviousData,
    }),
};

export const useAdminUsers = (filters: UserFilters) => useQuery(adminUserQueries.list(filters));

export function useCreateAdmin(options?: { mutationConfig?: Omit<UseMutationOptions<Me, ApiError, CreateAdminInput>, 'mutationFn'> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<Me, ApiError, CreateAdminInput>({
    ...rest,
    mutationFn: (input) => api.post<MeAnswer>('/api/admin/admins', input).then((r) => r.user),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: adminUserKeys.lists() });
      return onSuccess?.(...args);
    },
  });
}

type AccountMutationConfig<TInput> = Omit<UseMutationOptions<AdminUserRow, ApiError, TInput>, 'mutationFn'>;

export type SuspendUserInput = { userId: string } & SuspendUserBody;

/** After a suspension or reinstatement: the people list, and the shops and audit log that show the owner's state. */
function useAfterAccountChange() {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: adminUserKeys.lists() });
    void queryClient.invalidateQueries({ queryKey: adminKeys.all });
  };
}

/** Suspends an account with a reason; its sessions stop working on their next request. */
export function useSuspendUser(options?: { mutationConfig?: AccountMutationConfig<SuspendUserInput> }) {
  const refresh = useAfterAccountChange();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<AdminUserRow, ApiError, SuspendUserInput>({
    ...rest,
    mutationFn: ({ userId, reason }) => api.post<AdminUserAnswer>(`/api/admin/users/${encodeURIComponent(userId)}/suspend`, { reason }).then((r) => r.user),
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

export function useReinstateUser(options?: { mutationConfig?: AccountMutationConfig<{ userId: string }> }) {
  const refresh = useAfterAccountChange();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<AdminUserRow, ApiError, { userId: string }>({
    ...rest,
    mutationFn: ({ userId }) => api.post<AdminUserAnswer>(`/api/admin/users/${encodeURIComponent(userId)}/reinstate`).then((r) => r.user),
    onSuccess: (...args) => {
      refresh();
      return onSuccess?.(...args);
    },
  });
}

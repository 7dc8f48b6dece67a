import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AdminUserAnswer, AdminUserPage, AdminUserRow, CreateAdminInput, SuspendUserInput as SuspendUserBody, UserSearchInput } from '@shared/schemas/admin';
import type { Me, MeAnswer } from '@shared/schemas/auth';
import { api } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
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

export const useCreateAdmin = (options?: MutationOptions<Me, CreateAdminInput>) =>
  useApiMutation(
    (input: CreateAdminInput) => api.post<MeAnswer>('/api/admin/admins', input).then((r) => r.user),
    { refreshes: () => [adminUserKeys.lists()] },
    options?.mutationConfig,
  );

export type SuspendUserInput = { userId: string } & SuspendUserBody;

/** After a suspension or reinstatement: the people list, and the shops and audit log that show the owner's state. */
const afterAccountChange = { refreshes: () => [adminUserKeys.lists(), adminKeys.all] };

/** Suspends an account with a reason; its sessions stop working on their next request. */
export const useSuspendUser = (options?: MutationOptions<AdminUserRow, SuspendUserInput>) =>
  useApiMutation(
    ({ userId, reason }: SuspendUserInput) => api.post<AdminUserAnswer>(`/api/admin/users/${encodeURIComponent(userId)}/suspend`, { reason }).then((r) => r.user),
    afterAccountChange,
    options?.mutationConfig,
  );

export const useReinstateUser = (options?: MutationOptions<AdminUserRow, { userId: string }>) =>
  useApiMutation(
    ({ userId }: { userId: string }) => api.post<AdminUserAnswer>(`/api/admin/users/${encodeURIComponent(userId)}/reinstate`).then((r) => r.user),
    afterAccountChange,
    options?.mutationConfig,
  );

import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { CreateAdminInput } from '@shared/schemas/admin';
import type { Me, Role } from '@shared/schemas/auth';
import { api, type ApiError } from '@client/lib/api-client';

export interface AdminUserRow {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  status: 'active' | 'suspended';
  emailVerifiedAt: string | null;
  createdAt: string;
}

export interface UserFilters {
  q?: string;
  role?: Role;
}

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
      queryFn: () => api.get<{ users: AdminUserRow[]; total: number }>(`/api/admin/users?${toQuery(filters)}`),
      placeholderData: keepPreviousData,
    }),
};

export const useAdminUsers = (filters: UserFilters) => useQuery(adminUserQueries.list(filters));

export function useCreateAdmin(options?: { mutationConfig?: Omit<UseMutationOptions<Me, ApiError, CreateAdminInput>, 'mutationFn'> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<Me, ApiError, CreateAdminInput>({
    ...rest,
    mutationFn: (input) => api.post<{ user: Me }>('/api/admin/admins', input).then((r) => r.user),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: adminUserKeys.lists() });
      return onSuccess?.(...args);
    },
  });
}

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditPage, AuditQuery } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { adminKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export type AuditFilters = AuditQuery;
export type { AuditPage };

export const adminAuditQueries = {
  page: (filters: AuditFilters) =>
    queryOptions({
      queryKey: adminKeys.audit({ ...filters }),
      queryFn: () => api.get<AuditPage>(`/api/admin/audit${toSearch({ ...filters })}`),
      placeholderData: keepPreviousData,
    }),
};

export const useAuditLog = (filters: AuditFilters) => useQuery(adminAuditQueries.page(filters));

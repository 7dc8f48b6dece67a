import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditRow } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { adminKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export interface AuditFilters {
  action?: string;
  limit: number;
  offset: number;
}

export interface AuditPage {
  entries: AuditRow[];
  total: number;
}

export const adminAuditQueries = {
  page: (filters: AuditFilters) =>
    queryOptions({
      queryKey: adminKeys.audit({ ...filters }),
      queryFn: () => api.get<AuditPage>(`/api/admin/audit${toSearch({ ...filters })}`),
      placeholderData: keepPreviousData,
    }),
};

export const useAuditLog = (filters: AuditFilters) => useQuery(adminAuditQueries.page(filters));

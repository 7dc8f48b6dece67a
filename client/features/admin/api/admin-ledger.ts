import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerKind, LedgerPage, LedgerQuery } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { adminKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export type { LedgerKind };

/** What narrows the ledger; the CSV download takes the same. */
export type LedgerFilters = Omit<LedgerQuery, 'limit' | 'offset'>;

export type LedgerPageRequest = LedgerQuery;

export const adminLedgerQueries = {
  page: (request: LedgerPageRequest) =>
    queryOptions({
      queryKey: adminKeys.ledger({ ...request }),
      queryFn: () => api.get<LedgerPage>(`/api/admin/ledger${toSearch({ ...request })}`),
      placeholderData: keepPreviousData,
    }),
};

export const useLedger = (request: LedgerPageRequest) => useQuery(adminLedgerQueries.page(request));

/** The address of every row the filters match, as a CSV file. */
export function ledgerCsvUrl(filters: LedgerFilters): string {
  return `/api/admin/ledger.csv${toSearch({ kind: filters.kind, jobId: filters.jobId, from: filters.from, to: filters.to })}`;
}

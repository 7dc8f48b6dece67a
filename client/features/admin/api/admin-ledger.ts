import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerPage, ledgerKinds } from '@shared/schemas/admin';
import { api } from '@client/lib/api-client';
import { adminKeys } from '@client/lib/query-keys';
import { toSearch } from '@client/lib/search-params';

export type LedgerKind = (typeof ledgerKinds)[number];

/** What narrows the ledger; the CSV download takes the same. */
export interface LedgerFilters {
  kind?: LedgerKind;
  jobId?: string;
  from?: string;
  to?: string;
}

export interface LedgerPageRequest extends LedgerFilters {
  limit: number;
  offset: number;
}

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

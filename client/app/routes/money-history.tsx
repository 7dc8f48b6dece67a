import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import type { MoneyHistory, MoneyHistoryRow } from '@shared/schemas/payments';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { useMe } from '@client/features/auth';
import { api } from '@client/lib/api-client';
import { moneyHistoryKeys } from '@client/lib/query-keys';
import { useSearchParamUpdater } from '@client/lib/search-params';
import { TableHead } from '@client/components/ui/table-head';

const PAGE_SIZE = 25;

/**
 * The one request this page makes. It lives here rather than in a feature:
 * the history spans every job of the signed-in person and nothing else uses it.
 */
const moneyHistoryQuery = (offset: number) =>
  queryOptions({
    queryKey: moneyHistoryKeys.page(offset),
    queryFn: () => api.get<MoneyHistory>(`/api/me/money?limit=${PAGE_SIZE}&offset=${offset}`),
    placeholderData: keepPreviousData,
  });

type Side = 'builder' | 'shop';

/** What each ledger entry means to the person reading it. */
const kindWords: Record<Side, Record<MoneyHistoryRow['kind'], string>> = {
  builder: { paid_in: 'You paid in', released: 'Paid to the shop', fee: 'Platform fee', refunded: 'Refunded to you' },
  shop: { paid_in: 'Builder paid in (held)', released: 'Paid to you', fee: 'Platform fee', refunded: 'Refunded to the builder' },
};

const leads: Record<Side, string> = {
  builder: 'Every payment on your jobs, newest first: what you paid in, what went to the shop, the platform fee, and refunds.',
  shop: 'Every payment on your jobs, newest first: what builders paid in and is held, what was paid to you, the platform fee, and refunds.',
};

const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

function readPage(params: URLSearchParams): number {
  const page = Number(params.get('page'));
  return Number.isSafeInteger(page) && page > 1 ? page : 1;
}

export function MoneyHistoryRoute() {
  const { data: me } = useMe();
  const side: Side = me?.role === 'shop' ? 'shop' : 'builder';
  const { params, setPage } = useSearchParamUpdater();
  const page = readPage(params);
  const history = useQuery(moneyHistoryQuery((page - 1) * PAGE_SIZE));


  return (
    <div>
      <PageTitle title="Money" lead={leads[side]} />
      {history.isPending && <p className="text-ink-soft">Loading your money history …</p>}
      {history.isError && (
        <Notice tone="error" title="Your money history could not be loaded">
          {history.error.message}
        </Notice>
      )}
      {history.data && history.data.total === 0 && (
        <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
          <p className="text-lg font-bold">No money has moved yet</p>
          <p className="mt-1 text-ink-soft">
            {side === 'builder'
              ? 'Payments appear here once you pay for a job whose bid you accepted.'
              : 'Payments appear here once a builder pays for a job you won.'}
          </p>
        </div>
      )}
      {history.data && history.data.total > 0 && (
        <>
          {history.data.rows.length === 0 ? (
            <p className="text-ink-soft">This page is empty. Go back to the first page.</p>
          ) : (
            <div
              role="region"
              aria-label="Money history"
              tabIndex={0}
              className={`relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100 ${history.isPlaceholderData ? 'opacity-60' : ''}`}
              aria-busy={history.isFetching}
            >
              <table className="w-full min-w-[36rem] text-left text-sm">
                <caption className="sr-only">Money on your jobs, newest first</caption>
                <TableHead columns={['Date', 'Job', 'What happened', { label: 'Amount', align: 'right' }]} />
                <tbody>
                  {history.data.rows.map((row) => (
                    <tr key={row.id} className="border-b border-slate-100 align-top" data-testid="money-row">
                      <td className="py-3 pr-4 whitespace-nowrap">
                        <time dateTime={row.createdAt}>{when.format(new Date(row.createdAt))}</time>
                      </td>
                      <td className="py-3 pr-4">
                        <Link to={`/jobs/${row.jobId}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
                          {row.jobTitle || 'Untitled job'}
                        </Link>
                      </td>
                      <td className="py-3 pr-4">{kindWords[side][row.kind]}</td>
                      <td className="py-3 text-right font-semibold tabular-nums">{formatCents(row.amountCents)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <Pager className="mt-6" label="Money history pages" page={page} pageSize={PAGE_SIZE} total={history.data.total} onPage={(next) => setPage(next, { scrollToTop: false })} />
        </>
      )}
    </div>
  );
}

import { NAMES } from '@shared/glossary';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import type { MoneyHistory, MoneyHistoryRow, MoneyPeriod, MoneyTotals } from '@shared/schemas/payments';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { useMe } from '@client/features/auth';
import { api } from '@client/lib/api-client';
import { moneyHistoryKeys } from '@client/lib/query-keys';
import { toSearch, useSearchParamUpdater } from '@client/lib/search-params';
import { ClearFiltersButton, FilterForm } from '@client/components/ui/filter-form';
import { TextField } from '@client/components/ui/text-field';
import { TableHead } from '@client/components/ui/table-head';
import { formatDateTime } from '@client/lib/dates';
import { lazyModule } from '@client/lib/lazy-module';

const PAGE_SIZE = 25;

/**
 * The one request this page makes. It lives here rather than in a feature:
 * the history spans every job of the signed-in person and nothing else uses it.
 */
const moneyHistoryQuery = (offset: number, period: MoneyPeriod) =>
  queryOptions({
    queryKey: moneyHistoryKeys.page(offset, period),
    queryFn: () => api.get<MoneyHistory>(`/api/me/money${toSearch({ limit: PAGE_SIZE, offset, ...period })}`),
    placeholderData: keepPreviousData,
  });

const PERIOD_KEYS = ['from', 'to'] as const;

// The API's own schema checks the period in the address. It (with zod) loads after the first paint, so it is
// there before anyone picks a day (the results never blink out); only a page opened with a period waits for it.
const usePaymentSchemas = lazyModule(() => import('@shared/schemas/payments'));
type PeriodErrors = Partial<Record<'from' | 'to', string>>;

/**
 * The period from the address bar, checked with the API's own schema; a period the API would refuse is kept
 * aside with its messages. `checking` while the schema is still loading (there is nothing to check without a period).
 */
function usePeriod(params: URLSearchParams): { period: MoneyPeriod; errors: PeriodErrors; checking: boolean } {
  const raw = Object.fromEntries(PERIOD_KEYS.flatMap((key) => (params.get(key) ? [[key, params.get(key)]] : [])));
  const given = Object.keys(raw).length > 0;
  const schemas = usePaymentSchemas(true);
  if (!given) return { period: {}, errors: {}, checking: false };
  if (!schemas) return { period: {}, errors: {}, checking: true };
  const parsed = schemas.moneyPeriodSchema.safeParse(raw);
  if (parsed.success) return { period: parsed.data, errors: {}, checking: false };
  return { period: {}, errors: Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])), checking: false };
}

/** The period's totals, in the reader's words; a shop also sees what it kept. */
const totalWords: Record<Side, Array<[keyof MoneyTotals, string]>> = {
  builder: [
    ['paidIn', 'You paid in'],
    ['held', 'Held at the end of the period'],
    ['released', 'Paid to shops'],
    ['refunded', 'Refunded to you'],
  ],
  shop: [
    ['paidIn', 'Builders paid in'],
    ['held', 'Held at the end of the period'],
    ['released', 'Paid to you (net)'],
    ['fee', NAMES.fee],
    ['refunded', 'Refunded to builders'],
  ],
};

function MoneyTotalsBox({ totals, side }: { totals: MoneyTotals; side: Side }) {
  return (
    <section aria-labelledby="money-totals-heading" className="mb-6 rounded-card bg-paper-raised p-4 shadow-card ring-1 ring-slate-100">
      <h2 id="money-totals-heading" className="text-base font-bold">
        Totals for the period
      </h2>
      <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-5">
        {totalWords[side].map(([key, label]) => (
          <div key={key}>
            <dt className="text-sm text-ink-soft">{label}</dt>
            <dd className="text-lg font-bold tabular-nums" data-testid={`money-total-${key}`}>
              {formatCents(totals[key])}
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

type Side = 'builder' | 'shop';

/** What each ledger entry means to the person reading it. */
const kindWords: Record<Side, Record<MoneyHistoryRow['kind'], string>> = {
  builder: { paid_in: 'You paid in', released: 'Paid to the shop', fee: NAMES.fee, refunded: 'Refunded to you' },
  shop: { paid_in: 'Builder paid in (held)', released: 'Paid to you', fee: NAMES.fee, refunded: 'Refunded to the builder' },
};

const leads: Record<Side, string> = {
  builder: 'Every payment on your jobs, newest first: what you paid in, what went to the shop, the Tenthmark fee, and refunds.',
  shop: 'Every payment on your jobs, newest first: what builders paid in and is held, what was paid to you, the Tenthmark fee, and refunds.',
};


function readPage(params: URLSearchParams): number {
  const page = Number(params.get('page'));
  return Number.isSafeInteger(page) && page > 1 ? page : 1;
}

export function MoneyHistoryRoute() {
  const { data: me } = useMe();
  const side: Side = me?.role === 'shop' ? 'shop' : 'builder';
  const { params, setPage, setFilter, filtered, clearFilters } = useSearchParamUpdater(PERIOD_KEYS);
  const page = readPage(params);
  const { period, errors, checking } = usePeriod(params);
  const valid = Object.keys(errors).length === 0;
  const history = useQuery({ ...moneyHistoryQuery((page - 1) * PAGE_SIZE, period), enabled: valid && !checking });

  return (
    <div>
      <PageTitle title="Money" lead={leads[side]} />
      <FilterForm label="Choose the period" className="grid sm:grid-cols-3">
        <TextField label="First day" type="date" value={params.get('from') ?? ''} error={errors.from} onChange={(event) => setFilter('from', event.target.value, { replace: true })} />
        <TextField label="Last day" type="date" value={params.get('to') ?? ''} error={errors.to} onChange={(event) => setFilter('to', event.target.value, { replace: true })} />
        <ClearFiltersButton filtered={filtered} onClear={clearFilters} />
      </FilterForm>
      {valid ? (
        <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
          <p className="text-sm text-ink-soft">Days run midnight to midnight, UTC. The download holds every entry of the period and its totals, not only this page.</p>
          <a
            href={`/api/me/money.csv${toSearch(period)}`}
            download
            // Kept in place (hidden) while the period is being checked, so nothing moves when it is.
            className={`inline-flex min-h-11 items-center rounded-lg bg-paper-raised px-4 py-2 font-semibold text-slate-800 ring-1 ring-inset ring-slate-300 hover:bg-slate-50 ${checking ? 'invisible' : ''}`}
          >
            Download CSV
          </a>
        </div>
      ) : (
        <Notice tone="caution" title="Fix the marked day to see your money">
          The entries show again once the period reads from a first day to a last day on or after it.
        </Notice>
      )}
      {history.data && <MoneyTotalsBox totals={history.data.totals} side={side} />}
      {valid && history.isPending && <p className="text-ink-soft">Loading your money history …</p>}
      {history.isError && (
        <Notice tone="error" title="Your money history could not be loaded" onRetry={() => void history.refetch()}>
          {history.error.message}
        </Notice>
      )}
      {history.data && history.data.total === 0 && (
        <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
          <p className="text-lg font-bold">{filtered ? 'No money moved in this period' : 'No money has moved yet'}</p>
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
                        <time dateTime={row.createdAt}>{formatDateTime(row.createdAt)}</time>
                      </td>
                      <td className="py-3 pr-4">
                        <Link to={`/jobs/${row.jobId}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
                          {row.jobTitle || 'Untitled job'}
                        </Link>
                      </td>
                      <td className="py-3 pr-4">
                        {kindWords[side][row.kind]}
                        {row.receipt && (
                          <a href={`/api/payments/${row.receipt.paymentId}/receipt.pdf`} download className="block text-sm font-semibold text-slate-700 underline underline-offset-4">
                            Receipt {row.receipt.number} (PDF)
                          </a>
                        )}
                      </td>
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

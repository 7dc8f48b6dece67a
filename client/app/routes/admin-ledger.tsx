import { Link } from 'react-router-dom';
import { ledgerKinds } from '@shared/schemas/values';
import { PageTitle } from '@client/components/ui/card';
import { ClearFiltersButton, FilterForm } from '@client/components/ui/filter-form';
import { DebouncedTextField } from '@client/components/ui/debounced-text-field';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { SelectField } from '@client/components/ui/select-field';
import { TextField } from '@client/components/ui/text-field';
import { ledgerCsvUrl, useLedger, type LedgerFilters, ledgerKindWords, LedgerTable, LedgerTotals } from '@client/features/admin';
import { lazyModule } from '@client/lib/lazy-module';
import { toSearch, useSearchParamUpdater } from '@client/lib/search-params';

const PAGE_SIZE = 50;
const FILTER_KEYS = ['kind', 'jobId', 'from', 'to'] as const;
type FilterKey = (typeof FILTER_KEYS)[number];
// The API's own schema checks the filters in the address. It (with zod) loads after the first paint, so it is
// there before anyone picks a filter (the results never blink out); only a page opened with filters waits for it.
const useAdminSchemas = lazyModule(() => import('@shared/schemas/admin'));

/**
 * The filters from the address bar; a value the API would refuse is kept aside with its message.
 * `checking` while the schema is still loading (there is nothing to check without filters).
 */
function useFilters(params: URLSearchParams) {
  const filters: LedgerFilters = {};
  const errors: Partial<Record<FilterKey, string>> = {};
  const given = FILTER_KEYS.flatMap((key) => {
    const raw = params.get(key)?.trim();
    return raw ? [[key, raw] as const] : [];
  });
  const schemas = useAdminSchemas(true);
  const page = Math.max(1, Number.parseInt(params.get('page') ?? '1', 10) || 1);
  if (given.length === 0) return { filters, errors, page, checking: false };
  if (!schemas) return { filters, errors, page, checking: true };
  for (const [key, raw] of given) {
    const parsed = schemas.ledgerQuerySchema.shape[key].safeParse(raw);
    if (parsed.success) Object.assign(filters, { [key]: parsed.data });
    else errors[key] = parsed.error.issues[0]?.message ?? 'That value is not valid.';
  }
  if (filters.from && filters.to && filters.from > filters.to) errors.to = 'The end date is before the start date.';
  return { filters, errors, page, checking: false };
}

function LedgerResults({ filters, page, setPage }: { filters: LedgerFilters; page: number; setPage: (page: number) => void }) {
  const ledger = useLedger({ ...filters, limit: PAGE_SIZE, offset: (page - 1) * PAGE_SIZE });
  const filtered = FILTER_KEYS.some((key) => filters[key]);
  if (ledger.isPending) return <p className="text-ink-soft">Loading the ledger …</p>;
  if (ledger.isError)
    return (
      <Notice tone="error" title="The ledger could not be loaded" onRetry={() => void ledger.refetch()}>
        {ledger.error.message}
      </Notice>
    );
  return (
    <div className="flex flex-col gap-6">
      <LedgerTotals page={ledger.data} />
      {ledger.data.rows.length === 0 ? (
        <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
          <p className="text-lg font-bold">{filtered ? 'No entries match these filters' : 'The ledger is empty'}</p>
          <p className="mt-1 text-ink-soft">{filtered ? 'Try another kind, job or dates.' : 'Entries appear when a builder pays and when money is paid out or refunded.'}</p>
        </div>
      ) : (
        <LedgerTable
          rows={ledger.data.rows}
          dimmed={ledger.isPlaceholderData}
          onlyJobHref={(jobId) => `/admin/ledger${toSearch({ ...filters, jobId })}`}
        />
      )}
      <Pager label="Ledger pages" page={page} pageSize={PAGE_SIZE} total={ledger.data.total} onPage={setPage} />
    </div>
  );
}

export function AdminLedgerRoute() {
  const { params, setFilter, filtered, clearFilters, setPage } = useSearchParamUpdater(FILTER_KEYS);
  const { filters, errors, page, checking } = useFilters(params);
  const valid = Object.keys(errors).length === 0;

  return (
    <div>
      <PageTitle title="Ledger" lead="Every movement of money on Tenthmark: payments in, payouts to shops, fees kept and refunds. Entries are never changed or removed." />
      <FilterForm label="Filter the ledger" className="grid sm:grid-cols-2 lg:grid-cols-5">
        <SelectField
          label="Kind"
          // While the filters are being checked, the choice shows what the address says (it would jump back otherwise).
          value={(checking ? params.get('kind') : filters.kind) ?? ''}
          onChange={(event) => setFilter('kind', event.target.value)}
          options={[{ value: '', label: 'Every kind' }, ...ledgerKinds.map((kind) => ({ value: kind, label: ledgerKindWords[kind] }))]}
        />
        <DebouncedTextField
          label="Job id"
          value={params.get('jobId') ?? ''}
          onCommit={(text) => setFilter('jobId', text, { replace: true })}
          error={errors.jobId}
          autoComplete="off"
          spellCheck={false}
        />
        <TextField label="From" type="date" value={params.get('from') ?? ''} error={errors.from} onChange={(event) => setFilter('from', event.target.value, { replace: true })} />
        <TextField label="To" type="date" value={params.get('to') ?? ''} error={errors.to} onChange={(event) => setFilter('to', event.target.value, { replace: true })} />
        <ClearFiltersButton filtered={filtered} onClear={clearFilters} />
      </FilterForm>
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-ink-soft">The download holds every entry these filters match, not only this page.</p>
        {valid ? (
          <a
            href={ledgerCsvUrl(filters)}
            download
            // Kept in place (hidden) while the filters are being checked, so nothing moves when they are.
            className={`inline-flex min-h-11 items-center rounded-lg bg-paper-raised px-4 py-2 font-semibold text-slate-800 ring-1 ring-inset ring-slate-300 hover:bg-slate-50 ${checking ? 'invisible' : ''}`}
          >
            Download CSV
          </a>
        ) : null}
      </div>
      {checking ? (
        <p className="text-ink-soft">Loading the ledger …</p>
      ) : valid ? (
        <LedgerResults filters={filters} page={page} setPage={setPage} />
      ) : (
        <Notice tone="caution" title="Fix the marked filter to see the ledger">
          The entries show again once every filter holds a value the ledger can use.{' '}
          <Link to="/admin/ledger" className="font-semibold underline underline-offset-4">
            Show every entry
          </Link>
        </Notice>
      )}
    </div>
  );
}

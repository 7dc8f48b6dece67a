import { operations } from '@shared/catalogue';
import { formatDistance, POSTAL_CODE_NOT_FOUND } from '@shared/distance';
import type { ShopDirectoryPage } from '@shared/schemas/shops';
import { Button } from '@client/components/ui/button';
import { PageTitle } from '@client/components/ui/card';
import { FilterForm } from '@client/components/ui/filter-form';
import { DebouncedTextField } from '@client/components/ui/debounced-text-field';
import { WithinField } from '@client/components/ui/within-field';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { SelectField } from '@client/components/ui/select-field';
import { useShops, type DirectoryFilters, ShopCard } from '@client/features/shops';
import { lazyModule } from '@client/lib/lazy-module';
import { useSearchParamUpdater } from '@client/lib/search-params';

const PAGE_SIZE = 12;
const FILTER_KEYS = ['q', 'operation', 'country', 'region', 'takesShipped', 'near', 'within'] as const;
const CHECKED_KEYS = ['q', 'operation', 'country', 'region', 'near', 'within', 'page'] as const;
// The API's own schema checks the filters in the address. It (with zod) loads after the first paint, so it is
// there before anyone picks a filter (the results never blink out); only a page opened with filters waits for it.
const useShopSchemas = lazyModule(() => import('@shared/schemas/shops'));

/**
 * The filters in the address bar, keeping only values the API accepts (a hand-edited address never breaks
 * the page); undefined while the schema that checks them is still loading.
 */
function useFilters(params: URLSearchParams): DirectoryFilters | undefined {
  const given = CHECKED_KEYS.some((key) => params.get(key));
  const schemas = useShopSchemas(true);
  const shipped = params.get('takesShipped');
  const takesShipped = shipped === 'true' || shipped === 'false' ? shipped : undefined;
  if (!given) return { takesShipped, page: 1, pageSize: PAGE_SIZE };
  if (!schemas) return undefined;
  const shape = schemas.shopDirectoryQuerySchema.shape;
  const text = (key: 'q' | 'country' | 'region' | 'near') => {
    const value = params.get(key)?.trim();
    return value && shape[key].safeParse(value).success ? value : undefined;
  };
  const operation = shape.operation.safeParse(params.get('operation') ?? undefined);
  const page = shape.page.safeParse(params.get('page') ?? undefined);
  const near = text('near');
  const within = shape.within.safeParse(params.get('within') || undefined);
  return {
    q: text('q'),
    operation: operation.success ? operation.data : undefined,
    country: text('country'),
    region: text('region'),
    takesShipped,
    near,
    // A radius means something only from a postal code.
    within: near && within.success ? within.data : undefined,
    page: page.success ? page.data : 1,
    pageSize: PAGE_SIZE,
  };
}

/** What the order is measured from, said beside the count: a postal code typed in, or the builder's latest job. */
function MeasuredFrom({ from }: { from: ShopDirectoryPage['distanceFrom'] }) {
  if (!from) return null;
  const whose = from.from === 'latest-job' ? ' (your latest job)' : '';
  return (
    <span className="block text-sm font-normal text-ink-soft" data-testid="directory-origin">
      {from.found
        ? `Nearest to ${from.postalCode}${whose} first. Type another postal code to measure from there.`
        : `${from.postalCode ? `${from.postalCode}${whose}: ${POSTAL_CODE_NOT_FOUND}` : `Your jobs give no postal code: distances fall back to region`}; shops in ${from.region} first. Type a postal code to measure from there.`}
    </span>
  );
}

export function ShopDirectoryRoute() {
  // A new filter value starts again at page 1; typing replaces the history entry instead of adding one per pause.
  const { params, setParams, setFilter, filtered, setPage } = useSearchParamUpdater(FILTER_KEYS);
  const checked = useFilters(params);
  const shops = useShops(checked ?? { page: 1, pageSize: PAGE_SIZE }, { enabled: checked !== undefined });
  // While the filters are being checked, the choices show what the address says (they would jump back otherwise).
  const shown = (key: 'operation' | 'takesShipped') => (checked ? checked[key] : params.get(key)) ?? '';

  return (
    <div>
      <PageTitle
        title="Machine shops"
        lead="Shops that bore, hone, deck and grind for engine builders. Open a shop to see its equipment and usual prices."
      />
      <FilterForm label="Filter shops" className="grid sm:grid-cols-2 md:grid-cols-3 lg:grid-cols-5">
        <DebouncedTextField
          label="Name or town"
          type="search"
          value={params.get('q') ?? ''}
          onCommit={(text) => setFilter('q', text, { replace: true })}
          className="lg:col-span-1"
        />
        <SelectField
          label="Work"
          value={shown('operation')}
          onChange={(event) => setFilter('operation', event.target.value)}
          options={[{ value: '', label: 'Any work' }, ...operations.map((op) => ({ value: op.code, label: op.name }))]}
        />
        <DebouncedTextField label="Country" value={params.get('country') ?? ''} onCommit={(text) => setFilter('country', text, { replace: true })} />
        <DebouncedTextField
          label="State, province or county"
          value={params.get('region') ?? ''}
          onCommit={(text) => setFilter('region', text, { replace: true })}
        />
        <DebouncedTextField
          label="Near postal code"
          autoComplete="postal-code"
          value={params.get('near') ?? ''}
          onCommit={(text) => setFilter('near', text, { replace: true })}
        />
        <WithinField label="Within (miles or km)" value={params.get('within') ?? ''} onCommit={(text) => setFilter('within', text, { replace: true })} />
        <SelectField
          label="Shipped parts"
          value={shown('takesShipped')}
          onChange={(event) => setFilter('takesShipped', event.target.value)}
          options={[
            { value: '', label: 'Either' },
            { value: 'true', label: 'Takes shipped parts' },
            { value: 'false', label: 'Drop-off only' },
          ]}
        />
      </FilterForm>

      {shops.isError && (
        <Notice tone="error" title="The shops could not be loaded" onRetry={() => void shops.refetch()}>
          {shops.error.message}
        </Notice>
      )}
      {shops.isPending && <p className="text-ink-soft">Loading shops …</p>}
      {shops.data && (
        <>
          <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
            <p className="font-semibold" aria-live="polite">
              {shops.data.total === 1 ? '1 shop' : `${shops.data.total} shops`}
              {filtered ? (shops.data.total === 1 ? ' matches these filters' : ' match these filters') : ''}
              <MeasuredFrom from={shops.data.distanceFrom} />
            </p>
            {filtered && (
              <Button variant="quiet" onClick={() => setParams(new URLSearchParams())}>
                Clear filters
              </Button>
            )}
          </div>
          {shops.data.shops.length === 0 ? (
            <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
              <p className="text-lg font-bold">No shops {filtered ? 'match these filters' : 'have joined yet'}</p>
              <p className="mt-1 text-ink-soft">
                {filtered ? 'Try a wider area, or any kind of work.' : 'Shops appear here once they set up a profile.'}
              </p>
            </div>
          ) : (
            <ul className={`grid gap-4 sm:grid-cols-2 lg:grid-cols-3 ${shops.isPlaceholderData ? 'opacity-60' : ''}`} aria-busy={shops.isFetching}>
              {shops.data.shops.map((shop) => (
                <li key={shop.id}>
                  <ShopCard
                    shop={shop}
                    distance={shops.data.distanceFrom?.found ? (shop.distance === null ? 'distance unknown' : `${formatDistance(shop.distance, shops.data.distanceFrom.unit)} away`) : undefined}
                  />
                </li>
              ))}
            </ul>
          )}
          <Pager
            className="mt-6"
            label="Shop list pages"
            page={shops.data.page}
            pageSize={shops.data.pageSize}
            total={shops.data.total}
            onPage={setPage}
          />
        </>
      )}
    </div>
  );
}

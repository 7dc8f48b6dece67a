import { Link } from 'react-router-dom';
import { findOperation, operations } from '@shared/catalogue';
import type { BoardJob, BoardQuery, JobSummary } from '@shared/schemas/jobs';
import { BuilderStandingBrief } from '@client/components/standing';
import { Button } from '@client/components/ui/button';
import { PageTitle } from '@client/components/ui/card';
import { ClearFiltersButton, FilterForm } from '@client/components/ui/filter-form';
import { DebouncedTextField } from '@client/components/ui/debounced-text-field';
import { WithinField } from '@client/components/ui/within-field';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { SelectField } from '@client/components/ui/select-field';
import { TextField } from '@client/components/ui/text-field';
import { useBoard, readBoardFilters } from '@client/features/jobs';
import { useOwnShop } from '@client/features/shops';
import { cn } from '@client/lib/cn';
import { formatDate, formatDay } from '@client/lib/dates';
import { DISTANCE_UNIT_WORDS, formatDistance, POSTAL_CODE_NOT_FOUND, type DistanceUnit } from '@shared/distance';
import { useSearchParamUpdater } from '@client/lib/search-params';

type Sort = BoardQuery['sort'];
const FILTER_KEYS = ['operation', 'material', 'cylinders', 'country', 'region', 'logistics', 'neededBefore', 'within'] as const;
const PAGE_SIZES = [10, 20, 50, 100];

const materialWords: Record<NonNullable<JobSummary['blockMaterial']>, string> = { 'cast-iron': 'Cast iron', aluminium: 'Aluminium' };
const logisticsWords: Record<JobSummary['logistics'], string> = { ship: 'Shipped to the shop', 'drop-off': 'Dropped off' };

/** How each sort reads, and which way its column runs (for aria-sort). */
const sorts: Record<Sort, { column: string; order: string; direction: 'ascending' | 'descending' }> = {
  newest: { column: 'Posted', order: 'newest first', direction: 'descending' },
  'needed-soonest': { column: 'Needed by', order: 'soonest first', direction: 'ascending' },
  'fewest-bids': { column: 'Bids', order: 'fewest first', direction: 'ascending' },
  distance: { column: 'Where', order: 'nearest first', direction: 'ascending' },
};

/** How far the job's parts are from the shop, when both places are known. */
function DistanceLine({ job, unit }: { job: JobSummary; unit: DistanceUnit | undefined }) {
  if (!unit) return null;
  return (
    <span className="block text-sm text-ink-soft" data-testid="job-distance">
      {job.distance !== null ? `${formatDistance(job.distance, unit)} away` : job.placeFound ? 'distance unknown' : 'postal code not found'}
    </span>
  );
}

/** The day a job was posted, as the reader's date. */
function formatPosted(timestamp: string | null) {
  return timestamp ? formatDate(timestamp) : '—';
}

function SortHeader({ sort, current, onSort, className }: { sort: Sort; current: Sort; onSort: (sort: Sort) => void; className?: string }) {
  const words = sorts[sort];
  const active = sort === current;
  return (
    <th scope="col" aria-sort={active ? words.direction : 'none'} className={cn('py-2 pr-3 align-bottom', className)}>
      <button
        type="button"
        onClick={() => onSort(sort)}
        className={cn(
          '-mx-2 inline-flex min-h-9 items-center gap-1 whitespace-nowrap rounded-md px-2 font-semibold hover:bg-slate-100',
          active ? 'text-ink' : 'text-ink-soft',
        )}
      >
        {words.column}
        <span aria-hidden className={cn('text-xs', active ? 'text-slate-700' : 'text-ink-faint')}>
          {active ? (words.direction === 'ascending' ? '▲' : '▼') : '↕'}
        </span>
        <span className="sr-only">{active ? `, sorted ${words.order}` : `, sort ${words.order}`}</span>
      </button>
    </th>
  );
}

function JobRow({ job, unit }: { job: BoardJob; unit: DistanceUnit | undefined }) {
  return (
    <tr className="border-b border-slate-100 align-top">
      <td className="py-3 pr-3">
        <Thumb job={job} className="h-12 w-16" />
      </td>
      <th scope="row" className="py-3 pr-3 text-left font-normal">
        <Link to={`/jobs/${job.id}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
          {job.title}
        </Link>
      </th>
      <td className="py-3 pr-3">{job.engineFamily}</td>
      <td className="py-3 pr-3 text-right tabular-nums">{job.cylinders}</td>
      <td className="py-3 pr-3 whitespace-nowrap">{job.blockMaterial ? materialWords[job.blockMaterial] : '—'}</td>
      <td className="py-3 pr-3">{job.operations.map((code) => findOperation(code)?.name ?? code).join(', ')}</td>
      <td className="py-3 pr-3">
        {[job.city, job.region].filter(Boolean).join(', ')}
        <span className="block text-sm text-ink-soft">{logisticsWords[job.logistics]}</span>
        <DistanceLine job={job} unit={unit} />
      </td>
      <td className="py-3 pr-3">
        <span className="whitespace-nowrap">{formatPosted(job.publishedAt)}</span>
        {/* Who posted it, in a cell of its own: the row's header stays the job's title alone. */}
        <BuilderStandingBrief standing={job.builderStanding} />
      </td>
      <td className="py-3 pr-3 whitespace-nowrap">{formatDay(job.neededBy)}</td>
      <td className="py-3 text-right tabular-nums">{job.bidCount}</td>
    </tr>
  );
}

function Thumb({ job, className }: { job: JobSummary; className?: string }) {
  return job.thumbUrl ? (
    <img src={job.thumbUrl} alt="" loading="lazy" className={cn('rounded-md bg-paper-sunk object-cover ring-1 ring-slate-200', className)} />
  ) : (
    <div aria-hidden className={cn('flex items-center justify-center rounded-md bg-paper-sunk text-xs text-ink-soft ring-1 ring-slate-200', className)}>
      no photo
    </div>
  );
}

/** The same facts as a table row, as a card for tablets and phones. */
function JobCard({ job, unit }: { job: BoardJob; unit: DistanceUnit | undefined }) {
  return (
    <article className="flex h-full gap-4 rounded-card bg-paper-raised p-4 shadow-card ring-1 ring-slate-100">
      <Thumb job={job} className="h-16 w-20 shrink-0" />
      <div className="flex min-w-0 flex-1 flex-col gap-2">
        <h2 className="text-base font-bold leading-snug">
          <Link to={`/jobs/${job.id}`} className="text-slate-700 underline-offset-4 hover:underline">
            {job.title}
          </Link>
        </h2>
        <p className="text-sm text-ink-soft">
          {job.engineFamily} · {job.cylinders} {job.cylinders === 1 ? 'cylinder' : 'cylinders'}
          {job.blockMaterial && ` · ${materialWords[job.blockMaterial].toLowerCase()}`}
        </p>
        <p className="text-sm">{job.operations.map((code) => findOperation(code)?.name ?? code).join(', ')}</p>
        <BuilderStandingBrief standing={job.builderStanding} />
        <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="font-semibold text-ink-soft">Where</dt>
          <dd>
            {[job.city, job.region].filter(Boolean).join(', ')} · {logisticsWords[job.logistics].toLowerCase()}
            <DistanceLine job={job} unit={unit} />
          </dd>
          <dt className="font-semibold text-ink-soft">Needed by</dt>
          <dd>{formatDay(job.neededBy)}</dd>
          <dt className="font-semibold text-ink-soft">Posted</dt>
          <dd>{formatPosted(job.publishedAt)}</dd>
          <dt className="font-semibold text-ink-soft">Bids</dt>
          <dd>{job.bidCount === 0 ? 'none yet' : job.bidCount}</dd>
        </dl>
      </div>
    </article>
  );
}

export function BoardRoute() {
  const { params, update, setFilter, filtered, clearFilters, setPage } = useSearchParamUpdater(FILTER_KEYS);
  const filters = readBoardFilters(params);
  const board = useBoard(filters);
  const own = useOwnShop();
  const distanceFrom = board.data?.distanceFrom ?? null;
  const unit = distanceFrom?.unit;

  const setSort = (sort: Sort) =>
    update((next) => {
      if (sort === 'newest') next.delete('sort');
      else next.set('sort', sort);
      next.delete('page');
    });
  const setPageSize = (size: string) =>
    update((next) => {
      if (size === '20') next.delete('pageSize');
      else next.set('pageSize', size);
      next.delete('page');
    });

  return (
    <div>
      <PageTitle title="Job board" lead="Open jobs from engine builders. Open one to see its full spec and photos, and to bid." />

      {own.data === null && (
        <Notice tone="caution" title="Set up your shop profile to bid" className="mb-6">
          You can look around, but a shop needs a profile before it can bid.{' '}
          <Link to="/shop/profile" className="font-semibold underline underline-offset-4">
            Set up your shop profile
          </Link>
        </Notice>
      )}

      <FilterForm label="Filter jobs" className="grid sm:grid-cols-2 lg:grid-cols-4">
        <SelectField
          label="Work"
          value={filters.operation ?? ''}
          onChange={(event) => setFilter('operation', event.target.value)}
          options={[{ value: '', label: 'Any work' }, ...operations.map((op) => ({ value: op.code, label: op.name }))]}
        />
        <SelectField
          label="Block material"
          value={filters.material ?? ''}
          onChange={(event) => setFilter('material', event.target.value)}
          options={[{ value: '', label: 'Any material' }, ...Object.entries(materialWords).map(([value, label]) => ({ value, label }))]}
        />
        <SelectField
          label="Cylinders"
          value={filters.cylinders ? String(filters.cylinders) : ''}
          onChange={(event) => setFilter('cylinders', event.target.value)}
          options={[{ value: '', label: 'Any number' }, ...Array.from({ length: 16 }, (_, i) => ({ value: String(i + 1), label: String(i + 1) }))]}
        />
        <SelectField
          label="Getting it to you"
          value={filters.logistics ?? ''}
          onChange={(event) => setFilter('logistics', event.target.value)}
          options={[{ value: '', label: 'Shipped or dropped off' }, ...Object.entries(logisticsWords).map(([value, label]) => ({ value, label }))]}
        />
        <DebouncedTextField label="Country" value={params.get('country') ?? ''} onCommit={(text) => setFilter('country', text, { replace: true })} />
        <DebouncedTextField
          label="State, province or county"
          value={params.get('region') ?? ''}
          onCommit={(text) => setFilter('region', text, { replace: true })}
        />
        <WithinField
          label={`Within (${DISTANCE_UNIT_WORDS[unit ?? 'mi']} of your shop)`}
          value={params.get('within') ?? ''}
          onCommit={(text) => setFilter('within', text, { replace: true })}
        />
        <TextField
          label="Needed before"
          type="date"
          value={filters.neededBefore ?? ''}
          onChange={(event) => setFilter('neededBefore', event.target.value, { replace: true })}
        />
        <ClearFiltersButton filtered={filtered} onClear={clearFilters} />
      </FilterForm>

      {board.isError && (
        <Notice tone="error" title="The board could not be loaded" onRetry={() => void board.refetch()}>
          {board.error.message}
        </Notice>
      )}
      {board.isPending && <p className="text-ink-soft">Loading jobs …</p>}
      {board.data && (
        <>
          <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
            <p className="text-lg font-bold" aria-live="polite" data-testid="board-total">
              {/* Past the count's cap the server says only that there are more: "1,000+ jobs". */}
              {board.data.totalIsCapped ? `${board.data.total.toLocaleString('en-US')}+ jobs` : board.data.total === 1 ? '1 job' : `${board.data.total} jobs`}
              <span className="font-normal text-ink-soft">
                {filtered ? (board.data.total === 1 ? ' matches these filters' : ' match these filters') : ' open'}
              </span>
            </p>
            {distanceFrom && !distanceFrom.found && (
              // Shown with the list it explains, so nothing moves when it arrives.
              <p className="basis-full text-sm text-ink-soft" data-testid="board-place-not-found">
                {distanceFrom.postalCode ? `Your shop’s ${distanceFrom.postalCode}: ${POSTAL_CODE_NOT_FOUND}.` : 'Your shop profile has no postal code, so distances fall back to region.'}{' '}
                <Link to="/shop/profile" className="font-semibold underline underline-offset-4">
                  Check your shop profile
                </Link>
              </p>
            )}
            <div className="flex flex-wrap items-center gap-4">
              <label className="flex items-center gap-2 text-sm font-semibold lg:hidden">
                Sort by
                <select
                  value={filters.sort}
                  onChange={(event) => setSort(event.target.value as Sort)}
                  className="min-h-11 rounded-lg border border-slate-300 bg-white px-3 text-base font-normal"
                >
                  {(Object.keys(sorts) as Sort[]).filter((sort) => sort !== 'distance' || distanceFrom).map((sort) => (
                    <option key={sort} value={sort}>
                      {sorts[sort].column}, {sorts[sort].order}
                    </option>
                  ))}
                </select>
              </label>
              <label className="flex items-center gap-2 text-sm font-semibold">
                Per page
                <select
                  value={String(filters.pageSize)}
                  onChange={(event) => setPageSize(event.target.value)}
                  className="min-h-11 rounded-lg border border-slate-300 bg-white px-3 text-base font-normal"
                >
                  {PAGE_SIZES.map((size) => (
                    <option key={size} value={size}>
                      {size}
                    </option>
                  ))}
                </select>
              </label>
            </div>
          </div>

          {board.data.jobs.length === 0 ? (
            <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
              <p className="text-lg font-bold">{filtered ? 'No open jobs match these filters' : 'No open jobs right now'}</p>
              <p className="mt-1 text-ink-soft">
                {filtered
                  ? 'Try any work, a wider area or a later date.'
                  : 'New jobs appear here as soon as builders publish them. Turn on e-mails in your shop profile to hear about matching ones.'}
              </p>
              {filtered && (
                <Button variant="secondary" className="mt-4" onClick={clearFilters}>
                  Clear filters
                </Button>
              )}
            </div>
          ) : (
            <>
              <ul aria-label="Open jobs" aria-busy={board.isFetching} className={cn('grid gap-4 md:grid-cols-2 lg:hidden', board.isPlaceholderData && 'opacity-60')}>
                {board.data.jobs.map((job) => (
                  <li key={job.id}>
                    <JobCard job={job} unit={unit} />
                  </li>
                ))}
              </ul>
              <div
                className={cn(
                  'relative hidden overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100 lg:block',
                  board.isPlaceholderData && 'opacity-60',
                )}
                aria-busy={board.isFetching}
              >
                <table className="w-full text-left text-sm">
                  <caption className="sr-only">Open jobs, {sorts[filters.sort].column.toLowerCase()} {sorts[filters.sort].order}</caption>
                  <thead className="border-b border-slate-200 text-ink-soft">
                    <tr>
                      <th scope="col" className="w-20 py-2 pr-3 align-bottom font-semibold">
                        <span className="sr-only">Photo</span>
                      </th>
                      <th scope="col" className="py-2 pr-3 align-bottom font-semibold">Job</th>
                      <th scope="col" className="py-2 pr-3 align-bottom font-semibold">Engine</th>
                      <th scope="col" className="py-2 pr-3 text-right align-bottom font-semibold">
                        <abbr title="Cylinders" className="no-underline">Cyl.</abbr>
                      </th>
                      <th scope="col" className="py-2 pr-3 align-bottom font-semibold">Material</th>
                      <th scope="col" className="py-2 pr-3 align-bottom font-semibold">Work</th>
                      {distanceFrom ? (
                        <SortHeader sort="distance" current={filters.sort} onSort={setSort} />
                      ) : (
                        <th scope="col" className="py-2 pr-3 align-bottom font-semibold">Where</th>
                      )}
                      <SortHeader sort="newest" current={filters.sort} onSort={setSort} />
                      <SortHeader sort="needed-soonest" current={filters.sort} onSort={setSort} />
                      <SortHeader sort="fewest-bids" current={filters.sort} onSort={setSort} className="pr-0 text-right" />
                    </tr>
                  </thead>
                  <tbody>
                    {board.data.jobs.map((job) => (
                      <JobRow key={job.id} job={job} unit={unit} />
                    ))}
                  </tbody>
                </table>
              </div>
            </>
          )}
          <Pager
            className="mt-6"
            label="Job board pages"
            page={board.data.page}
            pageSize={board.data.pageSize}
            total={board.data.total}
            onPage={setPage}
          />
        </>
      )}
    </div>
  );
}

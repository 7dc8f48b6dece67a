import { useState } from 'react';
import { PageTitle } from '@client/components/ui/card';
import { DebouncedTextField } from '@client/components/ui/debounced-text-field';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { SelectField } from '@client/components/ui/select-field';
import { useAdminShops, AdminShopsTable } from '@client/features/admin';

const PAGE_SIZE = 50;

export function AdminShopsRoute() {
  const [q, setQ] = useState('');
  const [verified, setVerified] = useState<'' | 'yes' | 'no'>('');
  const [page, setPage] = useState(1);
  const filtered = q !== '' || verified !== '';
  const shops = useAdminShops({ q: q || undefined, verified: verified || undefined, limit: PAGE_SIZE, offset: (page - 1) * PAGE_SIZE });

  return (
    <div>
      <PageTitle
        title="Shops"
        lead="Every shop profile. Verify a shop once you have checked who runs it; builders see the mark on its bids and its page."
      />
      <form role="search" aria-label="Find shops" onSubmit={(event) => event.preventDefault()} className="mb-6 grid gap-4 rounded-card bg-paper-sunk p-4 sm:grid-cols-[2fr_1fr]">
        <DebouncedTextField
          label="Search by shop name or owner’s e-mail"
          type="search"
          value={q}
          onCommit={(text) => {
            setQ(text.trim());
            setPage(1);
          }}
        />
        <SelectField
          label="Verified"
          value={verified}
          onChange={(event) => {
            setVerified(event.target.value as '' | 'yes' | 'no');
            setPage(1);
          }}
          options={[
            { value: '', label: 'All shops' },
            { value: 'yes', label: 'Verified only' },
            { value: 'no', label: 'Not verified only' },
          ]}
        />
      </form>
      {shops.isPending && <p className="text-ink-soft">Loading shops …</p>}
      {shops.isError && (
        <Notice tone="error" title="The shops could not be loaded" onRetry={() => void shops.refetch()}>
          {shops.error.message}
        </Notice>
      )}
      {shops.data && (
        <>
          <p className="mb-3 text-sm text-ink-soft" aria-live="polite">
            {shops.data.total === 1 ? '1 shop' : `${shops.data.total} shops`}
            {filtered && (shops.data.total === 1 ? ' matches' : ' match')}
          </p>
          {shops.data.shops.length === 0 ? (
            <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
              <p className="text-lg font-bold">{filtered ? 'No shops match' : 'No shops yet'}</p>
              <p className="mt-1 text-ink-soft">{filtered ? 'Try another name or e-mail, or show all shops.' : 'Shops appear here once a shop account sets up its profile.'}</p>
            </div>
          ) : (
            <AdminShopsTable shops={shops.data.shops} dimmed={shops.isPlaceholderData} />
          )}
          <Pager className="mt-6" label="Shop list pages" page={page} pageSize={PAGE_SIZE} total={shops.data.total} onPage={setPage} />
        </>
      )}
    </div>
  );
}

import { Button } from '@client/components/ui/button';
import { PageTitle } from '@client/components/ui/card';
import { FilterForm } from '@client/components/ui/filter-form';
import { DebouncedTextField } from '@client/components/ui/debounced-text-field';
import { Notice } from '@client/components/ui/notice';
import { Pager } from '@client/components/ui/pager';
import { useAuditLog, AuditTable } from '@client/features/admin';
import { toSearch, useSearchParamUpdater } from '@client/lib/search-params';

const PAGE_SIZE = 50;
/** Actions the console records today, offered as suggestions; any other name can still be typed. */
const KNOWN_ACTIONS = ['dispute.resolve', 'user.suspend', 'user.reinstate', 'shop.verify', 'shop.unverify', 'fee.change', 'admin.create'];

export function AdminAuditRoute() {
  const { params, setParams, setPage } = useSearchParamUpdater();
  const action = params.get('action')?.trim().slice(0, 60) ?? '';
  const page = Math.max(1, Number.parseInt(params.get('page') ?? '1', 10) || 1);
  const audit = useAuditLog({ action: action || undefined, limit: PAGE_SIZE, offset: (page - 1) * PAGE_SIZE });

  const setAction = (text: string) => setParams(text.trim() ? { action: text.trim() } : {}, { replace: true });

  return (
    <div>
      <PageTitle title="Audit log" lead="Everything an administrator has done that changes an account, a shop, the fee or a dispute, newest first." />
      <FilterForm label="Filter the audit log" className="flex flex-wrap items-end">
        <DebouncedTextField
          label="Action"
          hint="The action’s name exactly as the table shows it, such as user.suspend. “Only this action” under an entry fills it in."
          list="audit-actions"
          value={action}
          onCommit={setAction}
          autoComplete="off"
          spellCheck={false}
          maxLength={60}
          className="min-w-64 flex-1"
        />
        <datalist id="audit-actions">
          {KNOWN_ACTIONS.map((name) => (
            <option key={name} value={name} />
          ))}
        </datalist>
        <Button variant="secondary" onClick={() => setParams({})} disabled={!action}>
          Show every action
        </Button>
      </FilterForm>
      {audit.isPending && <p className="text-ink-soft">Loading the audit log …</p>}
      {audit.isError && (
        <Notice tone="error" title="The audit log could not be loaded" onRetry={() => void audit.refetch()}>
          {audit.error.message}
        </Notice>
      )}
      {audit.data && (
        <div className="flex flex-col gap-4">
          <p className="text-sm text-ink-soft" aria-live="polite">
            {audit.data.total === 1 ? '1 entry' : `${audit.data.total} entries`}
            {action && ` for ${action}`}
          </p>
          {audit.data.entries.length === 0 ? (
            <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
              <p className="text-lg font-bold">{action ? 'No entries for this action' : 'Nothing logged yet'}</p>
              <p className="mt-1 text-ink-soft">{action ? 'Check the spelling, or show every action.' : 'Each change an administrator makes is logged here.'}</p>
            </div>
          ) : (
            <AuditTable entries={audit.data.entries} dimmed={audit.isPlaceholderData} onlyActionHref={(name) => `/admin/audit${toSearch({ action: name })}`} />
          )}
          <Pager label="Audit log pages" page={page} pageSize={PAGE_SIZE} total={audit.data.total} onPage={setPage} />
        </div>
      )}
    </div>
  );
}

import { useSearchParams } from 'react-router-dom';
import { DISPUTE_STATUS } from '@shared/glossary';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { SegmentedControl } from '@client/components/ui/segmented-control';
import { useDisputeQueue, type DisputeQueueStatus, DisputeQueueTable } from '@client/features/admin';

const statusOptions = [
  { value: 'open', label: DISPUTE_STATUS.open.label },
  { value: 'resolved', label: DISPUTE_STATUS.resolved.label },
  { value: 'all', label: 'All' },
] as const satisfies ReadonlyArray<{ value: DisputeQueueStatus; label: string }>;

const captions: Record<DisputeQueueStatus, string> = {
  open: 'Open disputes, oldest first',
  resolved: 'Decided disputes',
  all: 'All disputes',
};

const emptyWords: Record<DisputeQueueStatus, { title: string; lead: string }> = {
  open: { title: 'No open disputes', lead: 'When a builder or a shop opens a dispute, it waits here for a decision.' },
  resolved: { title: 'No decided disputes yet', lead: 'Disputes you or another administrator have decided are listed here.' },
  all: { title: 'No disputes yet', lead: 'No builder or shop has opened a dispute.' },
};

function readStatus(params: URLSearchParams): DisputeQueueStatus {
  const raw = params.get('status');
  return raw === 'resolved' || raw === 'all' ? raw : 'open';
}

export function AdminDisputesRoute() {
  const [params, setParams] = useSearchParams();
  const status = readStatus(params);
  const queue = useDisputeQueue(status);
  const setStatus = (next: DisputeQueueStatus) => setParams(next === 'open' ? {} : { status: next }, { replace: true });

  return (
    <div>
      <PageTitle
        title="Disputes"
        lead="Jobs where the builder and the shop disagree. The money stays held until an administrator decides; open a case to read the evidence and decide."
      />
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <SegmentedControl label="Which disputes" options={statusOptions} value={status} onChange={setStatus} />
        {queue.data && (
          <p className="text-sm text-ink-soft" aria-live="polite">
            {queue.data.length === 1 ? '1 dispute' : `${queue.data.length} disputes`}
          </p>
        )}
      </div>
      {queue.isPending && <p className="text-ink-soft">Loading disputes …</p>}
      {queue.isError && (
        <Notice tone="error" title="The disputes could not be loaded" onRetry={() => void queue.refetch()}>
          {queue.error.message}
        </Notice>
      )}
      {queue.data && queue.data.length === 0 && (
        <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
          <p className="text-lg font-bold">{emptyWords[status].title}</p>
          <p className="mt-1 text-ink-soft">{emptyWords[status].lead}</p>
        </div>
      )}
      {queue.data && queue.data.length > 0 && <DisputeQueueTable disputes={queue.data} caption={captions[status]} dimmed={queue.isPlaceholderData} />}
    </div>
  );
}

import type { ComponentType } from 'react';
import { Link } from 'react-router-dom';
import type { QueueStage } from '@shared/schemas/bids';
import type { JobStatus } from '@shared/schemas/jobs';
import { Badge } from '@client/components/ui/badge';
import { Notice } from '@client/components/ui/notice';
import { formatDay } from '@client/lib/dates';
import { useWorkQueue, type QueueJob } from '../api/bids';
import { days } from './bid-summary';

/** Where a won job stands, as its shop reads it: what happens next and who it waits on. */
const stageWords: Record<QueueStage, string> = {
  payment_due: 'Waiting for the builder’s payment; do not start yet.',
  waiting_for_parts: 'Paid and held; waiting for the parts to arrive.',
  in_shop: 'In your shop: machine, measure, then send the inspection record.',
  changes_asked: 'The builder asked for changes to the record: redo what they named and send a new version.',
  record_submitted: 'Record sent; the builder is checking it.',
  shipped_back: 'Shipped back to the builder.',
  ready_for_pickup: 'Ready for the builder to pick up.',
};

/** Calendar days, as the due day counts them. */
const calendarDays = (n: number) => `${n} ${n === 1 ? 'day' : 'days'}`;

/** Days left in words; an overdue job says so in words, not colour alone. */
function DueWords({ job }: { job: QueueJob }) {
  const overdue = job.daysLeft < 0;
  return (
    <p className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-1 text-sm">
      {overdue && <Badge tone="error">Overdue</Badge>}
      <span className={overdue ? 'font-bold text-fail' : 'font-semibold'} data-testid="queue-due">
        Due <time dateTime={job.dueOn}>{formatDay(job.dueOn)}</time>
        {' · '}
        {overdue ? `${calendarDays(-job.daysLeft)} late` : job.daysLeft === 0 ? 'due today' : `${calendarDays(job.daysLeft)} left`}
      </span>
    </p>
  );
}

/**
 * The shop's won jobs not finished yet, soonest due first: title (a link to
 * the job), builder, stage, status and due day. `limit` shows only the next
 * few (the shop's home page); the page shows all. The status badge comes
 * from the page, which has the jobs feature's words for it.
 */
export function WorkQueueList({ limit, StatusBadge, headingId }: { limit?: number; StatusBadge: ComponentType<{ status: JobStatus }>; headingId: string }) {
  const queue = useWorkQueue();
  if (queue.isPending) return <p className="mt-2 text-ink-soft">Loading your work queue …</p>;
  if (queue.isError) {
    return (
      <Notice tone="error" title="Your work queue could not be loaded" onRetry={() => void queue.refetch()} className="mt-3">
        {queue.error.message}
      </Notice>
    );
  }
  if (queue.data.length === 0) {
    return (
      <p className="mt-2 text-ink-soft" data-testid="queue-empty">
        No jobs in your shop right now. Won jobs show here until they are finished.
      </p>
    );
  }
  const shown = limit ? queue.data.slice(0, limit) : queue.data;
  return (
    <>
      <ul aria-labelledby={headingId} className="mt-3 divide-y divide-slate-100" data-testid="work-queue">
        {shown.map((job) => (
          <li key={job.jobId} className="py-3" data-stage={job.stage} data-overdue={job.daysLeft < 0 || undefined}>
            <div className="flex flex-wrap items-center gap-2">
              <Link to={`/jobs/${job.jobId}`} className="break-words font-semibold text-slate-700 underline underline-offset-4">
                {job.title}
              </Link>
              <StatusBadge status={job.status} />
            </div>
            <p className="mt-1 text-ink-soft">
              For {job.builderName} · {days(job.turnaroundDays)} turnaround
            </p>
            <p className="mt-1">{stageWords[job.stage]}</p>
            <DueWords job={job} />
          </li>
        ))}
      </ul>
      {limit && queue.data.length > limit && (
        <p className="mt-2 text-ink-soft">
          {queue.data.length - limit} more in the{' '}
          <Link to="/queue" className="font-semibold text-slate-700 underline underline-offset-4">
            work queue
          </Link>
          .
        </p>
      )}
    </>
  );
}

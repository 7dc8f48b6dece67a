import { Link } from 'react-router-dom';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { useDisputeQueue } from '../api/admin-disputes';

/** How many disputes wait for a decision, with the way to the queue. */
export function AdminOverview() {
  const open = useDisputeQueue('open');
  const count = open.data?.length;
  return (
    <Card className="mb-6 flex flex-col gap-4">
      <h2 className="text-xl font-bold">Waiting for you</h2>
      <div className="flex flex-wrap items-center gap-4">
        <p className="flex-1 text-ink-soft" aria-live="polite">
          {count === undefined
            ? open.isError
              ? 'The number of open disputes could not be loaded.'
              : 'Counting open disputes …'
            : count === 0
              ? 'No disputes are waiting for a decision.'
              : `${count === 1 ? '1 dispute is' : `${count} disputes are`} waiting for a decision; the money on ${count === 1 ? 'that job' : 'those jobs'} stays held until then.`}
        </p>
        {open.isError && count === undefined && (
          <Button variant="secondary" onClick={() => void open.refetch()}>
            Retry
          </Button>
        )}
        <Link to="/admin/disputes" className="inline-flex min-h-11 items-center rounded-lg bg-slate-700 px-4 py-2 font-semibold text-white hover:bg-slate-800">
          Open the dispute queue{count ? ` (${count})` : ''}
        </Link>
      </div>
    </Card>
  );
}

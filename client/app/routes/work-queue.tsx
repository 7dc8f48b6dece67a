import { Card, PageTitle } from '@client/components/ui/card';
import { WorkQueueList } from '@client/features/bids';
import { JobStatusBadge } from '@client/features/jobs';

/** The shop's work queue: every won job not finished yet, soonest due first. */
export function WorkQueueRoute() {
  return (
    <div>
      <PageTitle
        title="Work queue"
        lead="The jobs you won and have not finished, soonest due first. A job is due its turnaround after the parts arrive (after the award until they do)."
      />
      <Card aria-labelledby="work-queue-heading">
        <h2 className="text-xl font-bold" id="work-queue-heading">
          Jobs in your shop
        </h2>
        <WorkQueueList StatusBadge={JobStatusBadge} headingId="work-queue-heading" />
      </Card>
    </div>
  );
}

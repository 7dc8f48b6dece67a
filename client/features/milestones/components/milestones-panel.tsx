import type { JobDetail } from '@shared/schemas/jobs';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useMilestones } from '../api/milestones';
import { LogProgressForm } from './log-progress-form';
import { MilestoneTimeline } from './milestone-timeline';

/** States in which the shop has the job: paid for, and not yet closed. */
const WORK_STATES = new Set<JobDetail['status']>(['funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);
/** States in which the shop may still log progress (shipping back comes after acceptance). */
const LOGGING_STATES = new Set<JobDetail['status']>(['funded', 'in_work', 'inspection_submitted', 'completed']);

/** The job's progress, for the builder, the shop doing the work and administrators; the shop also logs here. */
export function MilestonesPanel({ job, canLog }: { job: JobDetail; canLog: boolean }) {
  const milestones = useMilestones(job.id, { enabled: WORK_STATES.has(job.status) });
  if (!WORK_STATES.has(job.status)) return null;
  return (
    <Card className="flex flex-col gap-4">
      <h2 className="text-xl font-bold tracking-tight">Progress</h2>
      {milestones.isPending && <p className="text-ink-soft">Loading the timeline …</p>}
      {milestones.isError && (
        <Notice tone="error" onRetry={() => void milestones.refetch()}>
          The timeline could not be loaded: {milestones.error.message}
        </Notice>
      )}
      {milestones.data && <MilestoneTimeline milestones={milestones.data} />}
      {canLog && LOGGING_STATES.has(job.status) && <LogProgressForm job={job} />}
    </Card>
  );
}

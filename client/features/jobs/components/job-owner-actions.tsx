import { useState } from 'react';
import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import type { JobDetail } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { ConfirmEmailNotice, useNeedsEmailConfirmation } from '@client/features/auth';
import { useCancelJob, usePublishJob } from '../api/jobs';

const cancelWords: Partial<Record<JobDetail['status'], string>> = {
  draft: 'The draft is closed and cannot be published later.',
  open: 'The job leaves the board. Shops that bid are told, and their bids are closed.',
  awarded: 'The shop whose bid you accepted is told, and its bid is closed.',
};

/** Publish, edit and cancel, as the job's state allows. */
export function JobOwnerActions({ job }: { job: JobDetail }) {
  const [confirmCancel, setConfirmCancel] = useState(false);
  const unconfirmed = useNeedsEmailConfirmation();
  const publish = usePublishJob({
    mutationConfig: {
      onSuccess: () => toast.success('Published. Shops can see the job on the board now.'),
      onError: (error) => toast.error(error.message),
    },
  });
  const cancel = useCancelJob({
    mutationConfig: {
      onSuccess: () => {
        setConfirmCancel(false);
        toast.success('The job is cancelled.');
      },
    },
  });
  const editable = job.status === 'draft' || job.status === 'open';
  const cancellable = job.status in cancelWords;
  if (!editable && !cancellable) return null;

  return (
    <div className="flex flex-wrap items-center gap-3">
      {job.status === 'draft' && unconfirmed && (
        <ConfirmEmailNotice
          title="Confirm your e-mail address to publish"
          reason="Shops rely on reaching you about a job they bid on, so publishing waits until your address is confirmed. Your draft is saved."
          className="w-full"
        />
      )}
      {job.status === 'draft' && (
        <Button busy={publish.isPending} disabled={unconfirmed} onClick={() => publish.mutate(job.id)}>
          Publish
        </Button>
      )}
      {editable && (
        <Link
          to={`/jobs/${job.id}/edit`}
          className="inline-flex min-h-11 items-center rounded-lg bg-paper-raised px-4 py-2 font-semibold text-slate-800 ring-1 ring-inset ring-slate-300 hover:bg-slate-50"
        >
          Edit
        </Link>
      )}
      {cancellable && (
        <Button variant="secondary" onClick={() => setConfirmCancel(true)}>
          Cancel job
        </Button>
      )}
      {job.status === 'draft' && job.photos.length === 0 && <p className="text-sm text-ink-soft">Shops bid more surely with photos: add some before you publish.</p>}
      <ConfirmDialog
        open={confirmCancel}
        onClose={() => {
          setConfirmCancel(false);
          cancel.reset();
        }}
        onConfirm={() => cancel.mutate(job.id)}
        title="Cancel this job?"
        description={cancelWords[job.status]}
        confirmLabel="Cancel the job"
        cancelLabel="Keep the job"
        tone="danger"
        mutation={cancel}
      />
    </div>
  );
}

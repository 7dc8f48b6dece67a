import { useEffect } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useMe } from '@client/features/auth';
import { useJob, useUpdateJob, JobForm, keptFormKey, plural } from '@client/features/jobs';

/** Changes to a draft or an open job; shops that bid on an open job are told by e-mail. */
export function EditJobRoute() {
  const { jobId = '' } = useParams();
  const navigate = useNavigate();
  const jobQuery = useJob(jobId);
  const { data: me } = useMe();
  const update = useUpdateJob({
    mutationConfig: {
      onSuccess: (job) => {
        toast.success(job.status === 'open' && job.bidCount > 0 ? 'Saved. The shops that bid are being told.' : 'Changes saved.');
        navigate(`/jobs/${job.id}`);
      },
    },
  });

  // The form's code comes while the job does.
  useEffect(() => JobForm.preload(), []);

  if (jobQuery.isPending) return <p className="text-ink-soft">Loading the job …</p>;
  if (jobQuery.isError) {
    return (
      <Notice tone="error" title="The job could not be loaded" onRetry={() => void jobQuery.refetch()}>
        {jobQuery.error.message}
      </Notice>
    );
  }
  const job = jobQuery.data;
  const back = (
    <Link to={`/jobs/${job.id}`} className="font-semibold text-slate-700 underline underline-offset-4">
      Back to the job
    </Link>
  );
  if (!job.viewer.isOwner) {
    return (
      <Notice tone="error" title="Not your job">
        Only the builder who posted this job can change it. {back}
      </Notice>
    );
  }
  if (job.status !== 'draft' && job.status !== 'open') {
    return (
      <div className="flex flex-col gap-4">
        <PageTitle title={`Edit “${job.title}”`} />
        <Notice tone="caution" title="This job can no longer be changed">
          A bid was accepted or the job was closed, so its spec is fixed. {back}
        </Notice>
      </div>
    );
  }

  return (
    <div>
      <PageTitle title={`Edit “${job.title}”`} lead={job.status === 'draft' ? 'Only you see this draft until you publish it.' : undefined} />
      {job.status === 'open' && (
        <Notice tone="caution" title="This job is on the board" className="mb-6">
          {job.bidCount > 0
            ? `When you save, the ${plural(job.bidCount, 'shop')} that bid will be told by e-mail that the job changed, so they can revise their bids.`
            : 'When you save, shops see the new version at once. Any shop that has bid by then is told by e-mail.'}
        </Notice>
      )}
      <JobForm
        initial={job.spec}
        submitLabel="Save changes"
        cancelTo={`/jobs/${job.id}`}
        keepKey={me ? keptFormKey(me.id, job.id) : undefined}
        saveNote={job.status === 'open' && job.bidCount > 0 ? 'Saving tells the shops that bid.' : undefined}
        onSave={(input) => update.mutateAsync({ id: job.id, input })}
      />
    </div>
  );
}

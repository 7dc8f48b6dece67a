import { useNavigate } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { PageTitle } from '@client/components/ui/card';
import type { JobInput } from '@shared/schemas/jobs';
import { useCreateJob, usePublishJob, JobForm, keptFormKey } from '@client/features/jobs';
import { ConfirmEmailNotice, useMe, useNeedsEmailConfirmation } from '@client/features/auth';

/** A new job, saved as a draft that only its builder sees until it is published. */
export function NewJobRoute() {
  const navigate = useNavigate();
  const unconfirmed = useNeedsEmailConfirmation();
  const { data: me } = useMe();
  const create = useCreateJob();
  const publish = usePublishJob();
  /** Saves the draft, publishes it when asked, then opens the job's page (a draft that could not be published stays a draft). */
  const save = async (input: JobInput, { publish: andPublish }: { publish: boolean }) => {
    const job = await create.mutateAsync(input);
    if (!andPublish) toast.success('Draft saved. Add photos, then publish it when it is ready.');
    else {
      try {
        await publish.mutateAsync(job.id);
        toast.success('Published. Shops can see the job on the board now; you can still add photos.');
      } catch (error) {
        toast.error(`Saved as a draft, but not published: ${error instanceof Error ? error.message : 'try again from the job’s page.'}`);
      }
    }
    navigate(`/jobs/${job.id}`);
  };
  return (
    <div>
      <PageTitle
        title="Post a job"
        lead="Say what you send and the work you want, step by step; what you type is kept on this device until you save. It is saved as a draft: only you see it until you publish it to the job board."
      />
      {unconfirmed && (
        <ConfirmEmailNotice
          title="Confirm your e-mail address before you publish"
          reason="You can save this job as a draft now. Shops rely on reaching you about it, so publishing waits until your address is confirmed."
          className="mb-6"
        />
      )}
      <JobForm
        submitLabel="Save draft"
        cancelTo="/jobs"
        keepKey={me ? keptFormKey(me.id) : undefined}
        publishLabel={unconfirmed ? undefined : 'Save and publish'}
        saveNote="Photos are added on the job’s page; publish there once they are in, or now."
        onSave={save}
      />
    </div>
  );
}

import { useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import { PageTitle } from '@client/components/ui/card';
import { useCreateJob, JobForm, keptFormKey } from '@client/features/jobs';
import { ConfirmEmailNotice, useMe, useNeedsEmailConfirmation } from '@client/features/auth';

/** A new job, saved as a draft that only its builder sees until it is published. */
export function NewJobRoute() {
  const navigate = useNavigate();
  const unconfirmed = useNeedsEmailConfirmation();
  const { data: me } = useMe();
  const create = useCreateJob({
    mutationConfig: {
      onSuccess: (job) => {
        toast.success('Draft saved. Add photos, then publish it when it is ready.');
        navigate(`/jobs/${job.id}`);
      },
    },
  });
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
        saveNote="You can add photos on the next page."
        onSave={(input) => create.mutateAsync(input)}
      />
    </div>
  );
}

import { useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import { PageTitle } from '@client/components/ui/card';
import { useCreateJob, JobForm } from '@client/features/jobs';
import { ConfirmEmailNotice, useNeedsEmailConfirmation } from '@client/features/auth';

/** A new job, saved as a draft that only its builder sees until it is published. */
export function NewJobRoute() {
  const navigate = useNavigate();
  const unconfirmed = useNeedsEmailConfirmation();
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
        lead="Say what you send and the work you want. It is saved as a draft: only you see it until you publish it to the job board."
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
        saveNote="You can add photos on the next page."
        onSave={(input) => create.mutateAsync(input)}
      />
    </div>
  );
}

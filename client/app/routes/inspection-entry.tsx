import { useEffect } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useInspection, InspectionEntry } from '@client/features/inspections';
import { useJob } from '@client/features/jobs';

/**
 * The awarded shop enters its measured inspection record for a job: a new
 * record, the draft it left, or a new version after the builder rejected one.
 */
export function InspectionEntryRoute() {
  const { jobId = '' } = useParams();
  const navigate = useNavigate();
  const job = useJob(jobId);
  const inspection = useInspection(jobId);
  const back = (
    <Link to={`/jobs/${jobId}`} className="font-semibold text-slate-700 underline underline-offset-4">
      ← Back to the job
    </Link>
  );

  // The form's code comes while the job and the record do.
  useEffect(() => InspectionEntry.preload(), []);

  if (job.isPending || inspection.isPending) return <p className="text-ink-soft">Loading the inspection record …</p>;
  if (job.isError || inspection.isError) {
    const error = job.error ?? inspection.error;
    return (
      <div className="mx-auto flex max-w-lg flex-col gap-4">
        <Notice tone="error" title="The inspection record cannot be opened" onRetry={() => void Promise.all([job.isError && job.refetch(), inspection.isError && inspection.refetch()])}>
          {error?.message}
        </Notice>
        {back}
      </div>
    );
  }

  const detail = job.data;
  const latest = inspection.data.versions[0];
  if (detail.status !== 'in_work') {
    return (
      <div className="mx-auto flex max-w-lg flex-col gap-4">
        <Notice title="Not waiting for an inspection record">
          {detail.status === 'inspection_submitted'
            ? 'Your record is with the builder. If the builder asks for changes, you can enter a new version here.'
            : detail.status === 'funded'
              ? 'Log the block as received on the job page first; then enter the record when the work is done.'
              : 'This job is not at the stage where the shop enters its inspection record.'}
        </Notice>
        {back}
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      {back}
      <PageTitle
        title={latest ? `Inspection record, version ${latest.version + 1}` : 'Inspection record'}
        lead={`${detail.title} · ${detail.engineFamily} · ${detail.cylinders} cylinders. Enter what your gauges read; every figure is worked out and checked against the builder’s spec as you type.`}
      />
      <InspectionEntry job={detail} view={inspection.data} onSubmitted={() => navigate(`/jobs/${detail.id}`)} />
    </div>
  );
}

import { Link, useSearchParams } from 'react-router-dom';
import { findOperation } from '@shared/catalogue';
import type { JobStatus, JobSummary } from '@shared/schemas/jobs';
import { jobStatuses } from '@shared/schemas/values';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { SelectField } from '@client/components/ui/select-field';
import { formatDay } from '@client/lib/dates';
import { useMyJobs, JobStatusBadge, plural, statusWords } from '@client/features/jobs';

const isStatus = (value: string | null): value is JobStatus => (jobStatuses as readonly string[]).includes(value ?? '');

const postLink = 'inline-flex min-h-11 items-center rounded-lg bg-slate-700 px-4 py-2 font-semibold text-white hover:bg-slate-800';

function JobRow({ job }: { job: JobSummary }) {
  const work = job.operations.map((code) => findOperation(code)?.name ?? code).join(', ');
  return (
    <li className="flex gap-4 rounded-card bg-paper-raised p-4 shadow-card ring-1 ring-slate-100" data-testid="my-job">
      <div className="size-24 shrink-0 overflow-hidden rounded-lg bg-paper-sunk ring-1 ring-slate-200 sm:size-28">
        {job.thumbUrl ? (
          <img src={job.thumbUrl} alt="" className="size-full object-cover" loading="lazy" />
        ) : (
          <span className="flex size-full items-center justify-center px-2 text-center text-xs text-ink-soft">No photo yet</span>
        )}
      </div>
      <div className="flex min-w-0 flex-1 flex-col gap-1.5">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <h2 className="text-lg font-bold leading-snug">
            <Link to={`/jobs/${job.id}`} className="text-slate-800 underline-offset-4 hover:underline">
              {job.title}
            </Link>
          </h2>
          <JobStatusBadge status={job.status} />
        </div>
        <p className="text-sm text-ink-soft">
          {job.engineFamily} · {job.cylinders} cylinders
        </p>
        <p className="text-sm text-ink-soft">{work}</p>
        <dl className="mt-1 flex flex-wrap gap-x-6 gap-y-1 text-sm">
          <div className="flex gap-1.5">
            <dt className="text-ink-soft">Bids</dt>
            <dd className="font-semibold text-ink">{job.status === 'draft' ? 'not published yet' : job.bidCount}</dd>
          </div>
          <div className="flex gap-1.5">
            <dt className="text-ink-soft">Needed by</dt>
            <dd className="font-semibold text-ink">{formatDay(job.neededBy)}</dd>
          </div>
        </dl>
      </div>
    </li>
  );
}

/** The builder's own jobs, newest first, filtered by status through the address bar. */
export function MyJobsRoute() {
  const [params, setParams] = useSearchParams();
  const raw = params.get('status');
  const status = isStatus(raw) ? raw : undefined;
  const jobsQuery = useMyJobs(status);

  const choose = (value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set('status', value);
    else next.delete('status');
    setParams(next, { replace: true });
  };

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <PageTitle title="My jobs" lead="Everything you have posted, from drafts to finished work." />
        <Link to="/jobs/new" className={`${postLink} mb-6`}>
          Post a job
        </Link>
      </div>
      <SelectField
        label="Show"
        className="max-w-xs"
        value={status ?? ''}
        onChange={(event) => choose(event.target.value)}
        options={[{ value: '', label: 'All jobs' }, ...jobStatuses.map((s) => ({ value: s, label: statusWords[s].label }))]}
      />

      {jobsQuery.isPending && <p className="text-ink-soft">Loading your jobs …</p>}
      {jobsQuery.isError && <Notice tone="error" title="Your jobs could not be loaded" onRetry={() => void jobsQuery.refetch()}>{jobsQuery.error.message}</Notice>}
      {jobsQuery.data && jobsQuery.data.length === 0 && (
        <Card className="flex flex-col items-start gap-3">
          {status ? (
            <>
              <h2 className="text-xl font-bold">No jobs with the status “{statusWords[status].label}”</h2>
              <button type="button" onClick={() => choose('')} className="font-semibold text-slate-700 underline underline-offset-4">
                Show all jobs
              </button>
            </>
          ) : (
            <>
              <h2 className="text-xl font-bold">You have not posted a job yet</h2>
              <p className="text-ink-soft">Describe a block and the work it needs; shops bid with a price and a turnaround.</p>
              <Link to="/jobs/new" className={postLink}>
                Post your first job
              </Link>
            </>
          )}
        </Card>
      )}
      {jobsQuery.data && jobsQuery.data.length > 0 && (
        <>
          <p className="text-sm text-ink-soft" aria-live="polite">
            {plural(jobsQuery.data.length, 'job')}
            {status && ` with the status “${statusWords[status].label}”`}
          </p>
          <ul className="flex flex-col gap-3">
            {jobsQuery.data.map((job) => (
              <JobRow key={job.id} job={job} />
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

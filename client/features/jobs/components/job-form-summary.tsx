import type { ReactNode } from 'react';
import { jobInputSchema, type JobFormValues } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { formatDay } from '@client/lib/dates';
import { jobFormSteps, stepOfPath } from './job-form-steps';
import { keepInScope } from './job-scope';
import { JobOperations, JobSpec } from './job-spec';
import { logisticsWords } from './job-words';

function SummaryPart({ title, step, onEdit, children }: { title: string; step: number; onEdit: (step: number) => void; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-3 border-t border-slate-200 pt-4 first:border-t-0 first:pt-0">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-lg font-bold text-ink">{title}</h3>
        <Button variant="quiet" onClick={() => onEdit(step)} aria-label={`Edit ${jobFormSteps[step]?.title.toLowerCase()}`}>
          Edit
        </Button>
      </div>
      {children}
    </section>
  );
}

/**
 * Everything the form will send, in the words the job page uses, each part
 * with a way back to its step. Shown from a full parse with the shared schema,
 * so what is listed is what is saved; while a value still needs a look, the
 * steps holding one are named instead.
 */
export function JobFormSummary({ values, onEdit }: { values: Partial<JobFormValues>; onEdit: (step: number) => void }) {
  const parsed = jobInputSchema.safeParse(keepInScope(values as JobFormValues));
  if (!parsed.success) {
    const steps = [...new Set(parsed.error.issues.map((issue) => stepOfPath(issue.path.join('.'))))].sort((a, b) => a - b);
    return (
      <Notice tone="caution" title="Some answers still need a look">
        <p>Saving marks each one with what to change. They are in:</p>
        <ul className="mt-2 flex flex-col gap-1">
          {steps.map((step) => (
            <li key={step}>
              <Button variant="quiet" onClick={() => onEdit(step)}>
                Step {step + 1}: {jobFormSteps[step]?.title}
              </Button>
            </li>
          ))}
        </ul>
      </Notice>
    );
  }
  const job = parsed.data;
  return (
    <div className="flex flex-col gap-5" data-testid="job-form-summary">
      <SummaryPart title="The job and the work" step={0} onEdit={onEdit}>
        <p className="text-lg font-semibold text-ink">{job.title}</p>
        <JobOperations spec={job} />
      </SummaryPart>
      <SummaryPart title="The engine, sizes and limits" step={1} onEdit={onEdit}>
        <JobSpec spec={job} />
      </SummaryPart>
      <SummaryPart title="Getting there, place and date" step={2} onEdit={onEdit}>
        <dl className="grid gap-x-6 gap-y-1.5 sm:grid-cols-[13rem_1fr]">
          <dt className="text-ink-soft">Getting the parts there</dt>
          <dd className="font-semibold text-ink">{logisticsWords[job.logistics]}</dd>
          <dt className="text-ink-soft">Your area</dt>
          <dd className="font-semibold text-ink">{[job.city, job.region, job.country].filter(Boolean).join(', ')}</dd>
          <dt className="text-ink-soft">Needed back by</dt>
          <dd className="font-semibold text-ink">{formatDay(job.neededBy)}</dd>
        </dl>
      </SummaryPart>
      <SummaryPart title="Notes and photos" step={3} onEdit={onEdit}>
        {job.notes ? <p className="whitespace-pre-wrap text-ink">{job.notes}</p> : <p className="text-ink-soft">No notes.</p>}
        <p className="text-ink-soft">Photos: added on the job’s page once it is saved.</p>
      </SummaryPart>
    </div>
  );
}

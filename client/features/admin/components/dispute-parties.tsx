import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import type { DisputeCase } from '@shared/schemas/disputes';
import { disputeReasonWords } from '@shared/schemas/values';
import { formatFee, formatMoment, jobStatusWords, sideWords } from './admin-words';

function Person({ role, name, email }: { role: string; name: string; email: string }) {
  return (
    <div>
      <dt className="text-sm font-semibold text-ink-soft">{role}</dt>
      <dd>
        <span className="font-semibold">{name}</span>
        <br />
        <a href={`mailto:${email}`} className="break-all text-slate-700 underline underline-offset-4">
          {email}
        </a>
      </dd>
    </div>
  );
}

/** The job, the two parties and how to reach them. */
export function DisputeParties({ data }: { data: DisputeCase }) {
  const { job, builder, shop } = data;
  return (
    <dl className="grid gap-4 sm:grid-cols-3">
      <div>
        <dt className="text-sm font-semibold text-ink-soft">Job</dt>
        <dd>
          <Link to={`/jobs/${job.id}`} className="font-semibold text-slate-700 underline underline-offset-4">
            {job.title || 'Untitled job'}
          </Link>
          <span className="block text-sm text-ink-soft">
            {job.engineFamily} · {job.cylinders} {job.cylinders === 1 ? 'cylinder' : 'cylinders'} · {jobStatusWords[job.status] ?? job.status}
          </span>
          {job.acceptedTotalCents !== null && (
            <span className="block text-sm text-ink-soft">
              Accepted bid {formatCents(job.acceptedTotalCents)}
              {job.feeBps !== null && <>, fee {formatFee(job.feeBps)}</>}
            </span>
          )}
        </dd>
      </div>
      <Person role="Builder" name={builder.name} email={builder.email} />
      {shop ? <Person role="Shop" name={shop.name} email={shop.email} /> : (
        <div>
          <dt className="text-sm font-semibold text-ink-soft">Shop</dt>
          <dd className="text-ink-soft">No shop on record</dd>
        </div>
      )}
    </dl>
  );
}

/** Both sides in their own words: the statement that opened the dispute, and the answer (or that none came). */
export function DisputeStatements({ data }: { data: DisputeCase }) {
  const { dispute, builder, shop } = data;
  const nameOf = (side: 'builder' | 'shop') => (side === 'builder' ? builder.name : (shop?.name ?? 'The shop'));
  const other = dispute.openedBy === 'builder' ? 'shop' : 'builder';
  return (
    <div className="flex flex-col gap-5">
      <section aria-labelledby="dispute-statement-heading" className="flex flex-col gap-2">
        <h3 id="dispute-statement-heading" className="text-lg font-bold">
          The dispute
        </h3>
        <p className="text-sm text-ink-soft">
          Opened by {nameOf(dispute.openedBy)} ({sideWords[dispute.openedBy].toLowerCase()}) on {formatMoment(dispute.openedAt)}
        </p>
        <p className="font-semibold">{disputeReasonWords[dispute.reason]}</p>
        <p className="whitespace-pre-wrap break-words rounded-lg bg-paper-sunk px-3 py-2" data-testid="dispute-statement">
          {dispute.statement}
        </p>
      </section>
      <section aria-labelledby="dispute-answer-heading" className="flex flex-col gap-2">
        <h3 id="dispute-answer-heading" className="text-lg font-bold">
          The answer
        </h3>
        {dispute.response ? (
          <>
            <p className="text-sm text-ink-soft">
              From {nameOf(dispute.response.by)} ({sideWords[dispute.response.by].toLowerCase()}) on {formatMoment(dispute.response.at)}
            </p>
            <p className="whitespace-pre-wrap break-words rounded-lg bg-paper-sunk px-3 py-2" data-testid="dispute-answer">
              {dispute.response.statement}
            </p>
          </>
        ) : (
          <p className="text-ink-soft">
            {nameOf(other)} ({sideWords[other].toLowerCase()}) has not answered.
          </p>
        )}
      </section>
    </div>
  );
}

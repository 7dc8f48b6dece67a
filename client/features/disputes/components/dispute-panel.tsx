import { useEffect, useId, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import { formatCents } from '@shared/catalogue';
import { DISPUTE_STATUS } from '@shared/glossary';
import type { Dispute, DisputeReason, OpenDisputeInput, openDisputeSchema, disputeResponseSchema } from '@shared/schemas/disputes';
import { disputeReasonWords } from '@shared/schemas/values';
import type { JobDetail } from '@shared/schemas/jobs';
import { TermBadge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { ApiError } from '@client/lib/api-client';
import { useRefreshJob } from '@client/lib/mutation';
import { cn } from '@client/lib/cn';
import { formatDateTime as formatWhen } from '@client/lib/dates';
import { applyServerErrors } from '@client/lib/form-errors';
import { useJobDispute, useOpenDispute, useRespondToDispute } from '../api/disputes';
import { lazyResolver } from '@client/lib/lazy-resolver';

const openDisputeResolver = lazyResolver(() => import('@shared/schemas/disputes').then((m) => m.openDisputeSchema));
const disputeResponseResolver = lazyResolver(() => import('@shared/schemas/disputes').then((m) => m.disputeResponseSchema));

type Side = 'builder' | 'shop';
export type DisputeViewer = Side | 'admin';

/** Job states in which a dispute may be opened, or may already exist. */
const DISPUTE_STATES = new Set<JobDetail['status']>(['funded', 'in_work', 'inspection_submitted', 'disputed', 'resolved']);

const HELD_NOTE = 'While the dispute is open, the payment stays held. An administrator reads both sides and the job’s record, then decides who is paid what.';


const otherSide = (side: Side): Side => (side === 'builder' ? 'shop' : 'builder');

/** "you" to the person themself, "the builder" or "the shop" to anyone else. */
function sideName(side: Side, viewer: DisputeViewer): string {
  return side === viewer ? 'you' : `the ${side}`;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** The administrator's outcome in plain words. */
export function outcomeWords(resolution: NonNullable<Dispute['resolution']>): string {
  switch (resolution.outcome) {
    case 'release':
      return `Paid to the shop in full: ${formatCents(resolution.shopCents)} (the Tenthmark fee comes out of the shop’s share).`;
    case 'refund':
      return `Refunded to the builder in full: ${formatCents(resolution.refundCents)}.`;
    case 'split':
      return `Split: ${formatCents(resolution.shopCents)} to the shop (the Tenthmark fee comes out of it), ${formatCents(resolution.refundCents)} back to the builder.`;
  }
}

/** A 409 means the job moved on (someone else acted first): show the page as it is now. */
function useRefreshOnConflict(jobId: string) {
  const refresh = useRefreshJob(jobId);
  return (error: unknown) => {
    if (error instanceof ApiError && error.status === 409) refresh();
  };
}

type OpenForm = z.input<typeof openDisputeSchema>;

function OpenDisputeForm({ jobId, viewer, reasons, onCancel }: { jobId: string; viewer: Side; reasons: DisputeReason[]; onCancel: () => void }) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const reasonsId = useId();
  const [formError, setFormError] = useState<string>();
  const [confirming, setConfirming] = useState<OpenDisputeInput | null>(null);
  const refreshOnConflict = useRefreshOnConflict(jobId);
  const form = useForm<OpenForm, unknown, z.output<typeof openDisputeSchema>>({
    resolver: openDisputeResolver,
    defaultValues: { reason: reasons.length === 1 ? reasons[0] : undefined, statement: '' },
  });
  const open = useOpenDispute(jobId, {
    mutationConfig: {
      onSuccess: () => {
        setConfirming(null);
        toast.success(`Dispute opened. ${capitalise(sideName(otherSide(viewer), viewer))} can answer it, and an administrator will decide.`);
      },
      onError: (error) => {
        setConfirming(null);
        setFormError(applyServerErrors(error, form.setError, ['reason', 'statement']));
        refreshOnConflict(error);
      },
    },
  });

  // The form appears in place of the button that revealed it: take focus along, so keyboard and screen reader users land on it.
  useEffect(() => headingRef.current?.focus(), []);

  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    setConfirming(values);
  });
  const reasonError = form.formState.errors.reason?.message;

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby={`${reasonsId}-heading`} className="flex flex-col gap-4 rounded-lg bg-slate-50 p-4 ring-1 ring-slate-200">
      <h3 id={`${reasonsId}-heading`} ref={headingRef} tabIndex={-1} className="text-lg font-bold">
        Open a dispute
      </h3>
      {formError && <Notice tone="error">{formError}</Notice>}
      <fieldset className="flex flex-col gap-2" aria-describedby={reasonError ? `${reasonsId}-error` : undefined}>
        <legend className="mb-1 text-sm font-semibold text-ink">What is wrong?</legend>
        {reasons.map((reason) => (
          <label
            key={reason}
            className={cn(
              'flex min-h-11 cursor-pointer items-center gap-3 rounded-lg bg-white px-3 py-2 ring-1 has-[:checked]:ring-2 has-[:checked]:ring-slate-700',
              reasonError ? 'ring-fail' : 'ring-slate-300',
            )}
          >
            <input type="radio" value={reason} aria-invalid={reasonError ? true : undefined} className="size-4 shrink-0 accent-slate-700" {...form.register('reason')} />
            <span className="text-base text-ink">{disputeReasonWords[reason]}</span>
          </label>
        ))}
        {reasonError && (
          <p id={`${reasonsId}-error`} className="text-sm font-semibold text-fail">
            {reasonError}
          </p>
        )}
      </fieldset>
      <TextAreaField
        label="Tell the administrator what happened"
        rows={6}
        hint={`Be specific: what was agreed, what you found, and what you have already tried. ${capitalise(sideName(otherSide(viewer), viewer))} will read this too.`}
        error={form.formState.errors.statement?.message}
        {...form.register('statement')}
      />
      <Notice tone="caution">{HELD_NOTE}</Notice>
      <div className="flex flex-wrap gap-3">
        <Button type="submit">Review and open the dispute</Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
      <ConfirmDialog
        open={confirming !== null}
        onClose={() => setConfirming(null)}
        onConfirm={() => confirming && open.mutate(confirming)}
        title="Open this dispute?"
        description={
          confirming && (
            <>
              <p>
                Reason: <strong className="text-ink">{disputeReasonWords[confirming.reason]}</strong>
              </p>
              <p className="mt-2">
                The job stops where it is. {capitalise(sideName(otherSide(viewer), viewer))} can answer once, and an administrator decides who is paid
                what. The payment stays held until then. This cannot be undone.
              </p>
            </>
          )
        }
        confirmLabel="Open the dispute"
        cancelLabel="Go back"
        tone="danger"
        busy={open.isPending}
      />
    </form>
  );
}

function AnswerForm({ jobId, viewer, opener }: { jobId: string; viewer: Side; opener: Side }) {
  const [formError, setFormError] = useState<string>();
  const refreshOnConflict = useRefreshOnConflict(jobId);
  const form = useForm<z.input<typeof disputeResponseSchema>, unknown, z.output<typeof disputeResponseSchema>>({
    resolver: disputeResponseResolver,
    defaultValues: { statement: '' },
  });
  const respond = useRespondToDispute(jobId, {
    mutationConfig: {
      onSuccess: () => {
        form.reset();
        toast.success('Your answer is with the administrator.');
      },
      onError: (error) => {
        setFormError(applyServerErrors(error, form.setError, ['statement']));
        refreshOnConflict(error);
      },
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    respond.mutate(values);
  });
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Answer the dispute" className="flex flex-col gap-3">
      <p>{capitalise(sideName(opener, viewer))} opened this dispute. Give your side before the administrator decides.</p>
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextAreaField
        label="Your side of it"
        rows={6}
        hint="You can answer once. The administrator reads both statements alongside the job’s messages, progress and inspection record."
        error={form.formState.errors.statement?.message}
        {...form.register('statement')}
      />
      <div>
        <Button type="submit" busy={respond.isPending}>
          Send your answer
        </Button>
      </div>
    </form>
  );
}

function Statement({ heading, at, text, testId }: { heading: string; at: string; text: string; testId: string }) {
  return (
    <section className="flex flex-col gap-1" data-testid={testId}>
      <h3 className="text-lg font-bold">{heading}</h3>
      <p className="text-sm text-ink-soft">{formatWhen(at)}</p>
      <p className="whitespace-pre-wrap">{text}</p>
    </section>
  );
}

function DisputeDetails({ dispute, viewer, canRespond, jobId }: { dispute: Dispute; viewer: DisputeViewer; canRespond: boolean; jobId: string }) {
  const opener = dispute.openedBy;
  const answerer = otherSide(opener);
  const decided = dispute.status === 'resolved';
  return (
    <div className="flex flex-col gap-5" data-testid="dispute">
      <div className="flex flex-wrap items-center gap-3">
        <TermBadge term={DISPUTE_STATUS[dispute.status]} prefix="Dispute status: " />
        <span className="text-ink-soft">
          Opened by {sideName(opener, viewer)} on {formatWhen(dispute.openedAt)}
        </span>
      </div>
      <dl className="grid gap-1">
        <dt className="text-sm font-semibold text-ink-soft">Reason</dt>
        <dd className="font-semibold" data-testid="dispute-reason">
          {disputeReasonWords[dispute.reason]}
        </dd>
      </dl>

      <Statement
        heading={opener === viewer ? 'Your statement' : `Statement from the ${opener}`}
        at={dispute.openedAt}
        text={dispute.statement}
        testId="dispute-statement"
      />

      {dispute.response ? (
        <Statement
          heading={dispute.response.by === viewer ? 'Your answer' : `Answer from the ${dispute.response.by}`}
          at={dispute.response.at}
          text={dispute.response.statement}
          testId="dispute-response"
        />
      ) : canRespond && viewer !== 'admin' ? (
        <section className="flex flex-col gap-2">
          <h3 className="text-lg font-bold">Your answer</h3>
          <AnswerForm jobId={jobId} viewer={viewer} opener={opener} />
        </section>
      ) : (
        <p className="text-ink-soft">
          {capitalise(sideName(answerer, viewer))} {decided ? 'did not answer' : answerer === viewer ? 'have not answered' : 'has not answered yet'}.
        </p>
      )}

      {dispute.resolution ? (
        <section className="flex flex-col gap-2" data-testid="dispute-decision">
          <h3 className="text-lg font-bold">The administrator’s decision</h3>
          <Notice tone="success" title={outcomeWords(dispute.resolution)}>
            <p>Decided on {formatWhen(dispute.resolution.at)}.</p>
          </Notice>
          <p className="whitespace-pre-wrap">{dispute.resolution.decision}</p>
        </section>
      ) : (
        <Notice>{HELD_NOTE}</Notice>
      )}
    </div>
  );
}

export interface DisputePanelProps {
  job: JobDetail;
  /** The job's builder or the shop doing the work may act; an administrator only reads, with a link to the case. */
  viewer: DisputeViewer;
}

/**
 * Disputes on the job page. The builder (instead of accepting the inspection
 * record) or the shop (when the builder has gone quiet, or over a change
 * order) opens one; the other side answers once; an administrator decides how
 * the held payment is shared, and the decision shows here for both.
 */
export function DisputePanel({ job, viewer }: DisputePanelProps) {
  const relevant = DISPUTE_STATES.has(job.status);
  const query = useJobDispute(job.id, { enabled: relevant });
  const [opening, setOpening] = useState(false);
  if (!relevant) return null;

  const inDispute = job.status === 'disputed' || job.status === 'resolved';
  let body;
  if (query.isPending) {
    // Before a dispute exists there may be nothing to show: stay out of the way while asking.
    if (!inDispute) return null;
    body = <p className="text-ink-soft">Loading the dispute …</p>;
  } else if (query.isError) {
    body = <Notice tone="error" onRetry={() => void query.refetch()}>The dispute could not be loaded: {query.error.message}</Notice>;
  } else {
    const { dispute, canOpenWith, canRespond } = query.data;
    const mayOpen = viewer !== 'admin' && !dispute && canOpenWith.length > 0;
    if (!dispute && !mayOpen) return null;
    if (dispute) {
      body = (
        <>
          <DisputeDetails dispute={dispute} viewer={viewer} canRespond={canRespond} jobId={job.id} />
          {viewer === 'admin' && (
            <p>
              <Link to={`/admin/disputes/${dispute.id}`} className="font-semibold text-slate-700 underline underline-offset-4">
                Open the case in the admin console
              </Link>
            </p>
          )}
        </>
      );
    } else if (viewer !== 'admin') {
      body = opening ? (
        <OpenDisputeForm jobId={job.id} viewer={viewer} reasons={canOpenWith} onCancel={() => setOpening(false)} />
      ) : (
        <div className="flex flex-col gap-3">
          <p className="text-ink-soft">
            {viewer === 'builder'
              ? 'If the work or the record is wrong in a way a new version cannot put right, you can open a dispute instead of accepting it. An administrator decides; until then the payment stays held.'
              : 'If the builder has gone quiet past the agreed date, or extra work is not being paid or answered, you can open a dispute. An administrator decides; until then the payment stays held.'}
          </p>
          <div>
            <Button variant="secondary" onClick={() => setOpening(true)}>
              Open a dispute
            </Button>
          </div>
        </div>
      );
    }
  }

  return (
    <Card className="flex flex-col gap-4">
      <h2 className="text-xl font-bold tracking-tight">Dispute</h2>
      {body}
    </Card>
  );
}

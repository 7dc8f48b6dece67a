import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import { boreSpecFor, checksNotConforming } from '@shared/calc';
import { RECORD_STATUS, type Term } from '@shared/glossary';
import type { InspectionVersion, rejectInspectionSchema } from '@shared/schemas/inspection';
import type { JobDetail } from '@shared/schemas/jobs';
import { TermBadge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { CheckboxField } from '@client/components/ui/checkbox-field';
import { ModalDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { lengthToText } from '@client/lib/numbers';
import { useAcceptInspection, useInspection, useRejectInspection } from '../api/inspections';
import { type VersionChange, versionChanges } from '../lib/version-diff';
import { BoreSizeChart } from './bore-size-chart';
import { InspectionResultsView } from './inspection-results';
import { formatDateTime as formatWhen } from '@client/lib/dates';
import { RecordSections } from './record-section-block';
import { ReadingsAt20 } from './record-judgement';
import { lazyResolver } from '@client/lib/lazy-resolver';

const rejectInspectionResolver = lazyResolver(() => import('@shared/schemas/inspection').then((m) => m.rejectInspectionSchema));

/** Job states in which an inspection record may exist or be on its way. */
const RECORD_STATES = new Set<JobDetail['status']>(['in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);

const versionStatus: Readonly<Record<InspectionVersion['status'], Term>> = RECORD_STATUS;


function Changes({ changes, previous }: { changes: VersionChange[]; previous: number }) {
  return (
    <section aria-label={`Changes from version ${previous}`} className="flex flex-col gap-2" data-testid="version-changes">
      <h4 className="font-bold">Changes from version {previous}</h4>
      {changes.length === 0 ? (
        <p className="text-sm text-ink-soft">Nothing changed: the same readings were sent again.</p>
      ) : (
        <div className="relative overflow-x-auto">
          <table className="w-full min-w-[28rem] text-sm">
            <thead className="text-left text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3 font-semibold">What</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Version {previous}</th>
                <th scope="col" className="py-1 font-semibold">Version {previous + 1}</th>
              </tr>
            </thead>
            <tbody>
              {changes.map((change) => (
                <tr key={change.key} className="border-t border-slate-200 align-top">
                  <th scope="row" className="py-1 pr-3 text-left font-semibold">{change.what}</th>
                  <td className="py-1 pr-3 tabular-nums text-ink-soft line-through decoration-ink-faint">{change.before}</td>
                  <td className="py-1 tabular-nums font-semibold">{change.after}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

function Conditions({ version }: { version: InspectionVersion }) {
  const { conditions, signedOffBy, notes } = version.input;
  return (
    <div className="flex flex-col gap-2">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="inspection-conditions">
        <dt className="text-ink-soft">Units</dt>
        <dd className="font-semibold">{conditions.unit === 'in' ? 'Inches' : 'Millimetres'}</dd>
        <dt className="text-ink-soft">Gauge resolution</dt>
        <dd className="font-semibold tabular-nums">{lengthToText(conditions.gaugeResolution, conditions.unit)} {conditions.unit}</dd>
        <dt className="text-ink-soft">Temperature at measurement</dt>
        <dd className="font-semibold tabular-nums">{conditions.temperatureF !== undefined ? `${conditions.temperatureF} °F` : `${conditions.temperatureC} °C`}</dd>
        {conditions.uncertainty !== undefined && (
          <>
            <dt className="text-ink-soft">Measurement uncertainty (U)</dt>
            <dd className="font-semibold tabular-nums">{lengthToText(conditions.uncertainty, conditions.unit)} {conditions.unit}</dd>
          </>
        )}
        <dt className="text-ink-soft">Torque plate</dt>
        <dd className="font-semibold">{conditions.torquePlate ? 'Fitted' : 'Not fitted'}</dd>
        <dt className="text-ink-soft">Signed off by</dt>
        <dd className="font-semibold">{signedOffBy}</dd>
        <dt className="text-ink-soft">Submitted</dt>
        <dd className="font-semibold">{formatWhen(version.submittedAt)}</dd>
      </dl>
      {notes && <p className="whitespace-pre-wrap text-sm">{notes}</p>}
    </div>
  );
}

/** One version in full: verdict and checks, the chart, surface figures, conditions and sign-off. */
function VersionBody({ version, job }: { version: InspectionVersion; job: JobDetail }) {
  const unit = version.input.conditions.unit;
  const target = boreSpecFor(job.spec, unit).targetBore;
  return (
    <div className="flex flex-col gap-5">
      <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <InspectionResultsView
          results={version.results}
          cylinderIndexes={(version.input.cylinders ?? []).map((_, i) => i)}
          cylinderCount={version.input.cylinders?.length ?? 0}
          spec={job.spec}
          unit={unit}
          complete
        />
        <div className="flex min-w-0 flex-col gap-5">
          {version.input.cylinders && <BoreSizeChart cylinders={version.input.cylinders} unit={unit} targetBore={target} />}
          <section aria-label="How the figures are defined" className="flex flex-col gap-1 text-sm" data-testid="figure-definitions">
            <h4 className="font-bold">How the figures are defined</h4>
            <p>
              <strong>Taper</strong>: on the diameter, the largest minus the smallest reading over the three depths in one direction; the larger direction
              counts.
            </p>
            <p>
              <strong>Out-of-round</strong>: two-point, the difference of the thrust and axial diameters at one depth; the largest depth counts.
            </p>
            {version.input.crosshatch?.mode === 'settings' && version.results.crosshatch && (
              <p data-testid="crosshatch-computed">
                <strong>Crosshatch</strong>: {version.results.crosshatch.includedAngleDeg.toFixed(1)}° included angle computed from settings (mid-stroke), not
                measured: {version.input.crosshatch.spindleRpm} rpm, {version.input.crosshatch.strokeLength} {unit} stroke, {version.input.crosshatch.cyclesPerMinute}{' '}
                full up-and-down cycles per minute.
              </p>
            )}
          </section>
          <section aria-label="Conditions and sign-off" className="flex flex-col gap-2">
            <h4 className="font-bold">Conditions and sign-off</h4>
            <Conditions version={version} />
          </section>
          <ReadingsAt20 input={version.input} results={version.results} />
        </div>
      </div>
      {version.results.sections && version.results.sections.length > 0 && (
        <section aria-label="Each operation" className="flex flex-col gap-2">
          <h4 className="font-bold">Each operation</h4>
          <RecordSections results={version.results} headingLevel={4} />
        </section>
      )}
    </div>
  );
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/**
 * Accepting pays the shop. When any check does not conform (fails, or could
 * not be judged), each one is named and must be ticked before the Accept
 * button works: nobody pays for a failing bore by clicking through.
 */
function AcceptDialog({ job, version, open, onClose }: { job: JobDetail; version: InspectionVersion; open: boolean; onClose: () => void }) {
  const failing = checksNotConforming(version.results);
  const [confirmed, setConfirmed] = useState<ReadonlySet<string>>(new Set());
  const close = () => {
    setConfirmed(new Set());
    onClose();
  };
  const accept = useAcceptInspection(job.id, {
    mutationConfig: {
      onSuccess: () => {
        close();
        toast.success('Accepted. The held payment is on its way to the shop.');
      },
    },
  });
  const allConfirmed = failing.every((name) => confirmed.has(name));
  const toggle = (name: string, on: boolean) =>
    setConfirmed((before) => {
      const next = new Set(before);
      if (on) next.add(name);
      else next.delete(name);
      return next;
    });
  return (
    <ModalDialog
      open={open}
      onClose={close}
      title={`Accept version ${version.version} of the inspection record?`}
      description="The held payment goes to the shop, less the Tenthmark fee, and the job is completed. This cannot be undone."
      size="sm"
    >
      {failing.length > 0 && (
        <fieldset className="flex flex-col gap-2 rounded-lg bg-fail-soft/50 p-3 ring-1 ring-fail/30" data-testid="accept-failing-checks">
          <legend className="px-1 font-bold text-fail">
            {failing.length === 1 ? 'This check does not conform' : `These ${failing.length} checks do not conform`}
          </legend>
          <p className="text-sm">Tick each one to say you accept the work as it is, knowing it is outside the job’s limits or not judged.</p>
          {failing.map((name, i) => (
            <CheckboxField
              key={name}
              label={`I accept: ${capitalise(name)}`}
              checked={confirmed.has(name)}
              onChange={(event) => toggle(name, event.currentTarget.checked)}
              data-autofocus={i === 0 ? true : undefined}
            />
          ))}
        </fieldset>
      )}
      {accept.error && <Notice tone="error">{accept.error.message}</Notice>}
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={close} data-autofocus={failing.length === 0 ? true : undefined}>
          Not yet
        </Button>
        <Button busy={accept.isPending} disabled={!allConfirmed} onClick={() => accept.mutate({ version: version.version, confirmedChecks: failing.filter((name) => confirmed.has(name)) })}>
          Accept and pay the shop
        </Button>
      </div>
      {!allConfirmed && (
        <p className="text-right text-sm text-ink-soft" aria-live="polite">
          Tick every check above to accept.
        </p>
      )}
    </ModalDialog>
  );
}

function BuilderDecision({ job, version, reviewDueAt, autoAccept, windowEnded }: { job: JobDetail; version: InspectionVersion; reviewDueAt: string | null; autoAccept: boolean | null; windowEnded: boolean }) {
  const [acceptOpen, setAcceptOpen] = useState(false);
  const [rejectOpen, setRejectOpen] = useState(false);
  return (
    <div className="flex flex-col gap-3 rounded-lg bg-caution-soft/40 p-4 ring-1 ring-caution/30">
      <p className="font-semibold">Check the readings and figures, then accept the work or say what needs redoing.</p>
      {reviewDueAt && autoAccept !== false && (
        <p className="text-sm" data-testid="review-due">
          If you do not answer, the record is accepted automatically on {formatWhen(reviewDueAt)}.
        </p>
      )}
      {autoAccept === false && !windowEnded && (
        <p className="text-sm" data-testid="review-due">
          At least one check does not conform, so this record is never accepted without you; it waits for your answer.
        </p>
      )}
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => setAcceptOpen(true)}>Accept the record</Button>
        <Button variant="secondary" onClick={() => setRejectOpen(true)}>
          Ask for changes
        </Button>
      </div>
      <p className="text-sm text-ink-soft">Something wrong that a new version cannot fix? Open a dispute below.</p>
      {/* Keyed by version: ticks and reasons given for one version never carry over to another that arrives while a dialog is open. */}
      <AcceptDialog key={version.version} job={job} version={version} open={acceptOpen} onClose={() => setAcceptOpen(false)} />
      <RejectDialog key={version.version} job={job} version={version} open={rejectOpen} onClose={() => setRejectOpen(false)} />
    </div>
  );
}

function RejectDialog({ job, version, open, onClose }: { job: JobDetail; version: InspectionVersion; open: boolean; onClose: () => void }) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<z.input<typeof rejectInspectionSchema>, unknown, z.output<typeof rejectInspectionSchema>>({
    resolver: rejectInspectionResolver,
    defaultValues: { version: version.version, reasons: '' },
  });
  const reject = useRejectInspection(job.id, {
    mutationConfig: {
      onSuccess: () => {
        onClose();
        form.reset();
        toast.success(`${RECORD_STATUS.rejected.label}. The shop is told what to redo and will send a new version.`);
      },
      onError: (error) => setFormError(applyServerErrors(error, form.setError, ['reasons'])),
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    // The version this dialog shows: if another one is waiting by now, the server refuses (version_changed) and says so.
    reject.mutate({ ...values, version: version.version });
  });
  return (
    <ModalDialog open={open} onClose={onClose} title={`Ask for changes to version ${version.version}?`} description="The shop sees your reasons, redoes the work and submits a new version. The payment stays held.">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Ask for changes to the inspection record">
        <TextAreaField label="What needs redoing, and why" rows={4} data-autofocus error={form.formState.errors.reasons?.message} {...form.register('reasons')} />
        {formError && <Notice tone="error">{formError}</Notice>}
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={onClose}>
            Go back
          </Button>
          <Button type="submit" variant="danger" busy={reject.isPending}>
            Send the changes asked
          </Button>
        </div>
      </form>
    </ModalDialog>
  );
}

/**
 * The inspection record on the job page. The builder reviews the latest
 * version and accepts it (the held payment goes to the shop) or rejects it
 * with reasons; the shop sees where its record stands and enters a new one
 * when it may; everyone involved can read older versions and what changed.
 */
export function InspectionReview({ job, viewer }: { job: JobDetail; viewer: 'builder' | 'shop' | 'admin' }) {
  const inspection = useInspection(job.id, { enabled: RECORD_STATES.has(job.status) });
  if (!RECORD_STATES.has(job.status)) return null;

  const canEnter = viewer === 'shop' && job.status === 'in_work';
  const enterLink = (
    <Link
      to={`/jobs/${job.id}/inspection/new`}
      className="inline-flex min-h-11 items-center justify-center rounded-lg bg-slate-700 px-4 py-2 font-semibold text-white hover:bg-slate-800"
    >
      Enter the inspection record
    </Link>
  );

  let body;
  if (inspection.isPending) body = <p className="text-ink-soft">Loading the inspection record …</p>;
  else if (inspection.isError)
    body = (
      <Notice tone="error" onRetry={() => void inspection.refetch()}>
        The inspection record could not be loaded: {inspection.error.message}
      </Notice>
    );
  else {
    const { versions, reviewDueAt, autoAccept = null, reviewWindowEnded = false } = inspection.data;
    const latest = versions[0];
    if (!latest) {
      body = (
        <div className="flex flex-col gap-3">
          <p className="text-ink-soft">
            {viewer === 'shop'
              ? 'When the work is done, enter your measured readings; the builder reviews them and the held payment is released when they accept.'
              : 'The shop has not sent its inspection record yet. It will appear here with every reading and figure, checked against your spec.'}
          </p>
          {canEnter && <div>{enterLink}</div>}
        </div>
      );
    } else {
      const previous = versions[1];
      const older = versions.slice(1);
      body = (
        <div className="flex flex-col gap-5" data-testid="inspection-review">
          <div className="flex flex-wrap items-center gap-3">
            <h3 className="text-lg font-bold">Version {latest.version}</h3>
            <TermBadge term={versionStatus[latest.status]} />
            <span className="text-sm text-ink-soft">submitted {formatWhen(latest.submittedAt)}</span>
            <Link to={`/jobs/${job.id}/inspection/${latest.version}/certificate`} className="text-sm font-semibold text-slate-700 underline underline-offset-4">
              Certificate (print or PDF)
            </Link>
          </div>

          {latest.status === 'rejected' && (
            <Notice tone="error" title={viewer === 'shop' ? 'The builder asked for changes to this version' : 'You asked for changes to this version'}>
              <p className="whitespace-pre-wrap" data-testid="reject-reasons">{latest.rejectReasons}</p>
              {viewer === 'shop' && <p className="mt-1">Redo what is asked, then enter a new version; your last readings are filled in for you.</p>}
            </Notice>
          )}
          {latest.status === 'accepted' && (
            <Notice tone="success" title="Accepted">
              Accepted{latest.decidedAt ? ` on ${formatWhen(latest.decidedAt)}` : ''}; the held payment was released to the shop.
            </Notice>
          )}
          {latest.status === 'submitted' && reviewWindowEnded && autoAccept === false && (
            <div data-testid="review-window-held"><Notice tone="caution" title="The review window has ended without acceptance">
              {reviewDueAt ? `The window ended on ${formatWhen(reviewDueAt)}. ` : ''}
              At least one check does not conform ({checksNotConforming(latest.results).join('; ')}), so the record was not accepted automatically. It waits for the
              builder’s answer and the payment stays held; the builder, the shop and Tenthmark’s admins were told by e-mail.
            </Notice></div>
          )}
          {viewer === 'builder' && job.status === 'inspection_submitted' && latest.status === 'submitted' && (
            <BuilderDecision job={job} version={latest} reviewDueAt={reviewDueAt} autoAccept={autoAccept} windowEnded={reviewWindowEnded} />
          )}
          {viewer !== 'builder' && latest.status === 'submitted' && reviewDueAt && !reviewWindowEnded && (
            <p className="text-sm" data-testid="review-due">
              {autoAccept === false
                ? `With the builder for review. At least one check does not conform, so it is not accepted automatically when the window ends on ${formatWhen(reviewDueAt)}.`
                : `With the builder for review; accepted automatically on ${formatWhen(reviewDueAt)} if they do not answer.`}
            </p>
          )}
          {canEnter && <div>{enterLink}</div>}

          <VersionBody version={latest} job={job} />
          {previous && <Changes changes={versionChanges(previous, latest)} previous={previous.version} />}

          {older.length > 0 && (
            <section aria-label="Earlier versions" className="flex flex-col gap-2">
              <h3 className="text-lg font-bold">Earlier versions</h3>
              {older.map((version, i) => {
                const before = older[i + 1];
                return (
                  <details key={version.id} className="rounded-lg border border-slate-200 p-3" data-testid="older-version">
                    <summary className="cursor-pointer font-semibold">
                      Version {version.version} · {versionStatus[version.status].label.toLowerCase()}
                      {version.replacedBy ? ` · replaced by version ${version.replacedBy}` : ''} · submitted {formatWhen(version.submittedAt)}
                    </summary>
                    <div className="mt-3 flex flex-col gap-4">
                      {version.rejectReasons && (
                        <Notice tone="error" title="Reasons given">
                          <p className="whitespace-pre-wrap">{version.rejectReasons}</p>
                        </Notice>
                      )}
                      {before && <Changes changes={versionChanges(before, version)} previous={before.version} />}
                      <VersionBody version={version} job={job} />
                    </div>
                  </details>
                );
              })}
            </section>
          )}
        </div>
      );
    }
  }

  return (
    <Card className="flex flex-col gap-4">
      <h2 className="text-xl font-bold tracking-tight">Inspection record</h2>
      {body}
    </Card>
  );
}

import { useMemo, useState, type ChangeEvent, type FormEvent, type KeyboardEvent, type ReactNode } from 'react';
import { toast } from '@client/lib/toast';
import type { LengthUnit } from '@shared/calc';
import type { InspectionVersion } from '@shared/schemas/inspection';
import type { JobDetail } from '@shared/schemas/jobs';
import { BoreReadingGrid } from '@client/components/bore-readings/bore-reading-grid';
import { Button } from '@client/components/ui/button';
import { CheckboxField } from '@client/components/ui/checkbox-field';
import { Notice } from '@client/components/ui/notice';
import { SegmentedControl } from '@client/components/ui/segmented-control';
import { SelectField } from '@client/components/ui/select-field';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField, type TextFieldProps } from '@client/components/ui/text-field';
import { ProposeChangeOrder } from '@client/features/payments';
import { ApiError } from '@client/lib/api-client';
import { formatTime } from '@client/lib/dates';
import { UNIT_WORDS } from '@client/lib/numbers';
import { useSubmitInspection } from '../api/inspections';
import { useDraftAutosave, type DraftStatus } from '../hooks/use-draft-autosave';
import { evaluateLive } from '../lib/evaluate';
import { MAX_TRACE_POINTS, readTrace } from '../lib/profile-file';
import { type CrosshatchMode, type FinishMode, type FinishUnit, PROFILE_FILTER_CHOICES, type RecordForm, checkRecord, fieldId, pathWords, toDraft } from '../lib/record-form';
import { ordersBoreWork } from '../lib/section-fields';
import { FailingChecksLine, InspectionResultsView } from './inspection-results';
import { DeckPositionFields, OrderedSections, type SectionContext } from './sections';


function DraftStatusLine({ status }: { status: DraftStatus }) {
  const words =
    status.kind === 'saving'
      ? 'Saving the draft …'
      : status.kind === 'saved'
        ? `Saved at ${formatTime(status.at)}`
        : status.kind === 'failed'
          ? `The draft could not be saved (${status.message}). It is tried again with your next change.`
          : 'The draft saves itself as you type.';
  return (
    <p role="status" className={status.kind === 'failed' ? 'text-sm font-semibold text-fail' : 'text-sm text-ink-soft'} data-testid="draft-status">
      {words}
    </p>
  );
}

function Section({ title, children, intro }: { title: string; children: ReactNode; intro?: ReactNode }) {
  return (
    <fieldset className="flex min-w-0 flex-col gap-3 rounded-lg border border-slate-200 p-4">
      <legend className="px-1 text-base font-bold text-ink">{title}</legend>
      {intro && <p className="text-sm text-ink-soft">{intro}</p>}
      {children}
    </fieldset>
  );
}

/** A decimal input for one path of the request, with that path's message. */
function NumberInput({ path, errors, ...rest }: { path: string; errors: Record<string, string> } & Omit<TextFieldProps, 'id' | 'error'>) {
  return <TextField id={fieldId(path)} type="text" inputMode="decimal" autoComplete="off" spellCheck={false} error={errors[path]} {...rest} />;
}

const listInWords = (items: string[]) => (items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`);

export interface InspectionEntryFormProps {
  job: JobDetail;
  initial: RecordForm;
  /** Where the form came from, said once at the top: a kept draft (with when it was saved, if known), and the version the builder rejected, if any. */
  origin: { draft: false | { savedAt: string | null }; rejected: InspectionVersion | null };
  onSubmitted: (version: InspectionVersion) => void;
}

/**
 * The shop's inspection record: conditions, the bore grid, deck, finish,
 * crosshatch and sign-off, with every figure and check worked out beside it
 * as the numbers go in. The draft saves itself; submitting sends only the raw
 * readings (the server works every figure out again).
 */
export function InspectionEntryForm({ job, initial, origin, onSubmitted }: InspectionEntryFormProps) {
  const boreWork = ordersBoreWork(job.spec.operations);
  const deckOrdered = job.spec.operations.some((op) => op.code === 'deck');
  /** The bore grid's rows: none when the job orders no bore work. */
  const count = boreWork ? job.cylinders : 0;
  const [form, setForm] = useState<RecordForm>(initial);
  const [tried, setTried] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string>();
  const [traceError, setTraceError] = useState<string>();
  const draft = useDraftAutosave(job.id, form, toDraft, { savedAt: origin.draft ? origin.draft.savedAt : null });

  const check = useMemo(() => checkRecord(form, count), [form, count]);
  const live = useMemo(() => evaluateLive(form, count, job.spec, check), [form, count, job.spec, check]);
  const errors = useMemo(() => ({ ...(tried ? check.missing : {}), ...check.errors, ...serverErrors }), [tried, check, serverErrors]);

  const submit = useSubmitInspection(job.id, {
    mutationConfig: {
      onSuccess: (version) => {
        toast.success(`Version ${version.version} of the inspection record is with the builder.`);
        onSubmitted(version);
      },
      onError: (error) => {
        if (error instanceof ApiError && Object.keys(error.fields).length > 0) setServerErrors(error.fields);
        setFormError(error.message);
      },
    },
  });

  const update = (change: Partial<RecordForm>) => {
    setForm((current) => ({ ...current, ...change }));
    if (Object.keys(serverErrors).length > 0) setServerErrors({});
  };
  const updateFields = (changes: Record<string, string>) => {
    setForm((current) => ({ ...current, fields: { ...current.fields, ...changes } }));
    if (Object.keys(serverErrors).length > 0) setServerErrors({});
  };
  const sectionCtx: SectionContext = { fields: form.fields, setFields: updateFields, errors, unit: form.unit, job, results: live.results };
  const crackFound = form.fields['sections.crackTest.result'] === 'crack-found';
  const updateCells = (changes: Record<string, string>) => setForm((current) => ({ ...current, cells: { ...current.cells, ...changes } }));
  const text = (path: string, value: string, onValue: (text: string) => void) => ({
    value,
    onChange: (event: ChangeEvent<HTMLInputElement>) => onValue(event.target.value),
    path,
    errors,
  });
  const unitShort = UNIT_WORDS[form.unit].short;

  const onTraceFile = async (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (!file) return;
    setTraceError(undefined);
    if (file.size > 8 * 1024 * 1024) {
      setTraceError(`“${file.name}” is larger than 8 MB; a trace of ${MAX_TRACE_POINTS.toLocaleString('en-US')} heights fits well within that.`);
      return;
    }
    const read = readTrace(await file.text());
    if (!read.ok) {
      setTraceError(`“${file.name}”: ${read.message}`);
      return;
    }
    update({ profile: { fileName: file.name, heights: read.heights } });
  };

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (crackFound) return;
    setTried(true);
    setFormError(undefined);
    if (!check.input) {
      const first = check.order[0];
      const target = first ? document.getElementById(fieldId(first)) : null;
      target?.focus();
      return;
    }
    // No draft save may land after the record: the server drops the draft when the record is submitted.
    draft.stop();
    submit.mutate(check.input, { onError: () => draft.resume() });
  };

  /** Enter in a text input never sends the record by accident; buttons still work with Enter. */
  const onFormKeyDown = (event: KeyboardEvent<HTMLFormElement>) => {
    const target = event.target as HTMLElement;
    if (event.key === 'Enter' && target instanceof HTMLInputElement && !['checkbox', 'radio', 'submit', 'button', 'file'].includes(target.type)) {
      event.preventDefault();
    }
  };

  const problems = tried && !check.input ? check.order : [];
  const profilePoints = form.profile?.heights?.length;
  const finishUnitWord = form.finishUnit === 'uin' ? 'µin' : 'µm';

  return (
    <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <form noValidate aria-label="Inspection record" onSubmit={onSubmit} onKeyDown={onFormKeyDown} className="flex min-w-0 flex-col gap-5">
        {origin.rejected && (
          <Notice tone="caution" title={`The builder asked for changes to version ${origin.rejected.version}`}>
            <p className="whitespace-pre-wrap" data-testid="reject-reasons">{origin.rejected.rejectReasons}</p>
            {!origin.draft && <p className="mt-1">Its readings are filled in below: change what was redone and submit the new version.</p>}
          </Notice>
        )}
        {origin.draft && (
          <Notice>
            Your draft is restored{origin.draft.savedAt ? ` as it was at ${formatTime(origin.draft.savedAt)}` : ''}. Carry on where you left off.
          </Notice>
        )}

        <Section title="Conditions" intro="How the readings were taken.">
          <div className="flex flex-col gap-1">
            <span aria-hidden className="text-sm font-semibold text-ink">
              Units of the readings
            </span>
            <SegmentedControl
              label="Units of the readings"
              options={[
                { value: 'in', label: 'Inches' },
                { value: 'mm', label: 'Millimetres' },
              ]}
              value={form.unit}
              onChange={(unit: LengthUnit) => update({ unit })}
              className="self-start"
            />
            {form.unit !== job.spec.unit && (
              <p className="text-sm text-ink-soft">The job’s limits are in {UNIT_WORDS[job.spec.unit].long}; they are converted exactly (1 in = 25.4 mm).</p>
            )}
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <NumberInput label={`Gauge resolution (${unitShort})`} {...text('conditions.gaugeResolution', form.gaugeResolution, (v) => update({ gaugeResolution: v }))} />
            <div className="flex flex-col gap-1">
              <NumberInput
                label={`Temperature at measurement (°${form.temperatureScale ?? 'C'})`}
                {...text('conditions.temperatureC', form.temperatureC, (v) => update({ temperatureC: v }))}
                errors={{ ...errors, 'conditions.temperatureC': errors['conditions.temperatureC'] ?? errors['conditions.temperatureF'] }}
              />
              <SegmentedControl<'C' | 'F'>
                label="Temperature scale"
                options={[
                  { value: 'C', label: '°C' },
                  { value: 'F', label: '°F' },
                ]}
                value={form.temperatureScale ?? 'C'}
                onChange={(temperatureScale) => update({ temperatureScale })}
                className="self-start"
              />
            </div>
            <NumberInput
              label={`Measurement uncertainty U (${unitShort}), optional`}
              hint="Leave empty to use the gauge resolution, which is only a lower bound on the uncertainty."
              {...text('conditions.uncertainty', form.uncertainty ?? '', (v) => update({ uncertainty: v }))}
            />
          </div>
          <p className="text-sm text-ink-soft">
            Readings are corrected to 20 °C (ISO 1) with the block’s and the pistons’ expansion coefficients before they are judged; both values are kept.
          </p>
          <CheckboxField
            id={fieldId('conditions.torquePlate')}
            label="Torque plate fitted while measuring"
            checked={form.torquePlate}
            onChange={(event) => update({ torquePlate: event.target.checked })}
          />
        </Section>

        <OrderedSections ctx={sectionCtx} only={['clean', 'crackTest']} />

        {crackFound && (
          <div className="flex flex-col gap-3" data-testid="crack-stop">
            <Notice tone="error" title="A crack was found: the record stops here">
              A cracked part is not measured further and this record cannot be submitted. Propose the extra work the crack needs (a repair, or a
              replacement part) to the builder below; once it is agreed and done, record the crack test again.
            </Notice>
            <ProposeChangeOrder
              jobId={job.id}
              description={`Crack found on crack test${form.fields['sections.crackTest.findings'] ? `: ${form.fields['sections.crackTest.findings']}` : '.'}`}
              intro="The crack test’s findings are filled in; add what the repair is and its price. The builder agrees and pays before you do it."
            />
          </div>
        )}

        <div hidden={crackFound} className="flex flex-col gap-5">
          {boreWork && (
            <Section title={`Bores: ${count} cylinders`}>
              <BoreReadingGrid
                cylinderCount={count}
                unit={form.unit}
                cells={form.cells}
                errors={errors}
                inputId={fieldId}
                pasteRows
                pistonNote="(diameter)"
                tableClassName="min-w-[34rem]"
                help={
                  <>
                    Readings in {UNIT_WORDS[form.unit].long}. Tab moves along a cylinder (top, middle, bottom; thrust then axial; then the piston); Enter
                    moves to the same reading of the next cylinder. Paste rows copied from a spreadsheet into any cell to fill the grid from there: one
                    row per cylinder, top thrust, top axial, middle thrust, middle axial, bottom thrust, bottom axial and, optionally, the piston.
                  </>
                }
                onChange={(changes) => {
                  updateCells(changes);
                  if (Object.keys(serverErrors).length > 0) setServerErrors({});
                }}
              />
              <FailingChecksLine results={live.results} cylinderIndexes={live.cylinderIndexes} spec={job.spec} unit={form.unit} className="xl:hidden" />
            </Section>
          )}

          <Section title={deckOrdered ? 'Deck' : 'Deck (optional)'} intro="The thickest feeler leaf under a straightedge at each position: lengthwise, crosswise and on both diagonals.">
            <TextField
              id={fieldId('deck.readings')}
              label={`Straightedge readings (${unitShort}), separated by spaces or commas`}
              autoComplete="off"
              spellCheck={false}
              value={form.deckReadings}
              onChange={(event) => update({ deckReadings: event.target.value })}
              error={errors['deck.readings'] ?? Object.entries(errors).find(([path]) => path.startsWith('deck.readings.'))?.[1]}
            />
            <NumberInput label="Deck finish Ra (µm), optional" {...text('deck.raUm', form.deckRa, (v) => update({ deckRa: v }))} />
            {deckOrdered && <DeckPositionFields ctx={sectionCtx} />}
          </Section>

          <Section title="Bore finish (optional)">
            <SegmentedControl<FinishMode>
              label="Bore finish"
              options={[
                { value: 'none', label: 'Not measured' },
                { value: 'values', label: 'Enter values' },
                { value: 'profile', label: 'From a profile trace' },
              ]}
              value={form.finishMode}
              onChange={(finishMode) => update({ finishMode })}
              className="self-start"
            />
            {form.finishMode === 'values' && (
              <div className="grid gap-3 sm:grid-cols-3">
                <NumberInput label={`Ra (${finishUnitWord})`} {...text('finish.raUm', form.finish.ra, (v) => update({ finish: { ...form.finish, ra: v } }))} />
                <NumberInput label={`Rk (${finishUnitWord}), optional`} {...text('finish.rkUm', form.finish.rk, (v) => update({ finish: { ...form.finish, rk: v } }))} />
                <NumberInput label={`Rpk (${finishUnitWord}), optional`} {...text('finish.rpkUm', form.finish.rpk, (v) => update({ finish: { ...form.finish, rpk: v } }))} />
                <NumberInput label={`Rvk (${finishUnitWord}), optional`} {...text('finish.rvkUm', form.finish.rvk, (v) => update({ finish: { ...form.finish, rvk: v } }))} />
                <NumberInput label="Mr1 (%), optional" {...text('finish.mr1', form.finish.mr1, (v) => update({ finish: { ...form.finish, mr1: v } }))} />
                <NumberInput label="Mr2 (%), optional" {...text('finish.mr2', form.finish.mr2, (v) => update({ finish: { ...form.finish, mr2: v } }))} />
                <SegmentedControl<FinishUnit>
                  label="Ra, Rk, Rpk and Rvk typed in"
                  options={[
                    { value: 'um', label: 'Typed in µm' },
                    { value: 'uin', label: 'Typed in µin' },
                  ]}
                  value={form.finishUnit}
                  onChange={(finishUnit) => update({ finishUnit })}
                  className="self-start sm:col-span-3"
                />
              </div>
            )}
            {form.finishMode === 'profile' && (
              <div className="flex flex-col gap-3">
                <p className="text-sm text-ink-soft">
                  A CSV or text file of heights in micrometres at equal spacing, one per row (a header row, and a position column before the
                  heights, are fine). The file is read here in your browser; Ra, Rq, Rz and the Rk figures are worked out from it.
                </p>
                <div className="flex flex-col gap-1">
                  <label htmlFor={fieldId('finish.heightsUm')} className="text-sm font-semibold text-ink">
                    Profile trace file
                  </label>
                  <input
                    id={fieldId('finish.heightsUm')}
                    type="file"
                    accept=".csv,.txt,text/csv,text/plain"
                    onChange={(event) => void onTraceFile(event)}
                    aria-invalid={traceError || errors['finish.heightsUm'] ? true : undefined}
                    className="text-sm"
                  />
                  {form.profile && (
                    <p className="text-sm text-ink-soft" data-testid="trace-summary">
                      {profilePoints
                        ? `${profilePoints.toLocaleString('en-US')} heights from ${form.profile.fileName}.`
                        : `${form.profile.fileName} was too long to keep in the draft: choose the file again.`}
                    </p>
                  )}
                  {(traceError || errors['finish.heightsUm']) && <p className="text-sm font-semibold text-fail">{traceError ?? errors['finish.heightsUm']}</p>}
                </div>
                <NumberInput label="Sample spacing (µm)" {...text('finish.spacingUm', form.profileSpacing, (v) => update({ profileSpacing: v }))} />
                <SelectField
                  id={fieldId('finish.filter.cutoffMm')}
                  label="Filter"
                  value={form.profileFilter}
                  onChange={(event) => update({ profileFilter: event.target.value })}
                  options={PROFILE_FILTER_CHOICES.map((choice) => ({
                    value: choice,
                    label: choice === 'none' ? 'None: the trace is a roughness profile already' : `Gaussian, cut-off ${choice} mm`,
                  }))}
                  error={errors['finish.filter.cutoffMm']}
                  hint="The Gaussian filter removes the form by a least-squares line, drops half a cut-off at each end and evaluates whole cut-offs."
                />
              </div>
            )}
          </Section>

          <Section title="Crosshatch (optional)">
            <SegmentedControl<CrosshatchMode>
              label="Crosshatch"
              options={[
                { value: 'none', label: 'Not measured' },
                { value: 'measured', label: 'Measured angle' },
                { value: 'settings', label: 'From hone settings' },
              ]}
              value={form.crosshatchMode}
              onChange={(crosshatchMode) => update({ crosshatchMode })}
              className="self-start"
            />
            {form.crosshatchMode === 'measured' && (
              <NumberInput label="Included angle (°)" {...text('crosshatch.includedAngleDeg', form.crosshatch.angle, (v) => update({ crosshatch: { ...form.crosshatch, angle: v } }))} />
            )}
            {form.crosshatchMode === 'settings' && (
              <>
                <p className="text-sm text-ink-soft">
                  The angle is computed from settings (mid-stroke), not measured: from the spindle and stroke speeds at the middle of the stroke, with the
                  mean bore of the readings. Count full up-and-down cycles: one stroke up and one down is one cycle (counting single strokes gives about
                  double the angle). The record stores it as computed from settings.
                </p>
                <div className="grid gap-3 sm:grid-cols-3">
                  <NumberInput label="Spindle speed (rev/min)" {...text('crosshatch.spindleRpm', form.crosshatch.spindleRpm, (v) => update({ crosshatch: { ...form.crosshatch, spindleRpm: v } }))} />
                  <NumberInput label={`Stroke length (${unitShort})`} {...text('crosshatch.strokeLength', form.crosshatch.strokeLength, (v) => update({ crosshatch: { ...form.crosshatch, strokeLength: v } }))} />
                  <NumberInput
                    label="Full up-and-down cycles per minute"
                    {...text('crosshatch.cyclesPerMinute', form.crosshatch.cyclesPerMinute, (v) => update({ crosshatch: { ...form.crosshatch, cyclesPerMinute: v } }))}
                  />
                </div>
              </>
            )}
          </Section>

          <OrderedSections ctx={sectionCtx} except={['clean', 'crackTest']} />
        </div>

        <Section title="Sign-off">
          <TextField
            id={fieldId('signedOffBy')}
            label="Signed off by (your name)"
            autoComplete="name"
            value={form.signedOffBy}
            onChange={(event) => update({ signedOffBy: event.target.value })}
            error={errors.signedOffBy}
          />
          <TextAreaField
            id={fieldId('notes')}
            label="Notes for the builder (optional)"
            rows={3}
            value={form.notes}
            onChange={(event) => update({ notes: event.target.value })}
            error={errors.notes}
          />
        </Section>

        {problems.length > 0 && (
          <Notice tone="error" title={problems.length === 1 ? 'One field needs attention' : `${problems.length} fields need attention`}>
            {listInWords(problems.slice(0, 5).map(pathWords))}
            {problems.length > 5 ? ` and ${problems.length - 5} more` : ''}.
          </Notice>
        )}
        {formError && <Notice tone="error">{formError}</Notice>}
        <div className="flex flex-wrap items-center gap-4">
          <Button type="submit" busy={submit.isPending} disabled={crackFound}>
            Submit the record
          </Button>
          <DraftStatusLine status={draft.status} />
        </div>
      </form>

      <aside aria-label="Results as you type" className="flex min-w-0 flex-col gap-3 rounded-lg bg-slate-50 p-4 ring-1 ring-slate-200 xl:sticky xl:top-4">
        <h2 className="text-sm font-bold uppercase tracking-wider text-slate-700">Results as you type</h2>
        {live.error && <Notice tone="error">{live.error}</Notice>}
        <InspectionResultsView
          results={live.results}
          cylinderIndexes={live.cylinderIndexes}
          cylinderCount={count}
          spec={job.spec}
          unit={form.unit}
          complete={live.complete}
          headingLevel={3}
        />
      </aside>
    </div>
  );
}

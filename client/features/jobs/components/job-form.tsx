import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Controller, get, useForm, useWatch, type FieldErrors, type Path, type Resolver, type UseFormRegisterReturn } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { type LengthUnit, convertLength } from '@shared/calc';
import { sizeDisagreement } from '@shared/calc/bore-spec';
import { operationCodes, partsOfJob } from '@shared/catalogue';
import { limitGroups } from '@shared/operation-limits';
import type { JobFormValues, JobInput } from '@shared/schemas/jobs';
import { blockMaterials, engineLayouts, logisticsOptions, pistonTypes } from '@shared/schemas/values';
import { UnsavedChangesGuard } from '@client/components/unsaved-changes-guard';
import { FieldError } from '@client/components/ui/field-frame';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { SegmentedControl } from '@client/components/ui/segmented-control';
import { SelectField } from '@client/components/ui/select-field';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { cn } from '@client/lib/cn';
import { formatDateTime, todayIso } from '@client/lib/dates';
import { applyServerErrors } from '@client/lib/form-errors';
import { JobFiguresPanel } from './job-figures';
import { JobFormSummary } from './lazy-panels';
import { forgetKeptForm, readKeptForm, writeKeptForm, type KeptJobForm } from './job-form-keeper';
import { SUMMARY_STEP, errorPaths, jobFormSteps, stepOfPath } from './job-form-steps';
import { convertLimit, jobScope, keepInScope, limitEntries, limitPaths } from './job-scope';
import { layoutWords, logisticsWords, materialWords, pistonWords } from './job-words';
import { OperationLimitsFields } from './operation-limits-fields';
import { OperationsPicker } from './operations-picker';
import { PartsSentChoice } from './parts-sent-choice';
import { lazyResolver } from '@client/lib/lazy-resolver';

const jobInputResolver = lazyResolver(() => import('@shared/schemas/jobs').then((m) => m.jobInputSchema));

/** Fields holding a length in the job's unit: converted in place when the unit changes. */
const LENGTH_FIELDS = ['stockBore', 'stroke', 'targetBore', 'boreSizeTolerance', 'pistonDiameter', 'clearanceMin', 'clearanceMax', 'maxTaper', 'maxOutOfRound', 'deckFlatnessMax'] as const;

/** The form's top-level fields: those of its steps (tests/unit/job-form-steps.test.ts holds them to the shared schema's). */
const TOP_FIELDS = jobFormSteps.flatMap((step) => step.fields) as Array<keyof JobFormValues>;

/**
 * Every field the server may name in a 400, for putting its messages beside
 * the inputs: the top-level fields, each limit ("limits.lineHone.housingMax")
 * and each operation's code and quantity ("operations.0.code").
 */
const FIELD_NAMES = [
  ...TOP_FIELDS,
  ...limitPaths,
  ...operationCodes.flatMap((_, index) => [`operations.${index}.code`, `operations.${index}.quantity`]),
] as Array<Path<JobFormValues>>;

/** The shared schema, checking only what the form shows for the parts and work chosen (see keepInScope). */
const schemaResolver = jobInputResolver;
const resolver: Resolver<JobFormValues, unknown, JobInput> = (values, context, options) => schemaResolver(keepInScope(values), context, options);

const INVALID = 'invalid';

const unitOptions = [
  { value: 'in', label: 'Inches' },
  { value: 'mm', label: 'Millimetres' },
] as const;

/**
 * The typed text as the schema wants it: nothing typed is "not given"
 * (undefined), anything that is not a plain decimal is NaN, which the schema
 * answers with its "must be a number" message. The input keeps the text.
 */
function typedNumber(text: unknown): number | undefined {
  if (typeof text === 'number') return text;
  const trimmed = String(text ?? '').trim();
  if (trimmed === '') return undefined;
  return /^[-+]?(?:\d+\.?\d*|\.\d+)$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

const emptyToUndefined = (value: unknown) => (value === '' || value === null ? undefined : value);

/**
 * When a target bore and the piston with its clearance range call for
 * different sizes, say so and which one the shop will work to (the target).
 */
function SizeDisagreementNotice({ values, unit }: { values: { targetBore?: unknown; pistonDiameter?: unknown; clearanceMin?: unknown; clearanceMax?: unknown }; unit: LengthUnit }) {
  const finite = (value: unknown) => (typeof value === 'number' && Number.isFinite(value) ? value : undefined);
  const clash = sizeDisagreement({
    targetBore: finite(values.targetBore),
    pistonDiameter: finite(values.pistonDiameter),
    clearanceMin: finite(values.clearanceMin),
    clearanceMax: finite(values.clearanceMax),
  });
  if (!clash) return null;
  const d = unit === 'in' ? 4 : 3;
  return (
    <Notice tone="caution" title="The target bore and the piston disagree">
      <span data-testid="size-disagreement">
        The piston with its clearance range calls for a bore of {clash.fromPistonMin.toFixed(d)}–{clash.fromPistonMax.toFixed(d)} {unit}, but the target bore is{' '}
        {clash.target.toFixed(d)} {unit}. The shop will work to the target bore, {clash.target.toFixed(d)} {unit}; the clearance is still judged against your range.
      </span>
    </Notice>
  );
}

/** A converted length written back into its input without floating-point noise. */
const tidy = (value: number) => Number(value.toPrecision(12));

const blankJob: Partial<JobFormValues> = {
  unit: 'in',
  parts: ['block'],
  operations: [],
  deckNotes: '',
  notes: '',
  title: '',
  engineFamily: '',
  country: '',
  region: '',
  city: '',
  postalCode: '',
  neededBy: '',
};

function FormSection({ title, intro, children, className }: { title: string; intro?: ReactNode; children: ReactNode; className?: string }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className={cn('rounded-card bg-paper-raised p-5 shadow-card ring-1 ring-slate-100 sm:p-6', className)}>
      <h3 id={id} className="text-xl font-bold tracking-tight text-ink">
        {title}
      </h3>
      {intro && <div className="mt-1 text-ink-soft">{intro}</div>}
      <div className="mt-4 flex flex-col gap-4">{children}</div>
    </section>
  );
}

function Grid({ children, columns = 2 }: { children: ReactNode; columns?: 2 | 3 }) {
  return <div className={cn('grid grid-cols-1 gap-4 sm:grid-cols-2', columns === 3 && 'lg:grid-cols-3')}>{children}</div>;
}

/** Radio buttons for a short choice, with one message for the group. */
function ChoiceGroup({
  legend,
  options,
  error,
  registration,
}: {
  legend: string;
  options: Array<{ value: string; label: string }>;
  error?: string;
  registration: UseFormRegisterReturn;
}) {
  const id = useId();
  return (
    <fieldset className="flex flex-col gap-2" aria-describedby={error ? `${id}-error` : undefined}>
      <legend className="mb-1 text-sm font-semibold text-ink">{legend}</legend>
      <div className="flex flex-wrap gap-3">
        {options.map((option) => (
          <label
            key={option.value}
            className={cn(
              'flex min-h-11 cursor-pointer items-center gap-2 rounded-lg bg-white px-3 py-2 ring-1 has-[:checked]:ring-2 has-[:checked]:ring-slate-700',
              error ? 'ring-fail' : 'ring-slate-300',
            )}
          >
            <input
              type="radio"
              value={option.value}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${id}-error` : undefined}
              className="size-4 accent-slate-700"
              {...registration}
            />
            <span className="text-base text-ink">{option.label}</span>
          </label>
        ))}
      </div>
      <FieldError id={`${id}-error`} error={error} />
    </fieldset>
  );
}

export interface JobFormProps {
  /** The saved spec when editing; a blank form otherwise. */
  initial?: JobInput;
  submitLabel: string;
  /** Saves the parsed spec (`publish` when the publish button was pressed); a rejected ApiError puts its field messages beside the inputs. */
  onSave: (input: JobInput, how: { publish: boolean }) => Promise<unknown>;
  /** A second button on the summary that saves and publishes; none without it. */
  publishLabel?: string;
  /** Where "Cancel" goes. */
  cancelTo: string;
  /** Words beside the save button (what saving does). */
  saveNote?: ReactNode;
  /** Where what is typed is kept on this device until it is saved (`keptFormKey`); nothing is kept without one. */
  keepKey?: string;
}

/** How long typing pauses before the form is kept on this device. */
const KEEP_AFTER_MS = 600;

/**
 * The job's spec in steps, grouped the way a builder thinks about a block,
 * checked with the shared schema as it is sent (Next checks the step's own
 * fields), with live figures from the shared calculation library beside it
 * and a summary to check before saving. What is typed is kept on this device
 * as it is typed (see job-form-keeper.ts) and leaving with unsaved changes
 * asks first.
 */
export function JobForm({ initial, submitLabel, onSave, cancelTo, saveNote, keepKey, publishLabel }: JobFormProps) {
  /** A server refusal's message, or 'invalid' while the form's own checks fail. */
  const [formError, setFormError] = useState<string>();
  const defaults = (initial ? { ...initial, parts: [...partsOfJob(initial)] } : blankJob) as JobFormValues;
  const form = useForm<JobFormValues, unknown, JobInput>({
    resolver,
    // A job posted before parts were named sent a block: the form says so.
    defaultValues: defaults,
    // The field may be on another step: showFirstError opens it, then focuses the field.
    shouldFocusError: false,
  });
  const { errors, isSubmitting } = form.formState;
  const values = useWatch({ control: form.control });
  const unit: LengthUnit = values.unit === 'mm' ? 'mm' : 'in';
  const scope = jobScope({ parts: values.parts?.filter((part): part is NonNullable<typeof part> => Boolean(part)) ?? [], operations: values.operations });

  const [step, setStep] = useState(0);
  /** What to focus once a step shows: its heading, or the first field with a message. */
  const [focusNext, setFocusNext] = useState<{ to: 'heading' } | { to: 'field'; path: string }>();
  const stepHeading = useRef<HTMLHeadingElement>(null);
  /** A kept form found on opening, offered back until the person answers. */
  const [offer, setOffer] = useState<KeptJobForm | undefined>(() => (keepKey ? readKeptForm(keepKey) : undefined));
  /** Changed since it was opened or last saved: leaving asks first. */
  const [changed, setChanged] = useState(false);
  const keep = useRef<{ timer?: ReturnType<typeof setTimeout>; flush?: () => void }>({});
  /** Which summary button sent the form. */
  const publishing = useRef(false);
  const stepRef = useRef(step);
  stepRef.current = step;
  const keeping = Boolean(keepKey) && !offer;

  // Keep what is typed (debounced), and again on leaving the page or the tab.
  useEffect(() => {
    if (!keepKey || !keeping) return;
    const pending = keep.current;
    const flush = () => {
      clearTimeout(pending.timer);
      pending.timer = undefined;
      pending.flush = undefined;
      writeKeptForm(keepKey, form.getValues(), stepRef.current);
    };
    const sub = form.watch((_, { name }) => {
      if (!name) return;
      setChanged(true);
      // A message from Next stays in step with what is typed.
      const head = name.split('.')[0] as keyof JobFormValues;
      if (form.getFieldState(head).error && !form.formState.isSubmitted) void form.trigger(head);
      clearTimeout(pending.timer);
      pending.flush = flush;
      pending.timer = setTimeout(flush, KEEP_AFTER_MS);
    });
    const onHide = () => pending.flush?.();
    window.addEventListener('pagehide', onHide);
    return () => {
      sub.unsubscribe();
      window.removeEventListener('pagehide', onHide);
      pending.flush?.();
    };
  }, [form, keepKey, keeping]);

  // The step is kept with the values once something was changed.
  useEffect(() => {
    if (keepKey && keeping && changed) writeKeptForm(keepKey, form.getValues(), step);
  }, [form, keepKey, keeping, changed, step]);

  useEffect(() => {
    if (!focusNext) return;
    setFocusNext(undefined);
    if (focusNext.to === 'field') {
      try {
        form.setFocus(focusNext.path as Path<JobFormValues>);
        if (document.activeElement && document.activeElement !== document.body) return;
      } catch {
        // A field without a focusable element (a group): the heading instead.
      }
    }
    stepHeading.current?.focus();
  }, [focusNext, form, step]);

  const goTo = (next: number, focus: 'heading' | { path: string } = 'heading') => {
    setStep(next);
    setFocusNext(focus === 'heading' ? { to: 'heading' } : { to: 'field', path: focus.path });
  };

  const continueKept = () => {
    if (!offer) return;
    form.reset({ ...defaults, ...offer.values } as JobFormValues, { keepDefaultValues: true });
    setOffer(undefined);
    setChanged(true);
    goTo(Math.min(Math.max(0, offer.step), SUMMARY_STEP));
  };
  const startFresh = () => {
    if (keepKey) forgetKeptForm(keepKey);
    setOffer(undefined);
  };

  const number = (name: Path<JobFormValues>) => form.register(name, { setValueAs: typedNumber });
  const choice = (name: Path<JobFormValues>) => form.register(name, { setValueAs: emptyToUndefined });
  const message = (name: keyof JobFormValues) => (errors as FieldErrors<Record<string, unknown>>)[name]?.message as string | undefined;
  const nestedMessage = (path: string) => (get(errors, path) as { message?: string } | undefined)?.message;

  const changeUnit = (next: LengthUnit) => {
    if (next === unit) return;
    for (const field of LENGTH_FIELDS) {
      const value = form.getValues(field);
      if (typeof value === 'number' && Number.isFinite(value)) {
        form.setValue(field, tidy(convertLength(value, unit, next)), { shouldDirty: true });
      }
    }
    for (const group of limitGroups) {
      for (const [key, limit] of limitEntries(group)) {
        const path = `limits.${group}.${key}` as Path<JobFormValues>;
        const value = form.getValues(path);
        if (typeof value === 'number' && Number.isFinite(value) && (limit.kind === 'length' || limit.kind === 'force')) {
          form.setValue(path, tidy(convertLimit(value, limit.kind, unit, next)), { shouldDirty: true });
        }
      }
    }
    form.setValue('unit', next, { shouldDirty: true });
  };

  /** Opens the earliest step holding a message, at its first field (read live: formState is the last render's). */
  const showFirstError = () => {
    const live = Object.fromEntries(TOP_FIELDS.flatMap((name) => (form.getFieldState(name).error ? [[name, form.getFieldState(name).error]] : [])));
    const paths = errorPaths(live);
    if (paths.length === 0) return;
    const first = paths.reduce((best, path) => (stepOfPath(path) < stepOfPath(best) ? path : best));
    goTo(stepOfPath(first), { path: first });
  };

  /** Next: the full schema runs, and only this step's fields take its messages. */
  const next = async () => {
    setFormError(undefined);
    const fields = jobFormSteps[step]?.fields ?? [];
    const fine = fields.length === 0 || (await form.trigger(fields as Array<Path<JobFormValues>>));
    if (fine) {
      goTo(Math.min(step + 1, SUMMARY_STEP));
      return;
    }
    setFormError(INVALID);
    showFirstError();
  };

  const onSubmit = form.handleSubmit(
    async (input) => {
      setFormError(undefined);
      // Saving navigates away: nothing is left unsaved by then, and no kept copy is written after it (the page unmounts later).
      setChanged(false);
      clearTimeout(keep.current.timer);
      keep.current.flush = undefined;
      try {
        await onSave(input, { publish: publishing.current });
        if (keepKey) forgetKeptForm(keepKey);
      } catch (error) {
        setChanged(true);
        setFormError(applyServerErrors(error, form.setError, FIELD_NAMES));
        showFirstError();
      }
    },
    () => {
      setFormError(INVALID);
      showFirstError();
    },
  );

  const operationErrors = errors.operations as
    | (FieldErrors<{ quantity: number; code: string }>[] & { message?: string; root?: { message?: string } })
    | undefined;
  const quantityErrors: Record<string, string | undefined> = {};
  (values.operations ?? []).forEach((op, index) => {
    const entry = operationErrors?.[index];
    if (op?.code && entry) quantityErrors[op.code] = (entry.quantity?.message ?? entry.code?.message) as string | undefined;
  });
  const lengthLabel = (words: string, optional = false) => `${words} (${unit})${optional ? ', optional' : ''}`;
  const numberProps = { inputMode: 'decimal' as const, autoComplete: 'off', spellCheck: false };
  const onSummary = step === SUMMARY_STEP;

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Job details" className="flex flex-col gap-6">
      <UnsavedChangesGuard
        when={changed && !isSubmitting}
        description={
          keepKey
            ? 'What you typed is kept on this device and offered back when you return to this form, but it is not saved to your account yet.'
            : 'What you changed here is not saved yet.'
        }
      />
      {offer && (
        <Notice tone="info" title={initial ? 'You have changes here that were not saved' : 'You started a job here before'}>
          <p>
            {initial ? 'Changes' : offer.values.title ? `“${offer.values.title}”` : 'A job without a title yet'} kept on this device on{' '}
            {formatDateTime(offer.keptAt)}.
          </p>
          <div className="mt-3 flex flex-wrap gap-3">
            <Button onClick={continueKept}>{initial ? 'Continue with my changes' : 'Continue that job'}</Button>
            <Button variant="secondary" onClick={startFresh}>
              {initial ? 'Discard them' : 'Start fresh'}
            </Button>
          </div>
        </Notice>
      )}
      <nav aria-label="Steps of the job form">
        <ol className="flex flex-wrap gap-2">
          {jobFormSteps.map((each, index) => (
            <li key={each.title}>
              <button
                type="button"
                onClick={() => goTo(index)}
                aria-current={index === step ? 'step' : undefined}
                className={cn(
                  'min-h-11 rounded-lg px-3 py-2 text-sm font-semibold ring-1 ring-inset',
                  index === step ? 'bg-slate-700 text-white ring-slate-700' : 'bg-paper-raised text-slate-800 ring-slate-300 hover:bg-slate-50',
                )}
              >
                <span className="tabular-nums">{index + 1}.</span> {each.title}
              </button>
            </li>
          ))}
        </ol>
      </nav>
      {formError && (formError !== INVALID || Object.keys(errors).length > 0) && (
        <Notice tone="error">{formError === INVALID ? 'Some values need another look. Each one is marked with what to change.' : formError}</Notice>
      )}
      <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,1fr)_21rem]">
        <div className="flex flex-col gap-6">
          <h2 ref={stepHeading} tabIndex={-1} className="text-2xl font-bold tracking-tight text-ink focus:outline-none">
            Step {step + 1} of {jobFormSteps.length}: {jobFormSteps[step]?.title}
          </h2>
          <div hidden={step !== 0} className="flex flex-col gap-6">
            <FormSection title="The engine and what you send">
              <TextField
                label="Job title"
                hint="One line shops read on the board, e.g. “Bore and hone an iron V8 block”."
                error={message('title')}
                {...form.register('title')}
              />
              <TextField
                label="Engine"
                hint="Family and era in your own words, e.g. “small-block V8, 1970s”."
                error={message('engineFamily')}
                {...form.register('engineFamily')}
              />
              <Grid>
                <SelectField
                  label="Layout"
                  options={[{ value: '', label: 'Choose…' }, ...engineLayouts.map((v) => ({ value: v, label: layoutWords[v] }))]}
                  error={message('layout')}
                  {...choice('layout')}
                />
                <TextField label="Cylinders" inputMode="numeric" autoComplete="off" error={message('cylinders')} {...number('cylinders')} />
              </Grid>
              <Controller
                control={form.control}
                name="parts"
                render={({ field }) => (
                  <PartsSentChoice value={field.value ?? []} onChange={field.onChange} error={nestedMessage('parts')} focusRef={field.ref} />
                )}
              />
              {scope.needsMaterial && (
                <ChoiceGroup
                  legend={scope.materialLabel}
                  options={blockMaterials.map((v) => ({ value: v, label: materialWords[v] }))}
                  error={message('blockMaterial')}
                  registration={choice('blockMaterial')}
                />
              )}
            </FormSection>

            <FormSection
              title="Work wanted"
              intro="Tick the work you want done; what you send decides which work you can choose. Quantities start from the cylinder count; change them if you need to."
            >
              <Controller
                control={form.control}
                name="operations"
                render={({ field }) => (
                  <OperationsPicker
                    value={field.value ?? []}
                    onChange={field.onChange}
                    cylinders={values.cylinders}
                    parts={scope.parts}
                    error={operationErrors?.message ?? operationErrors?.root?.message}
                    quantityErrors={quantityErrors}
                    focusRef={field.ref}
                  />
                )}
              />
            </FormSection>

          </div>
          <div hidden={step !== 1} className="flex flex-col gap-6">
            <FormSection title="Measuring">
              <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
                <span className="text-sm font-semibold text-ink" aria-hidden>
                  Lengths in
                </span>
                <SegmentedControl label="Length unit" options={unitOptions} value={unit} onChange={changeUnit} />
                <span className="text-sm text-ink-soft">Switching converts what you have typed (1 in = 25.4 mm; spring pressures 1 lbf = 4.448 N).</span>
              </div>
              <SelectField
                label="How the shop’s readings are judged"
                className="sm:max-w-md"
                hint="Guarded acceptance (ISO 14253-1): a reading conforms only inside its limit by the measurement uncertainty, fails only outside it by more, and in between is “not proven”. Simple acceptance: within the limit conforms."
                options={[
                  { value: '', label: 'Simple acceptance (the default)' },
                  { value: 'guarded', label: 'Guarded acceptance (ISO 14253-1)' },
                ]}
                error={message('decisionRule')}
                {...choice('decisionRule')}
              />
            </FormSection>

            {scope.boreWork && (
              <FormSection
                title="Bores: sizes and clearance"
                intro="Give a target bore, or the measured piston diameter with the clearance range its maker gives. Both is fine too."
              >
                <Grid>
                  <TextField label={lengthLabel('Stock bore')} hint="The engine’s original bore." error={message('stockBore')} {...numberProps} {...number('stockBore')} />
                  <TextField label={lengthLabel('Stroke')} error={message('stroke')} {...numberProps} {...number('stroke')} />
                  <TextField
                    label={lengthLabel('Target bore', true)}
                    hint="The finished size you want, if you know it."
                    error={message('targetBore')}
                    {...numberProps}
                    {...number('targetBore')}
                  />
                  <TextField
                    label={lengthLabel('Finished-size tolerance ±', true)}
                    hint={`Allowed on every bore reading around the finished size. Left empty: ± ${unit === 'in' ? '0.0005 in' : '0.0127 mm'}, common practice (no published source).`}
                    placeholder={unit === 'in' ? '0.0005' : '0.0127'}
                    error={message('boreSizeTolerance')}
                    {...numberProps}
                    {...number('boreSizeTolerance')}
                  />
                  <TextField
                    label={lengthLabel('Piston diameter', true)}
                    hint="Measured at the gauge point, 90° to the pin."
                    error={message('pistonDiameter')}
                    {...numberProps}
                    {...number('pistonDiameter')}
                  />
                  <TextField label={lengthLabel('Smallest clearance', true)} hint="Piston to wall." error={message('clearanceMin')} {...numberProps} {...number('clearanceMin')} />
                  <TextField label={lengthLabel('Largest clearance', true)} error={message('clearanceMax')} {...numberProps} {...number('clearanceMax')} />
                </Grid>
                <SizeDisagreementNotice values={values} unit={unit} />
                <SelectField
                  label="Piston type"
                  className="sm:max-w-xs"
                  options={[{ value: '', label: 'Choose…' }, ...pistonTypes.map((v) => ({ value: v, label: pistonWords[v] }))]}
                  error={message('pistonType')}
                  {...choice('pistonType')}
                />
              </FormSection>
            )}

            {scope.boreWork && (
              <FormSection
                title="Bores: finish and geometry limits"
                intro="All optional. Leave a box empty when the shop’s usual practice will do. Finishes in micrometres (1 µm ≈ 39.4 µin)."
              >
                <Grid>
                  <TextField label="Smallest crosshatch included angle (°), optional" error={message('crosshatchMinDeg')} {...numberProps} {...number('crosshatchMinDeg')} />
                  <TextField label="Largest crosshatch included angle (°), optional" error={message('crosshatchMaxDeg')} {...numberProps} {...number('crosshatchMaxDeg')} />
                  <TextField label="Largest bore Ra (µm), optional" error={message('finishRaMaxUm')} {...numberProps} {...number('finishRaMaxUm')} />
                  <TextField label="Largest Rk (µm), optional" error={message('finishRkMaxUm')} {...numberProps} {...number('finishRkMaxUm')} />
                  <TextField label="Largest Rpk (µm), optional" error={message('finishRpkMaxUm')} {...numberProps} {...number('finishRpkMaxUm')} />
                  <TextField label="Largest Rvk (µm), optional" error={message('finishRvkMaxUm')} {...numberProps} {...number('finishRvkMaxUm')} />
                  <TextField label={lengthLabel('Maximum taper', true)} error={message('maxTaper')} {...numberProps} {...number('maxTaper')} />
                  <TextField label={lengthLabel('Maximum out-of-round', true)} error={message('maxOutOfRound')} {...numberProps} {...number('maxOutOfRound')} />
                </Grid>
              </FormSection>
            )}

            {scope.deckWork && (
              <FormSection title="Deck">
                <Grid>
                  <TextField
                    label={lengthLabel('Deck out-of-flat limit', true)}
                    hint="0 means no feeler leaf may pass under the straightedge anywhere. Leave it empty for the common-practice figure for the block and a multi-layer steel gasket."
                    error={message('deckFlatnessMax')}
                    {...numberProps}
                    {...number('deckFlatnessMax')}
                  />
                  <TextField label="Largest deck Ra (µm), optional" error={message('deckRaMaxUm')} {...numberProps} {...number('deckRaMaxUm')} />
                </Grid>
                <TextAreaField
                  label="Deck notes, optional"
                  rows={3}
                  hint="Head gasket type, or anything else the deck needs."
                  error={message('deckNotes')}
                  {...form.register('deckNotes')}
                />
              </FormSection>
            )}

            {scope.limitGroups.length > 0 && (
              <FormSection
                title="Limits for the work"
                intro="Leave a box empty and the figure shown under it applies, where there is one; the shop measures and the record is judged against these."
              >
                <OperationLimitsFields
                  groups={scope.limitGroups}
                  unit={unit}
                  register={(path) => number(path as Path<JobFormValues>)}
                  errorFor={nestedMessage}
                />
              </FormSection>
            )}

          </div>
          <div hidden={step !== 2} className="flex flex-col gap-6">
            <FormSection title="Getting the parts there" intro="Shops see your town and region, never your address.">
              <ChoiceGroup
                legend="How the parts get to the shop"
                options={logisticsOptions.map((v) => ({ value: v, label: logisticsWords[v] }))}
                error={message('logistics')}
                registration={choice('logistics')}
              />
              <Grid columns={3}>
                <TextField label="Country" autoComplete="country-name" error={message('country')} {...form.register('country')} />
                <TextField label="State, province or county" autoComplete="address-level1" error={message('region')} {...form.register('region')} />
                <TextField label="Town or city" autoComplete="address-level2" error={message('city')} {...form.register('city')} />
                <TextField
                  label="Postal code (optional)"
                  autoComplete="postal-code"
                  hint="Shops see how far away the parts are, never the code."
                  error={message('postalCode')}
                  {...form.register('postalCode')}
                />
              </Grid>
            </FormSection>

            <FormSection title="Needed by">
              <TextField
                label="Date you need the parts back"
                type="date"
                min={todayIso()}
                className="sm:max-w-xs"
                hint="Shops quote their turnaround against this."
                error={message('neededBy')}
                {...form.register('neededBy')}
              />
            </FormSection>

          </div>
          <div hidden={step !== 3} className="flex flex-col gap-6">
            <FormSection title="Notes">
              <TextAreaField
                label="Anything else the shop should know, optional"
                rows={5}
                hint="Known damage, previous machining, parts you will send along."
                error={message('notes')}
                {...form.register('notes')}
              />
            </FormSection>
            <FormSection title="Photos">
              <p className="text-ink-soft">Photos are added on the job’s page once it is saved as a draft. Shops bid more surely with photos of the parts.</p>
            </FormSection>
          </div>
          {onSummary && (
            <FormSection title="Check what shops will see" intro="Edit any part before saving. Saving keeps it as a draft that only you see until you publish it.">
              <JobFormSummary values={values as Partial<JobFormValues>} onEdit={(index) => goTo(index)} />
            </FormSection>
          )}
          <div className="flex flex-wrap items-center gap-3 rounded-card bg-paper-raised p-4 shadow-card ring-1 ring-slate-100">
            {step > 0 && (
              <Button variant="secondary" onClick={() => goTo(step - 1)}>
                Back
              </Button>
            )}
            {onSummary ? (
              <>
                <Button type="submit" busy={isSubmitting && !publishing.current} disabled={isSubmitting} onClick={() => (publishing.current = false)}>
                  {submitLabel}
                </Button>
                {publishLabel && (
                  <Button type="submit" variant="secondary" busy={isSubmitting && publishing.current} disabled={isSubmitting} onClick={() => (publishing.current = true)}>
                    {publishLabel}
                  </Button>
                )}
              </>
            ) : (
              <Button onClick={() => void next()}>Next</Button>
            )}
            <Link to={cancelTo} className="rounded-md px-3 py-2 font-semibold text-slate-700 underline underline-offset-4 hover:bg-slate-50">
              Cancel
            </Link>
            {onSummary && saveNote && <p className="text-sm text-ink-soft">{saveNote}</p>}
          </div>
        </div>

        <aside aria-label="Live figures" className="lg:sticky lg:top-4">
          <JobFiguresPanel
            input={{
              unit,
              cylinders: values.cylinders,
              stockBore: values.stockBore,
              stroke: values.stroke,
              targetBore: values.targetBore,
              pistonDiameter: values.pistonDiameter,
              clearanceMin: values.clearanceMin,
              clearanceMax: values.clearanceMax,
              operations: values.operations ?? [],
              limits: values.limits,
            }}
          />
        </aside>

      </div>
    </form>
  );
}

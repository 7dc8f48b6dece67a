import { useMemo, type ReactNode } from 'react';
import { type BoreSize, type LengthUnit, type OversizeChoice, OVERSIZE_STEPS, boreSize, chooseOversize, convertLength } from '@shared/calc';
import { type BoreSizeRequest, boreSizeRequestSchema } from '@shared/schemas/calculations';
import { LENGTH_DECIMALS, formatLength, formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { oversizeSchema } from '../lib/form-schemas';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, NumberField } from './calculator-parts';

/**
 * Honing allowance left after boring, on the diameter: 0.002–0.003 in
 * (0.05–0.08 mm), common practice (no published source). The form starts at
 * the middle of that range and says so.
 */
const HONE_ALLOWANCE_IN = { low: 0.002, high: 0.003, start: '0.0025' };

const initial = {
  pistonDiameter: '',
  clearanceMin: '',
  clearanceMax: '',
  honeAllowance: HONE_ALLOWANCE_IN.start,
  standardBore: '',
  largestReading: '',
  minCleanup: '',
};
const kindOf = (): FieldKind => 'length';
const labels: Record<string, string> = {
  pistonDiameter: 'the piston diameter',
  clearanceMin: 'the least clearance',
  clearanceMax: 'the most clearance',
  honeAllowance: 'the hone allowance',
  standardBore: 'the standard bore',
  largestReading: 'the largest reading',
  minCleanup: 'the clean-up',
};

const computeSize = (data: BoreSizeRequest): BoreSize => boreSize(data);
const computeOversize = (data: { unit: LengthUnit; standardBore: number; largestReading: number; minCleanup: number }): OversizeChoice => {
  const worst = { thrust: data.largestReading, axial: data.largestReading };
  return chooseOversize({
    unit: data.unit,
    standardBore: data.standardBore,
    minCleanup: data.minCleanup,
    cylinders: [{ top: worst, middle: worst, bottom: worst }],
  });
};

function stepText(step: number, unit: LengthUnit) {
  return `+${formatNumber(step, unit === 'in' ? 3 : 2)} ${unit}`;
}

export function BoreSizeCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const sizeInput = useMemo(
    () => ({
      unit,
      pistonDiameter: toNumber(values.pistonDiameter),
      clearanceMin: toNumber(values.clearanceMin),
      clearanceMax: toNumber(values.clearanceMax),
      honeAllowance: toNumber(values.honeAllowance),
    }),
    [unit, values],
  );
  const oversizeInput = useMemo(
    () => ({
      unit,
      standardBore: toNumber(values.standardBore),
      largestReading: toNumber(values.largestReading),
      minCleanup: toNumber(values.minCleanup),
    }),
    [unit, values],
  );
  const size = useLiveCalculation(boreSizeRequestSchema, sizeInput, computeSize);
  const oversize = useLiveCalculation(oversizeSchema, oversizeInput, computeOversize);
  const oversizeStarted = [values.standardBore, values.largestReading, values.minCleanup].some((text) => text.trim() !== '');

  const field = (key: keyof typeof initial, label: string, errors: Record<string, string>, hint?: ReactNode) => (
    <NumberField label={`${label} (${unit})`} value={values[key]} onValueChange={(text) => setValue(key, text)} error={errors[key]} hint={hint} />
  );
  const allowance = (inches: number) => formatNumber(convertLength(inches, 'in', unit), LENGTH_DECIMALS[unit]);
  const steps = OVERSIZE_STEPS[unit];

  return (
    <CalculatorLayout
      id="bore-size"
      title="Bore size"
      intro="The finished bore is the measured piston plus the middle of its clearance range. The boring bar stops short of it by the hone allowance; the hone takes out the rest."
      inputs={
        <>
          <FieldGrid>
            {field('pistonDiameter', 'Piston diameter', size.errors, 'Measured at its gauge point, 90° to the pin.')}
            {field(
              'honeAllowance',
              'Hone allowance',
              size.errors,
              <CommonPractice>
                starts at {allowance(0.0025)}; {allowance(HONE_ALLOWANCE_IN.low)}–{allowance(HONE_ALLOWANCE_IN.high)} {unit} is usual.
              </CommonPractice>,
            )}
            {field('clearanceMin', 'Least clearance', size.errors, "From the piston maker's figure.")}
            {field('clearanceMax', 'Most clearance', size.errors)}
          </FieldGrid>
          <fieldset className="rounded-lg border border-slate-200 p-4">
            <legend className="px-1 text-sm font-bold text-ink">Optional: which oversize?</legend>
            <p className="mb-3 text-sm text-ink-soft">
              The smallest oversize step that takes out the worst spot of the worst cylinder, plus a little to clean up. Every cylinder
              is then finished to that one size.
            </p>
            <FieldGrid>
              {field('standardBore', 'Standard bore', oversize.errors)}
              {field('largestReading', 'Largest reading, worst cylinder', oversize.errors)}
              {field('minCleanup', 'Clean-up beyond it', oversize.errors, 'On the diameter.')}
            </FieldGrid>
            <p className="mt-3 text-sm">
              <CommonPractice>
                steps offered: {steps.map((step) => stepText(step, unit)).join(', ')}.
                {unit === 'mm' && ' Millimetre steps are their own series, not conversions of the inch steps.'}
              </CommonPractice>
            </p>
          </fieldset>
        </>
      }
      results={
        <>
          {size.result ? (
            <div className="flex flex-col gap-3" data-testid="bore-size-result">
              <HeadlineFigure label="Finished bore" value={formatLength(size.result.finishedBore, unit)} />
              <FigureList
                items={[
                  { label: 'Bore to, before honing', value: formatLength(size.result.boreTo, unit) },
                  { label: 'Clearance aimed at', value: formatLength(size.result.targetClearance, unit) },
                ]}
              />
            </div>
          ) : (
            <MissingHint missing={size.missing} errors={size.errors} labels={(key) => labels[key] ?? key} formError={size.formError} />
          )}
          {oversizeStarted && (
            <div className="flex flex-col gap-2 border-t border-slate-200 pt-3">
              <h4 className="font-bold">Oversize</h4>
              {oversize.result ? (
                oversize.result.step === null ? (
                  <p className="font-semibold text-fail">
                    No step reaches {formatLength(oversize.result.required, unit)}; the largest is {stepText(steps[steps.length - 1], unit)}.
                    The bore may need a sleeve.
                  </p>
                ) : (
                  <FigureList
                    items={[
                      { label: 'Least size that cleans up', value: formatLength(oversize.result.required, unit) },
                      {
                        label: 'Step to choose',
                        value: oversize.result.step === 0 ? 'Standard' : stepText(oversize.result.step, unit),
                        testId: 'oversize-step',
                      },
                      { label: 'Finish every cylinder at', value: formatLength(oversize.result.finishedBore ?? 0, unit) },
                    ]}
                  />
                )
              ) : (
                <MissingHint missing={oversize.missing} errors={oversize.errors} labels={(key) => labels[key] ?? key} />
              )}
            </div>
          )}
          {(size.result || oversize.result) && <GuidanceNote />}
        </>
      }
    />
  );
}

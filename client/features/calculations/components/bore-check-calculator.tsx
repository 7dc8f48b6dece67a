import { useMemo, type ReactNode } from 'react';
import {
  type BoreInspection,
  type BoreLimit,
  type CylinderReadings,
  type LengthUnit,
  type LimitFailure,
  convertLength,
  inspectBores,
} from '@shared/calc';
import { type BoreInspectionRequest, boreInspectionRequestSchema } from '@shared/schemas/calculations';
import { BoreDepthChart } from '@client/components/bore-readings/bore-depth-chart';
import { BoreReadingGrid } from '@client/components/bore-readings/bore-reading-grid';
import { Button } from '@client/components/ui/button';
import { SelectField } from '@client/components/ui/select-field';
import { DEPTHS, type Depth, cellKey, cellPathWords } from '@client/lib/bore-readings';
import { cn } from '@client/lib/cn';
import { LENGTH_DECIMALS, UNIT_WORDS, formatChange, formatLength, formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorCard, CommonPractice, FieldGrid, GuidanceNote, MissingHint, NumberField, PassMark, ResultsPanel } from './calculator-parts';

export const MAX_GRID_CYLINDERS = 16;
const SPEC_KEYS = ['targetBore', 'targetTolerance', 'clearanceMin', 'clearanceMax', 'maxTaper', 'maxOutOfRound'] as const;
type SpecKey = (typeof SPEC_KEYS)[number];

/**
 * A freshly machined bore holds taper and out-of-round to about 0.0005 in or
 * better; typical piston-to-wall clearance is about 0.0005–0.0015 in for cast
 * pistons and 0.0025–0.0045 in for forged ones. Common practice (no published
 * source); the piston maker's figure governs. Shown as hints, never filled in.
 */
const FRESH_BORE_LIMIT_IN = 0.0005;
const CLEARANCE_HINTS_IN = { cast: [0.0005, 0.0015], forged: [0.0025, 0.0045] } as const;

const initial: Record<string, string> = {
  count: '4',
  chart: '1',
  targetBore: '',
  targetTolerance: '',
  clearanceMin: '',
  clearanceMax: '',
  maxTaper: '',
  maxOutOfRound: '',
};
const kindOf = (key: string): FieldKind => (key === 'count' || key === 'chart' ? 'other' : 'length');

/** The form key of a schema path: cells keep theirs ("cylinders.2.top.thrust"), "spec.maxTaper" → "maxTaper". */
const formKey = (path: string) => path.replace(/^spec\./, '');
const SPEC_WORDS: Record<string, string> = {
  'spec.targetBore': 'the target bore',
  'spec.targetTolerance': 'the tolerance',
  'spec.clearanceMin': 'the least clearance',
  'spec.clearanceMax': 'the most clearance',
  'spec.maxTaper': 'the taper limit',
  'spec.maxOutOfRound': 'the out-of-round limit',
};
const pathWords = (path: string) => cellPathWords(path) ?? SPEC_WORDS[path] ?? path;
function failureText(failure: LimitFailure, unit: LengthUnit): string {
  const L = (value: number) => formatLength(value, unit);
  switch (failure.limit) {
    case 'maxTaper':
      return `Taper ${L(failure.value)} is over the ${L(failure.allowed)} limit.`;
    case 'maxOutOfRound':
      return `Out-of-round ${L(failure.value)} is over the ${L(failure.allowed)} limit.`;
    case 'clearanceMin':
      return `Clearance on the thrust axis ${L(failure.value)} (smallest thrust reading minus piston) is under the ${L(failure.allowed)} minimum.`;
    case 'clearanceMax':
      return `Clearance on the thrust axis ${L(failure.value)} (largest thrust reading minus piston) is over the ${L(failure.allowed)} maximum.`;
    case 'targetBore':
      return `Mean size is ${L(Math.abs(failure.value))} ${failure.value > 0 ? 'over' : 'under'} the target; ± ${L(failure.allowed)} allowed.`;
  }
}

function notCheckedText(limits: BoreLimit[]): string[] {
  const notes: string[] = [];
  if (limits.includes('clearanceMin') || limits.includes('clearanceMax')) notes.push('Clearance not judged: no piston diameter.');
  if (limits.includes('targetBore')) notes.push('Size not judged: enter a tolerance for the target bore.');
  return notes;
}

/** Made-up readings for trying the grid: a +0.030 in rebuild, one cylinder with too much taper. In inches. */
function exampleValues(count: number): Record<string, string> {
  const values: Record<string, string> = {
    targetBore: '4.0300',
    targetTolerance: '0.0005',
    clearanceMin: '0.0025',
    clearanceMax: '0.0035',
    maxTaper: '0.0005',
    maxOutOfRound: '0.0005',
  };
  const wobble = [0, 0.0001, -0.0001, 0.0002, 0, -0.0002, 0.0001, 0];
  for (let i = 0; i < count; i++) {
    const base = 4.03 + wobble[i % wobble.length] / 2;
    const taper = i === 2 ? 0.0009 : 0.0002 + (i % 3) * 0.0001;
    const oval = 0.0001 * ((i + 1) % 3);
    DEPTHS.forEach((depth, d) => {
      const atDepth = base + taper * (1 - d / 2) - taper / 2;
      values[cellKey(i, `${depth}.thrust`)] = (atDepth + oval).toFixed(4);
      values[cellKey(i, `${depth}.axial`)] = atDepth.toFixed(4);
    });
    values[cellKey(i, 'piston')] = '4.0270';
  }
  return values;
}

const computeInspection = (data: BoreInspectionRequest): BoreInspection => inspectBores(data);

export function BoreCheckCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue, setValues } = useUnitForm(unit, initial, kindOf);
  const count = Math.min(MAX_GRID_CYLINDERS, Math.max(1, Number(values.count) || 1));
  const chartIndex = Math.min(count, Math.max(1, Number(values.chart) || 1)) - 1;

  const input = useMemo(() => {
    const cylinders = Array.from({ length: count }, (_, i) => {
      const pair = (depth: Depth) => ({ thrust: toNumber(values[cellKey(i, `${depth}.thrust`)]), axial: toNumber(values[cellKey(i, `${depth}.axial`)]) });
      return { top: pair('top'), middle: pair('middle'), bottom: pair('bottom'), piston: toNumber(values[cellKey(i, 'piston')]) };
    });
    const spec = Object.fromEntries(SPEC_KEYS.map((key) => [key, toNumber(values[key])]));
    const hasSpec = Object.values(spec).some((value) => value !== undefined);
    return { unit, cylinders, spec: hasSpec ? spec : undefined };
  }, [unit, values, count]);

  const { result, errors: schemaErrors, missing, formError } = useLiveCalculation(boreInspectionRequestSchema, input, computeInspection);
  const errors = useMemo(() => Object.fromEntries(Object.entries(schemaErrors).map(([path, message]) => [formKey(path), message])), [schemaErrors]);
  const hasLimits = input.spec !== undefined && SPEC_KEYS.some((key) => key !== 'targetTolerance' && input.spec?.[key] !== undefined);

  const hint = (inches: number) => formatLength(convertLength(inches, 'in', unit), unit);
  const specField = (key: SpecKey, label: string, hintText?: ReactNode) => (
    <NumberField
      label={`${label} (${unit})`}
      value={values[key] ?? ''}
      onValueChange={(text) => setValue(key, text)}
      error={errors[key]}
      hint={hintText}
    />
  );

  const chartReadings: CylinderReadings | undefined = result ? (input.cylinders[chartIndex] as CylinderReadings) : undefined;

  return (
    <CalculatorCard
      id="bore-check"
      title="Bore check"
      intro={
        <>
          Bore gauge readings at the top, middle and bottom of ring travel, in the thrust direction and along the crank (axial). Taper is
          on the diameter: the largest minus the smallest reading over the three depths in one direction, wherever along the bore they
          fall, and the larger of the two directions counts. Out-of-round is the largest thrust–axial difference at one depth (a
          two-point figure on the diameter: for a plain oval, a roundness zone as drawing standards define it is half of this).
        </>
      }
    >
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="flex min-w-0 flex-col gap-3">
          <div className="flex flex-wrap items-end gap-3">
            <SelectField
              label="Cylinders"
              value={String(count)}
              onChange={(event) => setValue('count', event.target.value)}
              options={Array.from({ length: MAX_GRID_CYLINDERS }, (_, i) => ({ value: String(i + 1), label: String(i + 1) }))}
              className="w-28"
            />
            <Button variant="secondary" onClick={() => setValues(exampleValues(count), 'in')}>
              Fill in example readings
            </Button>
            <Button
              variant="quiet"
              onClick={() =>
                setValues(
                  Object.fromEntries(Object.keys(values).filter((key) => key !== 'count' && key !== 'chart').map((key) => [key, ''])),
                  unit,
                )
              }
            >
              Clear all
            </Button>
          </div>
          <BoreReadingGrid
            cylinderCount={count}
            unit={unit}
            cells={values}
            errors={errors}
            onChange={(changes) => setValues(changes, unit)}
            pistonNote="(optional)"
            tableClassName="min-w-[36rem]"
            help={
              <>
                Readings in {UNIT_WORDS[unit].long}. Tab moves along a cylinder (top, middle, bottom; thrust then axial); Enter or the arrow keys
                move between cylinders. The example readings are made up.
              </>
            }
          />
        </div>

        <fieldset className="flex min-w-0 flex-col gap-3 rounded-lg border border-slate-200 p-4">
          <legend className="px-1 text-sm font-bold text-ink">Limits (optional)</legend>
          <p className="text-sm text-ink-soft">Leave a limit empty to skip it. Each cylinder is judged on the limits given.</p>
          <FieldGrid>
            {specField('targetBore', 'Target bore')}
            {specField('targetTolerance', 'Size tolerance ±')}
            {specField('clearanceMin', 'Least clearance')}
            {specField('clearanceMax', 'Most clearance')}
            {specField('maxTaper', 'Most taper')}
            {specField('maxOutOfRound', 'Most out-of-round')}
          </FieldGrid>
          <p className="text-sm">
            <CommonPractice>
              a freshly machined bore holds taper and out-of-round to about {hint(FRESH_BORE_LIMIT_IN)} or better; piston-to-wall
              clearance is typically about {hint(CLEARANCE_HINTS_IN.cast[0])}–{hint(CLEARANCE_HINTS_IN.cast[1])} for cast pistons and{' '}
              {hint(CLEARANCE_HINTS_IN.forged[0])}–{hint(CLEARANCE_HINTS_IN.forged[1])} for forged ones. The piston maker&apos;s figure governs.
            </CommonPractice>
          </p>
        </fieldset>
      </div>

      <ResultsPanel>
        {result ? (
          <div className="flex flex-col gap-4" data-testid="bore-check-result">
            <div className="flex flex-wrap items-center gap-x-6 gap-y-2">
              {hasLimits ? (
                <p className="flex items-center gap-2 font-semibold">
                  <PassMark pass={result.pass} passText="All cylinders within limits" failText={`${result.cylinders.filter((c) => !c.pass).length} of ${count} outside limits`} />
                </p>
              ) : (
                <p className="text-ink-soft">No limits entered: the figures are shown, not judged.</p>
              )}
              <p>
                Largest taper <strong className="tabular-nums">{formatLength(result.worst.taper, unit)}</strong> (cylinder {result.worst.taperCylinder + 1})
              </p>
              <p>
                Largest out-of-round <strong className="tabular-nums">{formatLength(result.worst.outOfRound, unit)}</strong> (cylinder{' '}
                {result.worst.outOfRoundCylinder + 1})
              </p>
            </div>
            <div className="relative overflow-x-auto">
              <table className="w-full text-sm tabular-nums">
                <caption className="pb-1 text-left text-sm text-ink-soft">Figures per cylinder, in {unit === 'in' ? 'inches' : 'millimetres'}</caption>
                <thead>
                  <tr className="text-left align-bottom text-ink-soft">
                    <th scope="col" className="py-1 pr-3 font-semibold">Cyl.</th>
                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Mean</th>
                    {input.spec?.targetBore !== undefined && <th scope="col" className="py-1 pr-3 text-right font-semibold">Off target</th>}
                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Taper</th>
                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Out-of-round</th>
                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Clearance, thrust axis</th>
                    <th scope="col" className="py-1 font-semibold">Result</th>
                  </tr>
                </thead>
                <tbody>
                  {result.cylinders.map((cylinder, i) => {
                    const failed = (limit: BoreLimit | BoreLimit[]) =>
                      cylinder.failures.some((f) => (Array.isArray(limit) ? limit.includes(f.limit) : f.limit === limit)) && 'font-bold text-fail';
                    const notes = notCheckedText(cylinder.notChecked);
                    const figure = (value: number) => formatNumber(value, LENGTH_DECIMALS[unit]);
                    return (
                      <tr key={i} className="border-t border-slate-200 align-top" data-testid={`bore-row-${i + 1}`}>
                        <th scope="row" className="py-1.5 pr-3 text-left">{i + 1}</th>
                        <td className="whitespace-nowrap py-1.5 pr-3 text-right">{figure(cylinder.mean)}</td>
                        {cylinder.deviation !== undefined && (
                          <td className={cn('whitespace-nowrap py-1.5 pr-3 text-right', failed('targetBore'))}>
                            {formatChange(cylinder.deviation, LENGTH_DECIMALS[unit])}
                          </td>
                        )}
                        <td className={cn('whitespace-nowrap py-1.5 pr-3 text-right', failed('maxTaper'))}>{figure(cylinder.taper)}</td>
                        <td className={cn('whitespace-nowrap py-1.5 pr-3 text-right', failed('maxOutOfRound'))}>{figure(cylinder.outOfRound)}</td>
                        <td className={cn('whitespace-nowrap py-1.5 pr-3 text-right', failed(['clearanceMin', 'clearanceMax']))}>
                          {cylinder.thrustClearance === undefined ? '—' : `${figure(cylinder.thrustClearance.smallest)} – ${figure(cylinder.thrustClearance.largest)}`}
                        </td>
                        <td className="py-1.5">
                          {hasLimits ? <PassMark pass={cylinder.pass} passText="Pass" failText="Fail" /> : <span className="text-ink-soft">—</span>}
                          {(cylinder.failures.length > 0 || notes.length > 0) && (
                            <ul className="mt-1 flex flex-col gap-0.5 text-sm">
                              {cylinder.failures.map((failure) => (
                                <li key={failure.limit} className="font-semibold text-fail">
                                  {failureText(failure, unit)}
                                </li>
                              ))}
                              {notes.map((note) => (
                                <li key={note} className="text-ink-soft">
                                  {note}
                                </li>
                              ))}
                            </ul>
                          )}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
            <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
              {chartReadings && (
                <BoreDepthChart
                  readings={chartReadings}
                  unit={unit}
                  cylinderNumber={chartIndex + 1}
                  targetBore={input.spec?.targetBore}
                  testId="bore-depth-chart"
                  className="gap-2"
                  caption={
                    <>
                      Cylinder {chartIndex + 1}: diameter at each depth, thrust and axial. A straight vertical line is a bore without taper; a gap
                      between the two lines at a depth is out-of-round.
                    </>
                  }
                />
              )}
              <div className="flex flex-col gap-3">
                <SelectField
                  label="Cylinder to chart"
                  value={String(chartIndex + 1)}
                  onChange={(event) => setValue('chart', event.target.value)}
                  options={Array.from({ length: count }, (_, i) => ({ value: String(i + 1), label: `Cylinder ${i + 1}` }))}
                />
                <GuidanceNote>The engine and piston makers&apos; specifications and your calibrated gauges govern; check a reading twice before you machine to it.</GuidanceNote>
              </div>
            </div>
          </div>
        ) : (
          <MissingHint
            missing={missing}
            errors={schemaErrors}
            formError={formError}
            labels={pathWords}
            limit={3}
          />
        )}
      </ResultsPanel>
    </CalculatorCard>
  );
}

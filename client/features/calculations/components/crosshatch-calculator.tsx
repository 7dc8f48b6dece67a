import { useId, useMemo, type ReactNode } from 'react';
import {
  type CrosshatchRateResult,
  type CrosshatchResult,
  type LengthUnit,
  TYPICAL_INCLUDED_ANGLES,
  crosshatchAngle,
  crosshatchRate,
} from '@shared/calc';
import {
  type CrosshatchRateRequest,
  type CrosshatchRequest,
  crosshatchRateRequestSchema,
  crosshatchRequestSchema,
} from '@shared/schemas/calculations';
import { formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, NumberField } from './calculator-parts';

const initial = {
  bore: '',
  spindleRpm: '',
  strokeLength: '',
  cyclesPerMinute: '',
  includedAngleDeg: String(TYPICAL_INCLUDED_ANGLES.general),
};
const kindOf = (key: string): FieldKind => (key === 'bore' || key === 'strokeLength' ? 'length' : 'other');
const labels: Record<string, string> = {
  bore: 'the bore',
  spindleRpm: 'the spindle speed',
  strokeLength: 'the stroke length',
  cyclesPerMinute: 'the cycles per minute',
  includedAngleDeg: 'the target angle',
};

const computeAngle = (data: CrosshatchRequest): CrosshatchResult => crosshatchAngle(data);
const computeRate = (data: CrosshatchRateRequest): CrosshatchRateResult => crosshatchRate(data);

const { castIron, race, general } = TYPICAL_INCLUDED_ANGLES;

/** Surface speeds the way shops quote them: feet per minute, or metres per minute. */
function speedText(perMinute: number, unit: LengthUnit) {
  return unit === 'in' ? `${formatNumber(perMinute / 12, 0)} ft/min` : `${formatNumber(perMinute / 1000, 1)} m/min`;
}

function rangeNote(angle: number) {
  if (angle >= castIron.min && angle <= castIron.max) return `within the ${castIron.min}–${castIron.max}° often used for cast-iron bores.`;
  if (angle >= race.min && angle < castIron.min) return `flatter than the ${castIron.min}–${castIron.max}° usual for cast iron; ${race.min}–${race.max}° is used for some race work.`;
  return `outside the ${castIron.min}–${castIron.max}° often used for cast-iron bores.`;
}

/** A sketch of the scratch pattern at the given included angle, for the eye only. */
function CrosshatchSketch({ includedAngleDeg }: { includedAngleDeg: number }) {
  const clip = `hatch-${useId().replace(/[^a-zA-Z0-9]/g, '')}`;
  const width = 200;
  const height = 110;
  const slope = Math.tan(((includedAngleDeg / 2) * Math.PI) / 180); // rise per run
  const run = height / Math.max(slope, 0.01);
  const lines: Array<[number, number, number, number]> = [];
  for (let x = -run - 20; x < width + run + 20; x += 26) {
    lines.push([x, height, x + run, 0]);
    lines.push([x, 0, x + run, height]);
  }
  return (
    <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full max-w-56 rounded-md bg-white ring-1 ring-slate-200" aria-hidden="true">
      <clipPath id={clip}>
        <rect width={width} height={height} />
      </clipPath>
      <g clipPath={`url(#${clip})`} stroke="#3d6580" strokeWidth="1.5">
        {lines.map(([x1, y1, x2, y2], index) => (
          <line key={index} x1={x1} y1={y1} x2={x2} y2={y2} />
        ))}
      </g>
    </svg>
  );
}

export function CrosshatchCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const common = useMemo(
    () => ({ unit, bore: toNumber(values.bore), spindleRpm: toNumber(values.spindleRpm), strokeLength: toNumber(values.strokeLength) }),
    [unit, values.bore, values.spindleRpm, values.strokeLength],
  );
  const angleInput = useMemo(() => ({ ...common, cyclesPerMinute: toNumber(values.cyclesPerMinute) }), [common, values.cyclesPerMinute]);
  const rateInput = useMemo(() => ({ ...common, includedAngleDeg: toNumber(values.includedAngleDeg) }), [common, values.includedAngleDeg]);
  const angle = useLiveCalculation(crosshatchRequestSchema, angleInput, computeAngle);
  const rate = useLiveCalculation(crosshatchRateRequestSchema, rateInput, computeRate);
  const errors = { ...angle.errors, ...rate.errors };

  const field = (key: keyof typeof initial, label: string, hint?: ReactNode) => (
    <NumberField label={label} value={values[key]} onValueChange={(text) => setValue(key, text)} error={errors[key]} hint={hint} />
  );

  return (
    <CalculatorLayout
      id="crosshatch"
      title="Crosshatch"
      intro={
        <>
          The angle the hone leaves comes from how fast the stones travel up and down against how fast they turn. The{' '}
          <strong>included angle</strong> here is the angle between the up and the down scratches, measured across the horizontal (the
          angle that opens towards the sides of the bore). A <strong>cycle</strong> is one full up-and-down stroke. The figure is a
          mid-stroke value; the stones slow down at each end.
        </>
      }
      inputs={
        <>
          <FieldGrid>
            {field('bore', `Bore (${unit})`)}
            {field('spindleRpm', 'Spindle speed (rev/min)')}
            {field('strokeLength', `Stroke length of the hone (${unit})`)}
            {field('cyclesPerMinute', 'Cycles per minute', 'Full up-and-down cycles: one stroke up and one down count as one. Counting single strokes gives about double the angle.')}
          </FieldGrid>
          <div className="border-t border-slate-200 pt-4">
            <h3 className="mb-2 font-bold">The other way round: cycles for a target angle</h3>
            <FieldGrid>
              {field(
                'includedAngleDeg',
                'Target included angle (°)',
                <CommonPractice>
                  starts at {general}°. {castIron.min}–{castIron.max}° is usual for cast iron, {race.min}–{race.max}° for some race work.
                </CommonPractice>,
              )}
            </FieldGrid>
          </div>
        </>
      }
      results={
        <>
          {angle.result ? (
            <div className="flex flex-col gap-3" data-testid="crosshatch-angle-result">
              <div className="flex flex-wrap items-end justify-between gap-3">
                <HeadlineFigure label="Included angle, computed from settings (mid-stroke)" value={`${formatNumber(angle.result.includedAngleDeg, 1)}°`} />
                <CrosshatchSketch includedAngleDeg={angle.result.includedAngleDeg} />
              </div>
              <FigureList
                items={[
                  { label: 'Each scratch from the horizontal', value: `${formatNumber(angle.result.scratchAngleDeg, 1)}°` },
                  { label: 'Stone speed around the bore', value: speedText(angle.result.peripheralSpeed, unit) },
                  { label: 'Mean speed up and down', value: speedText(angle.result.axialSpeed, unit) },
                ]}
              />
              <p className="text-sm">
                <CommonPractice>{formatNumber(angle.result.includedAngleDeg, 1)}° is {rangeNote(angle.result.includedAngleDeg)}</CommonPractice>
              </p>
              <GuidanceNote>The ring and engine makers&apos; finish requirements govern; check the pattern on the bore itself.</GuidanceNote>
            </div>
          ) : (
            <MissingHint missing={angle.missing} errors={angle.errors} labels={(key) => labels[key] ?? key} formError={angle.formError} />
          )}
          <div className="flex flex-col gap-2 border-t border-slate-200 pt-3">
            <h4 className="font-bold">For the target angle</h4>
            {rate.result ? (
              <div data-testid="crosshatch-rate-result">
                <HeadlineFigure
                  label="Cycles per minute"
                  value={formatNumber(rate.result.cyclesPerMinute, 1)}
                  note={`Full up-and-down cycles at ${formatNumber(rateInput.spindleRpm ?? 0, 0)} rev/min.`}
                />
              </div>
            ) : (
              <MissingHint missing={rate.missing} errors={rate.errors} labels={(key) => labels[key] ?? key} formError={rate.formError} />
            )}
          </div>
        </>
      }
    />
  );
}

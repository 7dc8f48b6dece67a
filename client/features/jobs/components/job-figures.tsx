/**
 * Figures worked out from a job's spec with the shared calculation library:
 * displacement at the stock bore and after machining, the oversize over the
 * stock bore, and the finished bore from the piston plus its clearance with
 * the size to bore to before the hone. Shown live beside the job form and
 * again on the job page.
 */
import { useId, type ReactNode } from 'react';
import { type LengthUnit, boreSize, convertLength, displacement, type BoreSize, type DisplacementResult } from '@shared/calc';
import { balanceTolerance } from '@shared/calc/balance';
import { limitFor, type OperationLimits } from '@shared/operation-limits';
import { GuidanceCaution } from '@client/components/ui/guidance-caution';
import { cn } from '@client/lib/cn';
import { jobScope } from './job-scope';
import { formatLength, formatLengthChange, formatNumber } from './job-words';

/**
 * Diameter the boring bar leaves for the hone: 0.0025 in (0.0635 mm), the
 * middle of the usual 0.002–0.003 in. Common practice, no published source;
 * the hone maker's and the shop's own figure govern.
 */
export const HONE_ALLOWANCE_IN = 0.0025;

export interface FigureInput {
  unit?: LengthUnit;
  cylinders?: number;
  stockBore?: number;
  stroke?: number;
  targetBore?: number;
  pistonDiameter?: number;
  clearanceMin?: number;
  clearanceMax?: number;
  /** The work ordered: bore figures show only for work on the bores; without it, they always show. */
  operations?: ReadonlyArray<{ code?: string } | undefined>;
  /** The job's limits: the balance grade and service speed give the permissible specific unbalance. */
  limits?: OperationLimits;
}

export interface JobFigureSet {
  unit: LengthUnit;
  stock?: DisplacementResult;
  sized?: BoreSize;
  /** The bore the job ends at: the target bore when given, else the finished bore from the piston. */
  finalBore?: { value: number; from: 'target' | 'piston' };
  oversize?: number;
  machined?: DisplacementResult;
  /** What is still needed for each figure, in words. */
  missing: { displacement: string[]; finished: string[] };
}

const ok = (n: number | undefined): n is number => typeof n === 'number' && Number.isFinite(n);
const positive = (n: number | undefined): n is number => ok(n) && n > 0;
const wholeCylinders = (n: number | undefined): n is number => ok(n) && Number.isInteger(n) && n >= 1 && n <= 16;

function tryCompute<T>(run: () => T): T | undefined {
  try {
    return run();
  } catch {
    // The library refuses impossible input (CalculationError); the form's own messages say why.
    return undefined;
  }
}

export function jobFigures(input: FigureInput): JobFigureSet {
  const unit = input.unit ?? 'in';
  const { cylinders, stockBore, stroke, targetBore, pistonDiameter, clearanceMin, clearanceMax } = input;
  const missingDisplacement = [
    !positive(stockBore) && 'the stock bore',
    !positive(stroke) && 'the stroke',
    !wholeCylinders(cylinders) && 'the number of cylinders',
  ].filter((x): x is string => Boolean(x));
  const missingFinished = [
    !positive(pistonDiameter) && 'the piston diameter',
    !(ok(clearanceMin) && clearanceMin >= 0) && 'the smallest clearance',
    !(ok(clearanceMax) && clearanceMax >= 0) && 'the largest clearance',
  ].filter((x): x is string => Boolean(x));

  const canDisplace = (bore: number | undefined) => positive(bore) && positive(stroke) && wholeCylinders(cylinders);
  const stock = canDisplace(stockBore) ? tryCompute(() => displacement({ unit, bore: stockBore!, stroke: stroke!, cylinders: cylinders! })) : undefined;
  const sized =
    missingFinished.length === 0
      ? tryCompute(() =>
          boreSize({
            pistonDiameter: pistonDiameter!,
            clearanceMin: clearanceMin!,
            clearanceMax: clearanceMax!,
            honeAllowance: convertLength(HONE_ALLOWANCE_IN, 'in', unit),
          }),
        )
      : undefined;
  const finalBore = positive(targetBore)
    ? { value: targetBore, from: 'target' as const }
    : sized
      ? { value: sized.finishedBore, from: 'piston' as const }
      : undefined;
  const oversize = finalBore && positive(stockBore) ? finalBore.value - stockBore : undefined;
  const machined = finalBore && canDisplace(finalBore.value) ? tryCompute(() => displacement({ unit, bore: finalBore.value, stroke: stroke!, cylinders: cylinders! })) : undefined;
  return { unit, stock, sized, finalBore, oversize, machined, missing: { displacement: missingDisplacement, finished: missingFinished } };
}

/**
 * The permissible specific unbalance for a balance job, once its service speed
 * is in (the grade defaults as declared): ISO 21940-11, e_per = 9549 · G / n
 * in g·mm/kg. The rotor's mass is not asked for, so the permissible unbalance
 * itself (e_per times the mass, half per plane) is left to the shop.
 */
export function balanceFigure(limits: OperationLimits | undefined): { grade: number; serviceRpm: number; specificUnbalanceGmmPerKg: number } | undefined {
  const grade = limitFor(limits, 'balance', 'grade', 'in')?.value;
  const serviceRpm = limits?.balance?.serviceRpm;
  if (!ok(grade) || !ok(serviceRpm) || grade <= 0 || serviceRpm <= 0) return undefined;
  const result = tryCompute(() => balanceTolerance({ rotorMassKg: 1, serviceRpm, grade }));
  return result && { grade, serviceRpm, specificUnbalanceGmmPerKg: result.specificUnbalanceGmmPerKg };
}

function listInWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** One figure: a term and its value, and a note as a second description (a <dl> allows one <div> per group, no deeper). */
function Row({ label, value, testId, note }: { label: ReactNode; value: ReactNode; testId?: string; note?: ReactNode }) {
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-0.5 border-t border-slate-200 pt-2 first:border-t-0 first:pt-0">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="font-semibold tabular-nums text-ink" data-testid={testId}>
        {value}
      </dd>
      {note && <dd className="basis-full text-xs text-ink-soft">{note}</dd>}
    </div>
  );
}

function StillToEnter({ items }: { items: string[] }) {
  return <p className="text-sm text-ink-soft">Still to enter: {listInWords(items)}.</p>;
}

function CommonPracticeTag() {
  return (
    <span className="mr-1 rounded bg-brass-50 px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide text-brass-800 ring-1 ring-brass-200">
      Common practice
    </span>
  );
}

/** Displacement, oversize and bore sizes for a spec, with what is still missing and the caution. */
export function JobFiguresPanel({ input, title = 'Figures as you type', className }: { input: FigureInput; title?: string; className?: string }) {
  const figures = jobFigures(input);
  const { unit, stock, sized, finalBore, oversize, machined, missing } = figures;
  const allowance = convertLength(HONE_ALLOWANCE_IN, 'in', unit);
  const titleId = useId();
  const scope = input.operations ? jobScope({ operations: input.operations }) : undefined;
  const boreWork = scope ? scope.boreWork : true;
  const balance = scope?.codes.includes('balance') ? balanceFigure(input.limits) : undefined;
  return (
    <section aria-labelledby={titleId} className={cn('flex flex-col gap-4 rounded-lg bg-slate-50 p-4 ring-1 ring-slate-200', className)}>
      <h2 id={titleId} className="text-sm font-bold uppercase tracking-wider text-slate-700">
        {title}
      </h2>

      {scope?.codes.includes('balance') && (
        <div>
          <h3 className="font-bold text-ink">Balance</h3>
          {balance ? (
            <dl className="mt-1 flex flex-col gap-2">
              <Row
                label={`Permissible specific unbalance at G ${formatNumber(balance.grade, 1)}, ${formatNumber(balance.serviceRpm, 0)} rev/min`}
                value={`${formatNumber(balance.specificUnbalanceGmmPerKg, 2)} g·mm/kg`}
                testId="job-balance-specific-unbalance"
                note="ISO 21940-11: 9549 · G / n. Times the rotor’s mass in kg gives the permissible unbalance in g·mm, half of it per correction plane."
              />
            </dl>
          ) : (
            <StillToEnter items={['the highest service speed']} />
          )}
        </div>
      )}

      {!boreWork && <p className="text-sm text-ink-soft">Displacement and bore sizes show for work on the cylinder bores.</p>}
      {boreWork && (
        <>
          <div>
            <h3 className="font-bold text-ink">Displacement</h3>
            {stock ? (
              <>
                <p className="text-3xl font-extrabold tabular-nums tracking-tight text-ink">
                  <span data-testid="job-displacement-cc">{formatNumber(stock.cc, 0)} cc</span>
                </p>
                <p className="text-sm text-ink-soft">at the stock bore</p>
                <dl className="mt-2 flex flex-col gap-2">
                  <Row label="Litres" value={`${formatNumber(stock.litres, 2)} L`} />
                  <Row label="Cubic inches" value={`${formatNumber(stock.cubicInches, 1)} in³`} />
                  {machined && (
                    <Row
                      label={finalBore?.from === 'target' ? 'At the target bore' : 'At the finished bore'}
                      value={`${formatNumber(machined.cc, 0)} cc · ${formatNumber(machined.cubicInches, 1)} in³`}
                      testId="job-displacement-machined"
                    />
                  )}
                </dl>
              </>
            ) : (
              <StillToEnter items={missing.displacement} />
            )}
          </div>

          <div>
            <h3 className="font-bold text-ink">Bore sizes</h3>
            <div className="mt-1 flex flex-col gap-2">
              {!sized && (
                <div className="text-sm text-ink-soft">
                  {missing.finished.length < 3 ? <StillToEnter items={missing.finished} /> : <p>Give the piston diameter and its clearance range to see the finished bore.</p>}
                </div>
              )}
              {(sized || oversize !== undefined) && (
                <dl className="flex flex-col gap-2">
                  {sized && (
                    <>
                      <Row
                        label="Finished bore"
                        value={formatLength(sized.finishedBore, unit)}
                        testId="job-finished-bore"
                        note={`Piston plus the middle of its clearance range (${formatLength(sized.targetClearance, unit)}).`}
                      />
                      <Row
                        label="Bore to, before the hone"
                        value={formatLength(sized.boreTo, unit)}
                        testId="job-bore-to"
                        note={
                          <>
                            <CommonPracticeTag />
                            leaves {formatLength(allowance, unit)} on the diameter for the hone; the shop sets its own allowance.
                          </>
                        }
                      />
                    </>
                  )}
                  {oversize !== undefined && (
                    <Row
                      label="Oversize over stock"
                      value={formatLengthChange(oversize, unit)}
                      testId="job-oversize"
                      note={
                        oversize < 0
                          ? 'Smaller than the stock bore: check the figures.'
                          : finalBore?.from === 'target'
                            ? 'Target bore minus stock bore.'
                            : 'Finished bore minus stock bore.'
                      }
                    />
                  )}
                </dl>
              )}
              {oversize === undefined && <p className="text-sm text-ink-soft">The oversize shows once the stock bore and a target bore or piston size are in.</p>}
            </div>
          </div>
        </>
      )}
      <GuidanceCaution />
    </section>
  );
}

import { type LengthUnit, micrometresToMicroinches } from '@shared/calc';
import type { InspectionResults as Results } from '@shared/schemas/inspection';
import type { JobInput } from '@shared/schemas/jobs';
import { judgedNothing } from '@shared/inspection-words';
import { GuidanceCaution } from '@client/components/ui/guidance-caution';
import { cn } from '@client/lib/cn';
import { LENGTH_DECIMALS, formatChange, formatLength, formatNumber } from '@client/lib/numbers';
import { type CheckRow, boreLimits, cylinderChecks, otherChecks } from '../lib/evaluate';
import { finishFilterWords } from '../lib/finish-filter-words';
import { RecordJudgement, RecordVerdictMark, VerdictMark } from './record-judgement';

export function PassMark({ pass, passText = 'Pass', failText = 'Fail' }: { pass: boolean | null; passText?: string; failText?: string }) {
  if (pass === null) {
    return <span className="inline-flex items-center rounded-full bg-paper-sunk px-2.5 py-0.5 text-sm font-bold text-ink-soft ring-1 ring-slate-200">Not judged</span>;
  }
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1 whitespace-nowrap rounded-full px-2.5 py-0.5 text-sm font-bold ring-1',
        pass ? 'bg-pass-soft text-pass ring-pass/30' : 'bg-fail-soft text-fail ring-fail/30',
      )}
    >
      <span aria-hidden>{pass ? '✓' : '✕'}</span>
      <span>{pass ? passText : failText}</span>
    </span>
  );
}

function CheckItem({ row }: { row: CheckRow }) {
  return (
    <li className="flex flex-wrap items-baseline gap-x-3 gap-y-1" data-testid="inspection-check" data-pass={row.pass === null ? 'not-judged' : String(row.pass)}>
      <PassMark pass={row.pass} />
      <span className="font-semibold">{row.what}</span>
      <span className={cn('text-sm', row.pass === false ? 'font-semibold text-fail' : 'text-ink-soft')}>{row.reason}</span>
    </li>
  );
}

/** Checks with their verdicts; with `collapsePasses`, the passing ones fold away behind a count so failures stand out. */
function CheckList({ rows, label, collapsePasses = false }: { rows: CheckRow[]; label: string; collapsePasses?: boolean }) {
  if (rows.length === 0) return null;
  const open = collapsePasses ? rows.filter((row) => row.pass !== true) : rows;
  const passing = collapsePasses ? rows.filter((row) => row.pass === true) : [];
  return (
    <div className="flex flex-col gap-1.5">
      {open.length > 0 && (
        <ul aria-label={label} className="flex flex-col gap-1.5">
          {open.map((row) => (
            <CheckItem key={row.key} row={row} />
          ))}
        </ul>
      )}
      {passing.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-semibold text-pass">
            {passing.length} {passing.length === 1 ? 'check passes' : 'checks pass'}
          </summary>
          <ul aria-label={`${label} that pass`} className="mt-1.5 flex flex-col gap-1.5">
            {passing.map((row) => (
              <CheckItem key={row.key} row={row} />
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}

const pct = (value: number | undefined) => (value === undefined ? undefined : `${formatNumber(value, 1)} %`);
/** A roughness height in micrometres with microinches beside it (1 µin = 0.0254 µm exactly). */
const umAndMicroinches = (value: number | undefined) =>
  value === undefined ? undefined : `${formatNumber(value, 2)} µm (${formatNumber(micrometresToMicroinches(value), 1)} µin)`;

/** Finish, crosshatch and deck figures as label–value pairs. */
export function SurfaceFigures({ results, unit }: { results: Results; unit: LengthUnit }) {
  const f = results.finish;
  const items: Array<[string, string | undefined]> = [
    ['Bore Ra', umAndMicroinches(f?.raUm)],
    ['Bore Rq', umAndMicroinches(f?.rqUm)],
    ['Bore Rz', umAndMicroinches(f?.rzUm)],
    ['Rk', umAndMicroinches(f?.rkUm)],
    ['Rpk', umAndMicroinches(f?.rpkUm)],
    ['Rvk', umAndMicroinches(f?.rvkUm)],
    ['Mr1', pct(f?.mr1)],
    ['Mr2', pct(f?.mr2)],
    ['Finish filter', finishFilterWords(f?.filter)],
    ['Crosshatch included angle', results.crosshatch ? `${formatNumber(results.crosshatch.includedAngleDeg, 1)}°` : undefined],
    [
      'Deck out-of-flat',
      results.deck
        ? `${formatLength(results.deck.outOfFlat, unit)} (limit ${formatLength(results.deck.limit, unit)}${results.deck.limitSource === 'table' ? ', common practice for the block and a multi-layer steel gasket' : ''})`
        : undefined,
    ],
  ];
  const shown = items.filter((item): item is [string, string] => item[1] !== undefined);
  if (shown.length === 0) return null;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="surface-figures">
      {shown.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-ink-soft">{label}</dt>
          <dd className="font-semibold tabular-nums">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/**
 * A short line of what fails so far, for narrow screens where the full
 * results sit below the form: the shop sees a bad reading beside the grid.
 */
export function FailingChecksLine({
  results,
  cylinderIndexes,
  spec,
  unit,
  className,
}: {
  results: Results | undefined;
  cylinderIndexes: number[];
  spec: JobInput;
  unit: LengthUnit;
  className?: string;
}) {
  const limits = boreLimits(spec, unit);
  const rows = results
    ? [...cylinderIndexes.flatMap((index, k) => cylinderChecks(results.bores!.cylinders[k], index, limits, unit)), ...otherChecks(results, unit)]
    : [];
  const failing = rows.filter((row) => row.pass === false);
  // Under guarded acceptance a check may be neither conforming nor failing: it is not "passing" either.
  const unproven = results?.checks.filter((check) => check.verdict === 'not-proven') ?? [];
  return (
    <div aria-live="polite" className={className}>
      {failing.length > 0 ? (
        <ul className="flex flex-col gap-0.5 text-sm font-semibold text-fail">
          {failing.map((row) => (
            <li key={row.key}>
              {row.what}: {row.reason}
            </li>
          ))}
        </ul>
      ) : unproven.length > 0 ? (
        <p className="text-sm font-semibold text-caution">
          No check fails so far; {unproven.length === 1 ? 'one is' : `${unproven.length} are`} not proven ({unproven.map((check) => check.what).join(', ')}).
        </p>
      ) : rows.length > 0 ? (
        <p className="text-sm font-semibold text-pass">Every check so far passes.</p>
      ) : null}
    </div>
  );
}

/**
 * The computed figures and every check with its verdict and reason: per
 * cylinder (mean, taper, out-of-round, clearance, deviation), then the deck,
 * finish and crosshatch. Used live beside the entry grid and on the review.
 */
export function InspectionResultsView({
  results,
  cylinderIndexes,
  cylinderCount,
  spec,
  unit,
  complete,
  headingLevel = 4,
}: {
  results: Results | undefined;
  cylinderIndexes: number[];
  cylinderCount: number;
  spec: JobInput;
  unit: LengthUnit;
  complete: boolean;
  /** The level of its own headings: one below the heading it sits under (h3 beside the entry grid's h2, h4 in a review version). */
  headingLevel?: 3 | 4;
}) {
  const Heading = headingLevel === 3 ? 'h3' : 'h4';
  const limits = boreLimits(spec, unit);
  const byIndex = new Map(cylinderIndexes.map((index, k) => [index, results?.bores?.cylinders[k]]));
  const boreRows = cylinderIndexes.flatMap((index) => {
    const cylinder = byIndex.get(index);
    return cylinder ? cylinderChecks(cylinder, index, limits, unit) : [];
  });
  const surfaceRows = results ? otherChecks(results, unit) : [];
  const failing = [...boreRows, ...surfaceRows].filter((row) => row.pass === false).length;
  const decimals = LENGTH_DECIMALS[unit];
  const figure = (value: number | undefined) => (value === undefined ? '—' : formatNumber(value, decimals));
  // Records judged with verdicts: a cylinder's verdict is its worst check's, and its clearance the thrust-axis range that was judged.
  const checksOf = (index: number) => results?.checks.filter((check) => check.cylinder === index + 1) ?? [];
  const cylinderVerdict = (index: number) => {
    const verdicts = checksOf(index).map((check) => check.verdict);
    return verdicts.includes('fails') ? 'fails' : verdicts.includes('not-proven') ? 'not-proven' : 'conforms';
  };
  const thrustClearance = (index: number) => {
    if (!results?.verdict) return undefined;
    const low = checksOf(index).find((check) => check.limit === 'clearanceMin')?.value;
    const high = checksOf(index).find((check) => check.limit === 'clearanceMax')?.value;
    if (low === undefined && high === undefined) return '—';
    return [low, high].filter((v): v is number => v !== undefined).map((v) => formatNumber(v, decimals)).join(' – ');
  };

  return (
    <div className="flex flex-col gap-4" data-testid="inspection-results">
      <div aria-live="polite">
        {complete && results && (results.verdict || judgedNothing(results)) ? (
          <p className="flex flex-wrap items-center gap-2 font-semibold" data-testid="inspection-verdict">
            <RecordVerdictMark results={results} />
          </p>
        ) : complete && results ? (
          <p className="flex flex-wrap items-center gap-2 font-semibold" data-testid="inspection-verdict">
            <PassMark pass={results.pass && failing === 0} passText="Every check passes" failText={`${failing} ${failing === 1 ? 'check fails' : 'checks fail'}`} />
          </p>
        ) : (
          <p className="text-sm text-ink-soft" data-testid="inspection-verdict">
            {failing > 0 ? (
              <span className="font-semibold text-fail">
                {failing} {failing === 1 ? 'check fails' : 'checks fail'} so far.{' '}
              </span>
            ) : null}
            Figures so far; the overall result shows when the record is complete.
          </p>
        )}
      </div>

      {cylinderCount > 0 && (
        <>
          <div className="relative overflow-x-auto">
            <table className="w-full min-w-[24rem] text-sm tabular-nums">
              <caption className="sr-only">Figures per cylinder, in {unit}</caption>
              <thead className="text-left text-ink-soft">
                <tr>
                  <th scope="col" className="py-1 pr-2 font-semibold">Cyl.</th>
                  <th scope="col" className="py-1 pr-2 text-right font-semibold">Mean</th>
                  <th scope="col" className="py-1 pr-2 text-right font-semibold">Taper</th>
                  <th scope="col" className="py-1 pr-2 text-right font-semibold">Out-of-round</th>
                  <th scope="col" className="py-1 pr-2 text-right font-semibold">{results?.verdict ? 'Clearance (thrust)' : 'Clearance'}</th>
                  <th scope="col" className="py-1 pr-2 text-right font-semibold">From target</th>
                  <th scope="col" className="py-1 font-semibold">Result</th>
                </tr>
              </thead>
              <tbody>
                {Array.from({ length: cylinderCount }, (_, index) => {
                  const cylinder = byIndex.get(index);
                  if (!cylinder) {
                    return (
                      <tr key={index} className="border-t border-slate-200">
                        <th scope="row" className="py-1.5 pr-2 text-left">{index + 1}</th>
                        <td colSpan={6} className="py-1.5 text-ink-faint">Still to enter</td>
                      </tr>
                    );
                  }
                  const failed = (...names: string[]) => cylinder.failures.some((f) => names.includes(f.limit)) && 'font-bold text-fail';
                  return (
                    <tr key={index} className="border-t border-slate-200 align-top" data-testid={`result-cylinder-${index + 1}`}>
                      <th scope="row" className="py-1.5 pr-2 text-left">{index + 1}</th>
                      <td className="py-1.5 pr-2 text-right">{figure(cylinder.mean)}</td>
                      <td className={cn('py-1.5 pr-2 text-right', failed('maxTaper'))}>{figure(cylinder.taper)}</td>
                      <td className={cn('py-1.5 pr-2 text-right', failed('maxOutOfRound'))}>{figure(cylinder.outOfRound)}</td>
                      <td className={cn('py-1.5 pr-2 text-right', failed('clearanceMin', 'clearanceMax'))}>{thrustClearance(index) ?? figure(cylinder.clearance)}</td>
                      <td className={cn('py-1.5 pr-2 text-right', failed('targetBore'))}>{cylinder.deviation === undefined ? '—' : formatChange(cylinder.deviation, decimals)}</td>
                      <td className="py-1.5">
                        {results?.verdict ? <VerdictMark verdict={cylinderVerdict(index)} compact /> : <PassMark pass={cylinder.pass} />}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <p className="text-xs text-ink-soft" data-testid="figure-definitions-short">
            Taper: on the diameter, largest minus smallest reading over the three depths in one direction. Out-of-round: two-point, thrust minus axial
            diameter at one depth.
          </p>
        </>
      )}

      <section aria-label="Checks against the job’s specification" className="flex flex-col gap-2">
        <Heading className="text-sm font-bold uppercase tracking-wider text-slate-700">Checks</Heading>
        {results?.verdict ? (
          <RecordJudgement results={results} unit={unit} headingLevel={headingLevel} />
        ) : boreRows.length === 0 && surfaceRows.length === 0 ? (
          <p className="text-sm text-ink-soft">Checks appear as each cylinder’s six readings are in.</p>
        ) : (
          <>
            <CheckList rows={boreRows} label="Bore checks" collapsePasses />
            <CheckList rows={surfaceRows} label="Deck, finish and crosshatch checks" />
          </>
        )}
      </section>

      {results && <SurfaceFigures results={results} unit={unit} />}
      <GuidanceCaution />
    </div>
  );
}

/**
 * How the record was judged, in full: the record's verdict (pass, fail, not
 * proven, not fully judged), the decision rule and uncertainty it used, every
 * check with its own verdict, each limit that could not be judged and why,
 * and the statements the record makes (temperature correction, pistons used).
 * `ReadingsAt20` puts the raw readings beside the ones corrected to 20 °C.
 * Records stored before verdicts existed carry none of this; they show as they did.
 */
import type { LengthUnit } from '@shared/calc';
import type { CheckVerdict, InspectionInput, InspectionResults, LimitCheck } from '@shared/schemas/inspection';
import { recordVerdictText, shownVerdict } from '@shared/inspection-words';
import { checkVerdict } from '@shared/schemas/values';
import { cn } from '@client/lib/cn';
import { LENGTH_DECIMALS, formatNumber } from '@client/lib/numbers';

const VERDICT_LOOK: Record<CheckVerdict, { text: string; mark: string; className: string }> = {
  conforms: { text: 'Conforms', mark: '✓', className: 'bg-pass-soft text-pass ring-pass/30' },
  fails: { text: 'Fails', mark: '✕', className: 'bg-fail-soft text-fail ring-fail/30' },
  'not-proven': { text: 'Not proven', mark: '?', className: 'bg-caution-soft text-caution ring-caution/30' },
};

/** A check's verdict as a badge; `compact` for narrow table cells. */
export function VerdictMark({ verdict, compact = false }: { verdict: CheckVerdict; compact?: boolean }) {
  const look = VERDICT_LOOK[verdict];
  return (
    <span
      className={cn(
        'inline-flex items-center whitespace-nowrap rounded-full font-bold ring-1',
        compact ? 'px-2 py-0.5 text-sm' : 'gap-1 px-2.5 py-0.5 text-sm',
        look.className,
      )}
      title={compact ? look.text : undefined}
    >
      <span aria-hidden>{look.mark}</span>
      {/* In a narrow cell the word is for screen readers (and the tooltip); the mark and colour carry it on screen. */}
      <span className={compact ? 'sr-only' : undefined}>{look.text}</span>
    </span>
  );
}

/** The check's figure in its own unit: lengths in the record's unit, roughness in µm, angles in degrees. */
function figure(check: LimitCheck, unit: LengthUnit): string {
  if (check.limit === 'finish' || check.limit === 'deckRa' || /\bRa$|\bR[kpv]k?$/.test(check.what)) return `${formatNumber(check.value, 2)} µm`;
  if (check.limit === 'crosshatch' || check.what.includes('angle')) return `${formatNumber(check.value, 1)}°`;
  return `${formatNumber(check.value, LENGTH_DECIMALS[unit] + 1)} ${unit}`;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

function CheckLine({ check, unit }: { check: LimitCheck; unit: LengthUnit }) {
  const verdict = checkVerdict(check);
  return (
    <li className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5" data-testid="judged-check" data-verdict={verdict}>
      <VerdictMark verdict={verdict} />
      <span className="font-semibold">{capitalise(check.what)}</span>
      <span className={cn('text-sm tabular-nums', verdict === 'fails' ? 'font-semibold text-fail' : 'text-ink-soft')}>
        {figure(check, unit)}; allowed {check.allowed}
        {check.note ? ` (${check.note})` : ''}
      </span>
    </li>
  );
}

const RECORD_LOOK = {
  pass: 'bg-pass-soft text-pass ring-pass/30',
  fail: 'bg-fail-soft text-fail ring-fail/30',
  'not-proven': 'bg-caution-soft text-caution ring-caution/30',
  'not-fully-judged': 'bg-caution-soft text-caution ring-caution/30',
} as const;

/** The record's verdict as a badge; also for records stored before verdicts. */
export function RecordVerdictMark({ results }: { results: InspectionResults }) {
  const verdict = shownVerdict(results);
  return (
    <span className={cn('inline-flex items-center rounded-md px-2.5 py-1 text-sm font-bold ring-1', RECORD_LOOK[verdict])} data-testid="record-verdict" data-verdict={verdict}>
      {recordVerdictText(results)}
    </span>
  );
}

export function RecordJudgement({ results, unit, headingLevel = 4 }: { results: InspectionResults; unit: LengthUnit; headingLevel?: 3 | 4 }) {
  if (!results.verdict) return null;
  const Heading = headingLevel === 3 ? 'h3' : 'h4';
  const open = results.checks.filter((check) => checkVerdict(check) !== 'conforms');
  const conforming = results.checks.filter((check) => checkVerdict(check) === 'conforms');
  const notJudged = results.notJudged ?? [];
  return (
    <section aria-label="How the record was judged" className="flex flex-col gap-3" data-testid="record-judgement">
      {notJudged.length > 0 && (
        <div className="rounded-md bg-caution-soft p-3 ring-1 ring-caution/30" data-testid="not-judged">
          <Heading className="text-sm font-bold text-caution">Not judged: {notJudged.length === 1 ? 'one limit' : `${notJudged.length} limits`} of the job</Heading>
          <ul className="mt-1 list-disc pl-5 text-sm">
            {notJudged.map((item) => (
              <li key={item.what}>
                <span className="font-semibold">{capitalise(item.what)}</span>: {item.why}.
              </li>
            ))}
          </ul>
        </div>
      )}
      <div className="flex flex-col gap-1.5">
        {open.length > 0 && (
          <ul aria-label="Checks that fail or are not proven" className="flex flex-col gap-1.5">
            {open.map((check) => (
              <CheckLine key={check.what} check={check} unit={unit} />
            ))}
          </ul>
        )}
        {conforming.length > 0 && (
          <details className="text-sm">
            <summary className="cursor-pointer font-semibold text-pass">
              {conforming.length} {conforming.length === 1 ? 'check conforms' : 'checks conform'}
            </summary>
            <ul aria-label="Checks that conform" className="mt-1.5 flex flex-col gap-1.5">
              {conforming.map((check) => (
                <CheckLine key={check.what} check={check} unit={unit} />
              ))}
            </ul>
          </details>
        )}
      </div>
      {results.statements && results.statements.length > 0 && (
        <div className="flex flex-col gap-1">
          <Heading className="text-sm font-bold uppercase tracking-wider text-slate-700">How it was judged</Heading>
          <ul className="flex flex-col gap-1 text-sm text-ink-soft" data-testid="record-statements">
            {results.statements.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

const POSITIONS = [
  ['top', 'thrust'],
  ['top', 'axial'],
  ['middle', 'thrust'],
  ['middle', 'axial'],
  ['bottom', 'thrust'],
  ['bottom', 'axial'],
] as const;

/** Each reading as taken and at 20 °C, with the piston each clearance used. */
export function ReadingsAt20({ input, results }: { input: InspectionInput; results: InspectionResults }) {
  const corrected = results.corrected;
  if (!corrected || !results.temperature) return null;
  const unit = input.conditions.unit;
  const d = LENGTH_DECIMALS[unit] + 1;
  const t = results.temperature;
  const taken = t.enteredUnit === 'F' ? `${formatNumber(input.conditions.temperatureF ?? 0, 1)} °F (${formatNumber(t.measuredC, 2)} °C)` : `${formatNumber(t.measuredC, 1)} °C`;
  const cell = 'py-0.5 pr-2 text-right';
  return (
    <section aria-label="Readings as taken and at 20 °C" className="flex flex-col gap-2" data-testid="readings-at-20">
      <details>
        <summary className="cursor-pointer font-bold">Readings as taken ({taken}) and at 20 °C</summary>
        <p className="mt-1 text-sm text-ink-soft">
          Corrected with L20 = Lt / (1 + α·(t − 20)): block {t.block.words}; pistons {t.piston.words}. Source: {t.source}. Every figure on this record is judged at 20 °C.
        </p>
        <div className="relative mt-2 overflow-x-auto">
          <table className="w-full min-w-[36rem] text-xs tabular-nums">
            <caption className="sr-only">Each reading as taken and corrected to 20 °C, in {unit}</caption>
            <thead className="text-left text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-2 font-semibold">Cyl.</th>
                <th scope="col" className="py-1 pr-2 font-semibold" />
                {POSITIONS.map(([depth, direction]) => (
                  <th key={`${depth}-${direction}`} scope="col" className="py-1 pr-2 text-right font-semibold">
                    {depth} {direction}
                  </th>
                ))}
                <th scope="col" className="py-1 pr-2 text-right font-semibold">piston</th>
              </tr>
            </thead>
            <tbody>
              {(input.cylinders ?? []).map((raw, i) => {
                const at20 = corrected[i];
                if (!at20) return null;
                return [
                  <tr key={`${i}-raw`} className="border-t border-slate-200">
                    <th scope="row" rowSpan={2} className="py-0.5 pr-2 text-left align-top">{i + 1}</th>
                    <td className="py-0.5 pr-2 text-ink-soft">as taken</td>
                    {POSITIONS.map(([depth, direction]) => (
                      <td key={`${depth}-${direction}`} className={cell}>{formatNumber(raw[depth][direction], d)}</td>
                    ))}
                    <td className={cell}>{raw.piston !== undefined ? formatNumber(raw.piston, d) : '—'}</td>
                  </tr>,
                  <tr key={`${i}-20`}>
                    <td className="py-0.5 pr-2 text-ink-soft">at 20 °C</td>
                    {POSITIONS.map(([depth, direction]) => (
                      <td key={`${depth}-${direction}`} className={cn(cell, 'font-semibold')}>{formatNumber(at20[depth][direction], d)}</td>
                    ))}
                    <td className={cn(cell, 'font-semibold')}>
                      {at20.piston !== undefined ? formatNumber(at20.piston, d) : '—'}
                      {at20.pistonSource === 'job' ? ' (job’s size)' : ''}
                    </td>
                  </tr>,
                ];
              })}
            </tbody>
          </table>
        </div>
      </details>
    </section>
  );
}

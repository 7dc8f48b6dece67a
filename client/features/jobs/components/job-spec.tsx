import type { ReactNode } from 'react';
import type { LengthUnit } from '@shared/calc';
import { PART_SENT_WORDS, findOperation } from '@shared/catalogue';
import { limitFor, limitGroupOperation, type LimitGroup, type OperationLimits } from '@shared/operation-limits';
import type { JobDetail, JobInput } from '@shared/schemas/jobs';
import { formatDay } from '@client/lib/dates';
import { formatDistance, POSTAL_CODE_NOT_FOUND } from '@shared/distance';
import { jobScope, limitEntries } from './job-scope';
import { formatLength, formatLimit, layoutWords, materialWords, pistonWords, quantityText, unitWords } from './job-words';
import { BuilderStandingList } from '@client/components/standing';

type Item = [label: string, value: ReactNode] | false | undefined;

const given = (n: number | undefined): n is number => typeof n === 'number' && Number.isFinite(n);
const micrometres = (n: number) => `${new Intl.NumberFormat('en-US', { maximumFractionDigits: 3 }).format(n)} µm`;
const degrees = (n: number) => `${new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 }).format(n)}°`;

/** "a – b", "at least a", "at most b", or nothing. */
function range(min: number | undefined, max: number | undefined, format: (n: number) => string): string | undefined {
  if (given(min) && given(max)) return min === max ? format(min) : `${format(min)} – ${format(max)}`;
  if (given(min)) return `at least ${format(min)}`;
  if (given(max)) return `at most ${format(max)}`;
  return undefined;
}

function Facts({ items, empty, stacked = false }: { items: Item[]; empty?: string; stacked?: boolean }) {
  const shown = items.filter((item): item is [string, ReactNode] => Boolean(item) && (item as [string, ReactNode])[1] !== undefined);
  if (shown.length === 0) return <p className="text-ink-soft">{empty ?? 'None given.'}</p>;
  return (
    <dl className={stacked ? 'flex flex-col gap-y-0.5 [&_dd]:mb-2' : 'grid gap-x-6 gap-y-1.5 sm:grid-cols-[13rem_1fr]'}>
      {shown.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-ink-soft">{label}</dt>
          <dd className="font-semibold tabular-nums text-ink">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

function Group({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-2">
      <h3 className="text-base font-bold text-ink">{title}</h3>
      {children}
    </div>
  );
}

/** One ordered operation's limits: the job's own figures, else the default marked "(default)" with its source; limits with neither are left out. */
function LimitFacts({ group, limits, unit }: { group: LimitGroup; limits: OperationLimits | undefined; unit: LengthUnit }) {
  const items: Item[] = limitEntries(group).map(([key, field]) => {
    const applied = limitFor(limits, group, key as never, unit);
    if (!applied) return undefined;
    const figure = formatLimit(applied.value, field.kind, unit);
    if (!applied.isDefault) return [field.label, figure];
    return [
      field.label,
      <>
        {figure} <span className="font-normal text-ink-soft">(default) — {applied.source}</span>
      </>,
    ];
  });
  return <Facts items={items} empty="None given." />;
}

/** The job's specification in words, every length with its unit: what is sent, then only the parts of the spec its work needs. */
export function JobSpec({ spec }: { spec: JobInput }) {
  const unit: LengthUnit = spec.unit;
  const scope = jobScope(spec);
  const length = (n: number | undefined) => (given(n) ? formatLength(n, unit) : undefined);
  const deckGiven = scope.deckWork || given(spec.deckFlatnessMax) || given(spec.deckRaMaxUm) || Boolean(spec.deckNotes);
  return (
    <div className="flex flex-col gap-5">
      <p className="text-sm text-ink-soft">Lengths in {unitWords[unit]}; surface finish in micrometres.</p>
      <Group title="The engine and what is sent">
        <Facts
          items={[
            ['Engine', spec.engineFamily],
            ['Layout', layoutWords[spec.layout]],
            ['Cylinders', spec.cylinders],
            ['Parts sent', scope.parts.map((part) => PART_SENT_WORDS[part]).join(', ')],
            scope.needsMaterial && [scope.materialLabel, spec.blockMaterial ? materialWords[spec.blockMaterial] : '—'],
            scope.boreWork && ['Piston type', spec.pistonType ? pistonWords[spec.pistonType] : '—'],
            ['Readings judged by', spec.decisionRule === 'guarded' ? 'Guarded acceptance (ISO 14253-1)' : 'Simple acceptance'],
          ]}
        />
      </Group>
      {scope.boreWork && (
        <>
          <Group title="Bores: sizes and clearance">
            <Facts
              items={[
                ['Stock bore', length(spec.stockBore)],
                ['Stroke', length(spec.stroke)],
                ['Target bore', length(spec.targetBore)],
                ['Piston diameter', length(spec.pistonDiameter)],
                ['Piston-to-wall clearance', range(spec.clearanceMin, spec.clearanceMax, (n) => formatLength(n, unit))],
                ['Finished-size tolerance', spec.boreSizeTolerance !== undefined ? `± ${formatLength(spec.boreSizeTolerance, unit)}` : `± ${unit === 'in' ? '0.0005 in' : '0.0127 mm'} (common-practice default)`],
              ]}
            />
          </Group>
          <Group title="Bores: finish and geometry limits">
            <Facts
              empty="None given: the shop’s usual practice applies."
              items={[
                ['Crosshatch included angle', range(spec.crosshatchMinDeg, spec.crosshatchMaxDeg, degrees)],
                ['Largest bore Ra', given(spec.finishRaMaxUm) ? micrometres(spec.finishRaMaxUm) : undefined],
                ['Largest Rk', given(spec.finishRkMaxUm) ? micrometres(spec.finishRkMaxUm) : undefined],
                ['Largest Rpk', given(spec.finishRpkMaxUm) ? micrometres(spec.finishRpkMaxUm) : undefined],
                ['Largest Rvk', given(spec.finishRvkMaxUm) ? micrometres(spec.finishRvkMaxUm) : undefined],
                ['Maximum taper', length(spec.maxTaper)],
                ['Maximum out-of-round', length(spec.maxOutOfRound)],
              ]}
            />
          </Group>
        </>
      )}
      {deckGiven && (
        <Group title="Deck">
          <Facts
            empty="No deck limits given."
            items={[
              ['Out-of-flat limit', length(spec.deckFlatnessMax)],
              ['Largest deck Ra', given(spec.deckRaMaxUm) ? micrometres(spec.deckRaMaxUm) : undefined],
            ]}
          />
          {spec.deckNotes && <p className="whitespace-pre-wrap text-ink">{spec.deckNotes}</p>}
        </Group>
      )}
      {scope.limitGroups.map((group) => (
        <Group key={group} title={`Limits for ${(findOperation(limitGroupOperation[group])?.name ?? group).toLowerCase()}`}>
          <LimitFacts group={group} limits={spec.limits} unit={unit} />
        </Group>
      ))}
    </div>
  );
}

/** The operations wanted, with how many of each. */
export function JobOperations({ spec }: { spec: JobInput }) {
  return (
    <ul className="grid gap-2 sm:grid-cols-2">
      {spec.operations.map((op) => {
        const known = findOperation(op.code);
        return (
          <li key={op.code} className="flex items-baseline justify-between gap-3 rounded-lg bg-white px-3 py-2 ring-1 ring-slate-200">
            <span className="font-semibold text-ink">{known?.name ?? op.code}</span>
            <span className="text-sm tabular-nums text-ink-soft">{quantityText(known, op.quantity)}</span>
          </li>
        );
      })}
    </ul>
  );
}

/** Where, how and when, for the page's side column. */
export function JobLogistics({ job }: { job: JobDetail }) {
  return (
    <Facts
      stacked
      items={[
        ['Needed by', formatDay(job.neededBy)],
        ['Getting it there', job.logistics === 'ship' ? 'Shipped to the shop by the builder' : 'Dropped off at the shop by the builder'],
        ['Builder’s area', [job.city, job.region, job.country].filter(Boolean).join(', ')],
        // A shop sees how far the job is from its own place.
        job.distance !== null && job.distanceUnit !== null && ['Distance', `${formatDistance(job.distance, job.distanceUnit)} from your shop`],
        // Only the builder sees the postal code, and so whether it was found.
        ...(job.spec.postalCode ? [['Postal code', job.placeFound ? job.spec.postalCode : `${job.spec.postalCode} (${POSTAL_CODE_NOT_FOUND})`] as [string, string]] : []),
        ['Posted by', job.builder.displayName],
        ['Builder’s record', <BuilderStandingList key="standing" standing={job.builder.standing} className="font-normal" />],
      ]}
    />
  );
}

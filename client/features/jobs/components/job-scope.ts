/**
 * Which parts of a job's specification apply, from the parts sent and the work
 * ordered: the bore specification only for work on the bores, the material
 * only when a block or heads are sent, the deck limits only for a deck, and a
 * group of limits per ordered operation that has one. The form shows only
 * these and sends only these; the job page lists only these.
 */
import { NEWTONS_PER_POUND_FORCE, convertLength, type LengthUnit } from '@shared/calc';
import { boreOperationCodes, partsOfJob, type PartSent } from '@shared/catalogue';
import { limitGroupOperation, limitGroups, operationLimitFields, type LimitField, type LimitGroup, type OperationLimits } from '@shared/operation-limits';

/** The bore specification: asked for only when a bore operation is ordered. */
export const BORE_FIELDS = [
  'stockBore',
  'stroke',
  'targetBore',
  'boreSizeTolerance',
  'pistonDiameter',
  'clearanceMin',
  'clearanceMax',
  'pistonType',
  'crosshatchMinDeg',
  'crosshatchMaxDeg',
  'finishRaMaxUm',
  'finishRkMaxUm',
  'finishRpkMaxUm',
  'finishRvkMaxUm',
  'maxTaper',
  'maxOutOfRound',
] as const;

/** The deck's own limits: asked for only when a deck is ordered. */
export const DECK_FIELDS = ['deckFlatnessMax', 'deckRaMaxUm'] as const;

/** Limits the job schema requires when their operation is ordered (the rest take their defaults or are not judged). */
const REQUIRED_LIMITS: Partial<Record<LimitGroup, readonly string[]>> = { balance: ['serviceRpm'] };

export const limitRequired = (group: LimitGroup, key: string) => REQUIRED_LIMITS[group]?.includes(key) ?? false;

/** The fields of a group of limits, in declaration order. */
export const limitEntries = (group: LimitGroup) => Object.entries(operationLimitFields[group] as Record<string, LimitField>);

/** Every limit's path in the form, e.g. "limits.lineHone.housingMax". */
export const limitPaths = limitGroups.flatMap((group) => limitEntries(group).map(([key]) => `limits.${group}.${key}`));

interface ScopeInput {
  parts?: readonly PartSent[];
  operations?: ReadonlyArray<{ code?: string } | undefined>;
}

export interface JobScope {
  parts: readonly PartSent[];
  codes: string[];
  boreWork: boolean;
  deckWork: boolean;
  /** A block or heads are sent, so their material matters. */
  needsMaterial: boolean;
  materialLabel: string;
  /** The groups of limits for the work ordered, in declaration order. */
  limitGroups: LimitGroup[];
}

export function jobScope(job: ScopeInput): JobScope {
  const parts = partsOfJob(job);
  const codes = (job.operations ?? []).flatMap((op) => (op?.code ? [op.code] : []));
  const block = parts.includes('block');
  const heads = parts.includes('heads');
  return {
    parts,
    codes,
    boreWork: codes.some((code) => boreOperationCodes.includes(code as (typeof boreOperationCodes)[number])),
    deckWork: codes.includes('deck'),
    needsMaterial: block || heads,
    materialLabel: heads && !block ? 'Block or head material' : 'Block material',
    limitGroups: limitGroups.filter((group) => codes.includes(limitGroupOperation[group])),
  };
}

/**
 * The values as they are sent: what the form does not show for this job is
 * left out (a stock bore typed before the bore work was unticked, limits for
 * work no longer ordered), and empty groups of limits are dropped.
 */
export function keepInScope<T extends ScopeInput & { limits?: unknown }>(values: T): T {
  const scope = jobScope(values);
  const kept: Record<string, unknown> = { ...(values as Record<string, unknown>) };
  const given = values.limits as OperationLimits | undefined;
  if (!scope.boreWork) for (const field of BORE_FIELDS) kept[field] = undefined;
  if (!scope.deckWork) for (const field of DECK_FIELDS) kept[field] = undefined;
  if (!scope.needsMaterial) kept.blockMaterial = undefined;
  const limits: Record<string, Record<string, unknown>> = {};
  for (const group of scope.limitGroups) {
    const set = Object.entries((given?.[group] ?? {}) as Record<string, unknown>).filter(([, value]) => value !== undefined);
    if (set.length > 0) limits[group] = Object.fromEntries(set);
  }
  kept.limits = Object.keys(limits).length > 0 ? limits : undefined;
  return kept as T;
}

/** A limit converted when the job's unit changes: lengths by 25.4, forces lbf ↔ N; other kinds keep their figure. */
export function convertLimit(value: number, kind: LimitField['kind'], from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  if (kind === 'length') return convertLength(value, from, to);
  if (kind === 'force') return from === 'in' ? value * NEWTONS_PER_POUND_FORCE : value / NEWTONS_PER_POUND_FORCE;
  return value;
}

/**
 * How the jobs feature puts the spec into words: status names a builder
 * understands, the choices of the form, and lengths and dates as the trade
 * writes them.
 */
import type { LengthUnit } from '@shared/calc';
import { forceUnitFor, type LimitField } from '@shared/operation-limits';
import { JOB_STATUS } from '@shared/glossary';
import type { JobInput } from '@shared/schemas/jobs';

/** A job's status: its name, tone and explanation come from the glossary. */
export const statusWords = JOB_STATUS;

export const layoutWords: Record<JobInput['layout'], string> = { inline: 'Inline', v: 'V', flat: 'Flat (opposed)', other: 'Other' };
export const materialWords: Record<NonNullable<JobInput['blockMaterial']>, string> = { 'cast-iron': 'Cast iron', aluminium: 'Aluminium' };
export const pistonWords: Record<NonNullable<JobInput['pistonType']>, string> = { cast: 'Cast', hypereutectic: 'Hypereutectic', forged: 'Forged' };
export const logisticsWords: Record<JobInput['logistics'], string> = {
  ship: 'I ship the parts to the shop',
  'drop-off': 'I drop the parts off at the shop',
};
export const unitWords: Record<LengthUnit, string> = { in: 'inches', mm: 'millimetres' };

/** A length as the trade writes it: 3 to 4 decimals in inches (a tenth is 0.0001 in), 2 to 3 in millimetres. */
export function formatLength(value: number, unit: LengthUnit): string {
  const [min, max] = unit === 'in' ? [3, 4] : [2, 3];
  return `${new Intl.NumberFormat('en-US', { minimumFractionDigits: min, maximumFractionDigits: max }).format(value)} ${unit}`;
}

/** A signed length difference, e.g. "+0.0300 in". */
export function formatLengthChange(value: number, unit: LengthUnit): string {
  const decimals = unit === 'in' ? 4 : 3;
  return `${new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, signDisplay: 'exceptZero' }).format(value)} ${unit}`;
}

export function formatNumber(value: number, decimals: number): string {
  return new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals }).format(value);
}

export const plural = (count: number, one: string, many = `${one}s`) => `${count} ${count === 1 ? one : many}`;

const countWords: Record<string, [string, string]> = {
  block: ['block', 'blocks'],
  head: ['head', 'heads'],
  crank: ['crank', 'cranks'],
  rotating: ['assembly', 'assemblies'],
};

/** How much of an operation is wanted, in words: "8 cylinders", "2 heads", "once". */
export function quantityText(op: { pricedPer: string; part: string } | undefined, quantity: number): string {
  if (!op) return `× ${quantity}`;
  if (op.pricedPer === 'cylinder') return plural(quantity, 'cylinder');
  if (op.pricedPer === 'job') return quantity === 1 ? 'once' : `${quantity} times`;
  const [one, many] = countWords[op.part] ?? ['part', 'parts'];
  return plural(quantity, one, many);
}

const plainNumber = (value: number, decimals = 3) => new Intl.NumberFormat('en-US', { maximumFractionDigits: decimals }).format(value);

/** A job limit with its unit, by its kind: a length in the job's unit, µm, lbf or N, rev/min, or a balance grade. */
export function formatLimit(value: number, kind: LimitField['kind'], unit: LengthUnit): string {
  switch (kind) {
    case 'length':
      return formatLength(value, unit);
    case 'roughness':
      return `${plainNumber(value)} µm`;
    case 'force':
      return `${plainNumber(value, 1)} ${forceUnitFor(unit)}`;
    case 'speed':
      return `${plainNumber(value, 0)} rev/min`;
    case 'grade':
      return `G ${plainNumber(value, 1)}`;
  }
}

/** The unit a limit is typed in, for its label: "(in)", "(lbf)"; none where the label already names it. */
export function limitUnitSuffix(kind: LimitField['kind'], unit: LengthUnit): string {
  if (kind === 'length') return ` (${unit})`;
  if (kind === 'force') return ` (${forceUnitFor(unit)})`;
  return '';
}

/** What an empty limit means, e.g. "Empty: 0.0005 in — common practice, from memory; the maker’s figure governs". */
export function limitDefaultWords(field: LimitField, unit: LengthUnit): string | undefined {
  if (!field.default) return undefined;
  return `Empty: ${formatLimit(field.default[unit], field.kind, unit)} — ${field.default.source}`;
}

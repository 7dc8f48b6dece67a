import type { InspectionResults } from '@shared/schemas/inspection';
import { formatNumber } from '@client/lib/numbers';

/** What was done to the finish trace, in words; undefined for entered values and for results stored before the choice. */
export function finishFilterWords(filter: NonNullable<InspectionResults['finish']>['filter']): string | undefined {
  if (!filter) return undefined;
  if (filter.kind === 'none') return 'None: the trace taken as a roughness profile already';
  const mm = (value: number) => `${formatNumber(value, 3)} mm`;
  return (
    `Gaussian (ISO 16610-21), cut-off ${filter.cutoffMm} mm, least-squares line removed; ` +
    `${mm(filter.evaluationLengthMm)} evaluated (${filter.samplingLengths} × ${filter.cutoffMm} mm), ` +
    `${mm(filter.trimmedStartMm)} and ${mm(filter.trimmedEndMm)} dropped at the ends; Rk family on the ISO 13565-1 profile`
  );
}

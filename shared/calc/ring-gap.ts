/**
 * Piston ring end gap guidance: gap ≈ factor × bore, the factor being inches
 * of gap per inch of bore (so it is a pure ratio and works the same in
 * millimetres). Common practice (no published source); the ring maker's chart
 * governs.
 */
import { CalculationError, requirePositive } from './errors';

export type RingApplication = 'street' | 'performance' | 'race' | 'boost';

export const RING_APPLICATIONS: readonly RingApplication[] = ['street', 'performance', 'race', 'boost'];

/**
 * Gap per unit of bore: common practice (no published source). Top ring:
 * about 0.004 for street, 0.0045–0.0055 for performance and race, 0.006 and up
 * for boost or nitrous. The second ring runs somewhat larger; this table adds
 * 0.0005 per unit of bore to the top ring's factor.
 */
export const RING_GAP_FACTORS: Readonly<Record<RingApplication, { top: number; second: number }>> = {
  street: { top: 0.004, second: 0.0045 },
  performance: { top: 0.0045, second: 0.005 },
  race: { top: 0.005, second: 0.0055 },
  boost: { top: 0.006, second: 0.0065 },
};

export interface RingGapInput {
  bore: number;
  application: RingApplication;
}

export interface RingGapResult {
  /** In the bore's unit. */
  topRing: number;
  secondRing: number;
  topFactor: number;
  secondFactor: number;
}

export function ringGap(input: RingGapInput): RingGapResult {
  const bore = requirePositive(input.bore, 'bore', 'Bore');
  if (!Object.hasOwn(RING_GAP_FACTORS, input.application)) throw new CalculationError('Choose street, performance, race or boost.', 'application');
  const factors = RING_GAP_FACTORS[input.application];
  return {
    topRing: factors.top * bore,
    secondRing: factors.second * bore,
    topFactor: factors.top,
    secondFactor: factors.second,
  };
}

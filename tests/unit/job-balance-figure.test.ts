import { describe, expect, it } from 'vitest';
import { balanceFigure } from '../../client/features/jobs/components/job-figures';

describe('the balance figure beside the job form', () => {
  it('when the service speed is in, then the permissible specific unbalance is 9549 · G / n, with the declared default grade when none is chosen', () => {
    // ISO 21940-11: e_per = 9549 · G / n; G 2.5 at 6500 rev/min → 9549 × 2.5 / 6500 = 3.6727 g·mm/kg (derived)
    expect(balanceFigure({ balance: { grade: 2.5, serviceRpm: 6500 } })?.specificUnbalanceGmmPerKg).toBeCloseTo(3.6727, 4);
    // common practice default G 6.3 (shared/operation-limits.ts): 9549 × 6.3 / 6000 = 10.02645 g·mm/kg (derived)
    expect(balanceFigure({ balance: { serviceRpm: 6000 } })).toMatchObject({ grade: 6.3, serviceRpm: 6000 });
    expect(balanceFigure({ balance: { serviceRpm: 6000 } })?.specificUnbalanceGmmPerKg).toBeCloseTo(10.02645, 5);
  });

  it('when the speed is missing or not a number, then there is no figure', () => {
    expect(balanceFigure(undefined)).toBeUndefined();
    expect(balanceFigure({ balance: { grade: 2.5 } })).toBeUndefined();
    expect(balanceFigure({ balance: { grade: 2.5, serviceRpm: Number.NaN } })).toBeUndefined();
  });
});

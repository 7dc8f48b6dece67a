import { unit as mathUnit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { MM_PER_INCH, NEWTONS_PER_POUND_FORCE } from '../../shared/calc';
import { findOperation } from '../../shared/catalogue';
import { BALANCE_GRADE_CHOICES, limitGroupOperation, limitGroups, operationLimitFields, type LimitField } from '../../shared/operation-limits';

const declared = limitGroups.flatMap((group) => Object.entries(operationLimitFields[group] as Record<string, LimitField>).map(([key, field]) => ({ path: `${group}.${key}`, field })));

describe('the declared job limits', () => {
  it('when a limit has a default, then it names its source and gives a figure for inches and for millimetres', () => {
    const withDefault = declared.filter(({ field }) => field.default);
    expect(withDefault.length).toBeGreaterThan(0);
    for (const { path, field } of withDefault) {
      expect(field.default!.source.trim(), path).not.toBe('');
      expect(Number.isFinite(field.default!.in) && field.default!.in > 0, path).toBe(true);
      expect(Number.isFinite(field.default!.mm) && field.default!.mm > 0, path).toBe(true);
    }
  });

  it('when a length default is given in both units, then the millimetre figure is the inch figure converted, within 5 % (the mm figures are rounded to the trade’s usual steps)', () => {
    for (const { path, field } of declared.filter(({ field }) => field.default && field.kind === 'length')) {
      // exact by definition: 1 in = 25.4 mm
      const converted = field.default!.in * MM_PER_INCH;
      expect(Math.abs(field.default!.mm - converted) / converted, `${path}: ${field.default!.mm} mm against ${converted} mm`).toBeLessThanOrEqual(0.05);
    }
    for (const { path, field } of declared.filter(({ field }) => field.default && field.kind !== 'length')) {
      // Finishes, grades and speeds are the same figure in either unit system.
      expect(field.default!.mm, path).toBe(field.default!.in);
    }
  });

  it('when a group of limits is declared, then it belongs to an operation of the catalogue, and the grade default is one of the grades offered', () => {
    for (const group of limitGroups) expect(findOperation(limitGroupOperation[group]), group).toBeDefined();
    // ISO 21940-11 grades offered; G 6.3 is the common-practice default for a crankshaft assembly
    expect(BALANCE_GRADE_CHOICES).toContain(operationLimitFields.balance.grade.default.in);
  });

  it('when a spring pressure is converted, then 1 lbf is 4.4482216152605 N (exact by definition: 0.45359237 kg × 9.80665 m/s²)', () => {
    expect(NEWTONS_PER_POUND_FORCE).toBeCloseTo(0.45359237 * 9.80665, 12);
    expect(mathUnit(1, 'lbf').toNumber('N')).toBeCloseTo(NEWTONS_PER_POUND_FORCE, 10);
  });
});

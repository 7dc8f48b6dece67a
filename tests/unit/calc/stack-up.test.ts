import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bearingClearance, deckClearance } from '../../../shared/calc/stack-up';
import { inchesToMm } from '../../../shared/calc/units';
import { expectCalculationError, expectRelativelyNear, expectWithin } from './expectations';

// Invented small-block figures: 9.025 in deck, 3.48 in stroke, 5.7 in rod, 1.56 in compression height.
const stack = { unit: 'in' as const, deckHeight: 9.025, stroke: 3.48, rodLength: 5.7, compressionHeight: 1.56 };

describe('deckClearance', () => {
  it('when the stack is 0.025 in short of the deck, then the piston sits 0.025 in below it and quench adds the gasket', () => {
    const result = deckClearance({ ...stack, gasketThickness: 0.015 });
    expectWithin(result.pistonDeckClearance, 0.025, 1e-12); // derived: 9.025 − (1.74 + 5.7 + 1.56), references.md "Stack-up and bearings"
    expectWithin(result.quench, 0.04, 1e-12); // derived: deck clearance + compressed gasket, references.md "Stack-up and bearings"
    expect(result.quench).toBeGreaterThanOrEqual(0.035); // common practice: 0.035–0.045 in quench for steel rods and a flat top
    expect(result.quench).toBeLessThanOrEqual(0.045); // common practice: 0.035–0.045 in quench for steel rods and a flat top
  });

  it('when the piston stands proud, then the clearance is negative; with no gasket there is no quench', () => {
    const result = deckClearance({ ...stack, deckHeight: 8.995 });
    expectWithin(result.pistonDeckClearance, -0.005, 1e-12); // derived: 8.995 − 9.000
    expect('quench' in result).toBe(false);
  });

  it.each([
    { change: { deckHeight: 0 }, field: 'deckHeight' },
    { change: { stroke: -3 }, field: 'stroke' },
    { change: { rodLength: Number.NaN }, field: 'rodLength' },
    { change: { compressionHeight: 0 }, field: 'compressionHeight' },
    { change: { gasketThickness: -0.01 }, field: 'gasketThickness' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => deckClearance({ ...stack, ...change }), field);
  });

  it('when any stack is taken, then deck clearance + compression height + rod + half-stroke gives back the deck height', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 8, noNaN: true }),
        fc.double({ min: 3, max: 12, noNaN: true }),
        fc.double({ min: 0.5, max: 3, noNaN: true }),
        fc.double({ min: 5, max: 25, noNaN: true }),
        (stroke, rodLength, compressionHeight, deckHeight) => {
          const { pistonDeckClearance } = deckClearance({ unit: 'mm', deckHeight, stroke, rodLength, compressionHeight });
          expectRelativelyNear(pistonDeckClearance + compressionHeight + rodLength + stroke / 2, deckHeight, 1e-12); // derived: the stack-up definition
        },
      ),
    );
  });
});

describe('bearingClearance', () => {
  it('when a 2.6890 in housing takes a 2.4995 in journal and 0.0935 in shells, then the clearance is 0.0025 in, about 0.001 in per inch', () => {
    const result = bearingClearance({ unit: 'in', housingBore: 2.689, journalDiameter: 2.4995, shellWall: 0.0935 });
    expectWithin(result.clearance, 0.0025, 1e-12); // derived: housing − journal − 2 × wall, references.md "Stack-up and bearings"
    expectRelativelyNear(result.clearancePerInchOfJournal, 0.0025 / 2.4995, 1e-9); // derived: clearance ÷ journal
    expectWithin(result.clearancePerInchOfJournal, 0.001, 0.00005); // common practice: about 0.001 in per inch of journal (the bearing maker's figure governs)
  });

  it('when the shells are too thick, then the clearance is negative rather than hidden', () => {
    const result = bearingClearance({ unit: 'mm', housingBore: 60, journalDiameter: 55, shellWall: 2.6 });
    expectWithin(result.clearance, -0.2, 1e-12); // derived: 60 − 55 − 5.2
  });

  it.each([
    { change: { housingBore: 0 }, field: 'housingBore' },
    { change: { journalDiameter: -1 }, field: 'journalDiameter' },
    { change: { journalDiameter: 2.7 }, field: 'journalDiameter' }, // larger than the housing
    { change: { shellWall: 0 }, field: 'shellWall' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => bearingClearance({ unit: 'in', housingBore: 2.6878, journalDiameter: 2.4995, shellWall: 0.0935, ...change }), field);
  });

  it('when every length is converted from inches to millimetres, then the clearance converts and the ratio is unchanged', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 4, noNaN: true }),
        fc.double({ min: 0.05, max: 0.15, noNaN: true }),
        fc.double({ min: -0.002, max: 0.006, noNaN: true }),
        (journalDiameter, shellWall, clearance) => {
          const housingBore = journalDiameter + 2 * shellWall + clearance;
          const inches = bearingClearance({ unit: 'in', housingBore, journalDiameter, shellWall });
          const mm = bearingClearance({
            unit: 'mm',
            housingBore: inchesToMm(housingBore),
            journalDiameter: inchesToMm(journalDiameter),
            shellWall: inchesToMm(shellWall),
          });
          expectWithin(mm.clearance, inchesToMm(inches.clearance), 1e-9); // derived: 1 in = 25.4 mm exactly
          expectWithin(mm.clearancePerInchOfJournal, inches.clearancePerInchOfJournal, 1e-10); // derived: a ratio of lengths has no unit
        },
      ),
    );
  });
});

describe('bearing clearance on a vanishing journal', () => {
  it('refuses a journal so small that the clearance per inch overflows, naming the field (found by the API fuzz test)', () => {
    expectCalculationError(() => bearingClearance({ unit: 'in', housingBore: 2.4, journalDiameter: 5e-324, shellWall: 0.09 }), 'journalDiameter');
  });
});

import { describe, expect, it } from 'vitest';
import { boreSpecFor, evaluateInspection } from '../../shared/calc/inspection-record';
import type { InspectionInput } from '../../shared/schemas/inspection';
import { jobInput } from '../factories';

const pair = (thrust: number, axial: number) => ({ thrust, axial });

describe('evaluateInspection', () => {
  it('when the job gives a piston and a clearance range but no target, then the target is the piston plus the middle of the range', () => {
    // derived: 4.028 + (0.0025 + 0.0035) / 2 = 4.031
    expect(boreSpecFor(jobInput({ targetBore: undefined, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035 }), 'in').targetBore).toBeCloseTo(4.031, 12);
  });

  it('when the record is in millimetres and the spec in inches, then limits are converted exactly before judging', () => {
    const spec = jobInput({ maxTaper: 0.0005, maxOutOfRound: 0.0005, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035 });
    // derived: 1 in = 25.4 mm; 0.0005 in = 0.0127 mm
    expect(boreSpecFor(spec, 'mm').maxTaper).toBeCloseTo(0.0127, 12);
    const mm = (inches: number) => inches * 25.4;
    const cylinder = { top: pair(mm(4.0311), mm(4.0311)), middle: pair(mm(4.031), mm(4.0311)), bottom: pair(mm(4.031), mm(4.031)), piston: mm(4.028) };
    const input: InspectionInput = {
      conditions: { unit: 'mm', gaugeResolution: 0.002, temperatureC: 20, torquePlate: false },
      cylinders: Array.from({ length: 8 }, () => cylinder),
      signedOffBy: 'Test Shop',
      notes: '',
    };
    const result = evaluateInspection(input, spec);
    expect(result.pass).toBe(true);
    // derived: taper 0.0001 in = 0.00254 mm
    expect(result.bores.worst.taper).toBeCloseTo(0.00254, 9);

    const tapered = { ...cylinder, bottom: pair(mm(4.0302), mm(4.031)) };
    const failing = evaluateInspection({ ...input, cylinders: [tapered, ...input.cylinders.slice(1)] }, spec);
    expect(failing.pass).toBe(false);
    // derived: bottom thrust 0.0008 in under the top → taper 0.0009 in and out-of-round 0.0008 in, both over 0.0005 in (0.0127 mm)
    expect(failing.checks.map((c) => [c.what, c.pass, c.allowed])).toEqual([
      ['cylinder 1 taper', false, '0.013 mm'],
      ['cylinder 1 out-of-round', false, '0.013 mm'],
    ]);
  });

  it('when deck, finish and crosshatch are given, then each is judged against the job’s limits', () => {
    const spec = jobInput({ deckFlatnessMax: 0.002, finishRaMaxUm: 0.5, crosshatchMinDeg: 40, crosshatchMaxDeg: 50 });
    const cylinder = { top: pair(4.031, 4.031), middle: pair(4.031, 4.031), bottom: pair(4.031, 4.031) };
    const result = evaluateInspection(
      {
        conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: true },
        cylinders: Array.from({ length: 8 }, () => cylinder),
        deck: { readings: [0.001, 0.003] },
        finish: { mode: 'values', raUm: 0.45 },
        // derived: 2·atan(2·L·f / (π·D·n)) with D = 4.031, n = 200, L = 4, f = 130 → about 45.8°
        crosshatch: { mode: 'settings', spindleRpm: 200, strokeLength: 4, cyclesPerMinute: 130 },
        signedOffBy: 'Test Shop',
        notes: '',
      },
      spec,
    );
    const byWhat = Object.fromEntries(result.checks.map((c) => [c.what, c.pass]));
    expect(byWhat).toEqual({ 'deck out-of-flat': false, 'bore Ra': true, 'crosshatch included angle': true });
    expect(result.crosshatch!.includedAngleDeg).toBeCloseTo((2 * Math.atan((2 * 4 * 130) / (Math.PI * 4.031 * 200)) * 180) / Math.PI, 9);
    expect(result.pass).toBe(false);
  });
});

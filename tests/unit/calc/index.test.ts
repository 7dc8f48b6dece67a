import { describe, it, expect } from 'vitest';
import * as calc from '../../../shared/calc';

describe('shared/calc index', () => {
  it('when the library is imported from its folder, then every topic is exported', () => {
    const expected = [
      'CalculationError',
      'inchesToMm',
      'cubicInchesToCc',
      'microinchesToMicrometres',
      'displacement',
      'compressionRatio',
      'clearanceVolume',
      'machiningEffect',
      'inspectCylinder',
      'inspectBores',
      'boreSize',
      'chooseOversize',
      'crosshatchAngle',
      'crosshatchRate',
      'deckFlatness',
      'deckOutOfFlat',
      'deckFlatnessLimit',
      'ringGap',
      'roughness',
      'amplitudeParameters',
      'materialRatioParameters',
      'materialRatioCurve',
      'dynamicCompression',
      'pistonPosition',
      'balanceTolerance',
      'bobWeight',
      'deckClearance',
      'bearingClearance',
    ];
    for (const name of expected) expect(typeof (calc as Record<string, unknown>)[name]).toBe('function');
  });
});

/**
 * Timing for the two heaviest calculations. Run with:
 *   npm run bench:calc
 * Prints the median of several runs after a warm-up; asserts nothing.
 */
import { type CylinderReadings, inspectBores } from '../../shared/calc/bore';
import { roughness } from '../../shared/calc/roughness';

const RUNS = 15;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

function time(label: string, run: () => unknown): void {
  for (let i = 0; i < 3; i++) run(); // warm-up
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  const fastest = Math.min(...times);
  console.log(`${label}: median ${median(times).toFixed(3)} ms (fastest ${fastest.toFixed(3)} ms, ${RUNS} runs)`);
}

/** A repeatable pseudo-random sequence (a linear congruential generator) so every run times the same data. */
function randomSequence(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

// A plateau-honed-like trace: fine plateau texture with occasional deep valleys, 100,000 points.
const random = randomSequence(42);
const profile = Float64Array.from({ length: 100_000 }, (_, i) => {
  const plateau = 0.3 * Math.sin(i / 7) + 0.2 * (random() - 0.5);
  return random() < 0.05 ? plateau - 2 - 2 * random() : plateau;
});
const profileArray = Array.from(profile);

const cylinders: CylinderReadings[] = Array.from({ length: 16 }, () => {
  const reading = () => 4.03 + random() * 0.0008;
  return {
    top: { thrust: reading(), axial: reading() },
    middle: { thrust: reading(), axial: reading() },
    bottom: { thrust: reading(), axial: reading() },
    piston: 4.0265,
  };
});
const spec = { targetBore: 4.0303, targetTolerance: 0.0003, clearanceMin: 0.0025, clearanceMax: 0.0045, maxTaper: 0.0005, maxOutOfRound: 0.0005 };

time('roughness parameters, 100,000-point profile (plain array)', () => roughness(profileArray, 0.5));
time('roughness parameters, 100,000-point profile (Float64Array)', () => roughness(profile, 0.5));
// 100,000 heights at 0.5 µm span 50 mm; a 0.8 mm cut-off is 1,600 heights, its weighting reaches ±1,600.
time('roughness parameters, 100,000-point profile, Gaussian filter 0.8 mm (with ISO 13565-1 pass)', () =>
  roughness(profile, 0.5, { kind: 'gaussian', cutoffMm: 0.8 }),
);
time('roughness parameters, 100,000-point profile, Gaussian filter 2.5 mm (with ISO 13565-1 pass)', () =>
  roughness(profile, 0.5, { kind: 'gaussian', cutoffMm: 2.5 }),
);
time('bore inspection, 16 cylinders with spec', () => inspectBores({ cylinders, spec }));

/**
 * Surface roughness parameters from a profile: heights in micrometres sampled
 * at equal spacing along the trace.
 *
 * The profile is taken as given (already filtered to a roughness profile if
 * the instrument did so; ISO 13565-1 filtering is a separate step not done
 * here). Heights are measured from the mean line, here the arithmetic mean of
 * the heights (the least-squares line of zero slope); no tilt is removed.
 *
 * Amplitude parameters (ISO 4287 §4.2; ASME B46.1):
 * - Ra = mean |z|, Rq = √(mean z²);
 * - Rz = mean over five equal segments of (highest − lowest) in each.
 *
 * Material-ratio parameters (ISO 13565-2):
 * - the material-ratio curve is the heights sorted from highest to lowest,
 *   sample i (0-based) standing at material ratio 100·(i + ½)/n %;
 * - among the secants joining two curve points round(0.4·n) samples apart
 *   (40 % of material ratio), take the one of least gradient (the first on a
 *   tie); extended to 0 % and 100 % it gives the top and bottom of the core,
 *   and Rk = top − bottom;
 * - Mr1 = share of samples above the top; Mr2 = 100 % − share below the
 *   bottom (a height within 1e-12 of the profile's range of an edge counts
 *   as on the edge, so rounding noise cannot move a sample across it);
 * - A1 = area of the curve above the top (µm·%), A2 = area below the bottom;
 *   Rpk = 2·A1/Mr1 and Rvk = 2·A2/(100 − Mr2), the heights of triangles of
 *   equal area. When Mr1 = 0 there are no peaks above the core and Rpk = 0;
 *   when Mr2 = 100, Rvk = 0.
 *
 * Cost: one O(n) pass for the amplitudes, one sort, one O(n) secant scan.
 */
import { CalculationError, requireFinite, requirePositive } from './errors';

/** The fewest samples accepted: two per Rz segment, four in the 40 % secant. */
export const MIN_PROFILE_POINTS = 10;

export interface AmplitudeParameters {
  /** Arithmetic mean of the heights as given: the mean line. */
  mean: number;
  ra: number;
  rq: number;
  rz: number;
}

/** The Rk construction, for drawing over the material-ratio curve. Heights from the mean line. */
export interface RkConstruction {
  /** Material ratio (%) where the chosen secant starts and ends. */
  secantFrom: number;
  secantTo: number;
  /** Height of the extended secant at 0 % and at 100 %. */
  top: number;
  bottom: number;
  /** Peak and valley areas outside the core, µm·%. */
  a1: number;
  a2: number;
}

export interface MaterialRatioParameters {
  rk: number;
  rpk: number;
  rvk: number;
  /** Percent. */
  mr1: number;
  /** Percent. */
  mr2: number;
  construction: RkConstruction;
}

export interface RoughnessResult extends AmplitudeParameters, MaterialRatioParameters {
  points: number;
  /** Traced length (n − 1) · spacing, µm, when the spacing is given. */
  lengthUm?: number;
}

export interface CurvePoint {
  /** Material ratio, %. */
  mr: number;
  /** Height from the mean line, µm. */
  height: number;
}

function checkProfile(heightsUm: ArrayLike<number>): number {
  if (!heightsUm || typeof heightsUm.length !== 'number' || heightsUm.length < MIN_PROFILE_POINTS) {
    throw new CalculationError(`A profile needs at least ${MIN_PROFILE_POINTS} heights.`, 'heightsUm');
  }
  const n = heightsUm.length;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(heightsUm[i])) {
      throw new CalculationError(`Height number ${i + 1} is not a finite number.`, `heightsUm.${i}`);
    }
  }
  return n;
}

function meanOf(heightsUm: ArrayLike<number>, n: number): number {
  let sum = 0;
  for (let i = 0; i < n; i++) sum += heightsUm[i];
  return sum / n;
}

/** Ra, Rq and Rz about the mean line. */
export function amplitudeParameters(heightsUm: ArrayLike<number>): AmplitudeParameters {
  const n = checkProfile(heightsUm);
  const mean = meanOf(heightsUm, n);
  let absSum = 0;
  let squareSum = 0;
  for (let i = 0; i < n; i++) {
    const z = heightsUm[i] - mean;
    absSum += Math.abs(z);
    squareSum += z * z;
  }

  let rangeSum = 0;
  for (let segment = 0; segment < 5; segment++) {
    const from = Math.floor((segment * n) / 5);
    const to = Math.floor(((segment + 1) * n) / 5);
    let high = -Infinity;
    let low = Infinity;
    for (let i = from; i < to; i++) {
      const z = heightsUm[i];
      if (z > high) high = z;
      if (z < low) low = z;
    }
    rangeSum += high - low;
  }

  return { mean, ra: absSum / n, rq: Math.sqrt(squareSum / n), rz: rangeSum / 5 };
}

/** Heights from the mean line, sorted from highest to lowest (the material-ratio curve). */
function sortedFromMean(heightsUm: ArrayLike<number>, n: number): Float64Array {
  const mean = meanOf(heightsUm, n);
  const sorted = new Float64Array(n);
  for (let i = 0; i < n; i++) sorted[i] = heightsUm[i] - mean;
  sorted.sort();
  sorted.reverse();
  return sorted;
}

/** Rk, Rpk, Rvk, Mr1 and Mr2 (ISO 13565-2) from the least-gradient 40 % secant. */
export function materialRatioParameters(heightsUm: ArrayLike<number>): MaterialRatioParameters {
  const n = checkProfile(heightsUm);
  const z = sortedFromMean(heightsUm, n);
  const ratioAt = (i: number) => (100 * (i + 0.5)) / n;

  // Rounding noise allowance: a hair of the height range. Drops that differ by
  // less count as a tie (the earlier, higher secant is kept), and heights that
  // close to the band's edge count as on it, so no result flips when the
  // profile is rescaled or shifted and its last bits round differently.
  const tieSlack = 1e-12 * (z[0] - z[n - 1]);

  // Least-gradient secant: the smallest drop over a fixed window of samples.
  const window = Math.max(1, Math.round(0.4 * n));
  let start = 0;
  let leastDrop = z[0] - z[window];
  for (let i = 1; i + window < n; i++) {
    const drop = z[i] - z[i + window];
    if (drop < leastDrop - tieSlack) {
      leastDrop = drop;
      start = i;
    }
  }
  const secantFrom = ratioAt(start);
  const secantTo = ratioAt(start + window);
  const slope = -leastDrop / (secantTo - secantFrom); // µm per %
  const top = z[start] - slope * secantFrom;
  const bottom = top + slope * 100;

  const share = 100 / n;
  let peakCount = 0;
  let peakSum = 0;
  let valleyCount = 0;
  let valleySum = 0;
  for (let i = 0; i < n; i++) {
    const height = z[i];
    if (height > top + tieSlack) {
      peakCount++;
      peakSum += height - top;
    } else if (height < bottom - tieSlack) {
      valleyCount++;
      valleySum += bottom - height;
    }
  }
  const mr1 = peakCount * share;
  const mr2 = 100 - valleyCount * share;
  const a1 = peakSum * share;
  const a2 = valleySum * share;

  return {
    rk: top - bottom,
    rpk: peakCount === 0 ? 0 : (2 * a1) / mr1,
    rvk: valleyCount === 0 ? 0 : (2 * a2) / (100 - mr2),
    mr1,
    mr2,
    construction: { secantFrom, secantTo, top, bottom, a1, a2 },
  };
}

/**
 * All roughness parameters of a profile. `spacingUm` (the sample spacing)
 * does not change any parameter here; when given it is checked and the traced
 * length reported.
 */
export function roughness(heightsUm: ArrayLike<number>, spacingUm?: number): RoughnessResult {
  const amplitude = amplitudeParameters(heightsUm);
  const ratio = materialRatioParameters(heightsUm);
  const n = heightsUm.length;
  const result: RoughnessResult = { ...amplitude, ...ratio, points: n };
  if (spacingUm !== undefined) {
    result.lengthUm = (n - 1) * requirePositive(spacingUm, 'spacingUm', 'Sample spacing');
  }
  return result;
}

/**
 * The material-ratio curve thinned to `samples` evenly spaced ratios from
 * 0 % to 100 %, heights from the mean line, for a chart.
 */
export function materialRatioCurve(heightsUm: ArrayLike<number>, samples = 201): CurvePoint[] {
  const n = checkProfile(heightsUm);
  const count = Math.floor(requireFinite(samples, 'samples', 'Number of chart points'));
  if (count < 2) throw new CalculationError('A chart needs at least 2 points.', 'samples');
  const z = sortedFromMean(heightsUm, n);
  const points: CurvePoint[] = [];
  for (let k = 0; k < count; k++) {
    const mr = (100 * k) / (count - 1);
    const index = Math.min(n - 1, Math.floor((mr / 100) * n));
    points.push({ mr, height: z[index] });
  }
  return points;
}

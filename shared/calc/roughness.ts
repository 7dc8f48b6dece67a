/**
 * Surface roughness parameters from a profile: heights in micrometres sampled
 * at equal spacing along the trace.
 *
 * Two filter choices (`RoughnessFilter`):
 * - `none` (the default): the heights are taken to be a roughness profile
 *   already, as many instruments export it. Heights are measured from the
 *   arithmetic mean of the heights (the least-squares line of zero slope); no
 *   tilt is removed and nothing is filtered.
 * - `gaussian` with a cut-off λc: the form is removed by subtracting the
 *   least-squares line, then the ISO 16610-21 Gaussian profile filter gives
 *   the mean line (weighting s(x) = (1/(αλc))·exp(−π(x/(αλc))²),
 *   α = √(ln 2/π), cut off at ±λc where it is below 1e-6 of its peak, its
 *   sampled weights summed to one over the heights present). The roughness
 *   profile is the levelled profile minus that mean line. Ends: at least half
 *   a cut-off is dropped at each end (the filter's run-up and run-out) and
 *   the evaluation length is the largest whole number of sampling lengths
 *   (one sampling length = λc) left, centred; Rz averages the peak-to-valley
 *   of each sampling length. Rk, Rpk, Rvk, Mr1 and Mr2 use the ISO 13565-1
 *   profile instead: the first mean line as above, heights below it set to
 *   it, filtered again; that second mean line is subtracted from the levelled
 *   (unsuppressed) profile. The convolution runs through a fast Fourier
 *   transform, so a 100,000-height trace costs milliseconds whatever λc.
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
 * Cost: one O(n) pass for the amplitudes, one sort, one O(n) secant scan;
 * with the Gaussian filter also three FFTs of the padded trace per pass.
 */
import { CalculationError, requireFinite, requirePositive } from './errors';

/** The fewest samples accepted: two per Rz segment, four in the 40 % secant. */
export const MIN_PROFILE_POINTS = 10;

/** α of the Gaussian weighting function, √(ln 2 / π) ≈ 0.4697 (ISO 16610-21): the mean line transmits 50 % at λc. */
export const GAUSSIAN_ALPHA = Math.sqrt(Math.LN2 / Math.PI);

/**
 * The fewest heights per cut-off the Gaussian filter accepts. Our choice: the
 * weighting function's standard deviation is α·λc/√(2π) ≈ 0.19·λc, so 50
 * heights per cut-off sample it with about nine heights per deviation.
 */
export const MIN_POINTS_PER_CUTOFF = 50;

/** The cut-offs of ISO 4288's series, mm, offered by the forms. */
export const STANDARD_CUTOFFS_MM = [0.08, 0.25, 0.8, 2.5, 8] as const;

/** How the heights are turned into a roughness profile. Cut-off in millimetres. */
export type RoughnessFilter = { kind: 'none' } | { kind: 'gaussian'; cutoffMm: number };

/** What was applied, echoed with the result. Lengths in millimetres. */
export type AppliedFilter =
  | {
      kind: 'none';
      /** Every height is evaluated. */
      evaluatedPoints: number;
      /** The traced length, when the spacing is given. */
      evaluationLengthMm?: number;
      method: string;
    }
  | {
      kind: 'gaussian';
      cutoffMm: number;
      formRemoval: 'least-squares line';
      /** Length dropped before the first and after the last evaluated height. */
      trimmedStartMm: number;
      trimmedEndMm: number;
      /** Whole sampling lengths (of one cut-off each) evaluated. */
      samplingLengths: number;
      /** samplingLengths × cutoff: evaluated heights × spacing, each height standing for one spacing. */
      evaluationLengthMm: number;
      evaluatedPoints: number;
      /** The profile the Rk family is taken from. */
      rkFilter: 'ISO 13565-1 valley suppression';
      method: string;
    };

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
  /** Heights sent (before any end was dropped). */
  points: number;
  /** The filter applied, with the lengths dropped and evaluated. */
  filter: AppliedFilter;
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
  return amplitudeAbout(heightsUm, meanOf(heightsUm, n), 5);
}

/** Ra, Rq and Rz of heights measured from `mean`; Rz over `segments` equal parts. */
function amplitudeAbout(heightsUm: ArrayLike<number>, mean: number, segments: number): AmplitudeParameters {
  const n = heightsUm.length;
  let absSum = 0;
  let squareSum = 0;
  for (let i = 0; i < n; i++) {
    const z = heightsUm[i] - mean;
    absSum += Math.abs(z);
    squareSum += z * z;
  }

  let rangeSum = 0;
  for (let segment = 0; segment < segments; segment++) {
    const from = Math.floor((segment * n) / segments);
    const to = Math.floor(((segment + 1) * n) / segments);
    let high = -Infinity;
    let low = Infinity;
    for (let i = from; i < to; i++) {
      const z = heightsUm[i];
      if (z > high) high = z;
      if (z < low) low = z;
    }
    rangeSum += high - low;
  }

  return { mean, ra: absSum / n, rq: Math.sqrt(squareSum / n), rz: rangeSum / segments };
}

/** Heights from the mean line, sorted from highest to lowest (the material-ratio curve). */
function sortedFromMean(heightsUm: ArrayLike<number>, n: number, mean = meanOf(heightsUm, n)): Float64Array {
  const sorted = new Float64Array(n);
  for (let i = 0; i < n; i++) sorted[i] = heightsUm[i] - mean;
  sorted.sort();
  sorted.reverse();
  return sorted;
}

/** Rk, Rpk, Rvk, Mr1 and Mr2 (ISO 13565-2) from the least-gradient 40 % secant. */
export function materialRatioParameters(heightsUm: ArrayLike<number>): MaterialRatioParameters {
  const n = checkProfile(heightsUm);
  return materialRatioOfCurve(sortedFromMean(heightsUm, n));
}

/** The ISO 13565-2 construction on a material-ratio curve (heights sorted high to low). */
function materialRatioOfCurve(z: Float64Array): MaterialRatioParameters {
  const n = z.length;
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
 * All roughness parameters of a profile. Without a filter (or with
 * `{ kind: 'none' }`) the heights are used as sent and `spacingUm` changes no
 * parameter; when given it is checked and the traced length reported. The
 * Gaussian filter needs the spacing.
 */
export function roughness(heightsUm: ArrayLike<number>, spacingUm?: number, filter: RoughnessFilter = { kind: 'none' }): RoughnessResult {
  if (filter.kind === 'gaussian') return gaussianRoughness(heightsUm, spacingUm, filter.cutoffMm);
  const amplitude = amplitudeParameters(heightsUm);
  const ratio = materialRatioParameters(heightsUm);
  const n = heightsUm.length;
  const applied: AppliedFilter = { kind: 'none', evaluatedPoints: n, method: NONE_METHOD };
  const result: RoughnessResult = { ...amplitude, ...ratio, points: n, filter: applied };
  if (spacingUm !== undefined) {
    result.lengthUm = (n - 1) * requirePositive(spacingUm, 'spacingUm', 'Sample spacing');
    applied.evaluationLengthMm = result.lengthUm / 1000;
  }
  return result;
}

const NONE_METHOD = 'No filter: the heights are taken to be a roughness profile already; no form removed; every height evaluated.';

// --- the Gaussian filter (ISO 16610-21) and valley suppression (ISO 13565-1) ----------------

/** Millimetres as text without float noise: 0.25, 1.6, 0.8125. */
function mm(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/** Where the evaluation lies for n heights at `spacingUm` and a cut-off of `cutoffMm`, in heights. */
function evaluationWindow(n: number, spacingUm: number, cutoffMm: number) {
  const perCutoff = (cutoffMm * 1000) / spacingUm;
  const runUp = Math.ceil(perCutoff / 2 - 1e-9);
  const available = n - 2 * runUp;
  const samplingLengths = Math.floor(available / perCutoff + 1e-9);
  const count = Math.round(samplingLengths * perCutoff);
  const start = runUp + Math.floor((available - count) / 2);
  return { perCutoff, runUp, samplingLengths, count, start };
}

/**
 * Why n heights at `spacingUm` cannot be Gaussian-filtered at `cutoffMm`, or
 * undefined when they can: the trace must hold at least half a cut-off at
 * each end plus one whole cut-off, with at least MIN_POINTS_PER_CUTOFF heights
 * per cut-off. `field` is the request field to show the message beside.
 */
export function gaussianFilterProblem(n: number, spacingUm: number, cutoffMm: number): { field: 'heightsUm' | 'filter.cutoffMm'; message: string } | undefined {
  const window = evaluationWindow(n, spacingUm, cutoffMm);
  if (window.perCutoff < MIN_POINTS_PER_CUTOFF) {
    return {
      field: 'filter.cutoffMm',
      message: `A cut-off of ${mm(cutoffMm)} mm holds only ${Math.floor(window.perCutoff)} heights at ${mm(spacingUm)} µm spacing; the Gaussian filter needs at least ${MIN_POINTS_PER_CUTOFF} per cut-off. Choose a longer cut-off or a trace sampled more finely.`,
    };
  }
  if (window.samplingLengths < 1) {
    const needed = 2 * window.runUp + Math.ceil(window.perCutoff - 1e-9);
    return {
      field: 'heightsUm',
      message: `A cut-off of ${mm(cutoffMm)} mm needs a trace of at least ${mm(((needed - 1) * spacingUm) / 1000)} mm (${needed.toLocaleString('en-US')} heights at ${mm(spacingUm)} µm): half a cut-off dropped at each end and one whole cut-off evaluated. This trace is ${mm(((n - 1) * spacingUm) / 1000)} mm. Send a longer trace or choose a shorter cut-off.`,
    };
  }
  return undefined;
}

/** The heights minus their least-squares line (form removal). */
function levelled(heightsUm: ArrayLike<number>): Float64Array {
  const n = heightsUm.length;
  const middle = (n - 1) / 2;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += heightsUm[i];
  mean /= n;
  let sxz = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    const x = i - middle;
    sxz += x * (heightsUm[i] - mean);
    sxx += x * x;
  }
  const slope = sxx === 0 ? 0 : sxz / sxx;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = heightsUm[i] - mean - slope * (i - middle);
  return out;
}

/** In-place iterative radix-2 complex FFT; length a power of two. Inverse includes the 1/N. */
function fft(re: Float64Array, im: Float64Array, inverse: boolean): void {
  const size = re.length;
  for (let i = 1, j = 0; i < size; i++) {
    let bit = size >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i];
      re[i] = re[j];
      re[j] = t;
      t = im[i];
      im[i] = im[j];
      im[j] = t;
    }
  }
  for (let length = 2; length <= size; length <<= 1) {
    const half = length >> 1;
    const angle = ((inverse ? 2 : -2) * Math.PI) / length;
    for (let k = 0; k < half; k++) {
      const wr = Math.cos(angle * k);
      const wi = Math.sin(angle * k);
      for (let i = k; i < size; i += length) {
        const j = i + half;
        const xr = re[j] * wr - im[j] * wi;
        const xi = re[j] * wi + im[j] * wr;
        re[j] = re[i] - xr;
        im[j] = im[i] - xi;
        re[i] += xr;
        im[i] += xi;
      }
    }
  }
  if (inverse) {
    for (let i = 0; i < size; i++) {
      re[i] /= size;
      im[i] /= size;
    }
  }
}

/**
 * A Gaussian mean-line filter for n heights: the weighting function sampled
 * at the spacing over ±λc, applied by FFT convolution, each output divided by
 * the weights of the heights present (so the ends are not pulled to zero).
 */
function gaussianFilter(n: number, spacingUm: number, cutoffMm: number): (z: Float64Array) => Float64Array {
  const scale = GAUSSIAN_ALPHA * ((cutoffMm * 1000) / spacingUm); // α·λc in heights
  const reach = Math.ceil((cutoffMm * 1000) / spacingUm);
  const width = 2 * reach + 1;
  const weights = new Float64Array(width);
  for (let j = 0; j < width; j++) weights[j] = Math.exp(-Math.PI * ((j - reach) / scale) ** 2);
  const cumulative = new Float64Array(width + 1);
  for (let j = 0; j < width; j++) cumulative[j + 1] = cumulative[j] + weights[j];

  let size = 1;
  while (size < n + width) size <<= 1;
  const kernelRe = new Float64Array(size);
  const kernelIm = new Float64Array(size);
  kernelRe.set(weights);
  fft(kernelRe, kernelIm, false);

  return (z) => {
    const re = new Float64Array(size);
    const im = new Float64Array(size);
    re.set(z);
    fft(re, im, false);
    for (let k = 0; k < size; k++) {
      const a = re[k];
      const b = im[k];
      re[k] = a * kernelRe[k] - b * kernelIm[k];
      im[k] = a * kernelIm[k] + b * kernelRe[k];
    }
    fft(re, im, true);
    const line = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      // Weights j (offset j − reach) that land on a height: 0 ≤ i + j − reach < n.
      const from = Math.max(0, reach - i);
      const to = Math.min(width, n + reach - i);
      line[i] = re[i + reach] / (cumulative[to] - cumulative[from]);
    }
    return line;
  };
}

/** The evaluated parts of the two roughness profiles of a Gaussian-filtered trace. */
export interface RoughnessProfiles {
  /** Levelled heights minus the ISO 16610-21 Gaussian mean line, µm. */
  roughness: Float64Array;
  /** Levelled heights minus the ISO 13565-1 (valley-suppressed) mean line, µm. */
  plateau: Float64Array;
  /** Index of the first evaluated height in the trace. */
  start: number;
  samplingLengths: number;
}

/** The Gaussian and ISO 13565-1 roughness profiles over the evaluation length. Throws when the trace is too short. */
export function roughnessProfiles(heightsUm: ArrayLike<number>, spacingUm: number, cutoffMm: number): RoughnessProfiles {
  const n = checkProfile(heightsUm);
  requirePositive(spacingUm, 'spacingUm', 'Sample spacing');
  requirePositive(cutoffMm, 'filter.cutoffMm', 'Cut-off');
  const problem = gaussianFilterProblem(n, spacingUm, cutoffMm);
  if (problem) throw new CalculationError(problem.message, problem.field);
  const window = evaluationWindow(n, spacingUm, cutoffMm);

  const primary = levelled(heightsUm);
  const filter = gaussianFilter(n, spacingUm, cutoffMm);
  const first = filter(primary);
  // ISO 13565-1: valleys below the first mean line are cut back to it, and the result filtered again.
  const suppressed = new Float64Array(n);
  for (let i = 0; i < n; i++) suppressed[i] = primary[i] < first[i] ? first[i] : primary[i];
  const second = filter(suppressed);

  const roughnessProfile = new Float64Array(window.count);
  const plateau = new Float64Array(window.count);
  for (let k = 0; k < window.count; k++) {
    const i = window.start + k;
    roughnessProfile[k] = primary[i] - first[i];
    plateau[k] = primary[i] - second[i];
  }
  return { roughness: roughnessProfile, plateau, start: window.start, samplingLengths: window.samplingLengths };
}

function gaussianRoughness(heightsUm: ArrayLike<number>, spacingUm: number | undefined, cutoffMm: number): RoughnessResult {
  if (spacingUm === undefined) throw new CalculationError('The Gaussian filter needs the sample spacing.', 'spacingUm');
  const n = heightsUm?.length;
  const profiles = roughnessProfiles(heightsUm, spacingUm, cutoffMm);
  const count = profiles.roughness.length;
  // Heights are measured from the filter's mean line (zero), not re-centred.
  const amplitude = amplitudeAbout(profiles.roughness, 0, profiles.samplingLengths);
  const ratio = materialRatioOfCurve(sortedFromMean(profiles.plateau, count, 0));
  const lengthUm = (n - 1) * spacingUm;
  const trimmedStartMm = (profiles.start * spacingUm) / 1000;
  const trimmedEndMm = ((n - profiles.start - count) * spacingUm) / 1000;
  const evaluationLengthMm = (count * spacingUm) / 1000;
  return {
    ...amplitude,
    ...ratio,
    points: n,
    lengthUm,
    filter: {
      kind: 'gaussian',
      cutoffMm,
      formRemoval: 'least-squares line',
      trimmedStartMm,
      trimmedEndMm,
      samplingLengths: profiles.samplingLengths,
      evaluationLengthMm,
      evaluatedPoints: count,
      rkFilter: 'ISO 13565-1 valley suppression',
      method:
        `Least-squares line removed; ISO 16610-21 Gaussian filter, cut-off ${mm(cutoffMm)} mm; ` +
        `${mm(trimmedStartMm)} mm dropped at the start and ${mm(trimmedEndMm)} mm at the end (at least half a cut-off each); ` +
        `Ra, Rq and Rz over ${profiles.samplingLengths} sampling length${profiles.samplingLengths === 1 ? '' : 's'} (${mm(evaluationLengthMm)} mm); ` +
        'Rk, Rpk, Rvk, Mr1 and Mr2 on the ISO 13565-1 valley-suppressed profile.',
    },
  };
}

/**
 * The material-ratio curve thinned to `samples` evenly spaced ratios from
 * 0 % to 100 %, heights from the mean line, for a chart. The mean line is the
 * arithmetic mean of the heights unless `meanLine` gives it (0 for a filtered
 * profile, whose heights are already measured from the filter's mean line).
 */
export function materialRatioCurve(heightsUm: ArrayLike<number>, samples = 201, meanLine?: number): CurvePoint[] {
  const n = checkProfile(heightsUm);
  const count = Math.floor(requireFinite(samples, 'samples', 'Number of chart points'));
  if (count < 2) throw new CalculationError('A chart needs at least 2 points.', 'samples');
  const z = sortedFromMean(heightsUm, n, meanLine ?? meanOf(heightsUm, n));
  const points: CurvePoint[] = [];
  for (let k = 0; k < count; k++) {
    const mr = (100 * k) / (count - 1);
    const index = Math.min(n - 1, Math.floor((mr / 100) * n));
    points.push({ mr, height: z[index] });
  }
  return points;
}

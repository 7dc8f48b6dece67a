/**
 * A synthetic plateau-honed-like profile for trying the roughness calculator:
 * a flat plateau with fine texture, cut by occasional deep, rounded valleys
 * (the oil-holding scratches a plateau hone leaves) and a few small peaks.
 * Deterministic: the same seed always gives the same heights. It is made up,
 * not measured, and the screen says so.
 */

export const SYNTHETIC_SPACING_UM = 0.5;
export const SYNTHETIC_POINTS = 8_000;

/** mulberry32: a small, fast, seeded pseudo-random generator in [0, 1). */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Heights in micrometres at SYNTHETIC_SPACING_UM, SYNTHETIC_POINTS long. */
export function syntheticPlateauProfile(points = SYNTHETIC_POINTS, seed = 20_240_611): number[] {
  const random = seededRandom(seed);
  const heights = new Array<number>(points);
  // Plateau texture: smoothed noise, about 0.25 µm standard deviation.
  let smooth = 0;
  for (let i = 0; i < points; i++) {
    smooth = 0.7 * smooth + 0.3 * (random() - 0.5);
    heights[i] = 2 * smooth;
  }
  // Valleys: about one every 200 samples (100 µm), 1.5–4 µm deep, 10–30 samples wide, rounded.
  let at = Math.floor(random() * 80);
  while (at < points) {
    const width = 10 + Math.floor(random() * 21);
    const depth = 1.5 + random() * 2.5;
    for (let k = 0; k < width && at + k < points; k++) {
      const x = (2 * k) / (width - 1) - 1; // −1 … 1 across the valley
      heights[at + k] -= depth * (1 - x * x);
    }
    at += width + 60 + Math.floor(random() * 240);
  }
  // A few small peaks left standing above the plateau.
  for (let p = 0; p < points / 800; p++) {
    const centre = Math.floor(random() * points);
    const height = 0.4 + random() * 0.6;
    for (let k = -3; k <= 3; k++) {
      const i = centre + k;
      if (i >= 0 && i < points) heights[i] += height * (1 - Math.abs(k) / 4);
    }
  }
  return heights.map((h) => Math.round(h * 10_000) / 10_000);
}

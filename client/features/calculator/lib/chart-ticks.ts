/**
 * Round axis ticks for the charts: steps of 1, 2, 2.5 or 5 times a power of
 * ten, never finer than `minStep` (a tenth, 0.0001 in, on a bore chart), and
 * a domain that starts and ends on a tick.
 */
export function niceTicks(low: number, high: number, target = 5, minStep = 0): { domain: [number, number]; ticks: number[] } {
  const span = high - low || Math.abs(high) || 1;
  const base = 10 ** Math.floor(Math.log10(span / target));
  let step = base * 10;
  for (const multiple of [1, 2, 2.5, 5, 10]) {
    if (span / (base * multiple) <= target) {
      step = base * multiple;
      break;
    }
  }
  step = Math.max(step, minStep);
  const start = Math.floor(low / step + 1e-9) * step;
  const end = Math.ceil(high / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let k = 0; start + k * step <= end + step * 1e-6; k++) ticks.push(Number((start + k * step).toPrecision(12)));
  return { domain: [ticks[0], ticks[ticks.length - 1]], ticks };
}

import { lazy, memo, Suspense } from 'react';
import type { CurvePoint, MaterialRatioParameters } from '@shared/calc';
import { ChartLegend } from '@client/components/ui/chart-legend';
import { formatNumber } from '@client/lib/numbers';
import { BAND, CURVE, SECANT, TRIANGLE } from './material-ratio-colours';

// The plot needs the charting library: it loads with the first curve shown, in a placeholder of its own height.
const MaterialRatioPlot = lazy(() => import('./material-ratio-plot').then((m) => ({ default: m.MaterialRatioPlot })));
const PLOT_HEIGHT = 360;

/**
 * The material-ratio curve (heights sorted from highest to lowest against the
 * share of material at or above them) with the Rk construction of ISO 13565-2
 * drawn over it: the least-gradient 40 % secant extended to 0 % and 100 %, the
 * core band between its ends, the Mr1 and Mr2 marks, and the Rpk and Rvk
 * triangles of equal area. A caption and a hidden table describe the same.
 */
export const MaterialRatioChart = memo(function MaterialRatioChart({ curve, parameters }: { curve: CurvePoint[]; parameters: MaterialRatioParameters }) {
  const { construction: c, mr1, mr2 } = parameters;
  const summaryRows = [0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100].map((mr) => curve.reduce((best, p) => (Math.abs(p.mr - mr) < Math.abs(best.mr - mr) ? p : best)));

  return (
    <figure aria-labelledby="material-ratio-caption" className="flex flex-col gap-2">
      <ChartLegend
        items={[
          { label: 'Material-ratio curve', colour: CURVE },
          { label: '40 % secant, extended to 0 % and 100 %', colour: SECANT, dashed: true, weight: 1.5 },
          { label: 'Core band (Rk)', colour: BAND, band: true },
          { label: 'Rpk and Rvk triangles', colour: TRIANGLE, weight: 1.5 },
        ]}
      />
      <div aria-hidden="true" data-testid="material-ratio-chart">
        <Suspense fallback={<div style={{ height: PLOT_HEIGHT }} />}>
          <MaterialRatioPlot curve={curve} parameters={parameters} height={PLOT_HEIGHT} />
        </Suspense>
      </div>
      <figcaption id="material-ratio-caption" className="text-sm text-ink-soft">
        Material-ratio curve with the Rk construction. The dashed red line is the flattest secant spanning 40 % of material ratio
        (drawn thick between {formatNumber(c.secantFrom, 1)} % and {formatNumber(c.secantTo, 1)} %), extended to 0 % and 100 %; the
        shaded band between its ends, from {formatNumber(c.bottom, 3)} to {formatNumber(c.top, 3)} µm, is the core (Rk). The curve
        leaves the band at Mr1 = {formatNumber(mr1, 1)} % and Mr2 = {formatNumber(mr2, 1)} %; the brown triangles have the same areas
        as the peaks above and the valleys below the core, and their heights are Rpk and Rvk.
      </figcaption>
      <table className="sr-only">
        <caption>Material-ratio curve, height from the mean line at every tenth of material ratio</caption>
        <thead>
          <tr>
            <th scope="col">Material ratio (%)</th>
            <th scope="col">Height (µm)</th>
          </tr>
        </thead>
        <tbody>
          {summaryRows.map((point) => (
            <tr key={point.mr}>
              <td>{formatNumber(point.mr, 0)}</td>
              <td>{formatNumber(point.height, 3)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
});

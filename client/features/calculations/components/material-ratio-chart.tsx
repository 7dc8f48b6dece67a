import { memo } from 'react';
import { CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { CurvePoint, MaterialRatioParameters } from '@shared/calc';
import { ChartLegend } from '@client/components/ui/chart-legend';
import { formatNumber, niceTicks } from '@client/lib/numbers';

const CURVE = '#1d4e6b'; // slate-700
const SECANT = '#a3261b'; // fail red, for the construction line
const TRIANGLE = '#975c12'; // brass-600
const BAND = '#f4e2c2'; // brass-100
const INK_SOFT = '#3b4a55';

/**
 * The material-ratio curve (heights sorted from highest to lowest against the
 * share of material at or above them) with the Rk construction of ISO 13565-2
 * drawn over it: the least-gradient 40 % secant extended to 0 % and 100 %, the
 * core band between its ends, the Mr1 and Mr2 marks, and the Rpk and Rvk
 * triangles of equal area. A caption and a hidden table describe the same.
 */
export const MaterialRatioChart = memo(function MaterialRatioChart({ curve, parameters }: { curve: CurvePoint[]; parameters: MaterialRatioParameters }) {
  const { construction: c, mr1, mr2, rpk, rvk } = parameters;
  const slope = (c.bottom - c.top) / 100;
  const at = (mr: number) => c.top + slope * mr;
  const extended = [
    { mr: 0, height: c.top },
    { mr: 100, height: c.bottom },
  ];
  const chosen = [
    { mr: c.secantFrom, height: at(c.secantFrom) },
    { mr: c.secantTo, height: at(c.secantTo) },
  ];
  const peakTriangle = [
    { mr: 0, height: c.top },
    { mr: 0, height: c.top + rpk },
    { mr: mr1, height: c.top },
  ];
  const valleyTriangle = [
    { mr: mr2, height: c.bottom },
    { mr: 100, height: c.bottom - rvk },
    { mr: 100, height: c.bottom },
  ];
  const heights = curve.map((point) => point.height).concat([c.top + rpk, c.bottom - rvk]);
  const low = Math.min(...heights);
  const high = Math.max(...heights);
  const axis = niceTicks(low, high, 6);
  const tickDecimals = axis.ticks.some((tick) => !Number.isInteger(Number(tick.toFixed(6)))) ? 1 : 0;
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
        <LineChart
          responsive
          accessibilityLayer={false}
          style={{ width: '100%', height: 360 }}
          margin={{ top: 20, right: 20, bottom: 28, left: 12 }}
        >
          <CartesianGrid stroke="#d8e3ea" />
          <XAxis
            type="number"
            dataKey="mr"
            domain={[0, 100]}
            ticks={[0, 20, 40, 60, 80, 100]}
            tick={{ fill: INK_SOFT, fontSize: 12 }}
            label={{ value: 'Material ratio (%)', position: 'insideBottom', offset: -16, fill: INK_SOFT, fontSize: 12 }}
          />
          <YAxis
            type="number"
            dataKey="height"
            domain={axis.domain}
            ticks={axis.ticks}
            tickFormatter={(value: number) => formatNumber(value, tickDecimals)}
            tick={{ fill: INK_SOFT, fontSize: 12 }}
            width={56}
            label={{ value: 'Height (µm)', angle: -90, position: 'insideLeft', offset: 4, fill: INK_SOFT, fontSize: 12 }}
          />
          <ReferenceArea y1={c.bottom} y2={c.top} x1={0} x2={100} fill={BAND} fillOpacity={0.7} stroke="none" ifOverflow="extendDomain" />
          <ReferenceLine x={mr1} stroke={INK_SOFT} strokeDasharray="3 3" label={{ value: 'Mr1', position: 'top', fill: INK_SOFT, fontSize: 12 }} />
          <ReferenceLine x={mr2} stroke={INK_SOFT} strokeDasharray="3 3" label={{ value: 'Mr2', position: 'top', fill: INK_SOFT, fontSize: 12 }} />
          <Line data={curve} dataKey="height" name="Material-ratio curve" stroke={CURVE} strokeWidth={2.5} dot={false} activeDot={false} isAnimationActive={false} />
          <Line
            data={extended}
            dataKey="height"
            name="40 % secant, extended"
            stroke={SECANT}
            strokeWidth={1.5}
            strokeDasharray="6 4"
            dot={false}
            activeDot={false}
            isAnimationActive={false}
          />
          <Line data={chosen} dataKey="height" name="Chosen 40 % span" stroke={SECANT} strokeWidth={4} dot={false} activeDot={false} isAnimationActive={false} legendType="none" />
          <Line data={peakTriangle} dataKey="height" name="Rpk and Rvk triangles" stroke={TRIANGLE} strokeWidth={1.5} dot={false} activeDot={false} isAnimationActive={false} />
          <Line data={valleyTriangle} dataKey="height" name="Rvk triangle" stroke={TRIANGLE} strokeWidth={1.5} dot={false} activeDot={false} isAnimationActive={false} legendType="none" />
        </LineChart>
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

import { CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { CurvePoint, MaterialRatioParameters } from '@shared/calc';
import { formatNumber, niceTicks } from '@client/lib/numbers';
import { BAND, CURVE, INK_SOFT, SECANT, TRIANGLE } from './material-ratio-colours';

/** The drawn part of MaterialRatioChart, in its own chunk with the charting library. */
export function MaterialRatioPlot({ curve, parameters, height }: { curve: CurvePoint[]; parameters: MaterialRatioParameters; height: number }) {
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
  return (
    <LineChart
      responsive
      accessibilityLayer={false}
      style={{ width: '100%', height }}
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
  );
}

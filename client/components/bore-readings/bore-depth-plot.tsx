import { CartesianGrid, Line, LineChart, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { LengthUnit } from '@shared/calc';
import { LENGTH_DECIMALS, formatNumber, type niceTicks } from '@client/lib/numbers';
import { AXIAL_COLOUR, TARGET_COLOUR, THRUST_COLOUR } from './bore-depth-colours';

export interface BoreDepthPlotProps {
  depths: Array<{ depth: string; thrust: number; axial: number }>;
  unit: LengthUnit;
  axis: ReturnType<typeof niceTicks>;
  targetBore?: number;
  showThrust: boolean;
  showAxial: boolean;
  height: number;
}

/** The drawn part of BoreDepthChart, in its own chunk with the charting library. */
export function BoreDepthPlot({ depths, unit, axis, targetBore, showThrust, showAxial, height }: BoreDepthPlotProps) {
  const decimals = LENGTH_DECIMALS[unit];
  return (
    <LineChart
      layout="vertical"
      data={depths}
      responsive
      accessibilityLayer={false}
      style={{ width: '100%', height }}
      margin={{ top: 10, right: 24, bottom: 24, left: 8 }}
    >
      <CartesianGrid stroke="#d8e3ea" />
      <XAxis
        type="number"
        domain={axis.domain}
        ticks={axis.ticks}
        tickFormatter={(value: number) => formatNumber(value, decimals)}
        tick={{ fill: '#3b4a55', fontSize: 12 }}
        label={{ value: `Diameter (${unit})`, position: 'insideBottom', offset: -14, fill: '#3b4a55', fontSize: 12 }}
      />
      <YAxis type="category" dataKey="depth" width={64} tick={{ fill: '#3b4a55', fontSize: 12 }} />
      {targetBore !== undefined && <ReferenceLine x={targetBore} stroke={TARGET_COLOUR} strokeWidth={1.5} strokeDasharray="5 3" />}
      {showThrust && (
        <Line dataKey="thrust" name="Thrust" stroke={THRUST_COLOUR} strokeWidth={2.5} dot={{ r: 4, fill: THRUST_COLOUR }} activeDot={false} isAnimationActive={false} />
      )}
      {showAxial && (
        <Line
          dataKey="axial"
          name="Axial (along the crank)"
          stroke={AXIAL_COLOUR}
          strokeWidth={2.5}
          strokeDasharray="6 4"
          dot={{ r: 4, fill: AXIAL_COLOUR }}
          activeDot={false}
          isAnimationActive={false}
        />
      )}
    </LineChart>
  );
}

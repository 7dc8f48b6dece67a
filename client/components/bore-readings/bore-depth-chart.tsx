import { useId, type ReactNode } from 'react';
import { CartesianGrid, Line, LineChart, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { CylinderReadings, LengthUnit } from '@shared/calc';
import { ChartLegend } from '@client/components/ui/chart-legend';
import { DEPTHS } from '@client/lib/bore-readings';
import { cn } from '@client/lib/cn';
import { LENGTH_DECIMALS, formatLength, formatNumber, niceTicks } from '@client/lib/numbers';

const DEPTH_WORDS = { top: 'Top', middle: 'Middle', bottom: 'Bottom' } as const;
const THRUST_COLOUR = '#1d4e6b'; // slate-700
const AXIAL_COLOUR = '#975c12'; // brass-600
const TARGET_COLOUR = '#1e6b3a'; // pass green

export type ChartDirections = 'both' | 'thrust' | 'axial';

export interface BoreDepthChartProps {
  readings: CylinderReadings;
  unit: LengthUnit;
  /** One-based, for the caption and the table of readings. */
  cylinderNumber: number;
  targetBore?: number;
  directions?: ChartDirections;
  /** Pickers shown above the chart, inside the figure. */
  controls?: ReactNode;
  /** The figure's caption, which also names it. */
  caption: ReactNode;
  testId: string;
  className?: string;
}

/**
 * Bore diameter against depth for one cylinder, one line per direction, depth
 * running down the chart as it does down the bore. The figure carries a text
 * caption and a table of the readings for anyone who cannot see the chart.
 */
export function BoreDepthChart({ readings, unit, cylinderNumber, targetBore, directions = 'both', controls, caption, testId, className }: BoreDepthChartProps) {
  const captionId = useId();
  const showThrust = directions !== 'axial';
  const showAxial = directions !== 'thrust';
  const depths = DEPTHS.map((depth) => ({ depth: DEPTH_WORDS[depth], thrust: readings[depth].thrust, axial: readings[depth].axial }));
  const values = depths
    .flatMap((row) => [...(showThrust ? [row.thrust] : []), ...(showAxial ? [row.axial] : [])])
    .concat(targetBore === undefined ? [] : [targetBore]);
  const low = Math.min(...values);
  const high = Math.max(...values);
  // Leave room either side; at least a few tenths (or a few hundredths of a millimetre) so a perfect bore still reads.
  const pad = Math.max((high - low) * 0.25, unit === 'in' ? 0.0003 : 0.008);
  const decimals = LENGTH_DECIMALS[unit];
  const axis = niceTicks(low - pad, high + pad, 5, unit === 'in' ? 0.0001 : 0.001);

  return (
    <figure aria-labelledby={captionId} className={cn('flex flex-col', className)}>
      {controls}
      <ChartLegend
        items={[
          ...(showThrust ? [{ label: 'Thrust', colour: THRUST_COLOUR }] : []),
          ...(showAxial ? [{ label: 'Axial (along the crank)', colour: AXIAL_COLOUR, dashed: true }] : []),
          ...(targetBore === undefined ? [] : [{ label: 'Target bore', colour: TARGET_COLOUR, dashed: true, weight: 1.5 }]),
        ]}
      />
      <div aria-hidden="true" data-testid={testId}>
        <LineChart
          layout="vertical"
          data={depths}
          responsive
          accessibilityLayer={false}
          style={{ width: '100%', height: 240 }}
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
      </div>
      <figcaption id={captionId} className="text-sm text-ink-soft">
        {caption}
      </figcaption>
      <table className="sr-only">
        <caption>Cylinder {cylinderNumber} readings by depth</caption>
        <thead>
          <tr>
            <th scope="col">Depth</th>
            <th scope="col">Thrust</th>
            <th scope="col">Axial</th>
          </tr>
        </thead>
        <tbody>
          {depths.map((row) => (
            <tr key={row.depth}>
              <th scope="row">{row.depth}</th>
              <td>{formatLength(row.thrust, unit)}</td>
              <td>{formatLength(row.axial, unit)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}

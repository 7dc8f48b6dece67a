import { CartesianGrid, Line, LineChart, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { CylinderReadings, LengthUnit } from '@shared/calc';
import { niceTicks } from '@client/lib/numbers';
import { LENGTH_DECIMALS, formatLength, formatNumber } from '@client/lib/numbers';
import { ChartLegend } from './calculator-parts';

const DEPTH_WORDS = { top: 'Top', middle: 'Middle', bottom: 'Bottom' } as const;
const THRUST_COLOUR = '#1d4e6b'; // slate-700
const AXIAL_COLOUR = '#975c12'; // brass-600
const TARGET_COLOUR = '#1e6b3a'; // pass green

/**
 * Bore diameter against depth for one cylinder, one line per direction, depth
 * running down the chart as it does down the bore. The figure carries a text
 * summary and a table of the readings for anyone who cannot see the chart.
 */
export function BoreDepthChart({
  readings,
  unit,
  cylinderNumber,
  targetBore,
}: {
  readings: CylinderReadings;
  unit: LengthUnit;
  cylinderNumber: number;
  targetBore?: number;
}) {
  const depths = (['top', 'middle', 'bottom'] as const).map((depth) => ({
    depth: DEPTH_WORDS[depth],
    thrust: readings[depth].thrust,
    axial: readings[depth].axial,
  }));
  const all = depths.flatMap((row) => [row.thrust, row.axial]).concat(targetBore === undefined ? [] : [targetBore]);
  const low = Math.min(...all);
  const high = Math.max(...all);
  // Leave room either side; at least a few tenths (or a few hundredths of a millimetre) so a perfect bore still reads.
  const pad = Math.max((high - low) * 0.25, unit === 'in' ? 0.0003 : 0.008);
  const decimals = LENGTH_DECIMALS[unit];
  const axis = niceTicks(low - pad, high + pad, 5, unit === 'in' ? 0.0001 : 0.001);
  const captionId = `bore-chart-caption-${cylinderNumber}`;

  return (
    <figure aria-labelledby={captionId} className="flex flex-col gap-2">
      <ChartLegend
        items={[
          { label: 'Thrust', colour: THRUST_COLOUR },
          { label: 'Axial (along the crank)', colour: AXIAL_COLOUR, dashed: true },
          ...(targetBore === undefined ? [] : [{ label: 'Target bore', colour: TARGET_COLOUR, dashed: true, weight: 1.5 }]),
        ]}
      />
      <div aria-hidden="true" data-testid="bore-depth-chart">
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
          {targetBore !== undefined && (
            <ReferenceLine x={targetBore} stroke={TARGET_COLOUR} strokeWidth={1.5} strokeDasharray="5 3" />
          )}
          <Line dataKey="thrust" name="Thrust" stroke={THRUST_COLOUR} strokeWidth={2.5} dot={{ r: 4, fill: THRUST_COLOUR }} activeDot={false} isAnimationActive={false} />
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
        </LineChart>
      </div>
      <figcaption id={captionId} className="text-sm text-ink-soft">
        Cylinder {cylinderNumber}: diameter at each depth, thrust and axial. A straight vertical line is a bore without taper; a gap
        between the two lines at a depth is out-of-round.
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

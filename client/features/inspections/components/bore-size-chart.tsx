import { useId, useState } from 'react';
import { CartesianGrid, Line, LineChart, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { CylinderReadings, LengthUnit } from '@shared/calc';
import { SegmentedControl } from '@client/components/ui/segmented-control';
import { SelectField } from '@client/components/ui/select-field';
import { LENGTH_DECIMALS, formatLength, formatNumber, niceTicks } from '@client/lib/numbers';

const DEPTH_WORDS = { top: 'Top', middle: 'Middle', bottom: 'Bottom' } as const;
const THRUST_COLOUR = '#1d4e6b';
const AXIAL_COLOUR = '#975c12';
const TARGET_COLOUR = '#1e6b3a';

type Directions = 'both' | 'thrust' | 'axial';

function Legend({ items }: { items: Array<{ label: string; colour: string; dashed?: boolean }> }) {
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-1 text-sm text-ink" aria-hidden="true">
      {items.map((item) => (
        <li key={item.label} className="flex items-center gap-2">
          <svg width="28" height="12" viewBox="0 0 28 12" className="shrink-0">
            <line x1="1" y1="6" x2="27" y2="6" stroke={item.colour} strokeWidth={2.5} strokeDasharray={item.dashed ? '5 3' : undefined} />
          </svg>
          {item.label}
        </li>
      ))}
    </ul>
  );
}

/**
 * Bore size against depth, one cylinder at a time, with a picker for the
 * cylinder and the direction. Depth runs down the chart as it does down the
 * bore. A caption and a table of the readings say the same for anyone who
 * cannot see the chart.
 */
export function BoreSizeChart({ cylinders, unit, targetBore }: { cylinders: CylinderReadings[]; unit: LengthUnit; targetBore?: number }) {
  const [index, setIndex] = useState(0);
  const [directions, setDirections] = useState<Directions>('both');
  const captionId = useId();
  const readings = cylinders[Math.min(index, cylinders.length - 1)];
  if (!readings) return null;
  const number = Math.min(index, cylinders.length - 1) + 1;
  const showThrust = directions !== 'axial';
  const showAxial = directions !== 'thrust';

  const depths = (['top', 'middle', 'bottom'] as const).map((depth) => ({ depth: DEPTH_WORDS[depth], thrust: readings[depth].thrust, axial: readings[depth].axial }));
  const values = depths.flatMap((row) => [...(showThrust ? [row.thrust] : []), ...(showAxial ? [row.axial] : [])]).concat(targetBore === undefined ? [] : [targetBore]);
  const low = Math.min(...values);
  const high = Math.max(...values);
  const pad = Math.max((high - low) * 0.25, unit === 'in' ? 0.0003 : 0.008);
  const decimals = LENGTH_DECIMALS[unit];
  const axis = niceTicks(low - pad, high + pad, 5, unit === 'in' ? 0.0001 : 0.001);

  return (
    <figure aria-labelledby={captionId} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-4">
        <SelectField
          label="Cylinder to chart"
          value={String(number)}
          onChange={(event) => setIndex(Number(event.target.value) - 1)}
          options={cylinders.map((_, i) => ({ value: String(i + 1), label: `Cylinder ${i + 1}` }))}
          className="w-44"
        />
        <div className="flex flex-col gap-1">
          <span aria-hidden className="text-sm font-semibold text-ink">
            Direction
          </span>
          <SegmentedControl<Directions>
            label="Direction to chart"
            options={[
              { value: 'both', label: 'Both' },
              { value: 'thrust', label: 'Thrust' },
              { value: 'axial', label: 'Axial' },
            ]}
            value={directions}
            onChange={setDirections}
          />
        </div>
      </div>
      <Legend
        items={[
          ...(showThrust ? [{ label: 'Thrust', colour: THRUST_COLOUR }] : []),
          ...(showAxial ? [{ label: 'Axial (along the crank)', colour: AXIAL_COLOUR, dashed: true }] : []),
          ...(targetBore === undefined ? [] : [{ label: 'Target bore', colour: TARGET_COLOUR, dashed: true }]),
        ]}
      />
      <div aria-hidden="true" data-testid="bore-size-chart">
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
        Cylinder {number}: bore diameter at the top, middle and bottom of ring travel
        {directions === 'both' ? ', thrust and axial' : `, ${directions} only`}. A straight vertical line is a bore without taper; a gap between
        the two lines at one depth is out-of-round.
      </figcaption>
      <table className="sr-only">
        <caption>Cylinder {number} readings by depth</caption>
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

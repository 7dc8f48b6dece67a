import { lazy, Suspense, useId, type ReactNode } from 'react';
import type { CylinderReadings, LengthUnit } from '@shared/calc';
import { ChartLegend } from '@client/components/ui/chart-legend';
import { DEPTHS } from '@client/lib/bore-readings';
import { cn } from '@client/lib/cn';
import { formatLength, niceTicks } from '@client/lib/numbers';
import { AXIAL_COLOUR, TARGET_COLOUR, THRUST_COLOUR } from './bore-depth-colours';

// The plot itself needs the charting library (about 90 KB gzipped): it loads with the first chart shown, in a
// placeholder of the plot's own height so nothing moves when it arrives. Caption, key and table need no library.
const BoreDepthPlot = lazy(() => import('./bore-depth-plot').then((m) => ({ default: m.BoreDepthPlot })));
const PLOT_HEIGHT = 240;

const DEPTH_WORDS = { top: 'Top', middle: 'Middle', bottom: 'Bottom' } as const;

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
        <Suspense fallback={<div style={{ height: PLOT_HEIGHT }} />}>
          <BoreDepthPlot depths={depths} unit={unit} axis={axis} targetBore={targetBore} showThrust={showThrust} showAxial={showAxial} height={PLOT_HEIGHT} />
        </Suspense>
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

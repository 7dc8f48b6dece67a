import { useState } from 'react';
import type { CylinderReadings, LengthUnit } from '@shared/calc';
import { BoreDepthChart, type ChartDirections } from '@client/components/bore-readings/bore-depth-chart';
import { SegmentedControl } from '@client/components/ui/segmented-control';
import { SelectField } from '@client/components/ui/select-field';

/**
 * Bore size against depth, one cylinder at a time, with a picker for the
 * cylinder and the direction. Depth runs down the chart as it does down the
 * bore. A caption and a table of the readings say the same for anyone who
 * cannot see the chart.
 */
export function BoreSizeChart({ cylinders, unit, targetBore }: { cylinders: CylinderReadings[]; unit: LengthUnit; targetBore?: number }) {
  const [index, setIndex] = useState(0);
  const [directions, setDirections] = useState<ChartDirections>('both');
  const readings = cylinders[Math.min(index, cylinders.length - 1)];
  if (!readings) return null;
  const number = Math.min(index, cylinders.length - 1) + 1;

  return (
    <BoreDepthChart
      readings={readings}
      unit={unit}
      cylinderNumber={number}
      targetBore={targetBore}
      directions={directions}
      testId="bore-size-chart"
      className="gap-3"
      controls={
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
            <SegmentedControl<ChartDirections>
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
      }
      caption={
        <>
          Cylinder {number}: bore diameter at the top, middle and bottom of ring travel
          {directions === 'both' ? ', thrust and axial' : `, ${directions} only`}. A straight vertical line is a bore without taper; a gap between
          the two lines at one depth is out-of-round.
        </>
      }
    />
  );
}

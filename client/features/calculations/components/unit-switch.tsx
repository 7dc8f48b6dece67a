import type { LengthUnit } from '@shared/calc';
import { SegmentedControl } from '@client/components/ui/segmented-control';

const options = [
  { value: 'in', label: 'Inches' },
  { value: 'mm', label: 'Millimetres' },
] as const;

/** The page's inch/millimetre switch, kept in view while scrolling. */
export function UnitSwitch({ unit, onChange }: { unit: LengthUnit; onChange: (unit: LengthUnit) => void }) {
  return (
    <div className="sticky top-0 z-10 -mx-4 border-b border-slate-200 bg-paper/95 px-4 py-2 backdrop-blur">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1">
        <span className="text-sm font-semibold text-ink">
          Lengths in
        </span>
        <SegmentedControl label="Length unit" options={options} value={unit} onChange={onChange} />
        <span className="text-sm text-ink-soft">
          1 in = 25.4 mm exactly. Switching converts what you have typed. Inches show to a tenth (0.0001 in), millimetres to 0.001 mm.
        </span>
      </div>
    </div>
  );
}

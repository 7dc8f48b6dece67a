export interface LegendItem {
  label: string;
  colour: string;
  dashed?: boolean;
  /** Line thickness in pixels. */
  weight?: number;
  /** Draw a filled band instead of a line. */
  band?: boolean;
}

/** A chart key in plain HTML, in the order given, so it reads well and never overlaps the plot. */
export function ChartLegend({ items }: { items: LegendItem[] }) {
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-1 text-sm text-ink" aria-hidden="true">
      {items.map((item) => (
        <li key={item.label} className="flex items-center gap-2">
          <svg width="28" height="12" viewBox="0 0 28 12" className="shrink-0">
            {item.band ? (
              <rect x="0" y="1" width="28" height="10" fill={item.colour} />
            ) : (
              <line
                x1="1"
                y1="6"
                x2="27"
                y2="6"
                stroke={item.colour}
                strokeWidth={item.weight ?? 2.5}
                strokeDasharray={item.dashed ? '5 3' : undefined}
              />
            )}
          </svg>
          {item.label}
        </li>
      ))}
    </ul>
  );
}

import { OperationSection, ReadingTable, Reading, RowCount, columnsUnder, numbered, rowCount, unitShort, type SectionContext } from './section-kit';

const JOURNAL_COLUMNS = [
  { key: 'front.vertical', label: 'Front, vertical' },
  { key: 'front.horizontal', label: 'Front, horizontal' },
  { key: 'rear.vertical', label: 'Rear, vertical' },
  { key: 'rear.horizontal', label: 'Rear, horizontal' },
];

/** Crank grind: the undersize, each main and rod journal at two positions and two directions, and the finish. */
export function CrankGrindSection({ ctx }: { ctx: SectionContext }) {
  const mains = rowCount(ctx, 'crankMains', 5, 10);
  const rods = rowCount(ctx, 'crankRods', Math.min(16, ctx.job.cylinders), 16);
  const u = unitShort(ctx);
  return (
    <OperationSection ctx={ctx} operation="crank-grind" title="Crank grind" prefix="sections.crankGrind" intro="Journals are read with a micrometer near each end, vertically and horizontally.">
      <div className="flex flex-wrap gap-3">
        <Reading ctx={ctx} path="sections.crankGrind.undersize" label={`Undersize (${u}); 0 for standard`} />
        <RowCount ctx={ctx} name="crankMains" label="Main journals" fallback={5} max={10} />
        <RowCount ctx={ctx} name="crankRods" label="Rod journals" fallback={Math.min(16, ctx.job.cylinders)} max={16} />
      </div>
      <ReadingTable ctx={ctx} caption={`Main journals (${u})`} rows={numbered('Main', mains)} columns={columnsUnder((i) => `sections.crankGrind.mains.${i}`, JOURNAL_COLUMNS)} />
      <ReadingTable ctx={ctx} caption={`Rod journals (${u})`} rows={numbered('Rod', rods)} columns={columnsUnder((i) => `sections.crankGrind.rods.${i}`, JOURNAL_COLUMNS)} />
      <Reading ctx={ctx} path="sections.crankGrind.raUm" label="Journal finish Ra (µm), optional" />
    </OperationSection>
  );
}

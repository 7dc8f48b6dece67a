import { Choice, OperationSection, ReadingTable, RowCount, columnsUnder, numbered, rowCount, unitShort, type SectionContext } from './section-kit';

/** Line hone: each main housing bore, vertical and in a second direction, at both ends; optionally its centre on the alignment bar. */
export function LineHoneSection({ ctx }: { ctx: SectionContext }) {
  const count = rowCount(ctx, 'lineHone', 5, 12);
  return (
    <OperationSection ctx={ctx} operation="line-hone" title="Line hone" prefix="sections.lineHone" intro="Each main housing bore with the caps torqued, at both ends of the cap. Rows left empty are left out.">
      <div className="flex flex-wrap gap-3">
        <RowCount ctx={ctx} name="lineHone" label="Main housing bores" fallback={5} max={12} />
        <Choice ctx={ctx} path="sections.lineHone.secondDirection" label="Second direction" options={[{ value: '45', label: 'At 45°' }, { value: 'horizontal', label: 'Horizontal' }]} />
      </div>
      <ReadingTable
        ctx={ctx}
        caption={`Housing bores (${unitShort(ctx)})`}
        rows={numbered('Bore', count)}
        columns={columnsUnder((i) => `sections.lineHone.bores.${i}`, [
          { key: 'vertical.front', label: 'Vertical, front' },
          { key: 'vertical.rear', label: 'Vertical, rear' },
          { key: 'second.front', label: 'Second, front' },
          { key: 'second.rear', label: 'Second, rear' },
          { key: 'centre', label: 'Centre on the bar (optional)' },
        ])}
      />
    </OperationSection>
  );
}

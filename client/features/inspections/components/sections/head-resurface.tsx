import { HEAD_POSITIONS } from '../../lib/section-fields';
import { OperationSection, ReadingTable, RowCount, columnsUnder, numbered, rowCount, unitShort, type SectionContext } from './section-kit';

/** Head resurface: straightedge readings per head by position, stock removed and chamber volumes. */
export function HeadResurfaceSection({ ctx }: { ctx: SectionContext }) {
  const heads = rowCount(ctx, 'headResurface', 2, 4);
  const u = unitShort(ctx);
  return (
    <OperationSection ctx={ctx} operation="head-resurface" title="Head resurface" prefix="sections.headResurface" intro="The thickest feeler under a straightedge on each head’s gasket face; positions left empty are left out.">
      <RowCount ctx={ctx} name="headResurface" label="Heads" fallback={2} max={4} />
      <ReadingTable
        ctx={ctx}
        caption={`Straightedge readings (${u})`}
        rows={HEAD_POSITIONS.map((position) => position.charAt(0).toUpperCase() + position.slice(1))}
        columns={numbered('Head', heads).map((label, h) => ({ label, path: (i: number) => `sections.headResurface.heads.${h}.straightedge.${i}.value` }))}
      />
      <ReadingTable
        ctx={ctx}
        caption="Stock and chambers"
        rows={numbered('Head', heads)}
        columns={columnsUnder((h) => `sections.headResurface.heads.${h}`, [
          { key: 'stockRemoved', label: `Stock removed (${u}), optional` },
          { key: 'chamberBeforeCc', label: 'Chamber before (cc), optional' },
          { key: 'chamberAfterCc', label: 'Chamber after (cc), optional' },
        ])}
      />
    </OperationSection>
  );
}

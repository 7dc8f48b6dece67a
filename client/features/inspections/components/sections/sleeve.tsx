import { OperationSection, ReadingTable, columnsUnder, numbered, unitShort, type SectionContext } from './section-kit';

/** Sleeve: per sleeved cylinder, the block bore and the sleeve's outside diameter (the interference), and the flange protrusion. */
export function SleeveSection({ ctx }: { ctx: SectionContext }) {
  return (
    <OperationSection ctx={ctx} operation="sleeve" title="Sleeve" prefix="sections.sleeve" intro="Fill the rows of the cylinders sleeved; the others stay empty. The bores themselves go in the bore grid.">
      <ReadingTable
        ctx={ctx}
        caption={`Sleeved cylinders (${unitShort(ctx)})`}
        rows={numbered('Cylinder', ctx.job.cylinders)}
        columns={columnsUnder((i) => `sections.sleeve.cylinders.${i}`, [
          { key: 'blockBore', label: 'Block bore' },
          { key: 'sleeveOutside', label: 'Sleeve outside' },
          { key: 'flangeProtrusion', label: 'Flange protrusion (optional)' },
        ])}
      />
    </OperationSection>
  );
}

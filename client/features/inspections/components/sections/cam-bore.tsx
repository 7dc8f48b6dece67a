import { OperationSection, ReadingTable, RowCount, numbered, rowCount, unitShort, type SectionContext } from './section-kit';

/** Cam bore: each cam bearing's inside diameter and, where measured, its journal. */
export function CamBoreSection({ ctx }: { ctx: SectionContext }) {
  const count = rowCount(ctx, 'camBore', 5, 12);
  return (
    <OperationSection ctx={ctx} operation="cam-bore" title="Cam bore" prefix="sections.camBore" intro="Without measured journals, the job’s cam journal diameter is used for the clearance. Give a journal for every bearing or none.">
      <RowCount ctx={ctx} name="camBore" label="Cam bearings" fallback={5} max={12} />
      <ReadingTable
        ctx={ctx}
        caption={`Cam bearings (${unitShort(ctx)})`}
        rows={numbered('Bearing', count)}
        columns={[
          { label: 'Inside diameter', path: (i) => `sections.camBore.bearings.${i}` },
          { label: 'Journal (optional)', path: (i) => `sections.camBore.journals.${i}` },
        ]}
      />
    </OperationSection>
  );
}

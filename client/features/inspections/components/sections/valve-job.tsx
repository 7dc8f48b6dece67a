import { forceUnitFor } from '@shared/operation-limits';
import { valveRow } from '../../lib/section-fields';
import { OperationSection, ReadingTable, RowCount, columnsUnder, rowCount, unitShort, type SectionContext } from './section-kit';

/** Valve job: per valve, seat width, installed height, stem-to-guide clearance and, where given, spring pressure. */
export function ValveJobSection({ ctx }: { ctx: SectionContext }) {
  const count = rowCount(ctx, 'valveJob', Math.min(64, ctx.job.cylinders * 2), 64);
  const u = unitShort(ctx);
  return (
    <OperationSection ctx={ctx} operation="valve-job" title="Valve job" prefix="sections.valveJob" intro="Two rows per cylinder, intake then exhaust; rows left empty are left out.">
      <RowCount ctx={ctx} name="valveJob" label="Valves" fallback={Math.min(64, ctx.job.cylinders * 2)} max={64} />
      <ReadingTable
        ctx={ctx}
        caption={`Valves (${u})`}
        rows={Array.from({ length: count }, (_, i) => `Cylinder ${valveRow(i).label}`)}
        columns={columnsUnder((i) => `sections.valveJob.valves.${i}`, [
          { key: 'seatWidth', label: 'Seat width' },
          { key: 'installedHeight', label: 'Installed height' },
          { key: 'stemToGuide', label: 'Stem-to-guide' },
          { key: 'springPressure', label: `Spring pressure (${forceUnitFor(ctx.unit)}), optional` },
        ])}
      />
    </OperationSection>
  );
}

import { OperationSection, Reading, type SectionContext } from './section-kit';

/** Honing: the stones used; the bores, finish and crosshatch are in their own parts of the record. */
export function HoneSection({ ctx, operation, title }: { ctx: SectionContext; operation: string; title: string }) {
  return (
    <OperationSection ctx={ctx} operation={operation} title={title} prefix="sections.hone" intro="The bores, the wall finish and the crosshatch are entered above and below; this section says what was honed with.">
      <Reading ctx={ctx} path="sections.hone.stones" label="Hone stones used (grit and bond, per pass)" inputMode="text" />
    </OperationSection>
  );
}

import { BALANCE_GRADE_CHOICES } from '@shared/operation-limits';
import { Choice, OperationSection, Reading, type SectionContext } from './section-kit';

/** Balance: the weighed parts, the bob weight fitted, the crankshaft's mass, grade and speed, and the residual unbalance per plane. */
export function BalanceSection({ ctx }: { ctx: SectionContext }) {
  const p = (key: string) => `sections.balance.${key}`;
  return (
    <OperationSection ctx={ctx} operation="balance" title="Balance" prefix="sections.balance" intro="Masses in grams; the bob weight is worked out from the weighed parts and set beside the one fitted.">
      <div className="grid gap-3 sm:grid-cols-2">
        <Reading ctx={ctx} path={p('rotatingGrams')} label="Rotating mass per throw (g)" />
        <Reading ctx={ctx} path={p('reciprocatingGrams')} label="Reciprocating mass per throw (g)" />
        <Reading ctx={ctx} path={p('reciprocatingFactor')} label="Reciprocating factor, optional (commonly 0.5)" />
        <Reading ctx={ctx} path={p('oilGrams')} label="Oil allowance (g), optional" />
        <Reading ctx={ctx} path={p('bobWeightGrams')} label="Bob weight fitted (g)" />
        <Reading ctx={ctx} path={p('rotorMassKg')} label="Crankshaft mass (kg)" />
        <Choice ctx={ctx} path={p('grade')} label="Balance grade (ISO 21940-11)" options={BALANCE_GRADE_CHOICES.map((g) => ({ value: String(g), label: `G ${g}` }))} />
        <Reading ctx={ctx} path={p('serviceRpm')} label="Service speed (rev/min)" />
        <Reading ctx={ctx} path={p('residual.0.gmm')} label="Residual unbalance, front plane (g·mm)" />
        <Reading ctx={ctx} path={p('residual.1.gmm')} label="Residual unbalance, rear plane (g·mm)" />
      </div>
    </OperationSection>
  );
}

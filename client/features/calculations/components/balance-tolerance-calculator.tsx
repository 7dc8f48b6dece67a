import { useMemo } from 'react';
import { BALANCE_GRADES, type BalanceToleranceResult, balanceTolerance } from '@shared/calc';
import { type BalanceToleranceRequest, balanceToleranceRequestSchema } from '@shared/schemas/calculations';
import { SelectField } from '@client/components/ui/select-field';
import { formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, numberFieldsFor } from './calculator-parts';

const initial = { rotorMassKg: '', serviceRpm: '', grade: '2.5' };
const kindOf = (): FieldKind => 'other';
const labels: Record<string, string> = { rotorMassKg: 'the rotor mass', serviceRpm: 'the service speed' };

const compute = (data: BalanceToleranceRequest): BalanceToleranceResult => balanceTolerance(data);

const gmm = (value: number) => `${formatNumber(value, 1)} g·mm`;

/** Needs no unit switch: the standard works in kilograms, rev/min and g·mm. */
export function BalanceToleranceCalculator() {
  const { values, setValue } = useUnitForm('in', initial, kindOf);
  const input = useMemo(
    () => ({ rotorMassKg: toNumber(values.rotorMassKg), serviceRpm: toNumber(values.serviceRpm), grade: toNumber(values.grade) }),
    [values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(balanceToleranceRequestSchema, input, compute);

  const field = numberFieldsFor(values, setValue, errors);

  return (
    <CalculatorLayout
      id="balance-tolerance"
      title="Balance tolerance"
      intro={
        <>
          The residual unbalance ISO 21940-11 permits: e = 9549 · G ÷ n g·mm per kg of rotor, times the rotor mass, half in each of two
          correction planes of a rotor symmetric between them.
        </>
      }
      inputs={
        <FieldGrid>
          {field('rotorMassKg', 'Rotor mass (kg)')}
          {field('serviceRpm', 'Service speed (rev/min)', 'The highest speed the engine runs at.')}
          <SelectField
            label="Balance grade"
            value={values.grade}
            onChange={(event) => setValue('grade', event.target.value)}
            options={BALANCE_GRADES.map((grade) => ({ value: String(grade), label: `G ${grade}` }))}
            error={errors.grade}
          />
        </FieldGrid>
      }
      results={
        result ? (
          <div className="flex flex-col gap-3" data-testid="balance-tolerance-result">
            <HeadlineFigure label="Permissible residual unbalance" value={gmm(result.permissibleUnbalanceGmm)} testId="permissible-unbalance" />
            <FigureList
              items={[
                { label: 'In each of two planes', value: gmm(result.perPlaneGmm) },
                { label: 'Per kg of rotor', value: `${formatNumber(result.specificUnbalanceGmmPerKg, 3)} g·mm/kg` },
              ]}
            />
            <p className="text-sm">
              <CommonPractice>engine crank assemblies are usually held to G 6.3 to G 2.5, race assemblies tighter.</CommonPractice>
            </p>
            <GuidanceNote>The engine maker&apos;s balance specification and a calibrated balancing machine govern.</GuidanceNote>
          </div>
        ) : (
          <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
        )
      }
    />
  );
}

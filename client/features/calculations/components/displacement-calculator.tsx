import { useMemo } from 'react';
import { type DisplacementResult, type LengthUnit, displacement } from '@shared/calc';
import { displacementRequestSchema } from '@shared/schemas/calculations';
import { formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, FieldGrid, FigureList, HeadlineFigure, MissingHint, NumberField } from './calculator-parts';

const initial = { bore: '', stroke: '', cylinders: '' };
const kindOf = (key: string): FieldKind => (key === 'cylinders' ? 'other' : 'length');
const labels: Record<string, string> = { bore: 'the bore', stroke: 'the stroke', cylinders: 'the number of cylinders' };

const compute = (data: { unit: LengthUnit; bore: number; stroke: number; cylinders: number }): DisplacementResult => displacement(data);

export function DisplacementCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(
    () => ({ unit, bore: toNumber(values.bore), stroke: toNumber(values.stroke), cylinders: toNumber(values.cylinders) }),
    [unit, values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(displacementRequestSchema, input, compute);

  return (
    <CalculatorLayout
      id="displacement"
      title="Displacement"
      intro="The volume all the pistons sweep between bottom and top dead centre: π/4 × bore² × stroke × cylinders."
      inputs={
        <FieldGrid>
          <NumberField label={`Bore (${unit})`} value={values.bore} onValueChange={(t) => setValue('bore', t)} error={errors.bore} />
          <NumberField label={`Stroke (${unit})`} value={values.stroke} onValueChange={(t) => setValue('stroke', t)} error={errors.stroke} />
          <NumberField
            label="Cylinders"
            inputMode="numeric"
            value={values.cylinders}
            onValueChange={(t) => setValue('cylinders', t)}
            error={errors.cylinders}
          />
        </FieldGrid>
      }
      results={
        <>
          {result ? (
            <div className="flex flex-col gap-3" data-testid="displacement-result">
              <HeadlineFigure label="Total swept volume" value={`${formatNumber(result.cc, 1)} cc`} testId="displacement-cc" />
              <FigureList
                items={[
                  { label: 'Litres', value: `${formatNumber(result.litres, 3)} L` },
                  { label: 'Cubic inches', value: `${formatNumber(result.cubicInches, 1)} in³` },
                  { label: 'Per cylinder', value: `${formatNumber(result.cc / (input.cylinders ?? 1), 1)} cc` },
                ]}
              />
            </div>
          ) : (
            <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
          )}
        </>
      }
    />
  );
}

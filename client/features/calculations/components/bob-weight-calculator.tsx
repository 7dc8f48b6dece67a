import { useMemo } from 'react';
import { type BobWeightResult, DEFAULT_RECIPROCATING_FACTOR, bobWeight } from '@shared/calc';
import { type BobWeightRequest, bobWeightRequestSchema } from '@shared/schemas/calculations';
import { formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, numberFieldsFor } from './calculator-parts';

const initial = { rotatingGrams: '', reciprocatingGrams: '', reciprocatingFactor: '', oilGrams: '' };
const kindOf = (): FieldKind => 'other';
const labels: Record<string, string> = { rotatingGrams: 'the rotating mass', reciprocatingGrams: 'the reciprocating mass' };

const compute = (data: BobWeightRequest): BobWeightResult => bobWeight(data);

/** Needs no unit switch: masses are in grams. */
export function BobWeightCalculator() {
  const { values, setValue } = useUnitForm('in', initial, kindOf);
  const input = useMemo(
    () => ({
      rotatingGrams: toNumber(values.rotatingGrams),
      reciprocatingGrams: toNumber(values.reciprocatingGrams),
      reciprocatingFactor: toNumber(values.reciprocatingFactor),
      oilGrams: toNumber(values.oilGrams),
    }),
    [values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(bobWeightRequestSchema, input, compute);

  const field = numberFieldsFor(values, setValue, errors);

  return (
    <CalculatorLayout
      id="bob-weight"
      title="Bob weight"
      intro="The weight bolted to each crank throw on the balancing machine: all the rotating mass on the throw, a share of the reciprocating mass, and any oil allowance."
      inputs={
        <FieldGrid>
          {field('rotatingGrams', 'Rotating mass per throw (g)', "Rods' big ends and bearings on the throw.")}
          {field('reciprocatingGrams', 'Reciprocating mass per throw (g)', "Pistons, pins, locks, rings and rods' small ends.")}
          {field('reciprocatingFactor', 'Reciprocating share (0 to 1)', `Left empty: ${DEFAULT_RECIPROCATING_FACTOR}.`)}
          {field('oilGrams', 'Oil allowance (g)', 'Optional.')}
        </FieldGrid>
      }
      results={
        result ? (
          <div className="flex flex-col gap-3" data-testid="bob-weight-result">
            <HeadlineFigure label="Bob weight per throw" value={`${formatNumber(result.bobWeightGrams, 1)} g`} testId="bob-weight" />
            <FigureList items={[{ label: 'Reciprocating share used', value: formatNumber(result.reciprocatingFactor, 2) }]} />
            <p className="text-sm">
              <CommonPractice>a share of 0.5 for a 90° V8; other layouts use other shares, and inline engines are usually balanced without bob weights.</CommonPractice>
            </p>
            <GuidanceNote>The engine maker&apos;s balance figures and a calibrated scale govern.</GuidanceNote>
          </div>
        ) : (
          <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
        )
      }
    />
  );
}

import { useMemo } from 'react';
import { type LengthUnit, RING_APPLICATIONS, type RingGapResult, ringGap } from '@shared/calc';
import { type RingGapRequest, ringGapRequestSchema } from '@shared/schemas/calculations';
import { SelectField } from '@client/components/ui/select-field';
import { formatLength, formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, NumberField } from './calculator-parts';

const APPLICATION_WORDS: Record<RingGapRequest['application'], string> = {
  street: 'Street',
  performance: 'Performance',
  race: 'Race',
  boost: 'Boost or nitrous',
};

const initial = { bore: '', application: 'street' };
const kindOf = (key: string): FieldKind => (key === 'bore' ? 'length' : 'other');
const labels: Record<string, string> = { bore: 'the bore' };

const compute = (data: RingGapRequest): RingGapResult => ringGap(data);

export function RingGapCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(() => ({ unit, bore: toNumber(values.bore), application: values.application }), [unit, values]);
  const { result, errors, missing, formError } = useLiveCalculation(ringGapRequestSchema, input, compute);

  return (
    <CalculatorLayout
      id="ring-gap"
      title="Ring end gap"
      intro="A starting point for the gap at the ends of the top and second rings, as a share of the bore. Hotter-running engines need more gap so the ends never touch."
      inputs={
        <FieldGrid>
          <NumberField label={`Bore (${unit})`} value={values.bore} onValueChange={(text) => setValue('bore', text)} error={errors.bore} />
          <SelectField
            label="Use"
            value={values.application}
            onChange={(event) => setValue('application', event.target.value)}
            options={RING_APPLICATIONS.map((value) => ({ value, label: APPLICATION_WORDS[value] }))}
            error={errors.application}
          />
        </FieldGrid>
      }
      results={
        <>
          {result ? (
            <div className="flex flex-col gap-3" data-testid="ring-gap-result">
              <HeadlineFigure label="Top ring gap" value={formatLength(result.topRing, unit)} />
              <FigureList
                items={[
                  { label: 'Second ring gap', value: formatLength(result.secondRing, unit) },
                  { label: 'Top ring, per unit of bore', value: formatNumber(result.topFactor, 4) },
                  { label: 'Second ring, per unit of bore', value: formatNumber(result.secondFactor, 4) },
                ]}
              />
              <p className="text-sm">
                <CommonPractice>factors by use; the second ring runs a little wider than the top.</CommonPractice>
              </p>
              <GuidanceNote>The ring maker&apos;s chart governs; file-fit each ring in its own bore.</GuidanceNote>
            </div>
          ) : (
            <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
          )}
        </>
      }
    />
  );
}

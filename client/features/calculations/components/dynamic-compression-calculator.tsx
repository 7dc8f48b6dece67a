import { useMemo } from 'react';
import { type DynamicCompressionResult, type LengthUnit, dynamicCompression } from '@shared/calc';
import { type DynamicCompressionRequest, dynamicCompressionRequestSchema } from '@shared/schemas/calculations';
import { formatLength, formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CompressionFieldGrid, compressionInitial, compressionInput, compressionLabels, compressionLengthKeys } from './compression-fields';
import { CalculatorLayout, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, numberFieldsFor } from './calculator-parts';

const initial = { ...compressionInitial, rodLength: '', intakeClosingDegAbdc: '' };
const lengthKeys = new Set([...compressionLengthKeys, 'rodLength']);
const kindOf = (key: string): FieldKind => (lengthKeys.has(key) ? 'length' : 'other');
const labels: Record<string, string> = { ...compressionLabels, rodLength: 'the rod length', intakeClosingDegAbdc: 'the intake closing angle' };

const compute = (data: DynamicCompressionRequest): DynamicCompressionResult => dynamicCompression(data);

export function DynamicCompressionCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(
    () => ({ ...compressionInput(unit, values), rodLength: toNumber(values.rodLength), intakeClosingDegAbdc: toNumber(values.intakeClosingDegAbdc) }),
    [unit, values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(dynamicCompressionRequestSchema, input, compute);

  const field = numberFieldsFor(values, setValue, errors);

  return (
    <CalculatorLayout
      id="dynamic-compression"
      title="Dynamic compression ratio"
      intro={
        <>
          The ratio counted from the moment the intake valve closes: the piston position then (from the rod length and the crank angle)
          replaces the full stroke; the clearance volume is the one the static ratio uses.
        </>
      }
      inputs={
        <>
          <CompressionFieldGrid unit={unit} values={values} errors={errors} onValueChange={setValue} />
          <FieldGrid>
            {field('rodLength', `Rod length (${unit})`, 'Centre to centre.')}
            {field('intakeClosingDegAbdc', 'Intake closing (° ABDC)', 'Degrees after bottom dead centre, from the cam card; note the lift it is timed at.')}
          </FieldGrid>
        </>
      }
      results={
        result ? (
          <div className="flex flex-col gap-3" data-testid="dynamic-compression-result">
            <HeadlineFigure label="Dynamic compression ratio" value={`${formatNumber(result.dynamicRatio, 2)} : 1`} testId="dynamic-ratio" />
            <FigureList
              items={[
                { label: 'Static compression ratio', value: `${formatNumber(result.staticRatio, 2)} : 1` },
                { label: 'Piston travel left when the intake closes', value: formatLength(result.effectiveStroke, unit) },
              ]}
            />
            <GuidanceNote>
              Cam makers time the intake closing at different lifts, so compare like with like. Fuel, cam and the makers&apos; figures decide
              what ratio an engine can live with.
            </GuidanceNote>
          </div>
        ) : (
          <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
        )
      }
    />
  );
}

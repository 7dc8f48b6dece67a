import { useMemo } from 'react';
import { type BearingClearanceResult, type LengthUnit, bearingClearance } from '@shared/calc';
import { type BearingClearanceRequest, bearingClearanceRequestSchema } from '@shared/schemas/calculations';
import { formatLength, formatNumber, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, numberFieldsFor } from './calculator-parts';

const initial = { housingBore: '', journalDiameter: '', shellWall: '' };
const kindOf = (): FieldKind => 'length';
const labels: Record<string, string> = { housingBore: 'the housing bore', journalDiameter: 'the journal diameter', shellWall: 'the shell wall' };

const compute = (data: BearingClearanceRequest): BearingClearanceResult => bearingClearance(data);

export function BearingClearanceCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(
    () => ({ unit, housingBore: toNumber(values.housingBore), journalDiameter: toNumber(values.journalDiameter), shellWall: toNumber(values.shellWall) }),
    [unit, values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(bearingClearanceRequestSchema, input, compute);

  const field = numberFieldsFor(values, setValue, errors);

  return (
    <CalculatorLayout
      id="bearing-clearance"
      title="Bearing oil clearance"
      intro="The oil clearance a pair of shells leaves round a journal: housing bore less the journal and two shell walls."
      inputs={
        <FieldGrid>
          {field('housingBore', `Housing bore (${unit})`, 'Measured with the caps torqued, no shells.')}
          {field('journalDiameter', `Journal diameter (${unit})`)}
          {field('shellWall', `Shell wall (${unit})`, 'One shell, measured at the crown.')}
        </FieldGrid>
      }
      results={
        result ? (
          <div className="flex flex-col gap-3" data-testid="bearing-clearance-result">
            <HeadlineFigure label="Oil clearance" value={formatLength(result.clearance, unit)} testId="bearing-clearance" />
            <FigureList items={[{ label: `Per ${unit === 'in' ? 'inch' : 'millimetre'} of journal`, value: `${formatNumber(result.clearancePerInchOfJournal, 5)} ${unit}/${unit}` }]} />
            {result.clearance <= 0 && <p className="text-sm font-semibold text-fail">No oil clearance: the shells would pinch the journal.</p>}
            <p className="text-sm">
              <CommonPractice>about 0.001 in per inch of journal diameter (0.001 mm per mm).</CommonPractice>
            </p>
            <GuidanceNote>The bearing maker&apos;s clearance governs; confirm with a calibrated bore gauge and micrometer.</GuidanceNote>
          </div>
        ) : (
          <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
        )
      }
    />
  );
}

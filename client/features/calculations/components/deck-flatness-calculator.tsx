import { useMemo } from 'react';
import {
  DECK_FLATNESS_LIMITS,
  DECK_MATERIALS,
  type DeckFlatnessResult,
  GASKET_TYPES,
  type LengthUnit,
  MLS_DECK_FINISH_MAX_RA_UM,
  deckFlatness,
  deckFlatnessLimit,
  micrometresToMicroinches,
} from '@shared/calc';
import { type DeckFlatnessRequest, deckFlatnessRequestSchema } from '@shared/schemas/calculations';
import { SelectField } from '@client/components/ui/select-field';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { formatLength, formatNumber, toNumber, toNumberList } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, NumberField, PassMark } from './calculator-parts';

const MATERIAL_WORDS: Record<DeckFlatnessRequest['material'], string> = { 'cast-iron': 'Cast iron', aluminium: 'Aluminium' };
const GASKET_WORDS: Record<DeckFlatnessRequest['gasket'], string> = { mls: 'Multi-layer steel (MLS)', composite: 'Composite' };

const initial = { readings: '', material: 'cast-iron', gasket: 'mls', shopLimit: '' };
const kindOf = (key: string): FieldKind => (key === 'readings' ? 'length-list' : key === 'shopLimit' ? 'length' : 'other');
const labels: Record<string, string> = { readings: 'the straightedge readings' };

const compute = (data: DeckFlatnessRequest): DeckFlatnessResult => deckFlatness(data);

export function DeckFlatnessCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(
    () => ({
      unit,
      readings: toNumberList(values.readings),
      material: values.material,
      gasket: values.gasket,
      shopLimit: toNumber(values.shopLimit),
    }),
    [unit, values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(deckFlatnessRequestSchema, input, compute);

  // Messages for single readings ("readings.3") gathered beside the text box, with the reading's position.
  const readingErrors = Object.entries(errors)
    .filter(([key]) => key.startsWith('readings'))
    .map(([key, message]) => {
      const index = /^readings\.(\d+)$/.exec(key);
      return index ? `Reading ${Number(index[1]) + 1} (“${values.readings.split(/[\s,;]+/).filter(Boolean)[Number(index[1])]}”): ${message}` : message;
    });
  const material = input.material as DeckFlatnessRequest['material'];
  const gasket = input.gasket as DeckFlatnessRequest['gasket'];

  return (
    <CalculatorLayout
      id="deck"
      title="Deck flatness"
      intro="Lay a precision straightedge along both edges and the centre, across, and on both diagonals; at each place note the thickest feeler leaf that slides under it. The out-of-flat is the largest of those readings."
      inputs={
        <>
          <TextAreaField
            label={`Straightedge readings (${unit})`}
            hint="Separate the readings with spaces, commas or new lines."
            placeholder={unit === 'in' ? '0.0010 0.0015 0.0005 …' : '0.025 0.038 0.013 …'}
            value={values.readings}
            onChange={(event) => setValue('readings', event.target.value)}
            error={readingErrors.length > 0 ? readingErrors.slice(0, 3).join(' ') : undefined}
            spellCheck={false}
          />
          <FieldGrid>
            <SelectField
              label="Deck material"
              value={values.material}
              onChange={(event) => setValue('material', event.target.value)}
              options={DECK_MATERIALS.map((value) => ({ value, label: MATERIAL_WORDS[value] }))}
              error={errors.material}
            />
            <SelectField
              label="Head gasket"
              value={values.gasket}
              onChange={(event) => setValue('gasket', event.target.value)}
              options={GASKET_TYPES.map((value) => ({ value, label: GASKET_WORDS[value] }))}
              error={errors.gasket}
            />
            <NumberField
              label={`Your shop's limit (${unit}, optional)`}
              value={values.shopLimit}
              onValueChange={(text) => setValue('shopLimit', text)}
              error={errors.shopLimit}
              hint="Replaces the table figure below."
            />
          </FieldGrid>
          <table className="w-full max-w-md text-sm tabular-nums">
            <caption className="mb-1 text-left">
              <CommonPractice>out-of-flat limits over the whole deck. The gasket maker&apos;s figure governs.</CommonPractice>
            </caption>
            <thead>
              <tr className="text-left text-ink-soft">
                <th scope="col" className="py-1 font-semibold">
                  Deck
                </th>
                {GASKET_TYPES.map((type) => (
                  <th key={type} scope="col" className="py-1 text-right font-semibold">
                    {type === 'mls' ? 'MLS gasket' : 'Composite gasket'}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {DECK_MATERIALS.map((row) => (
                <tr key={row} className="border-t border-slate-200">
                  <th scope="row" className="py-1 text-left font-semibold">
                    {MATERIAL_WORDS[row]}
                  </th>
                  {GASKET_TYPES.map((type) => (
                    <td key={type} className="py-1 text-right">
                      {formatLength(deckFlatnessLimit(row, type, unit, DECK_FLATNESS_LIMITS), unit)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </>
      }
      results={
        <>
          {result ? (
            <div className="flex flex-col gap-3" data-testid="deck-result">
              <HeadlineFigure label="Out-of-flat" value={formatLength(result.outOfFlat, unit)} />
              <p>
                <PassMark pass={result.pass} passText="Within the limit" failText="Over the limit" />
              </p>
              <FigureList
                items={[
                  { label: 'Limit', value: formatLength(result.limit, unit) },
                  {
                    label: 'Limit from',
                    value:
                      result.limitSource === 'shop'
                        ? "your shop's figure"
                        : `common-practice table, ${MATERIAL_WORDS[material].toLowerCase()} with ${gasket === 'mls' ? 'MLS' : 'composite'} gasket`,
                  },
                  { label: 'Readings', value: String(input.readings?.length ?? 0) },
                ]}
              />
              {gasket === 'mls' && (
                <p className="text-sm">
                  <CommonPractice>
                    an MLS gasket also wants a deck finish of about Ra {formatNumber(micrometresToMicroinches(MLS_DECK_FINISH_MAX_RA_UM), 0)} µin (
                    {formatNumber(MLS_DECK_FINISH_MAX_RA_UM, 2)} µm) or finer.
                  </CommonPractice>
                </p>
              )}
              <GuidanceNote>The gasket and engine makers&apos; figures and a calibrated straightedge govern.</GuidanceNote>
            </div>
          ) : (
            <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
          )}
        </>
      }
    />
  );
}

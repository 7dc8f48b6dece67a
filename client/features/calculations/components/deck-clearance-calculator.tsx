import { useMemo } from 'react';
import { type DeckClearanceResult, type LengthUnit, deckClearance } from '@shared/calc';
import { type DeckClearanceRequest, deckClearanceRequestSchema } from '@shared/schemas/calculations';
import { formatLength, toNumber } from '@client/lib/numbers';
import { useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { CalculatorLayout, CommonPractice, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, numberFieldsFor } from './calculator-parts';

const initial = { deckHeight: '', stroke: '', rodLength: '', compressionHeight: '', gasketThickness: '' };
const kindOf = (): FieldKind => 'length';
const labels: Record<string, string> = {
  deckHeight: 'the deck height',
  stroke: 'the stroke',
  rodLength: 'the rod length',
  compressionHeight: 'the compression height',
};

const compute = (data: DeckClearanceRequest): DeckClearanceResult => deckClearance(data);

export function DeckClearanceCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(
    () => ({
      unit,
      deckHeight: toNumber(values.deckHeight),
      stroke: toNumber(values.stroke),
      rodLength: toNumber(values.rodLength),
      compressionHeight: toNumber(values.compressionHeight),
      gasketThickness: toNumber(values.gasketThickness),
    }),
    [unit, values],
  );
  const { result, errors, missing, formError } = useLiveCalculation(deckClearanceRequestSchema, input, compute);

  const field = numberFieldsFor(values, setValue, errors);

  return (
    <CalculatorLayout
      id="deck-clearance"
      title="Deck clearance and quench"
      intro="Where the piston crown sits against the deck at top dead centre: deck height less half the stroke, the rod and the piston's compression height. Add the compressed gasket for the quench."
      inputs={
        <FieldGrid>
          {field('deckHeight', `Deck height (${unit})`, 'Crank centreline to the deck.')}
          {field('stroke', `Stroke (${unit})`)}
          {field('rodLength', `Rod length (${unit})`, 'Centre to centre.')}
          {field('compressionHeight', `Compression height (${unit})`, 'Pin centre to the crown.')}
          {field('gasketThickness', `Gasket thickness (${unit})`, 'Optional; compressed, as installed. Gives the quench.')}
        </FieldGrid>
      }
      results={
        result ? (
          <div className="flex flex-col gap-3" data-testid="deck-clearance-result">
            <HeadlineFigure
              label="Piston deck clearance"
              value={formatLength(result.pistonDeckClearance, unit)}
              note={result.pistonDeckClearance >= 0 ? 'Below the deck at top dead centre.' : 'Proud of the deck at top dead centre.'}
              testId="piston-deck-clearance"
            />
            {result.quench !== undefined && <FigureList items={[{ label: 'Quench (piston to head)', value: formatLength(result.quench, unit), testId: 'quench' }]} />}
            {result.quench !== undefined && result.quench <= 0 && (
              <p className="text-sm font-semibold text-fail">With this stack the piston reaches the head: it would strike it.</p>
            )}
            <p className="text-sm">
              <CommonPractice>about 0.035–0.045 in (0.9–1.1 mm) of quench for steel rods and a flat-top piston; rod stretch and piston rock need margin.</CommonPractice>
            </p>
            <GuidanceNote>Measure the piston at the deck with a dial indicator before the head goes on; the makers&apos; figures govern.</GuidanceNote>
          </div>
        ) : (
          <MissingHint missing={missing} errors={errors} labels={(key) => labels[key] ?? key} formError={formError} />
        )
      }
    />
  );
}

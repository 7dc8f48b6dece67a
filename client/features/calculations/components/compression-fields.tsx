/**
 * The seven figures a compression ratio is worked from, shared by the static
 * and the dynamic compression cards: their empty values, their names in the
 * "still to enter" hint, the request built from the typed text, and the inputs.
 */
import type { LengthUnit } from '@shared/calc';
import { toNumber } from '@client/lib/numbers';
import { FieldGrid, numberFieldsFor } from './calculator-parts';

export const compressionInitial = {
  bore: '',
  stroke: '',
  chamberCc: '',
  pistonCc: '',
  deckClearance: '',
  gasketBore: '',
  gasketThickness: '',
};

/** The compression figures that are lengths and follow the unit switch. */
export const compressionLengthKeys: readonly string[] = ['bore', 'stroke', 'deckClearance', 'gasketBore', 'gasketThickness'];

export const compressionLabels: Record<string, string> = {
  bore: 'the bore',
  stroke: 'the stroke',
  chamberCc: 'the chamber volume',
  pistonCc: 'the piston volume',
  deckClearance: 'the deck clearance',
  gasketBore: 'the gasket bore',
  gasketThickness: 'the gasket thickness',
};

/** The compression-ratio request as typed so far (blank fields undefined). */
export function compressionInput(unit: LengthUnit, values: Record<string, string>) {
  return {
    unit,
    bore: toNumber(values.bore),
    stroke: toNumber(values.stroke),
    chamberCc: toNumber(values.chamberCc),
    pistonCc: toNumber(values.pistonCc),
    deckClearance: toNumber(values.deckClearance),
    gasketBore: toNumber(values.gasketBore),
    gasketThickness: toNumber(values.gasketThickness),
  };
}

export function CompressionFieldGrid({
  unit,
  values,
  errors,
  onValueChange,
}: {
  unit: LengthUnit;
  values: Record<string, string>;
  errors: Record<string, string>;
  onValueChange: (key: string, text: string) => void;
}) {
  const field = numberFieldsFor(values, onValueChange, errors);
  return (
    <FieldGrid>
      {field('bore', `Bore (${unit})`)}
      {field('stroke', `Stroke (${unit})`)}
      {field('chamberCc', 'Chamber volume (cc)', 'Measured in the head.')}
      {field('pistonCc', 'Piston volume (cc)', 'Dish or valve reliefs positive, dome negative.')}
      {field('deckClearance', `Deck clearance (${unit})`, 'Piston below the deck at top dead centre positive, above it negative.')}
      {field('gasketBore', `Gasket bore (${unit})`)}
      {field('gasketThickness', `Gasket thickness (${unit})`, 'Compressed, as installed.')}
    </FieldGrid>
  );
}

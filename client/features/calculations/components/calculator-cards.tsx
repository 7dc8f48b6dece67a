import type { LengthUnit } from '@shared/calc';
import { BalanceToleranceCalculator } from './balance-tolerance-calculator';
import { BearingClearanceCalculator } from './bearing-clearance-calculator';
import { BobWeightCalculator } from './bob-weight-calculator';
import { BoreCheckCalculator } from './bore-check-calculator';
import { BoreSizeCalculator } from './bore-size-calculator';
import { CompressionCalculator } from './compression-calculator';
import { CrosshatchCalculator } from './crosshatch-calculator';
import { DeckClearanceCalculator } from './deck-clearance-calculator';
import { DeckFlatnessCalculator } from './deck-flatness-calculator';
import { DisplacementCalculator } from './displacement-calculator';
import { DynamicCompressionCalculator } from './dynamic-compression-calculator';
import { RingGapCalculator } from './ring-gap-calculator';
import { RoughnessCalculator } from './roughness-calculator';

/** Every calculator card, in the order of the page's list (CALCULATOR_SECTIONS). */
export function CalculatorCards({ unit }: { unit: LengthUnit }) {
  return (
    <>
      <DisplacementCalculator unit={unit} />
      <CompressionCalculator unit={unit} />
      <DynamicCompressionCalculator unit={unit} />
      <DeckClearanceCalculator unit={unit} />
      <BoreCheckCalculator unit={unit} />
      <BoreSizeCalculator unit={unit} />
      <CrosshatchCalculator unit={unit} />
      <DeckFlatnessCalculator unit={unit} />
      <RoughnessCalculator />
      <RingGapCalculator unit={unit} />
      <BearingClearanceCalculator unit={unit} />
      <BalanceToleranceCalculator />
      <BobWeightCalculator />
    </>
  );
}

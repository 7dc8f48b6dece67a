// The calculator feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { BalanceToleranceCalculator } from './components/balance-tolerance-calculator';
export { BearingClearanceCalculator } from './components/bearing-clearance-calculator';
export { BobWeightCalculator } from './components/bob-weight-calculator';
export { BoreCheckCalculator } from './components/bore-check-calculator';
export { BoreSizeCalculator } from './components/bore-size-calculator';
export { CompressionCalculator } from './components/compression-calculator';
export { CrosshatchCalculator } from './components/crosshatch-calculator';
export { DeckFlatnessCalculator } from './components/deck-flatness-calculator';
export { DeckClearanceCalculator } from './components/deck-clearance-calculator';
export { DisplacementCalculator } from './components/displacement-calculator';
export { DynamicCompressionCalculator } from './components/dynamic-compression-calculator';
export { RingGapCalculator } from './components/ring-gap-calculator';
export { RoughnessCalculator } from './components/roughness-calculator';
export { UnitSwitch } from './components/unit-switch';
export { usePageUnit } from './hooks/use-page-unit';
export { CALCULATOR_SECTIONS } from './sections';

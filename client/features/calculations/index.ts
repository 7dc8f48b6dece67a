// The calculator feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { CalculatorCards } from './components/lazy-panels';
export { UnitSwitch } from './components/unit-switch';
export { usePageUnit } from './hooks/use-page-unit';
export { CALCULATOR_SECTIONS } from './sections';

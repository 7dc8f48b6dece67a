/**
 * Tenthmark's machining calculations: pure functions with no I/O, shared by
 * the browser and the server. Impossible input throws CalculationError.
 */
export * from './errors';
export * from './units';
export * from './engine';
export * from './bore';
export * from './sizing';
export * from './crosshatch';
export * from './deck';
export * from './ring-gap';
export * from './roughness';
export * from './inspection-record';
export * from './conformance';
export * from './figures';
export * from './check-figures';
export * from './balance';
export * from './stack-up';

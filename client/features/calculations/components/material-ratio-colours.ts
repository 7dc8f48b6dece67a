export const CURVE = '#1d4e6b'; // slate-700
export const SECANT = '#a3261b'; // fail red, for the construction line
export const TRIANGLE = '#975c12'; // brass-600
export const BAND = '#f4e2c2'; // brass-100
export const INK_SOFT = '#3b4a55';

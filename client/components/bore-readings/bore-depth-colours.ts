export const THRUST_COLOUR = '#1d4e6b'; // slate-700
export const AXIAL_COLOUR = '#975c12'; // brass-600
export const TARGET_COLOUR = '#1e6b3a'; // pass green

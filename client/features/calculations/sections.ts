/** The calculators on the page, in order: anchor id, heading and a few words for the in-page list. */
export const CALCULATOR_SECTIONS = [
  { id: 'displacement', title: 'Displacement', blurb: 'cc, litres and cubic inches' },
  { id: 'compression', title: 'Compression ratio', blurb: 'and what an overbore or deck cut does' },
  { id: 'dynamic-compression', title: 'Dynamic compression ratio', blurb: 'from rod length and intake closing' },
  { id: 'deck-clearance', title: 'Deck clearance and quench', blurb: 'the piston-to-deck stack-up' },
  { id: 'bore-check', title: 'Bore check', blurb: 'taper, out-of-round, clearance' },
  { id: 'bore-size', title: 'Bore size', blurb: 'finished size, bore-to size, oversize' },
  { id: 'crosshatch', title: 'Crosshatch', blurb: 'angle from hone settings, and back' },
  { id: 'deck', title: 'Deck flatness', blurb: 'straightedge readings against a limit' },
  { id: 'roughness', title: 'Surface roughness', blurb: 'Ra, Rz, Rk and friends from a trace' },
  { id: 'ring-gap', title: 'Ring end gap', blurb: 'a starting gap by use' },
  { id: 'bearing-clearance', title: 'Bearing oil clearance', blurb: 'housing, journal and shell wall' },
  { id: 'balance-tolerance', title: 'Balance tolerance', blurb: 'ISO 21940-11 residual unbalance' },
  { id: 'bob-weight', title: 'Bob weight', blurb: 'per crank throw, for the balancer' },
] as const;

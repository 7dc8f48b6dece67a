/**
 * What the inspection record measures for each kind of work in the
 * catalogue: one sheet per operation, declared once here and served by
 * GET /api/catalogue. Each measurement names what is read, where, and its
 * kind (a length is in the record's unit, in or mm; an angle in degrees; a
 * roughness in µm Ra; a volume in cc; a mass in grams; a force in the
 * record's force unit; an unbalance in g·mm; a speed in rpm).
 */
import { operations, type OperationCode } from './catalogue';

export const measurementKinds = ['choice', 'text', 'photos', 'length', 'angle', 'roughness', 'volume', 'mass', 'force', 'unbalance', 'speed'] as const;
export type MeasurementKind = (typeof measurementKinds)[number];

export interface Measurement {
  /** Unique within its sheet. */
  key: string;
  /** What is read and where, in the trade's words. */
  label: string;
  kind: MeasurementKind;
}

const cleanSheet: Measurement[] = [
  { key: 'method', label: 'Method (hot tank for iron and steel only, thermal oven, spray wash)', kind: 'choice' },
  { key: 'result', label: 'Result: clean, or what is left', kind: 'choice' },
  { key: 'findings', label: 'Findings, in words', kind: 'text' },
  { key: 'photos', label: 'Photos of the cleaned part', kind: 'photos' },
];

const crackTestSheet: Measurement[] = [
  { key: 'method', label: 'Method (magnetic particle, dye penetrant, pressure test)', kind: 'choice' },
  { key: 'result', label: 'Result: no crack found, or crack found (stops the record and proposes extra work)', kind: 'choice' },
  { key: 'findings', label: 'Findings, in words: where and how long any indication is', kind: 'text' },
  { key: 'photos', label: 'Photos of any indication', kind: 'photos' },
];

/** Today's bore grid, shared by every operation that finishes a cylinder bore. */
const boreGrid: Measurement[] = [
  { key: 'boreDiameter', label: 'Bore diameter per cylinder at top, middle and bottom, on the thrust and the axial direction', kind: 'length' },
  { key: 'pistonDiameter', label: 'Piston diameter per cylinder at the maker’s gauge point', kind: 'length' },
];

const honeFinish: Measurement[] = [
  { key: 'honeStones', label: 'Hone stones used (grit and bond, per pass)', kind: 'text' },
  { key: 'finishRa', label: 'Wall finish, Ra, from the profile trace', kind: 'roughness' },
  { key: 'crosshatchAngle', label: 'Crosshatch included angle', kind: 'angle' },
];

const straightedge = (where: string): Measurement => ({ key: 'straightedge', label: `Straightedge and feeler readings ${where}; the largest is the out-of-flat`, kind: 'length' });

export const measurementSheets: Readonly<Record<OperationCode, readonly Measurement[]>> = {
  clean: cleanSheet,
  'crack-test': crackTestSheet,
  bore: boreGrid,
  hone: [...boreGrid, ...honeFinish],
  'plateau-hone': [...boreGrid, ...honeFinish],
  'torque-plate-hone': [...boreGrid, ...honeFinish, { key: 'torquePlate', label: 'Torque plate and the bolt torque it was clamped with', kind: 'text' }],
  deck: [
    straightedge('lengthwise on both edges and the centre, crosswise at each cylinder, and on both diagonals'),
    { key: 'deckHeight', label: 'Deck height, crank centreline to deck, at the four corners (end-to-end and bank-to-bank differences worked out)', kind: 'length' },
    { key: 'finishRa', label: 'Deck finish, Ra', kind: 'roughness' },
  ],
  'line-hone': [
    { key: 'measuringDirection', label: 'Second direction measured: 45° or horizontal', kind: 'choice' },
    { key: 'housingBore', label: 'Each main housing bore, vertical and at the second direction, at both ends of the cap', kind: 'length' },
    { key: 'alignment', label: 'Each bore’s centre against the line through the end bores', kind: 'length' },
  ],
  sleeve: [
    { key: 'blockBore', label: 'Block bore for the sleeve, per sleeved cylinder', kind: 'length' },
    { key: 'sleeveOutside', label: 'Sleeve outside diameter, per sleeved cylinder (interference fit worked out)', kind: 'length' },
    { key: 'flangeProtrusion', label: 'Sleeve flange protrusion above the deck', kind: 'length' },
    ...boreGrid,
  ],
  'cam-bore': [
    { key: 'bearingBore', label: 'Cam bearing inside diameter, per journal', kind: 'length' },
    { key: 'camJournal', label: 'Cam journal diameter, per journal, where the builder gives the cam (clearance worked out)', kind: 'length' },
  ],
  'head-resurface': [
    straightedge('per head, lengthwise, crosswise and on both diagonals'),
    { key: 'stockRemoved', label: 'Stock removed from the gasket face', kind: 'length' },
    { key: 'chamberVolume', label: 'Combustion chamber volume before and after, where measured', kind: 'volume' },
  ],
  'valve-job': [
    { key: 'seatWidth', label: 'Seat width, per valve', kind: 'length' },
    { key: 'installedHeight', label: 'Installed height, per valve, against the target', kind: 'length' },
    { key: 'stemToGuide', label: 'Stem-to-guide clearance, per valve', kind: 'length' },
    { key: 'springPressure', label: 'Spring pressure at installed height, where given', kind: 'force' },
  ],
  'crank-grind': [
    { key: 'mainJournal', label: 'Each main journal at two positions and two directions', kind: 'length' },
    { key: 'rodJournal', label: 'Each rod journal at two positions and two directions', kind: 'length' },
    { key: 'undersize', label: 'Undersize chosen, from the standard steps (common practice)', kind: 'choice' },
    { key: 'journalFinish', label: 'Journal finish, Ra', kind: 'roughness' },
  ],
  balance: [
    { key: 'partWeights', label: 'Weighed parts: rotating and reciprocating ends of the rods, pistons, pins, rings, bearings', kind: 'mass' },
    { key: 'bobWeight', label: 'Bob weight used per throw, worked out from the weighed parts', kind: 'mass' },
    { key: 'balanceGrade', label: 'Balance grade (ISO 21940-11) and service speed', kind: 'choice' },
    { key: 'serviceSpeed', label: 'Service speed', kind: 'speed' },
    { key: 'residualUnbalance', label: 'Residual unbalance measured in each correction plane, against the permissible value', kind: 'unbalance' },
  ],
};

/**
 * What the server works out from each sheet's readings and judges (shared/calc/record-sections.ts
 * and inspection-record.ts); the job limits that apply are the operation's group in
 * shared/operation-limits.ts (`limitGroupOperation`), plus the bore limits of the job's spec for bore work.
 */
export const sheetComputes: Readonly<Record<OperationCode, readonly string[]>> = {
  clean: ['clean or not'],
  'crack-test': ['crack found or not (a crack stops the record)'],
  bore: ['size against the finished size', 'piston clearance on the thrust axis', 'taper', 'out-of-round'],
  hone: ['size', 'piston clearance', 'taper', 'out-of-round', 'Ra (and Rk family) from a trace', 'crosshatch included angle'],
  'plateau-hone': ['size', 'piston clearance', 'taper', 'out-of-round', 'Rk, Rpk, Rvk', 'crosshatch included angle'],
  'torque-plate-hone': ['size', 'piston clearance', 'taper', 'out-of-round', 'Ra', 'crosshatch included angle'],
  deck: ['out-of-flat (largest straightedge reading)', 'deck height front to rear and side to side', 'deck height against the target', 'deck Ra'],
  'line-hone': ['housing size per bore', 'out-of-round per bore', 'taper per bore', 'alignment against the line through the end bores'],
  sleeve: ['interference fit per cylinder', 'flange protrusion', 'the new bore as for bore work'],
  'cam-bore': ['bearing inside diameter', 'clearance where the cam journals are given'],
  'head-resurface': ['out-of-flat per head', 'stock removed', 'chamber volume change'],
  'valve-job': ['seat width', 'installed height against the target', 'stem-to-guide clearance', 'spring pressure at installed height'],
  'crank-grind': ['journal size against standard less undersize', 'journal taper', 'journal out-of-round', 'journal Ra'],
  balance: ['bob weight from the weighed parts', 'permissible unbalance per plane (ISO 21940-11)', 'residual unbalance per plane'],
};

/** The catalogue with each operation's sheet, as GET /api/catalogue answers it. */
export function catalogueWithSheets() {
  return operations.map((op) => ({
    code: op.code,
    name: op.name,
    description: op.description,
    pricedPer: op.pricedPer,
    part: op.part,
    measurements: measurementSheets[op.code].map(({ key, label, kind }) => ({ key, label, kind })),
  }));
}

/**
 * The record's sections and the deck's positioned readings as form text.
 *
 * Every reading is kept as typed, keyed by its path in the request
 * ("sections.lineHone.bores.2.vertical.front" → "2.6251"), so a draft is a
 * flat map of strings and survives a reload exactly. `sectionsFromFields`
 * builds the request's nested shape from the map (blank rows left out);
 * `fieldsFromSections` does the reverse for a version sent back.
 */
import { boreOperationCodes, type OperationCode } from '@shared/catalogue';
import type { InspectionInput } from '@shared/schemas/inspection';
import type { InspectionSections } from '@shared/schemas/inspection-sections';
import { SECTION_INPUT_KEYS } from '@shared/schemas/values';
import { numberToText, toNumber } from '@client/lib/numbers';

/** Leaves holding words or a choice, not a number. */
const TEXT_LEAVES = new Set(['method', 'result', 'findings', 'stones', 'secondDirection', 'label', 'kind', 'position']);
const LIST_LEAVES = new Set(['photoIds']);

/** The positions a head's straightedge readings are taken at. */
export const HEAD_POSITIONS = ['lengthwise, left', 'lengthwise, centre', 'lengthwise, right', 'crosswise, front', 'crosswise, middle', 'crosswise, rear', 'diagonal A', 'diagonal B'] as const;

/** Valve rows: two per cylinder, intake then exhaust. */
export const valveRow = (i: number) => ({ label: `${Math.floor(i / 2) + 1} ${i % 2 === 1 ? 'exhaust' : 'intake'}`, kind: i % 2 === 1 ? 'exhaust' : 'intake' });

/**
 * Rows whose keys follow from their place in the form (paths with "#" for any
 * index): the sleeve row of cylinder 3 is row 2; the rear plane's residual is
 * row 1. The keys are filled in from the row, and a row goes back to its place.
 */
const KEYED_ROWS: Record<string, { fill: (i: number) => Record<string, unknown>; indexOf: (row: Record<string, unknown>, i: number) => number }> = {
  'sections.sleeve.cylinders': { fill: (i) => ({ cylinder: i + 1 }), indexOf: (row) => Number(row.cylinder) - 1 },
  'sections.balance.residual': { fill: (i) => ({ plane: i === 1 ? 'rear' : 'front' }), indexOf: (row) => (row.plane === 'rear' ? 1 : 0) },
  'sections.headResurface.heads.#.straightedge': {
    fill: (i) => ({ position: HEAD_POSITIONS[i] ?? `reading ${i + 1}` }),
    indexOf: (row, i) => {
      const at = (HEAD_POSITIONS as readonly unknown[]).indexOf(row.position);
      return at >= 0 ? at : i;
    },
  },
  'sections.valveJob.valves': {
    fill: valveRow,
    indexOf: (row, i) => {
      const match = /^(\d+) (intake|exhaust)$/.exec(String(row.label));
      return match ? (Number(match[1]) - 1) * 2 + (match[2] === 'exhaust' ? 1 : 0) : i;
    },
  },
};
const keyedRows = (path: string) => KEYED_ROWS[path.replace(/\.\d+\./g, '.#.')];

/** Which part of the input each operation's own section fills. */
export const SECTION_KEYS: Partial<Record<OperationCode, keyof InspectionSections>> = {
  ...SECTION_INPUT_KEYS,
  hone: 'hone',
  'plateau-hone': 'hone',
  'torque-plate-hone': 'hone',
};

/** Whether the job orders work on the bores, and so needs the bore grid. */
export const ordersBoreWork = (operations: ReadonlyArray<{ code: string }>) => operations.some((op) => (boreOperationCodes as readonly string[]).includes(op.code));

/** The input sections a job's operations call for, once each, in the catalogue's order of first use. */
export function sectionKeysFor(operations: ReadonlyArray<{ code: string }>): Array<keyof InspectionSections> {
  const keys = operations.map((op) => SECTION_KEYS[op.code as OperationCode]).filter((key): key is keyof InspectionSections => key !== undefined);
  return [...new Set(keys)];
}

type Tree = { [key: string]: Tree | string };

function treeOf(fields: Record<string, string>, prefix: string): Tree {
  const root: Tree = {};
  for (const [path, value] of Object.entries(fields)) {
    if (!path.startsWith(`${prefix}.`)) continue;
    const parts = path.slice(prefix.length + 1).split('.');
    let node = root;
    parts.forEach((part, i) => {
      if (i === parts.length - 1) node[part] = value;
      else node = (node[part] = typeof node[part] === 'object' ? node[part] : {}) as Tree;
    });
  }
  return root;
}

const isIndex = (key: string) => /^\d+$/.test(key);

/** A tree of text as the request's values; blank leaves, rows and sections become undefined. */
function build(node: Tree | string, path: string, leaf: string): unknown {
  if (typeof node === 'string') {
    if (node.trim() === '') return undefined;
    if (LIST_LEAVES.has(leaf)) return node.split(/\s+/).filter(Boolean);
    return TEXT_LEAVES.has(leaf) ? node : (toNumber(node) ?? node);
  }
  const keys = Object.keys(node);
  if (keys.length > 0 && keys.every(isIndex)) {
    const keyed = keyedRows(path);
    const rows = keys
      .sort((a, b) => Number(a) - Number(b))
      .map((key) => {
        const row = build(node[key], `${path}.${key}`, leaf);
        return keyed && row && typeof row === 'object' ? { ...row, ...keyed.fill(Number(key)) } : row;
      })
      .filter((row) => row !== undefined);
    return rows.length > 0 ? rows : undefined;
  }
  const entries = keys.map((key) => [key, build(node[key], `${path}.${key}`, key)] as const).filter(([, value]) => value !== undefined);
  return entries.length > 0 ? Object.fromEntries(entries) : undefined;
}

/** The sections as the request's shape, from the form's text (numbers read, blanks left out for the schema to report). */
export function sectionsFromFields(fields: Record<string, string>): Record<string, unknown> | undefined {
  return build(treeOf(fields, 'sections'), 'sections', 'sections') as Record<string, unknown> | undefined;
}

/** The deck's positioned straightedge readings and four heights, from the form's text. */
export function deckFromFields(fields: Record<string, string>): { straightedge?: Array<{ position: string; value: unknown }>; heights?: unknown } {
  const straightedge = Object.entries(fields)
    .filter(([path, value]) => path.startsWith('deck.straightedge.') && value.trim() !== '')
    .map(([path, value]) => ({ position: path.slice('deck.straightedge.'.length), value: toNumber(value) ?? value }));
  const heights = build(treeOf(fields, 'deck.heights'), 'deck.heights', 'heights');
  return { ...(straightedge.length > 0 ? { straightedge } : {}), ...(heights ? { heights } : {}) };
}

function flatten(value: unknown, path: string, leaf: string, out: Record<string, string>) {
  if (value === undefined || value === null) return;
  if (Array.isArray(value)) {
    if (LIST_LEAVES.has(leaf)) {
      out[path] = value.join(' ');
      return;
    }
    const keyed = keyedRows(path);
    value.forEach((row, i) => {
      const index = keyed ? keyed.indexOf(row as Record<string, unknown>, i) : i;
      const filled = keyed ? Object.keys(keyed.fill(index)) : [];
      const rest = keyed ? Object.fromEntries(Object.entries(row as Record<string, unknown>).filter(([key]) => !filled.includes(key))) : row;
      flatten(rest, `${path}.${index}`, leaf, out);
    });
    return;
  }
  if (typeof value === 'object') {
    for (const [key, child] of Object.entries(value)) flatten(child, `${path}.${key}`, key, out);
    return;
  }
  if (value === '') return;
  out[path] = typeof value === 'number' ? numberToText(value) : String(value);
}

/** The row counts the section tables are drawn with (`rows.<name>`), and the request path each counts the rows of. */
export const ROW_COUNTS = {
  lineHone: 'sections.lineHone.bores',
  camBore: 'sections.camBore.bearings',
  headResurface: 'sections.headResurface.heads',
  valveJob: 'sections.valveJob.valves',
  crankMains: 'sections.crankGrind.mains',
  crankRods: 'sections.crankGrind.rods',
} as const;

/** A submitted version's sections and deck readings back into the form's text. */
export function fieldsFromInput(input: Pick<InspectionInput, 'sections' | 'deck'>): Record<string, string> {
  const out: Record<string, string> = {};
  flatten(input.sections, 'sections', 'sections', out);
  for (const reading of input.deck?.straightedge ?? []) out[`deck.straightedge.${reading.position}`] = numberToText(reading.value);
  flatten(input.deck?.heights, 'deck.heights', 'heights', out);
  // Each table as many rows as its furthest row filled.
  for (const [name, prefix] of Object.entries(ROW_COUNTS)) {
    const rows = Object.keys(out).flatMap((path) => (path.startsWith(`${prefix}.`) ? [Number(path.slice(prefix.length + 1).split('.')[0]) + 1] : []));
    if (rows.length > 0) out[`rows.${name}`] = String(Math.max(...rows));
  }
  return out;
}

/** Whether a saved key is one the form keeps. */
export const isFieldPath = (path: string) => /^(sections\.[A-Za-z]+|deck\.straightedge|deck\.heights|rows)\./.test(path);

/**
 * The straightedge positions on a block deck: lengthwise on both edges and the
 * centre, crosswise across each cylinder, and both diagonals.
 */
export function deckPositions(cylinderCount: number): Array<{ position: string; group: string }> {
  return [
    ...['left edge', 'centre', 'right edge'].map((where) => ({ position: `lengthwise, ${where}`, group: 'Lengthwise' })),
    ...Array.from({ length: cylinderCount }, (_, i) => ({ position: `across cylinder ${i + 1}`, group: 'Crosswise' })),
    ...['A', 'B'].map((letter) => ({ position: `diagonal ${letter}`, group: 'Diagonal' })),
  ];
}

const SECTION_WORDS: Record<string, string> = {
  clean: 'clean',
  crackTest: 'crack test',
  hone: 'hone',
  lineHone: 'line hone',
  camBore: 'cam bore',
  sleeve: 'sleeve',
  headResurface: 'head resurface',
  valveJob: 'valve job',
  crankGrind: 'crank grind',
  balance: 'balance',
  straightedge: 'deck straightedge',
  heights: 'deck height',
};

/** A section's path in words: "sections.lineHone.bores.2.vertical.front" → "line hone: bores 3 vertical front". */
export function sectionPathWords(path: string): string | undefined {
  const match = /^(?:sections|deck)\.([A-Za-z]+)(?:\.(.+))?$/.exec(path);
  if (!match || !SECTION_WORDS[match[1]]) return undefined;
  const rest = (match[2] ?? '')
    .split('.')
    .filter(Boolean)
    .map((part) => (/^\d+$/.test(part) ? String(Number(part) + 1) : part.replace(/([A-Z])/g, ' $1').toLowerCase()))
    .join(' ');
  return rest ? `${SECTION_WORDS[match[1]]}: ${rest}` : SECTION_WORDS[match[1]];
}

/**
 * The machining work a builder can ask for, in the trade's own words, and how
 * each is priced: per cylinder, per part, or once per job.
 */
export type PricedPer = 'cylinder' | 'part' | 'job';
export type PartKind = 'block' | 'head' | 'crank' | 'rotating';

export interface Operation {
  code: string;
  name: string;
  description: string;
  pricedPer: PricedPer;
  part: PartKind;
}

export const operations = [
  { code: 'clean', name: 'Clean', description: 'Cleaned by a method suited to the metal (a caustic hot tank for iron and steel only; a thermal oven or spray wash for aluminium), plugs out, passages flushed.', pricedPer: 'part', part: 'block' },
  { code: 'crack-test', name: 'Crack test', description: 'Magnetic particle or dye penetrant check for cracks.', pricedPer: 'part', part: 'block' },
  { code: 'bore', name: 'Bore', description: 'Bore each cylinder to size, leaving stock for the hone.', pricedPer: 'cylinder', part: 'block' },
  { code: 'hone', name: 'Hone', description: 'Finish hone to the final size and crosshatch.', pricedPer: 'cylinder', part: 'block' },
  { code: 'plateau-hone', name: 'Plateau hone', description: 'A final pass that knocks the peaks off for a plateau finish.', pricedPer: 'cylinder', part: 'block' },
  { code: 'torque-plate-hone', name: 'Torque-plate hone', description: 'Hone with a torque plate bolted on to mimic the head’s clamping load.', pricedPer: 'cylinder', part: 'block' },
  { code: 'deck', name: 'Deck', description: 'Surface the deck flat and to height, with the finish the gasket needs.', pricedPer: 'part', part: 'block' },
  { code: 'line-hone', name: 'Line hone', description: 'Size and align the main bearing bores.', pricedPer: 'part', part: 'block' },
  { code: 'sleeve', name: 'Sleeve', description: 'Fit a new sleeve to a cylinder past its last oversize or cracked.', pricedPer: 'cylinder', part: 'block' },
  { code: 'cam-bore', name: 'Cam bore', description: 'Line bore or fit cam bearings.', pricedPer: 'part', part: 'block' },
  { code: 'head-resurface', name: 'Head resurface', description: 'Surface a cylinder head’s gasket face flat.', pricedPer: 'part', part: 'head' },
  { code: 'valve-job', name: 'Valve job', description: 'Cut seats and valves, set installed height.', pricedPer: 'part', part: 'head' },
  { code: 'crank-grind', name: 'Crank grind', description: 'Grind main and rod journals undersize and polish.', pricedPer: 'part', part: 'crank' },
  { code: 'balance', name: 'Balance', description: 'Balance the rotating assembly.', pricedPer: 'job', part: 'rotating' },
] as const satisfies readonly Operation[];

export type OperationCode = (typeof operations)[number]['code'];

export const operationCodes = operations.map((op) => op.code) as [OperationCode, ...OperationCode[]];

const byCode = new Map<string, Operation>(operations.map((op) => [op.code, op]));

export function findOperation(code: string): Operation | undefined {
  return byCode.get(code);
}

/**
 * What a builder sends the shop. A rotating assembly is the crankshaft with
 * its rods and pistons, sent together to be balanced.
 */
export const partsSent = ['block', 'heads', 'crankshaft', 'rods', 'pistons', 'rotating-assembly'] as const;
export type PartSent = (typeof partsSent)[number];

export const PART_SENT_WORDS: Record<PartSent, string> = {
  block: 'Block',
  heads: 'Cylinder heads',
  crankshaft: 'Crankshaft',
  rods: 'Connecting rods',
  pistons: 'Pistons',
  'rotating-assembly': 'Rotating assembly (crankshaft, rods and pistons)',
};

/** Work on a cylinder bore: these need the bore specification (stock bore, stroke, finished size, pistons). */
export const boreOperationCodes: readonly OperationCode[] = ['bore', 'hone', 'plateau-hone', 'torque-plate-hone', 'sleeve'];

/** Cleaning and crack testing apply to whatever is sent. */
const anyPart: ReadonlySet<string> = new Set(['clean', 'crack-test']);

/**
 * Whether the parts sent include what an operation works on: a block for
 * block work, heads for head work, a crankshaft (alone or in an assembly) for
 * a grind, and a whole rotating assembly for a balance.
 */
export function partsAllow(code: string, parts: readonly PartSent[]): boolean {
  if (anyPart.has(code)) return parts.length > 0;
  const has = (part: PartSent) => parts.includes(part);
  const assembly = has('rotating-assembly');
  switch (findOperation(code)?.part) {
    case 'block':
      return has('block');
    case 'head':
      return has('heads');
    case 'crank':
      return has('crankshaft') || assembly;
    case 'rotating':
      return assembly || (has('crankshaft') && has('rods') && has('pistons'));
    default:
      return false;
  }
}

/** What to send for an operation, in words, for the message when it is missing. */
export function partsNeededWords(code: string): string {
  switch (findOperation(code)?.part) {
    case 'head':
      return 'the cylinder heads';
    case 'crank':
      return 'the crankshaft';
    case 'rotating':
      return 'the rotating assembly';
    default:
      return anyPart.has(code) ? 'a part' : 'the block';
  }
}

/** Jobs posted before the parts were named sent a block. */
export const partsOfJob = (spec: { parts?: readonly PartSent[] }): readonly PartSent[] => spec.parts ?? ['block'];

/**
 * How many units of an operation a job needs: the cylinder count for work
 * priced per cylinder, the number of parts (heads, say) for per-part work,
 * and one for per-job work.
 */
export function defaultQuantity(code: string, job: { cylinders: number; parts?: number }): number {
  const op = findOperation(code);
  if (!op) return 1;
  if (op.pricedPer === 'cylinder') return job.cylinders;
  if (op.pricedPer === 'part') return Math.max(1, job.parts ?? 1);
  return 1;
}

/** Money is integer cents everywhere; this is the one place a line total is worked out. */
export function lineAmountCents(quantity: number, unitPriceCents: number): number {
  if (!Number.isInteger(quantity) || !Number.isInteger(unitPriceCents)) throw new Error('quantity and unit price must be whole numbers');
  return quantity * unitPriceCents;
}

export function formatCents(cents: number, currency = 'USD', locale?: string): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(cents / 100);
}

export interface PrefilledLine {
  operation: OperationCode;
  description: string;
  quantity: number;
  unitPriceCents: number;
}

/**
 * A bid's first draft: one line per operation the job asks for, with the
 * job's quantity and the shop's price for that work (0 where the shop has
 * none yet, for the shop to fill in).
 */
export function prefillBidLines(
  jobOperations: ReadonlyArray<{ code: string; quantity: number }>,
  rateCard: ReadonlyArray<{ operation: string; priceCents: number }>,
): PrefilledLine[] {
  const prices = new Map(rateCard.map((r) => [r.operation, r.priceCents]));
  return jobOperations.flatMap((op) => {
    const known = findOperation(op.code);
    if (!known) return [];
    return [{ operation: known.code as OperationCode, description: known.name, quantity: op.quantity, unitPriceCents: prices.get(op.code) ?? 0 }];
  });
}

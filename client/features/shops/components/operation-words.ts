import { findOperation, operations, type Operation, type OperationCode, type PartKind, type PricedPer } from '@shared/catalogue';

/** How the catalogue's parts read as headings. */
export const partHeadings: Record<PartKind, string> = {
  block: 'Block',
  head: 'Cylinder heads',
  crank: 'Crankshaft',
  rotating: 'Rotating assembly',
};

export const pricedPerWords: Record<PricedPer, string> = {
  cylinder: 'per cylinder',
  part: 'per part',
  job: 'per job',
};

/** The catalogue in groups by part, in catalogue order. */
export const operationsByPart = (Object.keys(partHeadings) as PartKind[]).map((part) => ({
  part,
  heading: partHeadings[part],
  operations: operations.filter((op) => op.part === part) as Operation[],
}));

const catalogueOrder = new Map<string, number>(operations.map((op, index) => [op.code, index]));

/** Sorts codes into catalogue order (block work first, as a shop reads its own price list). */
export function inCatalogueOrder<T>(items: readonly T[], code: (item: T) => string): T[] {
  return [...items].sort((a, b) => (catalogueOrder.get(code(a)) ?? 999) - (catalogueOrder.get(code(b)) ?? 999));
}

export const catalogueIndex = (code: string) => catalogueOrder.get(code) ?? 999;

export const operationName = (code: string) => findOperation(code)?.name ?? code;

export const operationPricedPer = (code: string) => {
  const op = findOperation(code);
  return op ? pricedPerWords[op.pricedPer] : '';
};

export type { OperationCode };

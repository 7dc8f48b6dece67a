/**
 * The layout of a set of bore readings, shared by the inspection record and
 * the bore-check calculator: three depths, two directions, then the piston.
 * Cell keys are the schema paths ("cylinders.2.middle.axial"), so a schema
 * message lands on its cell without translation.
 */
export const DEPTHS = ['top', 'middle', 'bottom'] as const;
export const DIRECTIONS = ['thrust', 'axial'] as const;
export type Depth = (typeof DEPTHS)[number];
export type Direction = (typeof DIRECTIONS)[number];

/** The grid's columns in Tab order: top, middle, bottom; thrust then axial; then the piston. */
export const GRID_COLUMNS = [
  'top.thrust',
  'top.axial',
  'middle.thrust',
  'middle.axial',
  'bottom.thrust',
  'bottom.axial',
  'piston',
] as const;
export type GridColumn = (typeof GRID_COLUMNS)[number];

export const cellKey = (cylinder: number, column: GridColumn) => `cylinders.${cylinder}.${column}`;

/** "Cylinder 3 middle axial", "Cylinder 3 piston diameter" (cylinder is zero-based). */
export function cellLabel(cylinder: number, column: GridColumn): string {
  if (column === 'piston') return `Cylinder ${cylinder + 1} piston diameter`;
  const [depth, direction] = column.split('.');
  return `Cylinder ${cylinder + 1} ${depth} ${direction}`;
}

/** A cell's schema path in words, "cylinders.2.middle.axial" → "cylinder 3 middle axial"; undefined for any other path. */
export function cellPathWords(path: string): string | undefined {
  const cell = /^cylinders\.(\d+)\.(top|middle|bottom|piston)(?:\.(thrust|axial))?/.exec(path);
  if (!cell) return undefined;
  return cell[2] === 'piston' ? `cylinder ${Number(cell[1]) + 1} piston diameter` : `cylinder ${Number(cell[1]) + 1} ${cell[2]} ${cell[3] ?? ''}`.trim();
}

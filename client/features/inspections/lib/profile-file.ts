/**
 * A profile trace read in the browser from a CSV or text file: heights in
 * micrometres at equal spacing, one per line or separated by commas (tabs,
 * spaces and semicolons also work). A first line of words is a header and is
 * skipped. When a line holds several columns, the last is the height (a
 * position column before it is common in exported traces).
 */
import { isDecimal, splitRows } from '@client/lib/numbers';

export type TraceRead = { ok: true; heights: number[]; headerSkipped: boolean } | { ok: false; message: string };

export const MAX_TRACE_POINTS = 200_000;

export function readTrace(text: string): TraceRead {
  const rows = splitRows(text);
  const heights: number[] = [];
  let headerSkipped = false;
  for (let index = 0; index < rows.length; index++) {
    const cells = rows[index];
    if (index === 0 && !cells.some(isDecimal)) {
      headerSkipped = true;
      continue;
    }
    const bad = cells.find((cell) => !isDecimal(cell));
    if (bad !== undefined) {
      return { ok: false, message: `Row ${index + 1}: “${bad.slice(0, 24)}” is not a number. Give one height in micrometres per row.` };
    }
    heights.push(Number(cells[cells.length - 1]));
    if (heights.length > MAX_TRACE_POINTS) return { ok: false, message: `A trace may have at most ${MAX_TRACE_POINTS.toLocaleString('en-US')} heights.` };
  }
  if (heights.length === 0) return { ok: false, message: headerSkipped ? 'Only a header row was found; there are no heights under it.' : 'The file is empty.' };
  return { ok: true, heights, headerSkipped };
}

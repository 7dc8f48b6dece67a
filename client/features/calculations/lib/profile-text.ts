/**
 * Reading a roughness profile from pasted text or an uploaded CSV or text
 * file: heights in micrometres at equal spacing, one per line or separated by
 * commas (spaces, tabs and semicolons also work). A first line that holds
 * words rather than numbers is taken as a header and skipped; anything else
 * that is not a number stops the read with the line it was found on.
 */

export type ProfileRead =
  | { kind: 'empty' }
  | { kind: 'heights'; heights: number[]; headerSkipped: boolean }
  | { kind: 'error'; message: string };

const DECIMAL = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const SEPARATORS = /[\s,;]+/;

function shorten(token: string): string {
  return token.length > 24 ? `${token.slice(0, 24)}…` : token;
}

export function readProfileText(text: string): ProfileRead {
  const heights: number[] = [];
  let headerSkipped = false;
  let seenContent = false;
  const lines = text.split(/\r\n|\n|\r/);
  for (let lineIndex = 0; lineIndex < lines.length; lineIndex++) {
    const line = lines[lineIndex].trim().replace(/^\uFEFF/, '');
    if (line === '') continue;
    const tokens = line.split(SEPARATORS).filter(Boolean);
    const isFirst = !seenContent;
    seenContent = true;
    const bad = tokens.find((token) => !DECIMAL.test(token));
    if (bad !== undefined) {
      if (isFirst && /[a-z]/i.test(line) && !tokens.some((token) => DECIMAL.test(token))) {
        headerSkipped = true;
        continue;
      }
      return {
        kind: 'error',
        message: `Line ${lineIndex + 1}: “${shorten(bad)}” is not a number. Give one height in micrometres per line, or separate the heights with commas.`,
      };
    }
    for (const token of tokens) heights.push(Number(token));
  }
  if (heights.length === 0) {
    return headerSkipped ? { kind: 'error', message: 'Only a header line was found; there are no heights under it.' } : { kind: 'empty' };
  }
  return { kind: 'heights', heights, headerSkipped };
}

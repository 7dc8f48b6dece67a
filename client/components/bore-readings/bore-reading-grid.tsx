import { useId, useState, type ClipboardEvent, type KeyboardEvent, type ReactNode } from 'react';
import type { LengthUnit } from '@shared/calc';
import { DEPTHS, DIRECTIONS, GRID_COLUMNS, cellKey, cellLabel, cellPathWords } from '@client/lib/bore-readings';
import { cn } from '@client/lib/cn';
import { splitRows } from '@client/lib/numbers';

export interface BoreReadingGridProps {
  cylinderCount: number;
  unit: LengthUnit;
  /** The typed text by cell key (the schema path, see cellKey). */
  cells: Record<string, string>;
  /** Messages by schema path; the grid shows those of its cells under the table and ties them to the cells. */
  errors: Record<string, string>;
  onChange: (changes: Record<string, string>) => void;
  /** The help above the grid; the table is described by it. */
  help: ReactNode;
  /** The small words under "Piston" in the heading. */
  pistonNote: string;
  /** The id of a cell's input (its message gets the same id plus "-error"); by default one made for this grid. */
  inputId?: (path: string) => string;
  /** Fill the grid from a block of rows pasted from a spreadsheet, and say what was filled. */
  pasteRows?: boolean;
  /** Extra classes for the table, such as its least width. */
  tableClassName?: string;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/**
 * The cylinder column stays in place while a narrow screen scrolls the
 * readings sideways; its background hides the cells passing under it.
 */
const stickyColumn = 'sticky left-0 z-10 bg-paper-raised';

/**
 * Bore readings as a keyboard-first grid, one row per cylinder. Tab runs
 * along a cylinder (top, middle, bottom; thrust then axial; then the piston),
 * Enter and the down arrow go to the same reading of the next cylinder (from
 * the last cylinder, Enter goes to the top of the next column), the up arrow
 * back. With `pasteRows`, a block pasted from a spreadsheet fills the grid
 * from the cell it lands in.
 */
export function BoreReadingGrid({ cylinderCount, unit, cells, errors, onChange, help, pistonNote, inputId, pasteRows = false, tableClassName }: BoreReadingGridProps) {
  const gridId = useId();
  const idOf = inputId ?? ((path: string) => `${gridId}${path.replace(/\./g, '-')}`);
  const helpId = `${gridId}help`;
  const [pasteNote, setPasteNote] = useState('');

  const focusCell = (row: number, column: number) => {
    const target = document.getElementById(idOf(cellKey(row, GRID_COLUMNS[column]))) as HTMLInputElement | null;
    if (!target) return;
    target.focus();
    target.select();
  };

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>, row: number, column: number) => {
    if (event.key === 'Enter' || event.key === 'ArrowDown') {
      // Never submit a form from the grid.
      event.preventDefault();
      if (row + 1 < cylinderCount) focusCell(row + 1, column);
      else if (event.key === 'Enter' && column + 1 < GRID_COLUMNS.length) focusCell(0, column + 1);
    } else if (event.key === 'ArrowUp') {
      event.preventDefault();
      if (row > 0) focusCell(row - 1, column);
    }
  };

  const onPaste = (event: ClipboardEvent<HTMLInputElement>, row: number, column: number) => {
    const rows = splitRows(event.clipboardData.getData('text/plain'));
    // One number pastes into the cell as usual.
    if (rows.length === 0 || (rows.length === 1 && rows[0].length <= 1)) return;
    event.preventDefault();
    const changes: Record<string, string> = {};
    let left = 0;
    rows.forEach((values, r) => {
      values.forEach((value, c) => {
        const targetRow = row + r;
        const targetColumn = column + c;
        if (targetRow < cylinderCount && targetColumn < GRID_COLUMNS.length) changes[cellKey(targetRow, GRID_COLUMNS[targetColumn])] = value;
        else left += 1;
      });
    });
    onChange(changes);
    const filled = Object.keys(changes).length;
    setPasteNote(
      `Pasted ${filled} ${filled === 1 ? 'reading' : 'readings'} from cylinder ${row + 1}.` +
        (left > 0 ? ` ${left} ${left === 1 ? 'value did' : 'values did'} not fit in the grid and ${left === 1 ? 'was' : 'were'} left out.` : ''),
    );
  };

  const gridErrors = Object.entries(errors).filter(([path]) => /^cylinders\.\d+\./.test(path));

  const cell = (row: number, column: number) => {
    const key = cellKey(row, GRID_COLUMNS[column]);
    const error = errors[key];
    return (
      <input
        id={idOf(key)}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        aria-label={cellLabel(row, GRID_COLUMNS[column])}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${idOf(key)}-error` : undefined}
        value={cells[key] ?? ''}
        onChange={(event) => onChange({ [key]: event.target.value })}
        onKeyDown={(event) => onKeyDown(event, row, column)}
        onPaste={pasteRows ? (event) => onPaste(event, row, column) : undefined}
        className={cn(
          'w-full min-w-0 rounded-md border px-2 py-2 text-sm tabular-nums text-ink',
          error ? 'border-fail bg-fail-soft' : 'border-slate-300 bg-white focus:border-slate-600',
        )}
      />
    );
  };

  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-ink-soft" id={helpId}>
        {help}
      </p>
      <div className="relative overflow-x-auto" data-testid="reading-grid-scroller">
        <table className={cn('w-full table-fixed border-separate border-spacing-1 text-sm', tableClassName)} aria-describedby={helpId}>
          <caption className="sr-only">Bore readings in {unit}, one row per cylinder</caption>
          <colgroup>
            <col className="w-10" />
          </colgroup>
          <thead className="text-ink-soft">
            <tr>
              <th scope="col" rowSpan={2} className={cn(stickyColumn, 'text-left font-semibold')}>
                Cyl.
              </th>
              {DEPTHS.map((depth) => (
                <th key={depth} scope="colgroup" colSpan={2} className="border-b border-slate-200 pb-0.5 font-semibold capitalize text-ink">
                  {depth}
                </th>
              ))}
              <th scope="col" rowSpan={2} className="align-bottom font-semibold text-ink">
                Piston <span className="block text-xs font-normal text-ink-soft">{pistonNote}</span>
              </th>
            </tr>
            <tr>
              {DEPTHS.flatMap((depth) =>
                DIRECTIONS.map((direction) => (
                  <th key={`${depth}-${direction}`} scope="col" className="font-normal capitalize">
                    {direction}
                  </th>
                )),
              )}
            </tr>
          </thead>
          <tbody>
            {Array.from({ length: cylinderCount }, (_, row) => (
              <tr key={row}>
                <th scope="row" className={cn(stickyColumn, 'text-left font-bold text-ink')}>
                  {row + 1}
                </th>
                {GRID_COLUMNS.map((_, column) => (
                  <td key={column}>{cell(row, column)}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {pasteRows && (
        <p aria-live="polite" className="text-sm text-ink-soft" data-testid="paste-note">
          {pasteNote}
        </p>
      )}
      {gridErrors.length > 0 && (
        <ul className="flex flex-col gap-0.5 text-sm font-semibold text-fail">
          {gridErrors.map(([path, message]) => (
            <li key={path} id={`${idOf(path)}-error`}>
              {capitalise(cellPathWords(path) ?? path)}: {message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

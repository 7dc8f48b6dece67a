import type { ReactNode } from 'react';
import { cn } from '@client/lib/cn';

/** A column heading: its words, whether figures line up on the right, and whether the words are for screen readers only. */
export type TableColumn = string | { label: ReactNode; align?: 'right'; srOnly?: boolean };

/**
 * The heading row the app's data tables share: one `th scope="col"` per
 * column, padded between columns (not after the last), `dense` for tables
 * inside a card.
 */
export function TableHead({ columns, dense = false }: { columns: TableColumn[]; dense?: boolean }) {
  return (
    <thead className="border-b border-slate-200 text-ink-soft">
      <tr>
        {columns.map((column, index) => {
          const { label, align, srOnly } = typeof column === 'string' ? { label: column, align: undefined, srOnly: false } : column;
          const last = index === columns.length - 1;
          return (
            <th
              key={index}
              scope="col"
              className={cn(dense ? 'py-2' : 'py-3', !last && (dense ? 'pr-3' : 'pr-4'), align === 'right' && 'text-right', 'font-semibold')}
            >
              {srOnly ? <span className="sr-only">{label}</span> : label}
            </th>
          );
        })}
      </tr>
    </thead>
  );
}

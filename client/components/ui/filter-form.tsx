import type { ReactNode } from 'react';
import { cn } from '@client/lib/cn';
import { Button } from './button';

/**
 * The filters above a list (the job board, the shop directory, the ledger,
 * the audit log): a search landmark that never submits, since each filter
 * applies as it changes. `className` lays out the fields (grid or row).
 */
export function FilterForm({ label, className, children }: { label: string; className: string; children: ReactNode }) {
  return (
    <form role="search" aria-label={label} onSubmit={(event) => event.preventDefault()} className={cn('mb-6 gap-4 rounded-card bg-paper-sunk p-4', className)}>
      {children}
    </form>
  );
}

/** "Clear filters" as the last cell of a filter grid, enabled once a filter is set. */
export function ClearFiltersButton({ filtered, onClear }: { filtered: boolean; onClear: () => void }) {
  return (
    <div className="flex items-end">
      <Button variant="secondary" onClick={onClear} disabled={!filtered} className="w-full">
        Clear filters
      </Button>
    </div>
  );
}

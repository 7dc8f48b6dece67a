import { cn } from '@client/lib/cn';

export interface PagerProps {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
  /** What the list holds, for the accessible name: "job board pages". */
  label: string;
  className?: string;
}

const buttonClass =
  'inline-flex min-h-11 items-center rounded-lg px-4 text-sm font-semibold text-slate-800 ring-1 ring-inset ring-slate-300 hover:bg-slate-50 disabled:cursor-not-allowed disabled:text-ink-faint disabled:hover:bg-transparent';

/** Previous and next page, with where you are: "Page 2 of 7". */
export function Pager({ page, pageSize, total, onPage, label, className }: PagerProps) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (pages <= 1 && page <= 1) return null;
  return (
    <nav aria-label={label} className={cn('flex flex-wrap items-center gap-3', className)}>
      <button type="button" className={buttonClass} disabled={page <= 1} onClick={() => onPage(page - 1)}>
        <span aria-hidden>←</span> Previous
      </button>
      <p className="text-sm text-ink-soft" aria-live="polite">
        Page {page} of {pages}
      </p>
      <button type="button" className={buttonClass} disabled={page >= pages} onClick={() => onPage(page + 1)}>
        Next <span aria-hidden>→</span>
      </button>
    </nav>
  );
}

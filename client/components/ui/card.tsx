import type { ReactNode } from 'react';
import { cn } from '@client/lib/cn';

/** A raised card; with `aria-labelledby` (its heading's id) it is a named region, so its fields can be told from another card's. */
export function Card({ children, className, 'aria-labelledby': labelledBy }: { children: ReactNode; className?: string; 'aria-labelledby'?: string }) {
  return (
    <section aria-labelledby={labelledBy} className={cn('rounded-card bg-paper-raised p-6 shadow-card ring-1 ring-slate-100', className)}>
      {children}
    </section>
  );
}

export function PageTitle({ title, lead }: { title: string; lead?: ReactNode }) {
  return (
    <header className="mb-6">
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{title}</h1>
      {lead && <p className="mt-2 max-w-2xl text-lg text-ink-soft">{lead}</p>}
    </header>
  );
}

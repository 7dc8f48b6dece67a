import { useIsFetching, type Query } from '@tanstack/react-query';
import { useEffect, useState, type ReactNode } from 'react';
import { usePanelsLoading } from '@client/components/lazy-panel';
import { cn } from '@client/lib/cn';

/** A query loading for the first time: it has nothing to show yet (a background refetch has). */
const firstLoad = (query: Query) => query.state.data === undefined;
/** How long nothing may be loading for the first time before the content counts as settled (its panels' queries start as they mount). */
const SETTLE_MS = 60;

/**
 * A page of many panels, each filling in when its own answer comes: the panels are laid out at once
 * but shown only when their first answers are in (or after `maxWaitMs` at most, so a slow one never
 * hides the page), with `placeholder` over them meanwhile. So the reader never sees a panel grow and
 * push the ones below it down (layout shift), and the page appears whole. Later loads (a refetch, a
 * panel opened by the reader) show as before.
 */
export function RevealWhenSettled({ placeholder, maxWaitMs = 1_500, children }: { placeholder: ReactNode; maxWaitMs?: number; children: ReactNode }) {
  // Panels whose code is still loading count as not settled: they would appear and push the rest down.
  const firstLoads = useIsFetching({ predicate: firstLoad }) + usePanelsLoading();
  const [revealed, setRevealed] = useState(false);
  useEffect(() => {
    const timer = setTimeout(() => setRevealed(true), maxWaitMs);
    return () => clearTimeout(timer);
  }, [maxWaitMs]);
  useEffect(() => {
    if (revealed || firstLoads > 0) return;
    const timer = setTimeout(() => setRevealed(true), SETTLE_MS);
    return () => clearTimeout(timer);
  }, [revealed, firstLoads]);
  return (
    <div className="relative" aria-busy={!revealed}>
      {!revealed && <div className="absolute inset-x-0 top-0">{placeholder}</div>}
      <div className={cn(!revealed && 'invisible')}>{children}</div>
    </div>
  );
}

import { useIsFetching, type Query } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useLocation, useNavigation } from 'react-router-dom';

/** Waits shorter than this show nothing, so a fast page change does not flicker. */
export const PROGRESS_DELAY_MS = 150;
/** After a page change, how long nothing may be loading before the page counts as arrived. */
const SETTLE_MS = 300;

/** A query loading for the first time: it has nothing to show yet (a background refetch has). */
const firstLoad = (query: Query) => query.state.data === undefined;

/**
 * Whether a page change is still under way: the router is loading the new
 * page's code, or the page just shown is still loading its first data. Once
 * the page has arrived, later fetches (refetches, a filter changed on the
 * page) do not count.
 */
function usePageChanging(): boolean {
  const navigation = useNavigation();
  const { pathname } = useLocation();
  const firstLoads = useIsFetching({ predicate: firstLoad });
  const routing = navigation.state !== 'idle';
  const [arriving, setArriving] = useState(true);
  useEffect(() => setArriving(true), [pathname]);
  useEffect(() => {
    if (!arriving || routing || firstLoads > 0) return;
    // The new page's queries start as it mounts; give them a moment to be counted.
    const timer = setTimeout(() => setArriving(false), SETTLE_MS);
    return () => clearTimeout(timer);
  }, [arriving, routing, firstLoads]);
  return routing || (arriving && firstLoads > 0);
}

/** A thin bar across the top of the window while a page change takes longer than a moment. */
export function PageProgress() {
  const changing = usePageChanging();
  const [shown, setShown] = useState(false);
  useEffect(() => {
    if (!changing) {
      setShown(false);
      return;
    }
    const timer = setTimeout(() => setShown(true), PROGRESS_DELAY_MS);
    return () => clearTimeout(timer);
  }, [changing]);
  if (!shown) return null;
  return (
    <div role="progressbar" aria-label="Loading page" className="fixed inset-x-0 top-0 z-50 h-1 overflow-hidden bg-brass-100 print:hidden" data-testid="page-progress">
      <div className="page-progress-stripe h-full w-2/5 bg-brass-600" />
    </div>
  );
}

import { useSearchParams } from 'react-router-dom';

/** A query string from an object, skipping empty values: {a: 1, b: ''} → "?a=1". */
export function toSearch(values: Record<string, string | number | boolean | undefined | null>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(values)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

/**
 * Changes to the address bar's query for pages whose filters live there
 * (the job board, the ledger, the shop directory, the audit log): `update`
 * edits a copy of the current query; `setFilter` sets or clears one filter
 * and goes back to page 1; `clearFilters` clears the page's filters (`filterKeys`); `setPage`
 * moves through the list (page 1 has no `page` in the address).
 */
export function useSearchParamUpdater(filterKeys: readonly string[] = []) {
  const [params, setParams] = useSearchParams();
  /** Whether any of the filters is set. */
  const filtered = filterKeys.some((key) => params.get(key));
  const update = (change: (next: URLSearchParams) => void, { replace = false } = {}) =>
    setParams(
      (current) => {
        const next = new URLSearchParams(current);
        change(next);
        return next;
      },
      { replace },
    );
  const setFilter = (key: string, value: string, options?: { replace?: boolean }) =>
    update((next) => {
      if (value.trim()) next.set(key, value.trim());
      else next.delete(key);
      next.delete('page');
    }, options);
  const clearFilters = () =>
    update((next) => {
      for (const key of filterKeys) next.delete(key);
      next.delete('page');
    });
  /** By default the window goes back to the top, where the new page's list starts. */
  const setPage = (page: number, { scrollToTop = true } = {}) => {
    update((next) => (page > 1 ? next.set('page', String(page)) : next.delete('page')));
    if (scrollToTop) window.scrollTo({ top: 0 });
  };
  return { params, setParams, update, setFilter, filtered, clearFilters, setPage };
}

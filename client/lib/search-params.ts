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
 * (the job board, the ledger): `update` edits a copy of the current query;
 * `setFilter` sets or clears one filter and goes back to page 1.
 */
export function useSearchParamUpdater() {
  const [params, setParams] = useSearchParams();
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
  return { params, update, setFilter };
}

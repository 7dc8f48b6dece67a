import { useEffect, useSyncExternalStore } from 'react';

/**
 * A module a page needs only sometimes (say, a zod schema, and zod with it, about 25 KB gzipped, to check
 * filters typed into the address bar), loaded when first needed instead of with the page. Make one at
 * module level, so every render shares one load:
 *
 *   const usePaymentSchemas = lazyModule(() => import('@shared/schemas/payments'));
 *   const schemas = usePaymentSchemas(params.has('from'));   // undefined until loaded
 *
 * The hook starts the load once `needed` is true and returns the module once it is in (at once on later
 * renders and pages). A failed load is thrown from the hook during render, as a page whose own chunk
 * failed would be, so the route's error page shows it; a later visit tries again.
 * Making one has no side effects (a chunk that does not use it leaves it out).
 */
/*#__NO_SIDE_EFFECTS__*/
export function lazyModule<T>(load: () => Promise<T>): (needed: boolean) => T | undefined {
  let value: T | undefined;
  let failure: { error: unknown } | undefined;
  let loading: Promise<void> | undefined;
  const listeners = new Set<() => void>();
  const changed = () => listeners.forEach((listener) => listener());
  const start = () =>
    (loading ??= load().then(
      (loaded) => {
        value = loaded;
        changed();
      },
      (error: unknown) => {
        failure = { error };
        changed();
        // Shown once (by the renders now under way); a later render loads again.
        setTimeout(() => {
          failure = undefined;
          loading = undefined;
        });
      },
    ));
  const subscribe = (listener: () => void) => {
    listeners.add(listener);
    return () => listeners.delete(listener);
  };
  const snapshot = () => (failure ? failure : value);
  return function useLazyModule(needed) {
    const current = useSyncExternalStore(subscribe, snapshot);
    useEffect(() => {
      if (needed) void start();
    }, [needed]);
    if (current && current === failure) throw failure.error;
    return current as T | undefined;
  };
}

import { lazy, Suspense, useSyncExternalStore, type ComponentType, type ReactNode } from 'react';

// How many panels' code is still on its way, for a page that shows its panels together (RevealWhenSettled).
let loading = 0;
const listeners = new Set<() => void>();
const changed = () => listeners.forEach((listener) => listener());
function tracked<T>(load: Promise<T>): Promise<T> {
  loading += 1;
  changed();
  return load.finally(() => {
    loading -= 1;
    changed();
  });
}
const subscribe = (listener: () => void) => {
  listeners.add(listener);
  return () => listeners.delete(listener);
};
/** The number of lazy panels whose code is loading now. */
export function usePanelsLoading(): number {
  return useSyncExternalStore(subscribe, () => loading);
}

/**
 * A panel whose code loads when it is first rendered, in a chunk of its own with
 * whatever only it needs (forms, zod schemas, the inspection record), so a page
 * that shows it only sometimes, or below the fold, does not fetch it first.
 * `placeholder` holds its place meanwhile; give it the panel's size when the
 * panel is sure to show, and leave it empty when the panel may render nothing.
 * Making one has no side effects, so a feature can export one freely. `preload()`
 * starts the load before the panel renders (say, from an effect while the page
 * still waits for the answers the panel needs), so the two arrive together.
 *
 *   export const DisputePanel = lazyPanel(() => import('./dispute-panel').then((m) => m.DisputePanel));
 */
/*#__NO_SIDE_EFFECTS__*/
export function lazyPanel<P extends object>(
  load: () => Promise<ComponentType<P>>,
  placeholder: ReactNode = null,
): ((props: P) => ReactNode) & { preload: () => void } {
  let loading: Promise<ComponentType<P>> | undefined;
  const start = () => (loading ??= tracked(load()));
  const Panel = lazy(() => start().then((component) => ({ default: component })));
  function LazyPanel(props: P) {
    return (
      <Suspense fallback={placeholder}>
        <Panel {...props} />
      </Suspense>
    );
  }
  return Object.assign(LazyPanel, {
    preload: () => {
      // A failed preload is left for the panel's own load to report when it renders.
      start().catch(() => undefined);
    },
  });
}

/**
 * The placeholder of a page's main part that loads as a lazy panel (a form, the calculator's cards):
 * at least a screen tall, so the footer stays out of view and nothing below moves when the part comes.
 */
export function MainPartPlaceholder({ children }: { children: ReactNode }) {
  return (
    <p className="min-h-screen text-ink-soft" aria-busy="true">
      {children}
    </p>
  );
}

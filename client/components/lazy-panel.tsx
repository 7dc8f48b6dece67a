import { lazy, Suspense, type ComponentType, type ReactNode } from 'react';

/**
 * A panel whose code loads when it is first rendered, in a chunk of its own with
 * whatever only it needs (forms, zod schemas, the inspection record), so a page
 * that shows it only sometimes, or below the fold, does not fetch it first.
 * `placeholder` holds its place meanwhile; give it the panel's size when the
 * panel is sure to show, and leave it empty when the panel may render nothing.
 * Making one has no side effects, so a feature can export one freely.
 *
 *   export const DisputePanel = lazyPanel(() => import('./dispute-panel').then((m) => m.DisputePanel));
 */
/*#__NO_SIDE_EFFECTS__*/
export function lazyPanel<P extends object>(load: () => Promise<ComponentType<P>>, placeholder: ReactNode = null): (props: P) => ReactNode {
  const Panel = lazy(() => load().then((component) => ({ default: component })));
  return function LazyPanel(props: P) {
    return (
      <Suspense fallback={placeholder}>
        <Panel {...props} />
      </Suspense>
    );
  };
}

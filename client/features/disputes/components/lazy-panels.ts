import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const DisputePanel = lazyPanel(() => import('./dispute-panel').then((m) => m.DisputePanel));

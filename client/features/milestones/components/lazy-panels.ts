import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const MilestonesPanel = lazyPanel(() => import('./milestones-panel').then((m) => m.MilestonesPanel));
export const ShippingPanel = lazyPanel(() => import('./shipping-panel').then((m) => m.ShippingPanel));

import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const InspectionReview = lazyPanel(() => import('./inspection-review').then((m) => m.InspectionReview));

import { lazyPanel, MainPartPlaceholder } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const InspectionReview = lazyPanel(() => import('./inspection-review').then((m) => m.InspectionReview));
/**
 * The inspection entry form (its figures, checks and the shared schema, with zod) in a chunk of its own:
 * the entry page preloads it while the job and the record load, so the two arrive together.
 */
export const InspectionEntry = lazyPanel(
  () => import('./inspection-entry').then((m) => m.InspectionEntry),
  <MainPartPlaceholder>Loading the form …</MainPartPlaceholder>,
);

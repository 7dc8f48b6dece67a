import { lazyPanel, MainPartPlaceholder } from '@client/components/lazy-panel';

/**
 * The inspection entry form (its figures, checks and the shared schema, with zod) in a chunk of its own:
 * the entry page preloads it while the job and the record load, so the two arrive together. In a file of
 * its own, so that the job page's chunk of panels does not carry it.
 */
export const InspectionEntry = lazyPanel(
  () => import('./inspection-entry').then((m) => m.InspectionEntry),
  <MainPartPlaceholder>Loading the form …</MainPartPlaceholder>,
);

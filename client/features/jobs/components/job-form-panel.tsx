import { lazyPanel, MainPartPlaceholder } from '@client/components/lazy-panel';

/**
 * The job form (react-hook-form, the steps, the live figures) in a chunk of its own: the page's title
 * and notices paint first and the form follows; the edit page preloads it while the job loads. In a file
 * of its own, so that the job page's chunk of panels does not carry it.
 */
export const JobForm = lazyPanel(
  () => import('./job-form').then((m) => m.JobForm),
  <MainPartPlaceholder>Loading the form …</MainPartPlaceholder>,
);

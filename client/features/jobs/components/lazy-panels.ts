import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const PhotoUploader = lazyPanel(() => import('./photo-uploader').then((m) => m.PhotoUploader));
// The job form's last step (with the shared schema, and zod, for its full parse): loaded when the step opens.
export const JobFormSummary = lazyPanel(() => import('./job-form-summary').then((m) => m.JobFormSummary));

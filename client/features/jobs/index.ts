// The jobs feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useBoard, useCreateJob, useJob, useMyJobs, usePublishJob, useUpdateJob } from './api/jobs';
export { readBoardFilters } from './board-filters';
export { JobFiguresPanel } from './components/job-figures';
export { JobForm } from './components/job-form-panel';
export { keptFormKey } from './components/job-form-keeper';
export { JobOwnerActions } from './components/job-owner-actions';
export { JobLogistics, JobOperations, JobSpec } from './components/job-spec';
export { JobStatusBadge } from './components/job-status-badge';
export { plural, statusWords } from './components/job-words';
export { otherShopExplain, staffExplain, workingShopExplain } from './components/shop-job-words';
export { PhotoGallery } from './components/photo-gallery';
export { PhotoUploader } from './components/lazy-panels';

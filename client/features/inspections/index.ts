// The inspections feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useInspection } from './api/inspections';
export { InspectionEntryForm } from './components/inspection-entry-form';
export type { InspectionEntryFormProps } from './components/inspection-entry-form';
export { finishFilterWords } from './lib/finish-filter-words';
export { RecordSections } from './components/record-section-block';
export { draftSavedAt, emptyRecord, fromDraft, fromInput } from './lib/record-form';
export { InspectionReview } from './components/lazy-panels';

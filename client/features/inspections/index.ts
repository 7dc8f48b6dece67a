// The inspections feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useInspection } from './api/inspections';
export { finishFilterWords } from './lib/finish-filter-words';
export { RecordSections } from './components/record-section-block';
export { InspectionEntry } from './components/inspection-entry-panel';
export { InspectionReview } from './components/lazy-panels';

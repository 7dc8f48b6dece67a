// The milestones feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { milestoneKindWords, milestoneTitle } from './components/milestone-words';
export { MilestonePhotoPicker, type PendingPhoto } from './components/milestone-photo-picker';
export { MilestonesPanel, ShippingPanel } from './components/lazy-panels';

// The disputes feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { DisputePanel } from './components/lazy-panels';

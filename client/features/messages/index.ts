// The messages feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useUnreadTotal } from './api/threads';
export { ConversationList } from './components/conversation-list';
export type { Bidder } from './components/conversation-panel';
export { ConversationPanel } from './components/lazy-panels';

// The bids feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { bidQueries, useMyBids, useWorkQueue } from './api/bids';
export { BidStatusBadge, days, formatMoment } from './components/bid-summary';
export { WorkQueueList } from './components/work-queue';
export { BidComparison, ShopBidPanel } from './components/lazy-panels';

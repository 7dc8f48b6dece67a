// The payments feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { JobMoneyPanel, ShopExtraWork } from './components/job-money-panel';
export { ProposeChangeOrder } from './components/propose-change-order';
export { PayoutSetup } from './components/payout-setup';

import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const BidComparison = lazyPanel(() => import('./bid-comparison').then((m) => m.BidComparison));
export const ShopBidPanel = lazyPanel(() => import('./shop-bid-panel').then((m) => m.ShopBidPanel));

// The shops feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useOwnShop, useShop, useShops } from './api/shops';
export type { DirectoryFilters } from './api/shops';
export { operationsByPart } from './components/operation-words';
export { RateCardTable } from './components/rate-card-table';
export { RatingText, ShopCard, VerifiedBadge, placeOf } from './components/shop-card';
export { ShopProfileForm } from './components/shop-profile-form';

import { Link } from 'react-router-dom';
import type { PublicShop } from '@shared/schemas/shops';
import { ShopStandingList } from '@client/components/standing';
import { Badge } from '@client/components/ui/badge';
import { inCatalogueOrder, operationName } from './operation-words';

export function placeOf(shop: Pick<PublicShop, 'city' | 'region' | 'country'>) {
  return [shop.city, shop.region, shop.country].filter(Boolean).join(', ');
}

export function RatingText({ rating }: { rating: PublicShop['rating'] }) {
  if (!rating || rating.count === 0) return <span className="text-ink-soft">No reviews yet</span>;
  return (
    <span>
      <span aria-hidden className="text-brass-700">★ </span>
      {rating.average.toFixed(1)} out of 5 <span className="text-ink-soft">({rating.count} {rating.count === 1 ? 'review' : 'reviews'})</span>
    </span>
  );
}

export function VerifiedBadge() {
  return (
    <Badge tone="success">
      <span aria-hidden>✓</span> Verified
    </Badge>
  );
}

/** One shop in the directory: enough to decide whether to open its page. */
export function ShopCard({ shop, distance }: { shop: PublicShop; distance?: string }) {
  const capabilities = inCatalogueOrder(shop.capabilities, (code) => code);
  return (
    <article className="flex h-full flex-col gap-3 rounded-card bg-paper-raised p-5 shadow-card ring-1 ring-slate-100">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h2 className="text-lg font-bold leading-tight">
          <Link to={`/shops/${shop.id}`} className="text-slate-700 underline-offset-4 hover:underline">
            {shop.name}
          </Link>
        </h2>
        {shop.verified && <VerifiedBadge />}
      </div>
      <p className="text-sm text-ink-soft">
        {placeOf(shop)} · {shop.takesShipped ? 'takes shipped parts' : 'drop-off only'}
        {distance && <span className="block font-semibold text-ink" data-testid="shop-distance">{distance}</span>}
      </p>
      <ul aria-label="Work they do" className="flex flex-wrap gap-1.5">
        {capabilities.map((code) => (
          <li key={code} className="rounded-md bg-slate-50 px-2 py-0.5 text-sm text-slate-800 ring-1 ring-slate-200">
            {operationName(code)}
          </li>
        ))}
      </ul>
      <dl className="mt-auto grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold text-ink-soft">Turnaround</dt>
        <dd>
          usually {shop.turnaroundDays} working {shop.turnaroundDays === 1 ? 'day' : 'days'}
        </dd>
        <dt className="font-semibold text-ink-soft">Rating</dt>
        <dd>
          <RatingText rating={shop.rating} />
        </dd>
      </dl>
      <ShopStandingList standing={shop.standing} className="border-t border-slate-100 pt-2" />
    </article>
  );
}

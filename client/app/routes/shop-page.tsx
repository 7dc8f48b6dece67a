import { Link, useParams } from 'react-router-dom';
import { ShopStandingList, STANDING_NOTE } from '@client/components/standing';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useShop, operationsByPart, RateCardTable, placeOf, RatingText, VerifiedBadge } from '@client/features/shops';
import { ApiError } from '@client/lib/api-client';

export function ShopPageRoute() {
  const { shopId = '' } = useParams();
  const shop = useShop(shopId);

  if (shop.isPending) return <p className="text-ink-soft">Loading the shop …</p>;
  if (shop.isError) {
    const missing = shop.error instanceof ApiError && (shop.error.status === 404 || shop.error.status === 400);
    return (
      <div className="mx-auto max-w-lg">
        <Notice tone="error" title={missing ? 'No such shop' : 'The shop could not be loaded'} onRetry={missing ? undefined : () => void shop.refetch()}>
          {missing ? 'This shop is not on Tenthmark, or its address is mistyped.' : shop.error.message}{' '}
          <Link to="/shops" className="font-semibold underline underline-offset-4">
            See all shops
          </Link>
        </Notice>
      </div>
    );
  }

  const data = shop.data;
  const groups = operationsByPart
    .map((group) => ({ ...group, operations: group.operations.filter((op) => data.capabilities.includes(op.code)) }))
    .filter((group) => group.operations.length > 0);

  return (
    <div className="flex flex-col gap-6">
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link to="/shops" className="font-semibold text-slate-700 underline underline-offset-4">
          Machine shops
        </Link>
        <span aria-hidden className="px-2 text-ink-faint">/</span>
        <span aria-current="page" className="text-ink-soft">{data.name}</span>
      </nav>
      <header className="flex flex-col gap-2">
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-3xl font-extrabold tracking-tight">{data.name}</h1>
          {data.verified && <VerifiedBadge />}
        </div>
        <p className="text-lg text-ink-soft">{placeOf(data)}</p>
      </header>

      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[2fr_3fr]">
        <Card className="flex flex-col gap-4">
          <h2 className="text-xl font-bold">At a glance</h2>
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2">
            <dt className="font-semibold text-ink-soft">Turnaround</dt>
            <dd>
              usually {data.turnaroundDays} working {data.turnaroundDays === 1 ? 'day' : 'days'}
            </dd>
            <dt className="font-semibold text-ink-soft">Shipped parts</dt>
            <dd>{data.takesShipped ? 'Takes parts shipped to the shop' : 'Drop-off at the shop only'}</dd>
            <dt className="font-semibold text-ink-soft">Rating</dt>
            <dd>
              <RatingText rating={data.rating} />
            </dd>
            <dt className="font-semibold text-ink-soft">Checked by us</dt>
            <dd>{data.verified ? 'Yes, Tenthmark has verified this shop' : 'Not yet verified'}</dd>
          </dl>
          <h2 className="mt-2 text-xl font-bold">Work they do</h2>
          <div className="flex flex-col gap-3">
            {groups.map((group) => (
              <div key={group.part}>
                <h3 className="text-sm font-bold uppercase tracking-wider text-brass-700">{group.heading}</h3>
                <p>{group.operations.map((op) => op.name).join(', ')}</p>
              </div>
            ))}
          </div>
          {data.equipmentNotes && (
            <>
              <h2 className="mt-2 text-xl font-bold">Equipment</h2>
              <p className="whitespace-pre-line text-ink-soft">{data.equipmentNotes}</p>
            </>
          )}
        </Card>
        <div className="flex flex-col gap-6 lg:self-start">
          <Card>
            <h2 className="mb-3 text-xl font-bold">Record on Tenthmark</h2>
            <ShopStandingList standing={data.standing} className="text-base" />
            <p className="mt-3 text-sm text-ink-soft">{STANDING_NOTE}</p>
          </Card>
          <Card>
            <h2 className="mb-3 text-xl font-bold">Rate card</h2>
            <RateCardTable shop={data} />
          </Card>
        </div>
      </div>
    </div>
  );
}

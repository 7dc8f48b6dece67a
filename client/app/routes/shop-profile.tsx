import { Link, useSearchParams } from 'react-router-dom';
import { PayoutSetup } from '@client/features/payments';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useOwnShop, ShopProfileForm } from '@client/features/shops';

export function ShopProfileRoute() {
  const [params] = useSearchParams();
  const returned = params.get('payouts') === 'return';
  // Back from onboarding, the account's confirmation arrives by webhook a moment later: look again until it is ready.
  const own = useOwnShop({ refetchInterval: (data) => (returned && data && data.payouts !== 'ready' ? 2_000 : false) });
  return (
    <div className="mx-auto max-w-4xl">
      <PageTitle
        title="Your shop profile"
        lead="What builders see when you bid: where you are, the work you do and what it usually costs."
      />
      {own.isPending && <p className="text-ink-soft">Loading your profile …</p>}
      {own.isError && (
        <Notice tone="error" title="Your profile could not be loaded" onRetry={() => void own.refetch()}>
          {own.error.message}
        </Notice>
      )}
      {own.isSuccess && (
        <>
          {own.data === null ? (
            <Notice title="Set up your profile to start bidding" className="mb-6">
              A shop needs a profile before it can bid. Builders compare bids by the shop behind them, and your rate card fills in the lines
              of each bid for you, so a bid takes a minute instead of a phone call.
            </Notice>
          ) : (
            <p className="mb-6 text-sm text-ink-soft">
              Builders see this on <Link to={`/shops/${own.data.id}`} className="font-semibold text-slate-700 underline underline-offset-4">your public shop page</Link>.
              Changes apply to bids you place from now on; bids already sent keep their prices.
            </p>
          )}
          {own.data && <PayoutSetup status={own.data.payouts} returned={returned} />}
          <ShopProfileForm key={own.data?.id ?? 'new'} shop={own.data} />
        </>
      )}
    </div>
  );
}

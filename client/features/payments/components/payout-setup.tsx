import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useStartPayouts } from '../api/payments';

/**
 * Where a shop connects the account its earnings are paid into. Builders can
 * accept a shop's bid only once this is ready.
 */
export function PayoutSetup({ status, returned }: { status: 'none' | 'pending' | 'ready'; returned: boolean }) {
  const start = useStartPayouts();
  return (
    <Card className="mb-6" >
      <h2 className="text-xl font-bold">Payout account</h2>
      {status === 'ready' ? (
        <Notice tone="success" className="mt-3" title="Ready to be paid">
          Builders can accept your bids. When a builder accepts your inspection record, the payment goes to this account, less
          the Tenthmark fee.
        </Notice>
      ) : (
        <>
          <p className="mt-2 text-ink-soft">
            Builders can accept your bid only once you can be paid. Setting up takes a few minutes on the payment provider’s own pages
            (locally, a test page stands in for it).
          </p>
          {status === 'pending' && returned && (
            <Notice className="mt-3">We are waiting for the payment provider to confirm your account. This page updates by itself.</Notice>
          )}
          {start.isError && (
            <Notice tone="error" className="mt-3">
              {start.error.message}
            </Notice>
          )}
          <Button className="mt-4" busy={start.isPending} onClick={() => start.mutate()}>
            {status === 'none' ? 'Set up payouts' : 'Continue setting up payouts'}
          </Button>
        </>
      )}
    </Card>
  );
}

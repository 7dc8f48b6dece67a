import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import type { AdminShopRow } from '@shared/schemas/admin';
import { Badge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { cn } from '@client/lib/cn';
import { useSetShopVerification } from '../api/admin-shops';
import { TableHead } from '@client/components/ui/table-head';

const rating = new Intl.NumberFormat(undefined, { minimumFractionDigits: 1, maximumFractionDigits: 1 });

function VerificationButton({ shop }: { shop: AdminShopRow }) {
  const change = useSetShopVerification({
    mutationConfig: {
      onSuccess: (updated) => toast.success(updated.verified ? `${updated.name} is marked verified.` : `${updated.name} is no longer marked verified.`),
      onError: (error) => toast.error(error.message),
    },
  });
  return (
    <Button
      variant={shop.verified ? 'secondary' : 'primary'}
      busy={change.isPending}
      onClick={() => change.mutate({ shopId: shop.id, verified: !shop.verified })}
      className="whitespace-nowrap text-sm"
    >
      {shop.verified ? 'Remove verification' : 'Verify'}
      <span className="sr-only"> {shop.name}</span>
    </Button>
  );
}

/** Shops with what an administrator checks before verifying one, and the button that does it. */
export function AdminShopsTable({ shops, dimmed = false }: { shops: AdminShopRow[]; dimmed?: boolean }) {
  return (
    <div
      role="region"
      aria-label="Shops"
      tabIndex={0}
      className={cn('relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100', dimmed && 'opacity-60')}
    >
      <table className="w-full min-w-[56rem] text-left text-sm">
        <caption className="sr-only">Shops</caption>
        <TableHead columns={['Shop', 'Owner’s e-mail', 'Place', 'Payouts', 'Rating', 'Verified', 'Owner’s account', { label: 'Change verification', srOnly: true }]} />
        <tbody>
          {shops.map((shop) => (
            <tr key={shop.id} className="border-b border-slate-100 align-top">
              <th scope="row" className="py-3 pr-4 text-left font-normal">
                <Link to={`/shops/${shop.id}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
                  {shop.name}
                </Link>
              </th>
              <td className="break-all py-3 pr-4">{shop.email}</td>
              <td className="py-3 pr-4">{[shop.city, shop.region, shop.country].filter(Boolean).join(', ')}</td>
              <td className="py-3 pr-4">{shop.payoutsReady ? 'Ready' : <span className="text-caution">Not set up</span>}</td>
              <td className="whitespace-nowrap py-3 pr-4 tabular-nums">
                {shop.rating ? (
                  <>
                    {rating.format(shop.rating.average)} of 5 <span className="text-ink-soft">({shop.rating.count})</span>
                  </>
                ) : (
                  <span className="text-ink-soft">No reviews</span>
                )}
              </td>
              <td className="py-3 pr-4">{shop.verified ? <Badge tone="success">Verified</Badge> : <Badge tone="muted">Not verified</Badge>}</td>
              <td className="py-3 pr-4">{shop.ownerStatus === 'active' ? 'Active' : <Badge tone="error">Suspended</Badge>}</td>
              <td className="py-3 text-right">
                <VerificationButton shop={shop} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

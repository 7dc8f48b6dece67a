import { useId, useState, type ReactNode } from 'react';
import { toast } from '@client/lib/toast';
import { formatCents } from '@shared/catalogue';
import { formatDistance } from '@shared/distance';
import type { Bid, BidStatus } from '@shared/schemas/bids';
import type { JobStatus } from '@shared/schemas/jobs';
import { BID_STATUS } from '@shared/glossary';
import { ShopStandingList } from '@client/components/standing';
import { Badge, TermBadge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { cn } from '@client/lib/cn';
import { formatDay, todayIso } from '@client/lib/dates';
import { useAcceptBid, useDeclineBid, useJobBids } from '../api/bids';
import { QuoteLink } from './bid-summary';

export interface BidComparisonProps {
  jobId: string;
  jobStatus: JobStatus;
  /** The job's owner decides; an administrator only looks. */
  canDecide: boolean;
}

const days = (n: number) => `${n} working ${n === 1 ? 'day' : 'days'}`;
const percent = (share: number) => `${Math.round(share * 100)}%`;
const place = (shop: Bid['shop']) => [shop.city, shop.region, shop.country].filter(Boolean).join(', ');

function ratingText(rating: Bid['shop']['rating']): string {
  if (!rating) return 'No reviews yet';
  return `${rating.average.toFixed(1)} of 5 (${rating.count} ${rating.count === 1 ? 'review' : 'reviews'})`;
}


/** Accepted first, then the open bids (cheapest first, as the server sends them), then the closed ones. */
const order: Record<BidStatus, number> = { accepted: 0, active: 1, declined: 2, withdrawn: 3 };

function LineItems({ bid }: { bid: Bid }) {
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Line items of the bid from {bid.shop.name}</caption>
      <thead>
        <tr className="border-b border-slate-200 text-left text-ink-soft">
          <th scope="col" className="py-1 pr-3 font-semibold">
            Work
          </th>
          <th scope="col" className="py-1 pr-3 text-right font-semibold">
            Qty
          </th>
          <th scope="col" className="py-1 pr-3 text-right font-semibold">
            Each
          </th>
          <th scope="col" className="py-1 text-right font-semibold">
            Amount
          </th>
        </tr>
      </thead>
      <tbody>
        {bid.lineItems.map((line, index) => (
          <tr key={index} className="border-b border-slate-100 last:border-b-0">
            <td className="py-1 pr-3">{line.description}</td>
            <td className="py-1 pr-3 text-right tabular-nums">{line.quantity}</td>
            <td className="py-1 pr-3 text-right tabular-nums">{formatCents(line.unitPriceCents)}</td>
            <td className="py-1 text-right font-semibold tabular-nums">{formatCents(line.amountCents)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr>
          <th scope="row" colSpan={3} className="pt-2 pr-3 text-right font-semibold">
            Total
          </th>
          <td className="pt-2 text-right font-bold tabular-nums">{formatCents(bid.totalCents)}</td>
        </tr>
      </tfoot>
    </table>
  );
}

function ShopName({ bid, highlights }: { bid: Bid; highlights: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-bold text-ink">{bid.shop.name}</span>
        {bid.shop.verified && (
          <Badge tone="success">
            <span aria-hidden>✓</span> Verified
          </Badge>
        )}
      </div>
      <span className="text-sm text-ink-soft">
        {place(bid.shop)}
        {bid.distance && <span data-testid="bid-distance"> · {formatDistance(bid.distance.value, bid.distance.unit)} from the parts</span>}
      </span>
      <span className="text-sm text-ink-soft">{ratingText(bid.shop.rating)}</span>
      <ShopStandingList standing={bid.shop.standing} className="max-w-sm text-xs" />
      {highlights}
    </div>
  );
}

interface RowProps {
  bid: Bid;
  highlights: ReactNode;
  actions: ReactNode;
}

/** One bid as a row of the wide table, with its line items folding out beneath. */
function BidTableRows({ bid, highlights, actions }: RowProps) {
  const [open, setOpen] = useState(false);
  const detailsId = useId();
  const closed = bid.status === 'declined' || bid.status === 'withdrawn';
  return (
    <>
      <tr className={cn('border-t border-slate-200 align-top', closed && 'text-ink-soft')} data-testid="bid-row">
        <td className="py-3 pr-4">
          <ShopName bid={bid} highlights={highlights} />
          {bid.note && <p className="mt-2 line-clamp-2 max-w-sm border-l-4 border-slate-200 pl-3 text-sm text-ink">{bid.note}</p>}
        </td>
        <td className="py-3 pr-4 text-right text-lg font-bold tabular-nums text-ink" data-testid="bid-total">
          {formatCents(bid.totalCents)}
        </td>
        <td className="py-3 pr-4 tabular-nums">{days(bid.turnaroundDays)}</td>
        <td className="py-3 pr-4 tabular-nums">{formatDay(bid.validUntil)}</td>
        <td className="py-3 pr-4 text-right tabular-nums">{percent(bid.capabilityMatch)}</td>
        <td className="py-3">
          <div className="flex flex-col items-start gap-2">
            {actions}
            <Button variant="quiet" className="min-h-9 px-2 py-1 text-sm" aria-expanded={open} aria-controls={detailsId} onClick={() => setOpen((o) => !o)}>
              {open ? 'Hide' : 'Show'} line items<span className="sr-only"> from {bid.shop.name}</span>
            </Button>
          </div>
        </td>
      </tr>
      <tr id={detailsId} hidden={!open}>
        <td colSpan={6} className="pb-4">
          <div className="grid grid-cols-1 gap-4 rounded-lg bg-slate-50 p-4 ring-1 ring-slate-200 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <LineItems bid={bid} />
            <div>
              <h4 className="text-sm font-bold text-ink">Note from the shop</h4>
              <p className="mt-1 whitespace-pre-wrap text-sm text-ink">{bid.note || 'No note.'}</p>
              <QuoteLink bidId={bid.id} from={bid.shop.name} />
            </div>
          </div>
        </td>
      </tr>
    </>
  );
}

/** One bid as a card, for a tablet. */
function BidCard({ bid, highlights, actions }: RowProps) {
  const closed = bid.status === 'declined' || bid.status === 'withdrawn';
  return (
    <li className={cn('flex flex-col gap-3 rounded-card bg-paper-raised p-4 shadow-card ring-1', bid.status === 'accepted' ? 'ring-2 ring-pass' : 'ring-slate-200')} data-testid="bid-card">
      <ShopName bid={bid} highlights={highlights} />
      <p className={cn('text-3xl font-extrabold tabular-nums tracking-tight', closed ? 'text-ink-soft' : 'text-ink')} data-testid="bid-total">
        {formatCents(bid.totalCents)}
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">Turnaround</dt>
        <dd className="font-semibold text-ink">{days(bid.turnaroundDays)}</dd>
        <dt className="text-ink-soft">Valid until</dt>
        <dd className="font-semibold text-ink">{formatDay(bid.validUntil)}</dd>
        <dt className="text-ink-soft">Capability match</dt>
        <dd className="font-semibold text-ink">{percent(bid.capabilityMatch)}</dd>
      </dl>
      {bid.note && <p className="whitespace-pre-wrap border-l-4 border-slate-200 pl-3 text-sm text-ink">{bid.note}</p>}
      <details className="group rounded-lg bg-slate-50 ring-1 ring-slate-200">
        <summary className="flex min-h-11 cursor-pointer items-center px-3 font-semibold text-slate-700">
          Line items<span className="sr-only"> from {bid.shop.name}</span>
          <span className="ml-1 text-ink-soft">({bid.lineItems.length})</span>
        </summary>
        <div className="px-3 pb-3">
          <LineItems bid={bid} />
          <QuoteLink bidId={bid.id} from={bid.shop.name} />
        </div>
      </details>
      <div className="mt-auto flex flex-wrap gap-2">{actions}</div>
    </li>
  );
}

/**
 * The bids on one job side by side: a table on a wide screen, cards on a
 * tablet. The builder accepts one (every other bid is declined in the same
 * step) or declines any with an optional reason.
 */
export function BidComparison({ jobId, jobStatus, canDecide }: BidComparisonProps) {
  const bidsQuery = useJobBids(jobId);
  const [accepting, setAccepting] = useState<Bid | null>(null);
  const [declining, setDeclining] = useState<Bid | null>(null);
  const [reason, setReason] = useState('');
  const accept = useAcceptBid({
    mutationConfig: {
      onSuccess: ({ bid }) => {
        toast.success(`You accepted the bid from ${bid.shop.name}.`);
        setAccepting(null);
      },
    },
  });
  const decline = useDeclineBid({
    mutationConfig: {
      onSuccess: ({ bid }) => {
        toast.success(`You declined the bid from ${bid.shop.name}.`);
        setDeclining(null);
        setReason('');
      },
    },
  });

  if (bidsQuery.isPending) return <p className="text-ink-soft">Loading the bids …</p>;
  if (bidsQuery.isError) return <Notice tone="error" title="The bids could not be loaded" onRetry={() => void bidsQuery.refetch()}>{bidsQuery.error.message}</Notice>;

  const bids = [...bidsQuery.data].sort((a, b) => order[a.status] - order[b.status]);
  const active = bids.filter((b) => b.status === 'active');
  const accepted = bids.find((b) => b.status === 'accepted');
  const today = todayIso();
  const lowest = active.length > 1 ? Math.min(...active.map((b) => b.totalCents)) : undefined;
  const quickest = active.length > 1 ? Math.min(...active.map((b) => b.turnaroundDays)) : undefined;
  const deciding = canDecide && jobStatus === 'open';

  if (bids.length === 0) {
    return (
      <p className="text-ink-soft">
        {jobStatus === 'draft' ? 'Publish the job to start receiving bids.' : jobStatus === 'open' ? 'No bids yet. Shops on the job board can see this job now.' : 'This job has no bids.'}
      </p>
    );
  }

  const highlights = (bid: Bid) => {
    if (bid.status !== 'active' || (lowest === undefined && quickest === undefined)) return null;
    const tags = [bid.totalCents === lowest && 'Lowest price', bid.turnaroundDays === quickest && 'Quickest'].filter(Boolean) as string[];
    if (tags.length === 0) return null;
    return (
      <div className="flex flex-wrap gap-1">
        {tags.map((tag) => (
          <Badge key={tag} tone="neutral">
            {tag}
          </Badge>
        ))}
      </div>
    );
  };

  const actions = (bid: Bid) => {
    if (bid.status !== 'active') {
      return <TermBadge term={BID_STATUS[bid.status]} />;
    }
    if (!deciding) return <Badge tone="neutral">Open</Badge>;
    const expired = bid.validUntil < today;
    return (
      <div className="flex flex-wrap gap-2">
        {expired ? (
          <Badge tone="caution">Expired: ask the shop to revise</Badge>
        ) : (
          <Button onClick={() => setAccepting(bid)}>
            Accept<span className="sr-only"> the bid from {bid.shop.name}</span>
          </Button>
        )}
        <Button variant="secondary" onClick={() => setDeclining(bid)}>
          Decline<span className="sr-only"> the bid from {bid.shop.name}</span>
        </Button>
      </div>
    );
  };

  const others = accepting ? active.filter((b) => b.id !== accepting.id).length : 0;

  return (
    <div className="flex flex-col gap-4">
      {accepted && (
        <Notice tone="success" title={`You accepted the bid from ${accepted.shop.name}`}>
          {formatCents(accepted.totalCents)}, {days(accepted.turnaroundDays)}.
          {jobStatus === 'awarded' && ' Your payment comes next; it is held until you accept the inspection record, and the shop starts once it is in.'}
        </Notice>
      )}
      <p className="text-ink-soft" data-testid="bid-summary">
        {bids.length} {bids.length === 1 ? 'bid' : 'bids'}
        {active.length > 0 && `, ${active.length} open`}
        {lowest !== undefined && ` · lowest ${formatCents(lowest)}`}
        {quickest !== undefined && ` · quickest ${days(quickest)}`}
      </p>

      {/* Wide screens: a table to read across. */}
      <div className="relative hidden overflow-x-auto lg:block">
        <table className="w-full text-left">
          <caption className="sr-only">Bids on this job, side by side</caption>
          <thead>
            <tr className="text-sm text-ink-soft">
              <th scope="col" className="pb-2 pr-4 font-semibold">
                Shop
              </th>
              <th scope="col" className="pb-2 pr-4 text-right font-semibold">
                Total
              </th>
              <th scope="col" className="pb-2 pr-4 font-semibold">
                Turnaround
              </th>
              <th scope="col" className="pb-2 pr-4 font-semibold">
                Valid until
              </th>
              <th scope="col" className="pb-2 pr-4 text-right font-semibold">
                Capability match
              </th>
              <th scope="col" className="pb-2 font-semibold">
                <span className="sr-only">Decision and details</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {bids.map((bid) => (
              <BidTableRows key={bid.id} bid={bid} highlights={highlights(bid)} actions={actions(bid)} />
            ))}
          </tbody>
        </table>
      </div>

      {/* Tablets and phones: cards side by side. */}
      <ul className="grid gap-4 sm:grid-cols-2 lg:hidden" aria-label="Bids on this job">
        {bids.map((bid) => (
          <BidCard key={bid.id} bid={bid} highlights={highlights(bid)} actions={actions(bid)} />
        ))}
      </ul>
      <p className="text-sm text-ink-soft">Capability match: the share of the work you asked for that the shop lists as work it does.</p>

      <ConfirmDialog
        open={accepting !== null}
        onClose={() => {
          setAccepting(null);
          accept.reset();
        }}
        onConfirm={() => accepting && accept.mutate(accepting.id)}
        title={accepting ? `Accept the bid from ${accepting.shop.name}?` : 'Accept this bid?'}
        description={
          accepting && (
            <>
              <p>
                {accepting.shop.name} gets the job at {formatCents(accepting.totalCents)}, {days(accepting.turnaroundDays)}.
              </p>
              <p className="mt-2 font-semibold text-ink">
                {others > 0
                  ? others === 1
                    ? 'The other open bid will be declined and its shop told.'
                    : `The other ${others} open bids will be declined and their shops told.`
                  : 'Any other bids will be declined.'}{' '}
                This cannot be undone.
              </p>
            </>
          )
        }
        confirmLabel="Accept this bid"
        cancelLabel="Keep comparing"
        busy={accept.isPending}
        error={accept.error?.message}
      />

      <ConfirmDialog
        open={declining !== null}
        onClose={() => {
          setDeclining(null);
          setReason('');
          decline.reset();
        }}
        onConfirm={() => declining && decline.mutate({ id: declining.id, reason: reason.trim() })}
        title={declining ? `Decline the bid from ${declining.shop.name}?` : 'Decline this bid?'}
        description="The shop is told by e-mail, with your reason if you give one."
        confirmLabel="Decline bid"
        cancelLabel="Go back"
        tone="danger"
        mutation={decline}
      >
        <TextAreaField
          label="Reason, optional"
          rows={3}
          maxLength={500}
          value={reason}
          onChange={(event) => setReason(event.target.value)}
          hint="For example: the turnaround is too long for my build."
          error={decline.error?.fields.reason}
          data-autofocus
        />
      </ConfirmDialog>
    </div>
  );
}

import { useId, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { formatCents } from '@shared/catalogue';
import type { Bid } from '@shared/schemas/bids';
import type { JobDetail } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { formatDay } from '@client/lib/dates';
import { ConfirmEmailNotice, useNeedsEmailConfirmation } from '@client/features/auth';
// The panel's props are fixed by the job page ({ job }), so it reads the shop's own profile (rate card, turnaround) itself.
import { useOwnShop } from '@client/features/shops';
import { useBid, useJobBids, usePlaceBid, useReviseBid, useWithdrawBid } from '../api/bids';
import { BidForm, localDate, newBidValues, revisedBidValues } from './bid-form';
import { BidLinesTable, BidStatusBadge, days, formatMoment, QuoteLink } from './bid-summary';

function Panel({ children, title }: { children: ReactNode; title: string }) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-4 rounded-card bg-paper-raised p-6 shadow-card ring-1 ring-slate-100">
      <h2 id={headingId} className="text-2xl font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}

function BidFacts({ bid }: { bid: Bid }) {
  const expired = bid.status === 'active' && bid.validUntil < localDate();
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1">
      <dt className="font-semibold text-ink-soft">Status</dt>
      <dd>
        <BidStatusBadge status={bid.status} />
      </dd>
      <dt className="font-semibold text-ink-soft">Total</dt>
      <dd className="font-bold tabular-nums">{formatCents(bid.totalCents)}</dd>
      <dt className="font-semibold text-ink-soft">Turnaround</dt>
      <dd>{days(bid.turnaroundDays)}</dd>
      <dt className="font-semibold text-ink-soft">Valid until</dt>
      <dd>
        {formatDay(bid.validUntil)}
        {expired && <span className="ml-2 font-semibold text-caution">(expired: revise it so the builder can accept it)</span>}
      </dd>
      <dt className="font-semibold text-ink-soft">Version</dt>
      <dd>
        {bid.version} <span className="text-ink-soft">· last changed {formatMoment(bid.updatedAt)}</span>
      </dd>
    </dl>
  );
}

/** The shop's active bid on an open job: what was sent, revise, withdraw, and the earlier versions. */
function ActiveBid({ bidId, job }: { bidId: string; job: JobDetail }) {
  const detail = useBid(bidId);
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const revise = useReviseBid();
  const unconfirmed = useNeedsEmailConfirmation();
  const withdraw = useWithdrawBid({
    mutationConfig: {
      onSuccess: () => {
        setConfirming(false);
        toast.success('Bid withdrawn. The builder no longer sees it.');
      },
      onError: (error) => toast.error(error.message),
    },
  });

  if (detail.isPending) return <p className="text-ink-soft">Loading your bid …</p>;
  if (detail.isError) return <Notice tone="error" title="Your bid could not be loaded" onRetry={() => void detail.refetch()}>{detail.error.message}</Notice>;
  const { bid, revisions } = detail.data;
  const canRevise = job.status === 'open';

  return (
    <div className="flex flex-col gap-5">
      {editing ? (
        <>
          <Notice>
            You are revising version {bid.version}. The builder sees the new version at once; this one stays in the history below.
          </Notice>
          <BidForm
            label="Revise your bid"
            defaultValues={revisedBidValues(bid)}
            submitLabel="Send the revised bid"
            onCancel={() => setEditing(false)}
            submit={async (input) => {
              const result = await revise.mutateAsync({ id: bid.id, input });
              setEditing(false);
              toast.success(`Bid revised. The builder now sees version ${result.bid.version}.`);
            }}
          />
        </>
      ) : (
        <>
          <BidFacts bid={bid} />
          <BidLinesTable lines={bid.lineItems} totalCents={bid.totalCents} caption={`Your bid, version ${bid.version}`} />
          {bid.note && (
            <div>
              <h3 className="font-semibold text-ink-soft">Your note</h3>
              <p className="whitespace-pre-line">{bid.note}</p>
            </div>
          )}
          {canRevise && unconfirmed && (
            <ConfirmEmailNotice
              title="Confirm your e-mail address to revise your bid"
              reason="The builder relies on reaching you about their block, so changing a bid waits until your address is confirmed."
            />
          )}
          <div className="flex flex-wrap gap-3">
            {canRevise && (
              <Button disabled={unconfirmed} onClick={() => setEditing(true)}>
                Revise bid
              </Button>
            )}
            <Button variant="secondary" onClick={() => setConfirming(true)}>
              Withdraw bid
            </Button>
            <QuoteLink bidId={bid.id} />
          </div>
        </>
      )}

      {revisions.length > 0 && (
        <section aria-label="Earlier versions" className="flex flex-col gap-2">
          <h3 className="text-lg font-bold">Earlier versions</h3>
          <ul className="flex flex-col gap-2">
            {revisions.map((revision) => (
              <li key={revision.version}>
                <details className="group rounded-lg bg-white ring-1 ring-slate-200">
                  <summary className="flex min-h-11 cursor-pointer list-none flex-wrap items-center gap-x-3 px-4 py-2 [&::-webkit-details-marker]:hidden">
                    <span aria-hidden className="inline-block text-slate-700 transition-transform group-open:rotate-90">
                      ▸
                    </span>
                    <span className="font-semibold">Version {revision.version}</span>
                    <span className="tabular-nums">{formatCents(revision.totalCents)}</span>
                    <span className="text-ink-soft">{days(revision.turnaroundDays)}</span>
                    <span className="text-sm text-ink-soft">sent {formatMoment(revision.createdAt)}</span>
                  </summary>
                  <div className="flex flex-col gap-2 border-t border-slate-200 px-4 py-3">
                    <BidLinesTable lines={revision.lineItems} totalCents={revision.totalCents} caption={`Version ${revision.version}`} />
                    <p className="text-sm text-ink-soft">Valid until {formatDay(revision.validUntil)}</p>
                    {revision.note && <p className="whitespace-pre-line text-sm">{revision.note}</p>}
                  </div>
                </details>
              </li>
            ))}
          </ul>
        </section>
      )}

      <ConfirmDialog
        open={confirming}
        onClose={() => setConfirming(false)}
        onConfirm={() => withdraw.mutate(bid.id)}
        title="Withdraw your bid?"
        description="The builder will no longer see it and cannot accept it. While the job is open you can send a new bid later."
        confirmLabel="Withdraw my bid"
        cancelLabel="Keep my bid"
        tone="danger"
        mutation={withdraw}
      />
    </div>
  );
}

/** What happened to a bid that is no longer active, in plain words. */
function decidedWords(bid: Bid, job: JobDetail): { tone: 'success' | 'info' | 'caution'; title: string; text: string } {
  if (bid.status === 'accepted') {
    if (job.status === 'awarded') return { tone: 'success', title: 'Accepted — wait for the builder’s payment before starting', text: 'The builder chose your bid. Tenthmark tells you as soon as the payment is held; do not start work or arrange shipping until then.' };
    if (job.status === 'funded') return { tone: 'success', title: 'Accepted and paid — you can start', text: 'The builder’s payment is held by Tenthmark until they accept your inspection record.' };
    if (job.status === 'cancelled') return { tone: 'caution', title: 'Accepted, then the job was cancelled', text: 'The builder cancelled this job before it was paid for.' };
    return { tone: 'success', title: 'Accepted — the job is yours', text: 'This job is under way with your shop.' };
  }
  if (bid.status === 'declined') {
    if (job.awardedBidId && job.awardedBidId !== bid.id) return { tone: 'info', title: 'Declined — the builder chose another shop', text: 'Thank you for bidding. Other open jobs are on the board.' };
    return { tone: 'info', title: 'Declined by the builder', text: job.status === 'open' ? 'You can send a new bid while the job is open.' : 'This job is no longer taking bids.' };
  }
  return { tone: 'info', title: 'You withdrew your bid', text: job.status === 'open' ? 'You can send a new bid while the job is open.' : 'This job is no longer taking bids.' };
}

function NewBid({ job, shop }: { job: JobDetail; shop: { rateCard: Array<{ operation: string; priceCents: number }>; turnaroundDays: number } }) {
  const place = usePlaceBid(job.id);
  const unpriced = newBidValues(job, shop)
    .lineItems.filter((line) => line.unitPrice === '0.00')
    .map((line) => line.description);
  return (
    <>
      <p className="text-ink-soft">
        The lines below come from the work this job asks for and your rate card. Change anything before you send it.
      </p>
      {unpriced.length > 0 && (
        <Notice tone="caution">
          Your rate card has no price for {unpriced.join(', ')}, so {unpriced.length === 1 ? 'that line starts' : 'those lines start'} at $0.00. Put
          your price in before you send.
        </Notice>
      )}
      <BidForm
        label="Your bid"
        defaultValues={newBidValues(job, shop)}
        submitLabel="Send my bid"
        submit={async (input) => {
          await place.mutateAsync(input);
          toast.success('Bid sent. The builder has been told.');
        }}
      />
    </>
  );
}

/**
 * Bidding on a job, for a shop: set up a profile first; place a bid
 * (prefilled from the rate card); see, revise or withdraw the active bid; or
 * read what became of it.
 */
export function ShopBidPanel({ job }: { job: JobDetail }) {
  const own = useOwnShop();
  const mine = useJobBids(job.id);
  const unconfirmed = useNeedsEmailConfirmation();

  if (own.isPending) {
    return (
      <Panel title="Your bid">
        <p className="text-ink-soft">Loading …</p>
      </Panel>
    );
  }
  if (own.isError) {
    return (
      <Panel title="Your bid">
        <Notice tone="error" title="Your shop profile could not be loaded" onRetry={() => void own.refetch()}>
          {own.error.message}
        </Notice>
      </Panel>
    );
  }
  if (own.data === null) {
    return (
      <Panel title="Bid on this job">
        <Notice title="Set up your shop profile to bid">
          Builders compare bids by the shop behind them, and your rate card fills in the lines of each bid.{' '}
          <Link to="/shop/profile" className="font-semibold underline underline-offset-4">
            Set up your shop profile
          </Link>
        </Notice>
      </Panel>
    );
  }

  if (job.viewer.myBidId) {
    return (
      <Panel title="Your bid">
        <ActiveBid bidId={job.viewer.myBidId} job={job} />
      </Panel>
    );
  }

  const latest = [...(mine.data ?? [])].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))[0];
  const earlier = latest && latest.status !== 'active' ? decidedWords(latest, job) : undefined;
  const accepted = latest?.status === 'accepted';

  return (
    <Panel title={accepted ? 'Your bid' : job.viewer.canBid ? 'Bid on this job' : 'Your bid'}>
      {earlier && latest && (
        <div className="flex flex-col gap-4">
          <Notice tone={earlier.tone} title={earlier.title}>
            {earlier.text}
          </Notice>
          {accepted && (
            <>
              <BidFacts bid={latest} />
              <BidLinesTable lines={latest.lineItems} totalCents={latest.totalCents} caption="Your accepted bid" />
            </>
          )}
        </div>
      )}
      {job.viewer.canBid ? (
        unconfirmed ? (
          <ConfirmEmailNotice
            title="Confirm your e-mail address to bid"
            reason="A builder who accepts your bid relies on reaching you about their block, so bidding waits until your address is confirmed."
          />
        ) : (
          <NewBid job={job} shop={own.data} />
        )
      ) : (
        !earlier && <Notice>This job is no longer taking bids.</Notice>
      )}
    </Panel>
  );
}

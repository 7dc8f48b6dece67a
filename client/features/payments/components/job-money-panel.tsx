import { EXTRA_WORK_STATUS, NAMES } from '@shared/glossary';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { formatCents } from '@shared/catalogue';
import { feeRateWords, netOf } from '@shared/money';
import type { JobDetail } from '@shared/schemas/jobs';
import type { ChangeOrder, MoneyView } from '@shared/schemas/payments';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { ConfirmEmailNotice, useNeedsEmailConfirmation } from '@client/features/auth';
import { lazyPanel } from '@client/components/lazy-panel';
import {
  useApproveChangeOrder,
  useCancelAndRefund,
  useChangeOrders,
  useDeclineChangeOrder,
  useMoney,
  useStartCheckout,
} from '../api/payments';

// The extra-work form (react-hook-form) loads when the shop opens it.
const ProposeChangeOrder = lazyPanel(() => import('./propose-change-order').then((m) => m.ProposeChangeOrder));

const PAID_STATES = new Set(['funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);

const HELD_WORDS =
  'Your payment is held by Tenthmark until you accept the shop’s inspection record; then it goes to the shop, less the Tenthmark fee. Until the shop starts, you can cancel for a full refund.';

function Row({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div className="flex justify-between gap-4 border-b border-slate-100 py-1.5">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="font-semibold tabular-nums" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

/** The builder pays, sees what is held, cancels for a refund, and answers extra work. */
function BuilderMoney({ job, acceptedTotalCents }: { job: JobDetail; acceptedTotalCents?: number }) {
  const [params] = useSearchParams();
  const confirming = params.get('payment') === 'done' && job.status === 'awarded';
  const money = useMoney(job.id, { refetchInterval: confirming ? 1_500 : false });
  const checkout = useStartCheckout(job.id);
  const unconfirmed = useNeedsEmailConfirmation();
  const [cancelOpen, setCancelOpen] = useState(false);
  const cancel = useCancelAndRefund(job.id, {
    mutationConfig: {
      onSuccess: () => {
        setCancelOpen(false);
        toast.success('The job is cancelled and your payment is on its way back.');
      },
    },
  });
  const lastPayment = money.data?.payments.filter((p) => p.kind === 'bid').at(-1);
  const declined = params.get('payment') !== 'done' && lastPayment?.status === 'pending' ? lastPayment.failureMessage : null;
  // A cancelled job shows its money only when some came in (a payment made on a page left open, refunded).
  if (job.status === 'cancelled' && !(money.data && money.data.balance.paidIn > 0)) return null;

  return (
    <Card>
      <h2 className="text-xl font-bold">Payment</h2>
      {job.status === 'awarded' && (
        <div className="mt-3 flex flex-col gap-3">
          {confirming ? (
            <Notice>Payment received by the payment page; waiting for the provider to confirm it. This updates by itself.</Notice>
          ) : (
            <>
              <p>
                Pay {acceptedTotalCents !== undefined ? <strong>{formatCents(acceptedTotalCents)}</strong> : 'the accepted bid'} to let the shop start.
              </p>
              <p className="text-sm text-ink-soft">{HELD_WORDS}</p>
              {declined && (
                <Notice tone="error" title="The last payment did not go through">
                  {declined} Try again, or use another card.
                </Notice>
              )}
              {checkout.isError && <Notice tone="error">{checkout.error.message}</Notice>}
              {unconfirmed && (
                <ConfirmEmailNotice
                  title="Confirm your e-mail address to pay"
                  reason="The shop relies on reaching you about the work you pay for, so paying waits until your address is confirmed."
                />
              )}
              <div>
                <Button busy={checkout.isPending} disabled={unconfirmed} onClick={() => checkout.mutate()}>
                  {declined ? 'Try the payment again' : 'Pay and hold for the work'}
                </Button>
              </div>
            </>
          )}
        </div>
      )}
      {(PAID_STATES.has(job.status) || job.status === 'cancelled') && money.data && (
        <>
          <Balance money={money.data} side="builder" />
          <Documents job={job} money={money.data} side="builder" />
        </>
      )}
      {job.status === 'funded' && (
        <>
          <p className="mt-3 text-sm text-ink-soft">{HELD_WORDS}</p>
          <Button variant="secondary" className="mt-3" onClick={() => setCancelOpen(true)}>
            Cancel the job and get a refund
          </Button>
          <ConfirmDialog
            open={cancelOpen}
            onClose={() => setCancelOpen(false)}
            onConfirm={() => cancel.mutate()}
            title="Cancel this job and refund the payment?"
            description="The shop is told, and everything you paid goes back to your card. This cannot be undone."
            confirmLabel="Cancel and refund"
            cancelLabel="Keep the job"
            tone="danger"
            mutation={cancel}
          />
        </>
      )}
      {PAID_STATES.has(job.status) && <ChangeOrders job={job} side="builder" />}
    </Card>
  );
}

/** A download link to one of the job's documents (receipt, invoice). */
function DocumentLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <a href={href} download className="font-semibold text-slate-700 underline underline-offset-4 hover:text-slate-900">
      {children}
    </a>
  );
}

/** The invoice is issued once the job is completed, or a dispute ended with money to the shop. */
const invoiceReady = (job: JobDetail, money: MoneyView) => job.status === 'completed' || (job.status === 'resolved' && money.balance.released + money.balance.fee > 0);

/** The builder's receipts (one per payment made) and, once the job is finished, the shop's invoice. */
function Documents({ job, money, side }: { job: JobDetail; money: MoneyView; side: 'builder' | 'shop' }) {
  const receipts = side === 'builder' ? money.payments.filter((p) => p.status === 'paid' && p.receiptNumber) : [];
  const invoice = invoiceReady(job, money);
  if (receipts.length === 0 && !invoice) return null;
  return (
    <section className="mt-4" aria-labelledby="money-documents-heading">
      <h3 id="money-documents-heading" className="text-base font-bold">
        Documents
      </h3>
      <ul className="mt-1 flex flex-col gap-1 text-sm">
        {receipts.map((p) => (
          <li key={p.id}>
            <DocumentLink href={`/api/payments/${p.id}/receipt.pdf`}>
              Receipt {p.receiptNumber} ({p.kind === 'bid' ? 'the accepted bid' : 'extra work'}, {formatCents(p.amountCents)}, PDF)
            </DocumentLink>
          </li>
        ))}
        {invoice && (
          <li>
            <DocumentLink href={`/api/jobs/${job.id}/invoice.pdf`}>{side === 'shop' ? 'Invoice with your fee and net payout (PDF)' : 'The shop’s invoice (PDF)'}</DocumentLink>
          </li>
        )}
      </ul>
    </section>
  );
}

function Balance({ money, side }: { money: MoneyView; side: 'builder' | 'shop' }) {
  const { balance, pending } = money;
  const late = money.payments.filter((p) => p.status === 'refunded');
  const lateOnItsWay = pending.some((p) => p.kind === 'late_refund');
  return (
    <div className="mt-3">
      <dl>
        <Row label="Paid in" value={formatCents(balance.paidIn)} testId="money-paid" />
        <Row label="Held now" value={formatCents(balance.held)} testId="money-held" />
        {balance.released > 0 && <Row label={side === 'shop' ? 'Paid to you' : 'Paid to the shop'} value={formatCents(balance.released)} testId="money-released" />}
        {balance.fee > 0 && <Row label={NAMES.fee} value={formatCents(balance.fee)} />}
        {balance.refunded > 0 && <Row label="Refunded" value={formatCents(balance.refunded)} testId="money-refunded" />}
      </dl>
      {late.length > 0 && (
        <Notice className="mt-3" title={lateOnItsWay ? 'A payment is being refunded' : 'A payment was refunded'}>
          {late.map((p) => `${formatCents(p.amountCents)} for ${p.kind === 'bid' ? 'the accepted bid' : 'extra work'}`).join('; ')}{' '}
          {late.length === 1 ? 'was' : 'were'} paid when {late.length === 1 ? 'it' : 'they'} could no longer be used (the job was cancelled, it was already paid, or the
          extra work was declined), so {late.length === 1 ? 'it goes' : 'they go'} back to the card in full. Tenthmark keeps nothing.
        </Notice>
      )}
      {pending.length > 0 && (
        <Notice tone="caution" className="mt-3" title="A payout is on its way">
          {pending.map((p) => `${p.kind === 'release' ? (side === 'shop' ? 'Your payout' : 'Payment to the shop') : 'Refund'} of ${formatCents(p.amountCents)}`).join('; ')} is waiting for the
          payment provider and is retried by itself.
        </Notice>
      )}
    </div>
  );
}


/** Change orders: inside the builder's payment box, or (`ownCard`) a card of their own for the shop. */
function ChangeOrders({ job, side, ownCard = false }: { job: JobDetail; side: 'builder' | 'shop'; ownCard?: boolean }) {
  const orders = useChangeOrders(job.id);
  const approve = useApproveChangeOrder();
  const unconfirmed = useNeedsEmailConfirmation() && side === 'builder';
  const decline = useDeclineChangeOrder(job.id, { mutationConfig: { onSuccess: () => toast.success(`${NAMES.extraWork} declined; the shop is told.`) } });
  const canPropose = side === 'shop' && (job.status === 'funded' || job.status === 'in_work');
  if (!orders.data?.length && !canPropose) return null;
  const Heading = ownCard ? 'h2' : 'h3';
  return (
    <section className={ownCard ? 'rounded-card bg-paper-raised p-6 shadow-card ring-1 ring-slate-100' : 'mt-6'} aria-labelledby="change-orders-heading">
      <Heading id="change-orders-heading" className={ownCard ? 'text-xl font-bold' : 'text-lg font-bold'}>
        Extra work
      </Heading>
      {orders.data && orders.data.length > 0 && (
        <ul className="mt-2 flex flex-col gap-2">
          {orders.data.map((order: ChangeOrder) => (
            <li key={order.id} className="rounded-lg border border-slate-200 bg-white p-3" data-testid="change-order">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <span>{order.description}</span>
                <strong className="tabular-nums">{formatCents(order.amountCents)}</strong>
              </div>
              <p className="text-sm text-ink-soft">
                {EXTRA_WORK_STATUS[order.status].label}
              </p>
              {side === 'builder' && (order.status === 'proposed' || order.status === 'approved') && (
                <div className="mt-2 flex gap-2">
                  <Button busy={approve.isPending} disabled={unconfirmed} onClick={() => approve.mutate(order.id)}>
                    Agree and pay {formatCents(order.amountCents)}
                  </Button>
                  <Button variant="secondary" busy={decline.isPending} onClick={() => decline.mutate(order.id)}>
                    Decline
                  </Button>
                </div>
              )}
            </li>
          ))}
        </ul>
      )}
      {approve.isError && <Notice tone="error" className="mt-2">{approve.error.message}</Notice>}
      {unconfirmed && orders.data?.some((order) => order.status === 'proposed' || order.status === 'approved') && (
        <ConfirmEmailNotice
          title="Confirm your e-mail address to pay for extra work"
          reason="The shop relies on reaching you about the work you pay for, so paying waits until your address is confirmed."
          className="mt-2"
        />
      )}
      {canPropose && <CollapsedProposal jobId={job.id} />}
    </section>
  );
}

/** The shop's extra-work form, rarely needed, behind a button until asked for. */
function CollapsedProposal({ jobId }: { jobId: string }) {
  const [open, setOpen] = useState(false);
  if (!open) {
    return (
      <Button variant="secondary" className="mt-3" onClick={() => setOpen(true)}>
        Propose extra work
      </Button>
    );
  }
  return <ProposeChangeOrder jobId={jobId} />;
}

/**
 * What the shop keeps: the amount the builder pays (or paid), Tenthmark's fee
 * at the rate fixed on the job, and the net, by the same rule the release uses.
 */
function ShopNet({ amountCents, feeBps, released }: { amountCents: number; feeBps: number; released: boolean }) {
  const { feeCents, netCents } = netOf(amountCents, feeBps);
  return (
    <dl className="mt-3" aria-label="What you keep">
      <Row label={released ? 'The builder paid' : 'The builder pays'} value={formatCents(amountCents)} />
      <Row label={`${NAMES.fee} (${feeRateWords(feeBps)})`} value={formatCents(feeCents)} testId="shop-fee" />
      <Row label={released ? 'Your payout' : 'You receive'} value={formatCents(netCents)} testId="shop-net" />
    </dl>
  );
}

/** Where the builder's money stands, said to the shop: held while it works, held through a dispute, on its way, sent, or gone back to the builder. */
function ShopMoneySentence({ job, money, released }: { job: JobDetail; money: MoneyView; released: boolean }) {
  const { balance } = money;
  if (released) {
    return (
      <p className="mt-3 text-sm" data-testid="shop-released">
        Released: {formatCents(balance.released)} was sent to your payout account, after the Tenthmark fee of {formatCents(balance.fee)}.
      </p>
    );
  }
  // A payout on its way says so in the balance above.
  if (money.pending.some((p) => p.kind === 'release')) return null;
  const words =
    job.status === 'disputed'
      ? 'The builder’s payment stays held while an administrator decides the dispute; the decision says how much of it is paid to you.'
      : job.status === 'resolved' || job.status === 'completed'
        ? balance.refunded > 0 && balance.held === 0
          ? 'The builder’s payment went back to them; nothing is paid to you for this job.'
          : null
        : 'Tenthmark holds the builder’s payment while you work. When the builder accepts your inspection record (or the review window closes), it is sent to your payout account, less the Tenthmark fee.';
  return words ? (
    <p className="mt-3 text-sm text-ink-soft" data-testid="shop-held">
      {words}
    </p>
  ) : null;
}

/** The awarded shop: whether the builder has paid, what it keeps after the fee, whether the money was released, its invoice, and extra work. */
function ShopMoney({ job, acceptedTotalCents }: { job: JobDetail; acceptedTotalCents?: number }) {
  const money = useMoney(job.id);
  const data = money.data;
  const paidCents = data?.payments.filter((p) => p.status === 'paid').reduce((sum, p) => sum + p.amountCents, 0) ?? 0;
  const released = !!data && data.balance.released + data.balance.fee > 0 && data.balance.held === 0;
  const amountCents = paidCents > 0 ? paidCents : acceptedTotalCents;
  return (
    <Card>
      <h2 className="text-xl font-bold">Payment</h2>
      {job.status === 'awarded' && <Notice className="mt-3">Waiting for the builder’s payment. Start once it shows as held here.</Notice>}
      {data && amountCents !== undefined && data.feeBps !== null && !released && <ShopNet amountCents={amountCents} feeBps={data.feeBps} released={false} />}
      {data && PAID_STATES.has(job.status) && <Balance money={data} side="shop" />}
      {data && PAID_STATES.has(job.status) && <ShopMoneySentence job={job} money={data} released={released} />}
      {data && <Documents job={job} money={data} side="shop" />}
    </Card>
  );
}

/**
 * The working shop's extra work (change orders): what it proposed and their
 * state, and the form to propose more, behind a button. On the job page it
 * comes after "Log progress", which the shop uses far more often.
 */
export function ShopExtraWork({ job }: { job: JobDetail }) {
  return PAID_STATES.has(job.status) ? <ChangeOrders job={job} side="shop" ownCard /> : null;
}

/** Money on the job page: only for the job's builder and the shop doing the work. */
export function JobMoneyPanel({ job, isAwardedShop, acceptedTotalCents }: { job: JobDetail; isAwardedShop: boolean; acceptedTotalCents?: number }) {
  if (job.viewer.isOwner && (job.status === 'awarded' || job.status === 'cancelled' || PAID_STATES.has(job.status))) {
    return <BuilderMoney job={job} acceptedTotalCents={acceptedTotalCents} />;
  }
  if (isAwardedShop && (job.status === 'awarded' || PAID_STATES.has(job.status))) return <ShopMoney job={job} acceptedTotalCents={acceptedTotalCents} />;
  return null;
}

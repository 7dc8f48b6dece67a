import { formatCents } from '@shared/catalogue';
import { NAMES, PAYMENT_STATUS } from '@shared/glossary';
import type { MoneyView } from '@shared/schemas/payments';
import { Notice } from '@client/components/ui/notice';
import { formatMoment } from './admin-words';

function Row({ label, cents, strong = false, testId }: { label: string; cents: number; strong?: boolean; testId?: string }) {
  return (
    <div className="flex justify-between gap-4 border-b border-slate-100 py-1.5">
      <dt className={strong ? 'font-semibold' : 'text-ink-soft'}>{label}</dt>
      <dd className="font-semibold tabular-nums" data-testid={testId}>
        {formatCents(cents)}
      </dd>
    </div>
  );
}

/** A payment's status in a sentence: "paid", or "refunded (it arrived when it could no longer be used …)". */
function paymentStatusWords(status: MoneyView['payments'][number]['status']): string {
  const term = PAYMENT_STATUS[status];
  return status === 'refunded' && term.explain ? `${term.label.toLowerCase()}: ${term.explain.charAt(0).toLowerCase()}${term.explain.slice(1, -1)}` : term.label.toLowerCase();
}

/** What the job's money is now: paid in, and where it went; held is what a decision moves. */
export function DisputeMoney({ money }: { money: MoneyView }) {
  const { balance } = money;
  return (
    <div className="flex flex-col gap-3">
      <dl className="text-sm">
        <Row label="Paid in by the builder" cents={balance.paidIn} />
        <Row label="Paid to the shop" cents={balance.released} />
        <Row label={NAMES.fee} cents={balance.fee} />
        <Row label="Refunded to the builder" cents={balance.refunded} />
        <Row label="Held now" cents={balance.held} strong testId="case-held" />
      </dl>
      {money.pending.length > 0 && (
        <Notice tone="caution" title="Waiting for the payment provider">
          {money.pending
            .map((move) => `${move.kind === 'release' ? 'Payment to the shop' : 'Refund to the builder'} of ${formatCents(move.amountCents)}${move.attempts > 0 ? ` (tried ${move.attempts} ${move.attempts === 1 ? 'time' : 'times'}${move.lastError ? `: ${move.lastError}` : ''})` : ''}`)
            .join('; ')}
          . It is retried automatically.
        </Notice>
      )}
      {money.payments.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-semibold text-slate-700">Payments ({money.payments.length})</summary>
          <ul className="mt-2 flex flex-col gap-1">
            {money.payments.map((payment) => (
              <li key={payment.id}>
                {payment.kind === 'bid' ? 'Accepted bid' : NAMES.extraWork}: <span className="font-semibold tabular-nums">{formatCents(payment.amountCents)}</span>,{' '}
                {paymentStatusWords(payment.status)}
                {payment.paidAt && <> on {formatMoment(payment.paidAt)}</>}
                {payment.failureMessage && <span className="text-fail"> ({payment.failureMessage})</span>}
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}

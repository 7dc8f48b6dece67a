import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import { jobStatusInSentence } from '@shared/glossary';
import { feeRateWords } from '@shared/money';
import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useMyBids, BidStatusBadge, days, formatMoment } from '@client/features/bids';
import { TableHead } from '@client/components/ui/table-head';
import { formatDay } from '@client/lib/dates';


/** A due day (a calendar date, UTC) as people read it. */

export function MyBidsRoute() {
  const bids = useMyBids();
  return (
    <div>
      <PageTitle title="My bids" lead="Every bid your shop has sent, most recently changed first." />
      {bids.isPending && <p className="text-ink-soft">Loading your bids …</p>}
      {bids.isError && (
        <Notice tone="error" title="Your bids could not be loaded" onRetry={() => void bids.refetch()}>
          {bids.error.message}
        </Notice>
      )}
      {bids.data && bids.data.length === 0 && (
        <div className="rounded-card bg-paper-raised p-8 text-center ring-1 ring-slate-100">
          <p className="text-lg font-bold">No bids yet</p>
          <p className="mt-1 text-ink-soft">
            Find a job on the{' '}
            <Link to="/board" className="font-semibold text-slate-700 underline underline-offset-4">
              job board
            </Link>{' '}
            and bid from its page.
          </p>
        </div>
      )}
      {bids.data && bids.data.length > 0 && (
        <div role="region" aria-label="Your bids" tabIndex={0} className="relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100">
          <table className="w-full min-w-[52rem] text-left text-sm">
            <TableHead columns={['Job', 'Status', { label: 'Total', align: 'right' }, { label: 'You receive', align: 'right' }, 'Turnaround', 'Updated', 'Quote']} />
            <tbody>
              {bids.data.map((bid) => (
                <tr key={bid.id} className="border-b border-slate-100 align-top">
                  <th scope="row" className="py-3 pr-4 text-left font-normal">
                    <Link to={`/jobs/${bid.jobId}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
                      {bid.jobTitle || 'Untitled job'}
                    </Link>
                    <span className="block text-ink-soft">Job {jobStatusInSentence(bid.jobStatus)}</span>
                  </th>
                  <td className="py-3 pr-4">
                    <BidStatusBadge status={bid.status} />
                    {bid.version > 1 && <span className="block pt-1 text-ink-soft">version {bid.version}</span>}
                  </td>
                  <td className="py-3 pr-4 text-right font-semibold tabular-nums">{formatCents(bid.totalCents)}</td>
                  <td className="py-3 pr-4 text-right tabular-nums" data-testid="my-bid-net">
                    <span className="font-semibold">{formatCents(bid.netCents)}</span>
                    <span className="block text-ink-soft">
                      after {formatCents(bid.feeCents)} fee ({feeRateWords(bid.feeBps)})
                    </span>
                  </td>
                  <td className="py-3 pr-4">
                    {days(bid.turnaroundDays)}
                    {bid.dueOn && (
                      <span className="block font-semibold" data-testid="my-bid-due">
                        Due {formatDay(bid.dueOn)}
                      </span>
                    )}
                  </td>
                  <td className="py-3 pr-4">{formatMoment(bid.updatedAt)}</td>
                  <td className="py-3">
                    <a href={`/api/bids/${bid.id}/quote.pdf`} download className="font-semibold text-slate-700 underline underline-offset-4">
                      Quote PDF
                    </a>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

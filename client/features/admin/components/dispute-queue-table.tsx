import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import { DISPUTE_STATUS } from '@shared/glossary';
import type { DisputeQueueRow } from '@shared/schemas/disputes';
import { disputeReasonWords } from '@shared/schemas/values';
import { TermBadge } from '@client/components/ui/badge';
import { cn } from '@client/lib/cn';
import { formatAge, formatMoment, sideWords } from './admin-words';
import { TableHead } from '@client/components/ui/table-head';

export function DisputeStatusBadge({ status }: { status: 'open' | 'resolved' }) {
  return <TermBadge term={DISPUTE_STATUS[status]} />;
}

/** The dispute queue: one row per dispute, the job title leading to the case. */
export function DisputeQueueTable({ disputes, caption, dimmed = false }: { disputes: DisputeQueueRow[]; caption: string; dimmed?: boolean }) {
  const now = new Date();
  return (
    <div
      role="region"
      aria-label={caption}
      tabIndex={0}
      className={cn('relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100', dimmed && 'opacity-60')}
    >
      <table className="w-full min-w-[56rem] text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <TableHead columns={['Job', 'Builder', 'Shop', 'Opened by', 'Reason', 'Age', { label: 'Held', align: 'right' }, 'Answered', 'Status']} />
        <tbody>
          {disputes.map((row) => (
            <tr key={row.id} className="border-b border-slate-100 align-top">
              <th scope="row" className="py-3 pr-4 text-left font-normal">
                <Link to={`/admin/disputes/${row.id}`} className="font-bold text-slate-700 underline-offset-4 hover:underline">
                  {row.jobTitle || 'Untitled job'}
                </Link>
              </th>
              <td className="py-3 pr-4">{row.builderName}</td>
              <td className="py-3 pr-4">{row.shopName}</td>
              <td className="py-3 pr-4">{sideWords[row.openedBy]}</td>
              <td className="py-3 pr-4">{disputeReasonWords[row.reason]}</td>
              <td className="whitespace-nowrap py-3 pr-4">
                <time dateTime={row.openedAt} title={formatMoment(row.openedAt)}>
                  {formatAge(row.openedAt, now)}
                </time>
              </td>
              <td className="py-3 pr-4 text-right font-semibold tabular-nums">{formatCents(row.heldCents)}</td>
              <td className="py-3 pr-4">{row.answered ? 'Yes' : 'No'}</td>
              <td className="py-3">
                <DisputeStatusBadge status={row.status} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

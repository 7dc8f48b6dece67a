import { formatCents } from '@shared/catalogue';
import { BID_STATUS } from '@shared/glossary';
import type { BidLine, BidStatus } from '@shared/schemas/bids';
import { TermBadge } from '@client/components/ui/badge';
import { TableHead } from '@client/components/ui/table-head';

export const bidStatusWords = BID_STATUS;

export function BidStatusBadge({ status }: { status: BidStatus }) {
  return <TermBadge term={bidStatusWords[status]} />;
}

/** A moment as the reader's date, time and zone. */
export { formatDateTime as formatMoment } from '@client/lib/dates';

export const days = (n: number) => `${n} working ${n === 1 ? 'day' : 'days'}`;

/** A bid's lines with their amounts and the server's total. */
export function BidLinesTable({ lines, totalCents, caption }: { lines: BidLine[]; totalCents: number; caption: string }) {
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full min-w-[28rem] text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <TableHead dense columns={['Line', { label: 'Quantity', align: 'right' }, { label: 'Unit price', align: 'right' }, { label: 'Amount', align: 'right' }]} />
        <tbody>
          {lines.map((line, index) => (
            <tr key={index} className="border-b border-slate-100">
              <td className="py-2 pr-3">{line.description}</td>
              <td className="py-2 pr-3 text-right tabular-nums">{line.quantity}</td>
              <td className="py-2 pr-3 text-right tabular-nums">{formatCents(line.unitPriceCents)}</td>
              <td className="py-2 text-right tabular-nums">{formatCents(line.amountCents)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row" colSpan={3} className="py-2 pr-3 text-right font-bold">
              Total
            </th>
            <td className="py-2 text-right text-base font-extrabold tabular-nums">{formatCents(totalCents)}</td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}

/** The bid as the shop's quote, a PDF to keep or print (the bid's shop, the job's builder and admins). */
export function QuoteLink({ bidId, from }: { bidId: string; from?: string }) {
  return (
    <a href={`/api/bids/${bidId}/quote.pdf`} download className="inline-flex min-h-9 items-center text-sm font-semibold text-slate-700 underline underline-offset-4 hover:text-slate-900">
      Quote PDF{from && <span className="sr-only"> from {from}</span>}
    </a>
  );
}

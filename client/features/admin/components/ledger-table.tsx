import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import type { LedgerPage, LedgerRow } from '@shared/schemas/admin';
import { ledgerKinds } from '@shared/schemas/values';
import { cn } from '@client/lib/cn';
import { formatMoment, ledgerKindWords, plural } from './admin-words';
import { TableHead } from '@client/components/ui/table-head';

const kindTone: Record<LedgerRow['kind'], string> = {
  paid_in: 'text-ink',
  released: 'text-pass',
  fee: 'text-slate-700',
  refunded: 'text-caution',
};

/** Sums per kind over every entry the filters match (not only this page). */
export function LedgerTotals({ page }: { page: LedgerPage }) {
  return (
    <section aria-labelledby="ledger-totals-heading" className="rounded-card bg-paper-raised p-4 shadow-card ring-1 ring-slate-100">
      <h2 id="ledger-totals-heading" className="text-base font-bold">
        Totals over {plural(page.total, 'matching entry', 'matching entries')}
      </h2>
      <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-4">
        {ledgerKinds.map((kind) => (
          <div key={kind}>
            <dt className="text-sm text-ink-soft">{ledgerKindWords[kind]}</dt>
            <dd className="text-lg font-bold tabular-nums" data-testid={`ledger-total-${kind}`}>
              {formatCents(page.totals[kind] ?? 0)}
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

/** Ledger entries, newest first as the server sends them; each job can narrow the list to itself. */
export function LedgerTable({ rows, onlyJobHref, dimmed = false }: { rows: LedgerRow[]; onlyJobHref: (jobId: string) => string; dimmed?: boolean }) {
  return (
    <div
      role="region"
      aria-label="Ledger entries"
      tabIndex={0}
      className={cn('relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100', dimmed && 'opacity-60')}
    >
      <table className="w-full min-w-[48rem] text-left text-sm">
        <caption className="sr-only">Ledger entries</caption>
        <TableHead columns={['When', 'Job', 'Kind', { label: 'Amount', align: 'right' }, 'Reference']} />
        <tbody>
          {rows.map((row) => (
            <tr key={row.id} className="border-b border-slate-100 align-top">
              <td className="whitespace-nowrap py-3 pr-4 tabular-nums">
                <time dateTime={row.createdAt}>{formatMoment(row.createdAt)}</time>
              </td>
              <td className="py-3 pr-4">
                <Link to={`/jobs/${row.jobId}`} className="font-semibold text-slate-700 underline-offset-4 hover:underline">
                  {row.jobTitle || 'Untitled job'}
                </Link>
                <Link to={onlyJobHref(row.jobId)} className="block text-xs text-ink-soft underline underline-offset-4">
                  Only this job<span className="sr-only">: {row.jobTitle || 'Untitled job'}</span>
                </Link>
              </td>
              <td className={cn('py-3 pr-4 font-semibold', kindTone[row.kind])}>{ledgerKindWords[row.kind]}</td>
              <td className="py-3 pr-4 text-right font-semibold tabular-nums">{formatCents(row.amountCents)}</td>
              <td className="break-all py-3 font-mono text-xs">{row.reference}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

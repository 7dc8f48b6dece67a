import { Link } from 'react-router-dom';
import { formatCents } from '@shared/catalogue';
import type { AuditRow } from '@shared/schemas/admin';
import { cn } from '@client/lib/cn';
import { formatFee, formatMoment } from './admin-words';
import { TableHead } from '@client/components/ui/table-head';

const SUMMARY_LENGTH = 140;

/** One detail as a person reads it: cents as money, basis points as a percentage, the rest as text. */
function detailValue(key: string, value: unknown): string {
  if (typeof value === 'number' && /cents$/i.test(key)) return formatCents(value);
  if (typeof value === 'number' && /bps$/i.test(key)) return formatFee(value);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (value === null || value === undefined) return '—';
  if (typeof value === 'string') return value;
  return JSON.stringify(value);
}

function Details({ details }: { details: Record<string, unknown> }) {
  const entries = Object.entries(details ?? {});
  if (entries.length === 0) return <span className="text-ink-soft">—</span>;
  const text = entries.map(([key, value]) => `${key}: ${detailValue(key, value)}`).join('; ');
  if (text.length <= SUMMARY_LENGTH) return <span className="[overflow-wrap:anywhere]">{text}</span>;
  return (
    <details>
      <summary className="cursor-pointer [overflow-wrap:anywhere]">{text.slice(0, SUMMARY_LENGTH).trimEnd()} …</summary>
      <pre className="mt-2 whitespace-pre-wrap rounded-md bg-paper-sunk p-2 text-xs [overflow-wrap:anywhere]">{JSON.stringify(details, null, 2)}</pre>
    </details>
  );
}

const targetPages: Record<string, (id: string) => string> = {
  dispute: (id) => `/admin/disputes/${id}`,
  job: (id) => `/jobs/${id}`,
  shop: (id) => `/shops/${id}`,
};

function Target({ type, id }: { type: string; id: string }) {
  const page = targetPages[type];
  const words = (
    <>
      {type} <span className="font-mono text-xs">{/^[0-9a-f-]{36}$/i.test(id) ? `${id.slice(0, 8)}…` : id}</span>
    </>
  );
  return page ? (
    <Link to={page(id)} className="text-slate-700 underline underline-offset-4">
      {words}
      <span className="sr-only"> (id {id})</span>
    </Link>
  ) : (
    <span title={id}>{words}</span>
  );
}

/** What administrators did, newest first as the server sends it. */
export function AuditTable({ entries, onlyActionHref, dimmed = false }: { entries: AuditRow[]; onlyActionHref: (action: string) => string; dimmed?: boolean }) {
  return (
    <div
      role="region"
      aria-label="Audit log entries"
      tabIndex={0}
      className={cn('relative overflow-x-auto rounded-card bg-paper-raised px-4 shadow-card ring-1 ring-slate-100', dimmed && 'opacity-60')}
    >
      <table className="w-full min-w-[52rem] text-left text-sm">
        <caption className="sr-only">Audit log entries</caption>
        <TableHead columns={['When', 'Administrator', 'Action', 'Target', 'Details']} />
        <tbody>
          {entries.map((entry) => (
            <tr key={entry.id} className="border-b border-slate-100 align-top">
              <td className="whitespace-nowrap py-3 pr-4 tabular-nums">
                <time dateTime={entry.at}>{formatMoment(entry.at)}</time>
              </td>
              <td className="py-3 pr-4">{entry.admin.displayName}</td>
              <td className="py-3 pr-4">
                <span className="font-mono text-xs font-semibold">{entry.action}</span>
                <Link to={onlyActionHref(entry.action)} className="block text-xs text-ink-soft underline underline-offset-4">
                  Only this action<span className="sr-only">: {entry.action}</span>
                </Link>
              </td>
              <td className="py-3 pr-4">
                <Target type={entry.targetType} id={entry.targetId} />
              </td>
              <td className="max-w-md py-3">
                <Details details={entry.details} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

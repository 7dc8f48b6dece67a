import { Link } from 'react-router-dom';
import { RECORD_STATUS } from '@shared/glossary';
import type { NeedsYouItem } from '@shared/schemas/notifications';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useNeedsYou } from '../api/notifications';
import { formatWhen } from './notification-words';

/** The heading of each kind of thing that waits, as the list names it. */
const kindWords: Record<NeedsYouItem['kind'], string> = {
  'bids-to-compare': 'Bids to compare',
  'payment-due': 'Payment due',
  'results-to-review': 'Results to review',
  'dispute-waiting': 'Dispute',
  'bid-accepted-awaiting-payment': 'Waiting for payment',
  'jobs-coming-due': 'Coming due',
  'record-rejected': RECORD_STATUS.rejected.label,
  'dispute-to-decide': 'Dispute to decide',
};

/** What waits on the signed-in person, at the top of their home page, each with a link and the time left. */
export function NeedsYouList() {
  const needs = useNeedsYou();
  return (
    <Card className="mb-6">
      <h2 className="text-xl font-bold" id="needs-you-heading">
        Needs you
      </h2>
      {needs.isPending ? (
        <p className="mt-2 text-ink-soft">Looking for what waits on you …</p>
      ) : needs.isError ? (
        <Notice tone="error" title="What needs you could not be loaded." className="mt-3">
          <Button variant="secondary" className="mt-2" onClick={() => void needs.refetch()}>
            Retry
          </Button>
        </Notice>
      ) : needs.data.length === 0 ? (
        <p className="mt-2 text-ink-soft" data-testid="needs-you-empty">
          Nothing waits on you right now.
        </p>
      ) : (
        <ul aria-labelledby="needs-you-heading" className="mt-3 divide-y divide-slate-100" data-testid="needs-you">
          {needs.data.map((item) => (
            <li key={`${item.kind}-${item.jobId}`} className="py-3" data-kind={item.kind}>
              <p className="text-sm font-bold uppercase tracking-wide text-brass-700">{kindWords[item.kind]}</p>
              <Link to={item.href} className="break-words font-semibold text-slate-700 underline underline-offset-4">
                {item.title}
              </Link>
              <p className="mt-1 text-ink-soft">{item.text}</p>
              {item.dueAt && (
                <p className="mt-1 text-sm text-ink-soft">
                  Due <time dateTime={item.dueAt}>{formatWhen(item.dueAt)}</time>
                </p>
              )}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

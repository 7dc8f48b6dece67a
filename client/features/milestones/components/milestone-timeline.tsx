import type { Milestone } from '@shared/schemas/milestones';
import { MilestonePhotos } from './milestone-photos';
import { formatWhen, milestoneTitle, shippingWords } from './milestone-words';

/**
 * The job's progress as an ordered list, oldest first: what happened, when,
 * who logged it, and any note; the trips to and from the shop with carrier and tracking number.
 */
export function MilestoneTimeline({ milestones }: { milestones: Milestone[] }) {
  if (milestones.length === 0) {
    return <p className="text-ink-soft">Nothing logged yet. The shop logs each step here, starting when the parts arrive.</p>;
  }
  return (
    <ol aria-label="Progress on this job" className="flex flex-col">
      {milestones.map((m, index) => (
        <li key={m.id} data-testid="milestone" className="relative flex gap-3 pb-5 last:pb-0">
          <div aria-hidden className="flex flex-col items-center">
            <span className="mt-1.5 size-3 shrink-0 rounded-full bg-slate-700 ring-4 ring-slate-100" />
            {index < milestones.length - 1 && <span className="mt-1 w-0.5 flex-1 bg-slate-200" />}
          </div>
          <div className="min-w-0 flex-1">
            <p className="font-bold text-ink">{milestoneTitle(m)}</p>
            <p className="text-sm text-ink-soft">
              <time dateTime={m.createdAt}>{formatWhen(m.createdAt)}</time> · {m.author.displayName}
            </p>
            {shippingWords(m) && <p className="mt-1 text-sm">{shippingWords(m)}</p>}
            {m.note && <p className="mt-1 whitespace-pre-wrap text-ink">{m.note}</p>}
            {m.photos.length > 0 && <MilestonePhotos photos={m.photos} title={milestoneTitle(m)} />}
          </div>
        </li>
      ))}
    </ol>
  );
}

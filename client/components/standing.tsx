import type { BuilderStanding, ShopStanding, StandingShare } from '@shared/schemas/standing';
import { PAY_WITHIN_DAYS, STANDING_MIN_COUNT, STANDING_RECENT } from '@shared/standing';
import { cn } from '@client/lib/cn';

// A shop's or a builder's standing as worked out from their history on Tenthmark (server/modules/standing).
// Each figure says what it counts; below the minimum count it says so instead of a figure.

type Line = { label: string; text: string };

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const shareLine = (figure: StandingShare | null, words: (f: StandingShare) => string, tooFew: string) => (figure ? words(figure) : tooFew);

/** Minutes as a person says them: "25 min", "2 h 10 min", "3 days". */
export function answerTimeWords(minutes: number): string {
  if (minutes < 60) return `${minutes} min`;
  if (minutes < 48 * 60) {
    const hours = Math.floor(minutes / 60);
    const rest = minutes % 60;
    return rest ? `${hours} h ${rest} min` : `${hours} h`;
  }
  return plural(Math.round(minutes / (24 * 60)), 'day', 'days');
}

export function shopStandingLines(standing: ShopStanding): Line[] {
  const { firstTimeAcceptance, onTime, disputes, answerTime } = standing;
  const tooFew = 'Not enough finished jobs yet';
  let disputeText = tooFew;
  if (disputes) {
    const ended = [
      disputes.outcomes.release && `${disputes.outcomes.release} paid to the shop`,
      disputes.outcomes.refund && `${disputes.outcomes.refund} refunded`,
      disputes.outcomes.split && `${disputes.outcomes.split} split`,
      disputes.outcomes.open && `${disputes.outcomes.open} still open`,
    ].filter(Boolean);
    disputeText = `${plural(disputes.opened, 'dispute', 'disputes')} over ${plural(disputes.completed, 'completed job', 'completed jobs')}${ended.length ? ` (${ended.join(', ')})` : ''}`;
  }
  return [
    { label: 'Records', text: shareLine(firstTimeAcceptance, (f) => `${f.count} of ${f.of} records accepted first time`, tooFew) },
    { label: 'On time', text: shareLine(onTime, (f) => `${f.count} of ${f.of} jobs ready or shipped by the due day`, tooFew) },
    { label: 'Disputes', text: disputeText },
    {
      label: 'Answers',
      text: answerTime ? `Answers builders in ${answerTimeWords(answerTime.minutes)} (the middle of ${plural(answerTime.of, 'answer', 'answers')})` : 'Not enough answered messages yet',
    },
  ];
}

export function builderStandingLines(standing: BuilderStanding): Line[] {
  return [
    { label: 'Payments', text: shareLine(standing.paysOnTime, (f) => `${f.count} of ${f.of} awards paid within ${PAY_WITHIN_DAYS} days`, 'Not enough awards yet') },
    {
      label: 'Records',
      text: shareLine(standing.answersRecords, (f) => `${f.count} of ${f.of} inspection records answered within the review window`, 'Not enough records yet'),
    },
  ];
}

function StandingList({ lines, label, className }: { lines: Line[]; label: string; className?: string }) {
  return (
    <dl aria-label={label} className={cn('grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm', className)}>
      {lines.map((line) => (
        <div key={line.label} className="contents">
          <dt className="font-semibold text-ink-soft">{line.label}</dt>
          <dd>{line.text}</dd>
        </div>
      ))}
    </dl>
  );
}

/** How a standing is worked out, in one sentence for beneath it. */
export const STANDING_NOTE = `Worked out from work done on Tenthmark (the latest ${STANDING_RECENT} jobs), never typed in; a figure shows once ${STANDING_MIN_COUNT} or more count. Working days are Monday to Friday.`;

/** One short line instead of a list of "not enough" when no figure can be shown yet. */
function NoRecordYet({ why, className }: { why: string; className?: string }) {
  return <p className={cn('text-sm text-ink-soft', className)}>No record on Tenthmark yet: {why}.</p>;
}

const nothingShown = (standing: ShopStanding | BuilderStanding) => Object.values(standing).every((figure) => figure === null);

export function ShopStandingList({ standing, className }: { standing: ShopStanding; className?: string }) {
  if (nothingShown(standing)) return <NoRecordYet why="too few finished jobs for a figure" className={className} />;
  return <StandingList lines={shopStandingLines(standing)} label="Record on Tenthmark" className={className} />;
}

export function BuilderStandingList({ standing, className }: { standing: BuilderStanding; className?: string }) {
  if (nothingShown(standing)) return <NoRecordYet why="too few awards and records for a figure" className={className} />;
  return <StandingList lines={builderStandingLines(standing)} label="Builder’s record on Tenthmark" className={className} />;
}

/** A builder's standing in one short line for a board row: each figure there is, or that there is none yet. */
export function BuilderStandingBrief({ standing, className }: { standing: BuilderStanding; className?: string }) {
  const { paysOnTime, answersRecords } = standing;
  const parts = [
    paysOnTime && `paid ${paysOnTime.count} of ${paysOnTime.of} awards on time`,
    answersRecords && `answered ${answersRecords.count} of ${answersRecords.of} records in time`,
  ].filter(Boolean);
  return (
    <span className={cn('block text-sm text-ink-soft', className)} data-testid="builder-standing">
      {parts.length ? `Builder ${parts.join(', ')}` : 'Builder: no record on Tenthmark yet'}
    </span>
  );
}

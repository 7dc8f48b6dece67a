import { useId, useState } from 'react';
import { formatCents } from '@shared/catalogue';
import type { EvidenceItem } from '@shared/schemas/disputes';
import { disputeReasonWords } from '@shared/schemas/values';
import type { InspectionResults } from '@shared/schemas/inspection';
import { EXTRA_WORK_STATUS, NAMES } from '@shared/glossary';
import { INSPECTION_STATUS_WORDS } from '@shared/inspection-words';
import { Badge, type BadgeTone } from '@client/components/ui/badge';
import { CheckboxField } from '@client/components/ui/checkbox-field';
import { PhotoThumbnails } from '@client/components/ui/photo-thumbnails';
import { cn } from '@client/lib/cn';
import { milestoneTitle } from '@client/features/milestones';
import { formatMoment, ledgerKindWords, plural, sideWords } from './admin-words';

/** The kinds an administrator can show or hide; both dispute statements count as one. */
type Group = 'dispute' | 'message' | 'milestone' | 'inspection' | 'change_order' | 'money' | 'job_photo';

const groups: Record<Group, { label: string; tone: BadgeTone }> = {
  dispute: { label: 'Dispute', tone: 'error' },
  message: { label: 'Message', tone: 'neutral' },
  milestone: { label: NAMES.progress, tone: 'info' },
  inspection: { label: 'Inspection record', tone: 'caution' },
  change_order: { label: NAMES.extraWork, tone: 'neutral' },
  money: { label: 'Money', tone: 'success' },
  job_photo: { label: 'Job photos', tone: 'muted' },
};

const filterLabels: Record<Group, string> = {
  dispute: 'Dispute statements',
  message: 'Messages',
  milestone: NAMES.progress,
  inspection: 'Inspection records',
  change_order: NAMES.extraWork,
  money: 'Money',
  job_photo: 'Job photos',
};

const groupOf = (item: EvidenceItem): Group => (item.kind === 'dispute_opened' || item.kind === 'dispute_answered' ? 'dispute' : item.kind);


const figure = new Intl.NumberFormat(undefined, { maximumFractionDigits: 4 });

function PassFail({ pass }: { pass: boolean }) {
  return (
    <Badge tone={pass ? 'success' : 'error'}>
      <span aria-hidden>{pass ? '✓' : '✕'}</span> {pass ? 'Passes' : 'Fails'}
    </Badge>
  );
}

function Statement({ text }: { text: string }) {
  return <p className="whitespace-pre-wrap break-words rounded-lg bg-paper-sunk px-3 py-2">{text}</p>;
}

/** The verdict, how many checks pass, and each failing check with its figure and limit. */
function InspectionSummary({ results }: { results: InspectionResults }) {
  const failing = results.checks.filter((check) => !check.pass);
  const cylinderFailures = (results.bores?.cylinders ?? []).flatMap((cylinder, index) => (cylinder.pass ? [] : [index + 1]));
  return (
    <div className="flex flex-col gap-1.5 text-sm">
      <p>
        {results.checks.length === 0
          ? 'No limits were given to check against'
          : `${results.checks.length - failing.length} of ${results.checks.length === 1 ? '1 check passes' : `${results.checks.length} checks pass`}`}
        {cylinderFailures.length > 0 && <>; bores out of limits on {cylinderFailures.length === 1 ? 'cylinder' : 'cylinders'} {cylinderFailures.join(', ')}</>}
        {results.deck && <>; deck {results.deck.pass ? 'within' : 'outside'} its flatness limit</>}.
      </p>
      {failing.length > 0 && (
        <ul aria-label="Failing checks" className="flex flex-col gap-0.5">
          {failing.map((check, index) => (
            <li key={`${check.what}-${index}`} className="text-fail">
              <span className="font-semibold">{check.what}</span>: {figure.format(check.value)} (allowed {check.allowed})
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

function ItemBody({ item, builderName, shopName }: { item: EvidenceItem; builderName: string; shopName: string }) {
  const nameOf = (side: 'builder' | 'shop') => `${side === 'builder' ? builderName : shopName} (${sideWords[side].toLowerCase()})`;
  switch (item.kind) {
    case 'dispute_opened':
      return (
        <>
          <p>
            <span className="font-semibold">{nameOf(item.by)}</span> opened the dispute: {disputeReasonWords[item.reason]}
          </p>
          <Statement text={item.statement} />
        </>
      );
    case 'dispute_answered':
      return (
        <>
          <p>
            <span className="font-semibold">{nameOf(item.by)}</span> answered the dispute
          </p>
          <Statement text={item.statement} />
        </>
      );
    case 'message':
      return (
        <>
          <p className="font-semibold">
            {item.authorName} <span className="font-normal text-ink-soft">({sideWords[item.by].toLowerCase()})</span>
          </p>
          {item.body && <p className="whitespace-pre-wrap break-words">{item.body}</p>}
          <PhotoThumbnails
            photos={item.photos}
            nameOf={(index, count) => `Photo ${index + 1} of ${count} sent by ${item.authorName}`}
            thumbClassName="size-20"
            testId="evidence-photo"
          />
        </>
      );
    case 'milestone':
      return (
        <>
          <p className="font-semibold">{milestoneTitle({ kind: item.milestone, operation: item.operation })}</p>
          {item.note && <p className="whitespace-pre-wrap break-words">{item.note}</p>}
          {(item.carrier || item.trackingNumber) && (
            <p className="text-sm">
              {item.carrier && <>Carrier: {item.carrier}</>}
              {item.carrier && item.trackingNumber && ' · '}
              {item.trackingNumber && (
                <>
                  Tracking number: <span className="font-mono">{item.trackingNumber}</span>
                </>
              )}
            </p>
          )}
          <PhotoThumbnails
            photos={item.photos}
            nameOf={(index, count) => `Photo ${index + 1} of ${count}: ${milestoneTitle({ kind: item.milestone, operation: item.operation })}`}
            thumbClassName="size-20"
            testId="evidence-photo"
          />
        </>
      );
    case 'inspection':
      return (
        <>
          <p className="flex flex-wrap items-center gap-2">
            <span className="font-semibold">Version {item.version}</span>
            <PassFail pass={item.pass} />
            <span className="text-ink-soft">{INSPECTION_STATUS_WORDS[item.status] ?? item.status}</span>
            {item.decidedAt && <span className="text-sm text-ink-soft">on {formatMoment(item.decidedAt)}</span>}
          </p>
          <InspectionSummary results={item.results} />
          {item.rejectReasons && (
            <div className="text-sm">
              <p className="font-semibold">Why the builder sent it back</p>
              <Statement text={item.rejectReasons} />
            </div>
          )}
        </>
      );
    case 'change_order':
      return (
        <>
          <p>
            <span className="font-semibold tabular-nums">{formatCents(item.amountCents)}</span> · {EXTRA_WORK_STATUS[item.status].label}
          </p>
          <p className="whitespace-pre-wrap break-words">{item.description}</p>
        </>
      );
    case 'money':
      return (
        <p>
          {ledgerKindWords[item.entry]}: <span className="font-semibold tabular-nums">{formatCents(item.amountCents)}</span>{' '}
          <span className="break-all font-mono text-xs text-ink-soft">{item.reference}</span>
        </p>
      );
    case 'job_photo':
      return (
        <>
          <p>{plural(item.photos.length, 'photo')} added to the job.</p>
          <PhotoThumbnails
            photos={item.photos}
            nameOf={(index, count) => `Job photo ${index + 1} of ${count}`}
            thumbClassName="size-20"
            testId="evidence-photo"
          />
        </>
      );
  }
}

/**
 * Everything that happened on the job, oldest first, in one list: each entry
 * with its time, what kind it is and what it says. Kinds can be hidden.
 */
export function EvidenceTimeline({ items, builderName, shopName }: { items: EvidenceItem[]; builderName: string; shopName: string }) {
  const filterId = useId();
  const [hidden, setHidden] = useState<Set<Group>>(new Set());
  const counts = new Map<Group, number>();
  for (const item of items) counts.set(groupOf(item), (counts.get(groupOf(item)) ?? 0) + 1);
  const present = (Object.keys(groups) as Group[]).filter((group) => counts.has(group));
  const shown = items.filter((item) => !hidden.has(groupOf(item)));

  const toggle = (group: Group, visible: boolean) =>
    setHidden((current) => {
      const next = new Set(current);
      if (visible) next.delete(group);
      else next.add(group);
      return next;
    });

  if (items.length === 0) return <p className="text-ink-soft">Nothing has been recorded on this job.</p>;

  return (
    <div className="flex flex-col gap-4">
      {present.length > 1 && (
        <div role="group" aria-labelledby={filterId} className="rounded-lg bg-paper-sunk px-4 py-3">
          <p id={filterId} className="mb-2 text-sm font-semibold">
            Show these kinds of evidence
          </p>
          <div className="flex flex-wrap gap-x-5 gap-y-2">
            {present.map((group) => (
              <CheckboxField
                key={group}
                label={`${filterLabels[group]} (${counts.get(group)})`}
                checked={!hidden.has(group)}
                onChange={(event) => toggle(group, event.target.checked)}
              />
            ))}
          </div>
        </div>
      )}
      <p className="text-sm text-ink-soft" aria-live="polite">
        {shown.length === items.length ? `${plural(items.length, 'entry', 'entries')}, oldest first` : `Showing ${shown.length} of ${plural(items.length, 'entry', 'entries')}, oldest first`}
      </p>
      {shown.length === 0 ? (
        <p className="text-ink-soft">Every kind is hidden. Tick one above to see its entries.</p>
      ) : (
        <ol aria-label="Evidence, oldest first" className="flex flex-col">
          {shown.map((item, index) => {
            const group = groupOf(item);
            return (
              <li
                key={`${item.kind}-${item.at}-${index}`}
                className={cn('flex flex-col gap-2 border-l-2 py-3 pl-4', group === 'dispute' ? 'border-fail' : 'border-slate-200')}
                data-kind={item.kind}
              >
                <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
                  <time dateTime={item.at} className="font-semibold tabular-nums text-ink-soft">
                    {formatMoment(item.at)}
                  </time>
                  <Badge tone={groups[group].tone}>{groups[group].label}</Badge>
                </div>
                <ItemBody item={item} builderName={builderName} shopName={shopName} />
              </li>
            );
          })}
        </ol>
      )}
    </div>
  );
}

import type { InspectionVersion, InspectionView } from '@shared/schemas/inspection';
import { draftSavedAt, emptyRecord, fromDraft, fromInput } from '../lib/record-form';
import { InspectionEntryForm, type InspectionEntryFormProps } from './inspection-entry-form';

/** The entry form, started from the shop's kept draft, the version the builder rejected, or empty. */
export function InspectionEntry({
  job,
  view,
  onSubmitted,
}: {
  job: InspectionEntryFormProps['job'];
  view: InspectionView;
  onSubmitted: (version: InspectionVersion) => void;
}) {
  const latest = view.versions[0];
  // A kept draft wins, unless it is older than a rejection (then the rejected version's readings are the better start).
  const rejected = latest?.status === 'rejected' ? latest : null;
  const savedAt = draftSavedAt(view.draft);
  const draftIsCurrent = !rejected || !savedAt || Date.parse(savedAt) > Date.parse(rejected.decidedAt ?? rejected.submittedAt);
  const draft = draftIsCurrent ? fromDraft(view.draft, job.spec.unit) : null;
  const initial = draft ?? (rejected ? fromInput(rejected.input) : emptyRecord(job.spec.unit));
  const origin: InspectionEntryFormProps['origin'] = { draft: draft ? { savedAt } : false, rejected };
  return <InspectionEntryForm job={job} initial={initial} origin={origin} onSubmitted={onSubmitted} />;
}

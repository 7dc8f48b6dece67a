import { findOperation } from '@shared/catalogue';
import type { Milestone } from '@shared/schemas/milestones';

type Kind = Milestone['kind'];

/** Each kind of progress in the words a shop would say it. */
export const milestoneKindWords: Record<Kind, string> = {
  block_received: 'Block received',
  teardown: 'Teardown and incoming inspection',
  operation_started: 'Operation started',
  operation_finished: 'Operation finished',
  inspection_submitted: 'Inspection record submitted',
  ready_for_pickup: 'Ready for pickup',
  shipped: 'Shipped',
  delivered: 'Delivered',
  note: 'Note',
};

/** One line for the timeline: "Bore started", "Shipped", "Block received". */
export function milestoneTitle(milestone: Pick<Milestone, 'kind' | 'operation'>): string {
  if ((milestone.kind === 'operation_started' || milestone.kind === 'operation_finished') && milestone.operation) {
    const name = findOperation(milestone.operation)?.name ?? milestone.operation;
    return `${name} ${milestone.kind === 'operation_started' ? 'started' : 'finished'}`;
  }
  return milestoneKindWords[milestone.kind];
}

const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** "Mar 4, 2026, 2:15 PM" in the reader's own time zone. */
export const formatWhen = (iso: string) => when.format(new Date(iso));

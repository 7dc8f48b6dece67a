import { findOperation } from '@shared/catalogue';
import type { Milestone } from '@shared/schemas/milestones';

type Kind = Milestone['kind'];

/** Each kind of progress in the words a shop would say it. */
export const milestoneKindWords: Record<Kind, string> = {
  block_received: 'Parts received',
  teardown: 'Teardown and incoming inspection',
  operation_started: 'Operation started',
  operation_finished: 'Operation finished',
  inspection_submitted: 'Inspection record submitted',
  ready_for_pickup: 'Ready for pickup',
  shipped: 'Shipped back',
  delivered: 'Delivered',
  note: 'Note',
  sent_to_shop: 'Sent to the shop',
};

/** One line for the timeline: "Bore started", "Shipped back", "Parts received". */
export function milestoneTitle(milestone: Pick<Milestone, 'kind' | 'operation'>): string {
  if ((milestone.kind === 'operation_started' || milestone.kind === 'operation_finished') && milestone.operation) {
    const name = findOperation(milestone.operation)?.name ?? milestone.operation;
    return `${name} ${milestone.kind === 'operation_started' ? 'started' : 'finished'}`;
  }
  return milestoneKindWords[milestone.kind];
}

/** The trip in words: "Sent to the shop by Ridgeline Freight, tracking RF 4471" or "Shipped back by …"; null for other kinds. */
export function shippingWords(milestone: Pick<Milestone, 'kind' | 'carrier' | 'trackingNumber'>): string | null {
  if (milestone.kind !== 'sent_to_shop' && milestone.kind !== 'shipped') return null;
  if (!milestone.carrier && !milestone.trackingNumber) return null;
  const start = milestone.kind === 'sent_to_shop' ? 'Sent to the shop' : 'Shipped back';
  const by = milestone.carrier ? ` by ${milestone.carrier}` : '';
  const tracking = milestone.trackingNumber ? `, tracking ${milestone.trackingNumber}` : '';
  return `${start}${by}${tracking}`;
}

/** "4 Mar 2026, 14:15 EST" in the reader's own time zone, named. */
export { formatDateTime as formatWhen } from '@client/lib/dates';

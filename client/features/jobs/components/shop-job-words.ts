import type { JobStatus } from '@shared/schemas/jobs';

/**
 * What a job's status means to a shop reading the job page: the shop doing
 * the work, or a shop whose bid was not the one accepted. The status names
 * stay those of `statusWords`; only the sentence beside them changes, since
 * the builder's ("you accepted", "your payment") would speak to the wrong
 * person.
 */
export const workingShopExplain: Record<JobStatus, string> = {
  draft: 'Not published yet.',
  open: 'Shops can see it on the job board and bid.',
  awarded: 'The builder accepted your bid. Wait for their payment before you start; it shows as held on this page.',
  funded: 'The builder paid and Tenthmark holds the money while you work. Log “parts received” when the parts arrive.',
  in_work: 'The parts are in your shop. When the work is done, send the measured inspection record.',
  inspection_submitted: 'You sent your measured results; the builder is checking them.',
  completed: 'The builder accepted your results; the payment was released to you, less the Tenthmark fee.',
  disputed: 'An administrator is looking at the disagreement; the payment stays held until they decide.',
  resolved: 'An administrator decided the dispute.',
  cancelled: 'This job was cancelled.',
};

/** For a shop whose bid was not accepted, once the builder chose another. */
export const otherShopExplain = 'The builder accepted another shop’s bid.';

/** For an administrator, who is neither party: the same facts in the third person. */
export const staffExplain: Record<JobStatus, string> = {
  draft: 'Not published yet; only the builder sees it.',
  open: 'Shops can see it on the job board and bid.',
  awarded: 'The builder accepted a bid; the payment is due from the builder.',
  funded: 'The builder paid; Tenthmark holds the money until the builder accepts the inspection record.',
  in_work: 'The shop has the parts and is working on them.',
  inspection_submitted: 'The shop sent its measured results; the builder is checking them.',
  completed: 'The builder accepted the results and the shop was paid.',
  disputed: 'The dispute waits for an administrator’s decision; the payment stays held.',
  resolved: 'An administrator decided the dispute.',
  cancelled: 'This job was cancelled.',
};

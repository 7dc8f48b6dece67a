// Plain values the schemas check against (lists, limits and their words), kept free of zod so that a page
// can show them without loading zod (about 25 KB gzipped) with its first load. Each schema module re-exports
// its own, so the server and the tests import them from there as before.

import type { CheckVerdict, InspectionResults, LimitCheck, RecordVerdict } from './inspection';

export const MAX_MESSAGE_LENGTH = 4000;

export const MAX_PHOTOS_PER_MESSAGE = 4;

export const jobStatuses = ['draft', 'open', 'awarded', 'funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved', 'cancelled'] as const;
export type JobStatus = (typeof jobStatuses)[number];

/**
 * Why a dispute is opened. The builder disputes instead of accepting an
 * inspection record; the shop disputes when the builder has gone silent past
 * the agreed date, or over a change order.
 */
export const builderDisputeReasons = ['record_outside_limits', 'work_not_as_agreed', 'parts_damaged_or_missing', 'other'] as const;
export const shopDisputeReasons = ['builder_silent', 'change_order'] as const;
export const disputeReasons = [...builderDisputeReasons, ...shopDisputeReasons] as const;
export type DisputeReason = (typeof disputeReasons)[number];

export const disputeReasonWords: Record<DisputeReason, string> = {
  record_outside_limits: 'The inspection record shows sizes outside the agreed limits',
  work_not_as_agreed: 'The work done is not what was agreed',
  parts_damaged_or_missing: 'Parts came back damaged or missing',
  other: 'Something else (explain below)',
  builder_silent: 'The builder has not answered past the agreed date',
  change_order: 'Extra work is not being paid or answered',
};

/** The kinds of ledger entry: money paid in, released to the shop, the platform's fee, refunded to the builder. */
export const ledgerKinds = ['paid_in', 'released', 'fee', 'refunded'] as const;

export const blockMaterials = ['cast-iron', 'aluminium'] as const;
export const engineLayouts = ['inline', 'v', 'flat', 'other'] as const;
export const pistonTypes = ['cast', 'hypereutectic', 'forged'] as const;
export const logisticsOptions = ['ship', 'drop-off'] as const;

export const cleanMethods = ['hot-tank', 'thermal-oven', 'spray-wash', 'other'] as const;
export type CleanMethod = (typeof cleanMethods)[number];

/**
 * The cleaning methods suited to the job's metal (its block and heads; null
 * when it sends neither, e.g. a crankshaft alone). A caustic hot tank attacks
 * aluminium (common practice), so it is offered for iron and steel only.
 */
export function cleanMethodsFor(material: (typeof blockMaterials)[number] | null | undefined): readonly CleanMethod[] {
  return material === 'aluminium' ? cleanMethods.filter((m) => m !== 'hot-tank') : cleanMethods;
}

export const HOT_TANK_ON_ALUMINIUM = 'A caustic hot tank attacks aluminium: clean an aluminium part in a thermal oven or a spray wash.';
export const crackTestMethods = ['magnetic-particle', 'dye-penetrant', 'pressure-test'] as const;

/** The section of the input each kind of work fills with its own readings (honing's stones are shared by every kind of hone: see the entry form). */
export const SECTION_INPUT_KEYS = {
  clean: 'clean',
  'crack-test': 'crackTest',
  'line-hone': 'lineHone',
  'cam-bore': 'camBore',
  sleeve: 'sleeve',
  'head-resurface': 'headResurface',
  'valve-job': 'valveJob',
  'crank-grind': 'crankGrind',
  balance: 'balance',
} as const;

/** A check's verdict, also for records stored before verdicts existed. */
export const checkVerdict = (check: LimitCheck): CheckVerdict => check.verdict ?? (check.pass ? 'conforms' : 'fails');

/** The record's verdict, also for records stored before verdicts existed. */
export const recordVerdict = (results: InspectionResults): RecordVerdict => results.verdict ?? (results.pass ? 'pass' : 'fail');

export const RECORD_VERDICT_WORDS: Record<RecordVerdict, string> = {
  pass: 'Pass: every limit judged, every check conforms',
  fail: 'Fail: at least one check fails',
  'not-fully-judged': 'Not fully judged: at least one limit could not be judged',
  'not-proven': 'Not proven: no check fails, but at least one lies within the measurement uncertainty of its limit',
};

/** `block_received` reads "Parts received" (the code stays for stored rows); `sent_to_shop` is the builder's, logged through its own route. */
export const milestoneKinds = ['block_received', 'teardown', 'operation_started', 'operation_finished', 'inspection_submitted', 'ready_for_pickup', 'shipped', 'delivered', 'note', 'sent_to_shop'] as const;

/** The most photos one milestone may carry. */
export const MAX_PHOTOS_PER_MILESTONE = 4;

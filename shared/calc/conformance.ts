/**
 * Whether a judged inspection record conforms as a whole, and which checks
 * keep it from conforming. Used by the review window (only a record whose
 * every check conforms may be accepted without the builder) and by the
 * builder's accept dialog (every such check is named and confirmed).
 *
 * The rule is written as "every check's verdict is conforms": a verdict this
 * file does not know (fail, not proven, not fully judged, anything added
 * later) counts as not conforming, never as a pass.
 */
import type { InspectionResults, LimitCheck } from '../schemas/inspection';

/**
 * The one not-judged item of a record with nothing to judge: the job gave no
 * limits (older jobs can have none), so no check was made. Such a record is
 * "not fully judged", never a pass, and the window does not accept it.
 */
export const NO_LIMITS_GIVEN = { what: 'the job’s limits', why: 'the job gives no limits, so nothing was judged' } as const;

/** The verdict words that mean a check conforms; anything else does not. */
const CONFORMING_VERDICTS = new Set(['conforms', 'pass']);

type JudgedCheck = LimitCheck & { verdict?: unknown };
type JudgedResults = InspectionResults & { verdict?: unknown; notJudged?: Array<{ what: string }> };

/** True only for a check whose verdict says it conforms. */
export function checkConforms(check: JudgedCheck): boolean {
  if (check.verdict !== undefined) return typeof check.verdict === 'string' && CONFORMING_VERDICTS.has(check.verdict) && check.pass !== false;
  return check.pass === true;
}

const BORE_LIMIT_WORDS: Record<string, string> = {
  clearanceMin: 'piston clearance',
  clearanceMax: 'piston clearance',
  maxTaper: 'taper',
  maxOutOfRound: 'out-of-round',
};

/**
 * The names of the checks that do not conform: every check whose verdict is
 * not "conforms", every bore limit left unjudged (a clearance limit with no
 * piston measured), and a cylinder judged failing without a check of its own.
 */
export function checksNotConforming(results: InspectionResults): string[] {
  const names: string[] = [];
  const add = (name: string) => {
    if (!names.includes(name)) names.push(name);
  };
  for (const check of results.checks as JudgedCheck[]) if (!checkConforms(check)) add(check.what);
  const notJudged = (results as JudgedResults).notJudged ?? [];
  for (const item of notJudged) add(`${item.what} (not judged)`);
  // A record with no checks and nothing said about why (stored before the rule above) has judged nothing all the same.
  if (results.checks.length === 0 && notJudged.length === 0) add(`${NO_LIMITS_GIVEN.what} (not judged)`);
  results.bores?.cylinders.forEach((cylinder, index) => {
    // A size with no tolerance is reported, not a limit; a clearance limit with no piston measured is a limit left unjudged.
    for (const limit of (cylinder.notChecked ?? []).filter((l) => l !== 'targetBore')) add(`cylinder ${index + 1} ${BORE_LIMIT_WORDS[limit] ?? limit} (not judged)`);
    if (!cylinder.pass && !names.some((name) => name.startsWith(`cylinder ${index + 1} `))) add(`cylinder ${index + 1}`);
  });
  return names;
}

/** True when the record as a whole conforms: its overall verdict and every check's verdict say so. */
export function recordConforms(results: InspectionResults): boolean {
  const overall = (results as JudgedResults).verdict;
  if (overall !== undefined && !(typeof overall === 'string' && CONFORMING_VERDICTS.has(overall))) return false;
  return results.pass === true && (results.bores === undefined || results.bores.pass === true) && checksNotConforming(results).length === 0;
}

/**
 * The builder's accept for a version they have read in full: that version's
 * number and every check of it that does not conform, named (what the accept
 * dialog asks them to tick). For scripted runs (the demo, tests).
 */
export function acceptAsRead(version: { version: number; results: InspectionResults }): { version: number; confirmedChecks: string[] } {
  return { version: version.version, confirmedChecks: checksNotConforming(version.results) };
}

/**
 * An inspection record's status and overall result in words, the same on the
 * job page, the web certificate and the PDF certificate.
 */
import { NO_LIMITS_GIVEN, recordConforms } from './calc/conformance';
import { RECORD_STATUS } from './glossary';
import type { InspectionResults, InspectionVersion, LimitCheck, NotJudged, RecordVerdict } from './schemas/inspection';
import { RECORD_VERDICT_WORDS, checkVerdict, recordVerdict } from './schemas/values';
import type { SectionFigure, SectionResult, SectionVerdict } from './schemas/inspection-sections';

/** Every status a version can have, in words (the glossary's names). */
export const INSPECTION_STATUS_WORDS: Readonly<Record<InspectionVersion['status'], string>> = {
  submitted: RECORD_STATUS.submitted.label,
  accepted: RECORD_STATUS.accepted.label,
  rejected: RECORD_STATUS.rejected.label,
};

/** A version's status in words, with the version that replaced it when there is one ("Changes asked; replaced by version 2"). */
export function versionStatusWords(version: Pick<InspectionVersion, 'status' | 'replacedBy'>): string {
  const status = INSPECTION_STATUS_WORDS[version.status] ?? version.status;
  return version.replacedBy ? `${status}; replaced by version ${version.replacedBy}` : status;
}

export type ResultTone = 'none' | 'pass' | 'fail' | 'open';

/** What every screen (badge, review, certificate page and PDF) says of a record with nothing to judge. */
export const NOTHING_JUDGED_WORDS = 'Not fully judged: no limits given, so nothing was judged';

/**
 * True when the record judged nothing: no check at all, and nothing not
 * judged but the job's missing limits (records stored before that item was
 * written have none; they judged nothing all the same), and no section judged.
 */
export function judgedNothing(results: InspectionResults): boolean {
  const judgedSection = (results.sections ?? []).some((section) => section.verdict === 'conforms' || section.verdict === 'fails' || section.verdict === 'not-proven');
  return results.checks.length === 0 && !judgedSection && (results.notJudged ?? []).every((item) => item.what === NO_LIMITS_GIVEN.what);
}

/** The record's verdict as shown: a record that judged nothing is not fully judged, whatever an older record stored. */
export const shownVerdict = (results: InspectionResults): RecordVerdict => (judgedNothing(results) ? 'not-fully-judged' : recordVerdict(results));

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The record's verdict with how many checks fail, are not proven, or limits went unjudged (the job page's badge and the review). */
export function recordVerdictText(results: InspectionResults): string {
  if (judgedNothing(results)) return NOTHING_JUDGED_WORDS;
  const verdict = recordVerdict(results);
  if (!results.verdict) return RECORD_VERDICT_WORDS[verdict];
  const verdicts = results.checks.map(checkVerdict);
  const failing = verdicts.filter((v) => v === 'fails').length;
  const unproven = verdicts.filter((v) => v === 'not-proven').length;
  const unjudged = results.notJudged?.length ?? 0;
  switch (verdict) {
    case 'pass':
      return 'Pass: every limit judged, every check conforms';
    case 'fail':
      return `Fail: ${count(failing, 'check fails', 'checks fail')}${unjudged > 0 ? `; ${count(unjudged, 'limit', 'limits')} not judged` : ''}`;
    case 'not-fully-judged':
      return `Not fully judged: ${count(unjudged, 'limit', 'limits')} not judged${unproven > 0 ? `; ${count(unproven, 'check', 'checks')} not proven` : ''}`;
    case 'not-proven':
      return `Not proven: ${count(unproven, 'check lies', 'checks lie')} within the uncertainty of the limit`;
  }
}

/** The overall result line of the certificate: nothing judged, conforms, or why not. */
export function resultHeadline(results: InspectionResults): { tone: ResultTone; text: string } {
  if (judgedNothing(results)) return { tone: 'none', text: NOTHING_JUDGED_WORDS };
  if (recordConforms(results)) return { tone: 'pass', text: 'PASS — every check within the job’s limits' };
  const verdict = (results as { verdict?: string }).verdict;
  if (verdict === 'not-proven') return { tone: 'open', text: 'NOT PROVEN — no check fails, but at least one is too close to its limit to prove conformance' };
  if (verdict === 'not-fully-judged') return { tone: 'open', text: 'NOT FULLY JUDGED — no check fails, but some of the job’s limits could not be judged' };
  return { tone: 'fail', text: 'FAIL — see the checks below' };
}

/**
 * The lines saying how the record was judged: the decision rule, the
 * temperature correction, the roughness filter and the record's own
 * statements, each printed only when the results carry it (records judged
 * before these existed carry none). Read loosely, so older stored results
 * and newer fields both print.
 */
export function methodLines(results: InspectionResults): Array<{ label: string; text: string }> {
  const r = results as InspectionResults & {
    decisionRule?: { name?: string; words?: string; uncertaintyWords?: string };
    temperature?: { measuredC?: number; referenceC?: number; source?: string; block?: { words?: string }; piston?: { words?: string } };
    finish?: { filter?: unknown };
    statements?: string[];
  };
  const lines: Array<{ label: string; text: string }> = [];
  if (r.decisionRule) {
    lines.push({ label: 'Decision rule', text: [r.decisionRule.name, r.decisionRule.words, r.decisionRule.uncertaintyWords].filter(Boolean).join(' — ') });
  }
  if (r.temperature) {
    const t = r.temperature;
    const parts = [
      t.measuredC !== undefined && t.referenceC !== undefined ? `Measured at ${Number(t.measuredC.toFixed(1))} °C; bore figures corrected to ${t.referenceC} °C` : undefined,
      t.block?.words,
      t.piston?.words,
      t.source,
    ];
    lines.push({ label: 'Temperature correction', text: parts.filter(Boolean).join(' · ') });
  }
  const filter = r.finish?.filter;
  if (filter !== undefined && filter !== null) {
    lines.push({ label: 'Roughness filter', text: filterWords(filter) });
  }
  for (const statement of r.statements ?? []) lines.push({ label: 'Statement', text: statement });
  return lines;
}

/** A roughness filter in words, from whatever the results carry: its own words, a plain string, or the filter's figures. */
function filterWords(filter: unknown): string {
  if (typeof filter === 'string') return filter;
  if (typeof filter !== 'object' || filter === null) return String(filter);
  const f = filter as { words?: string; kind?: string; cutoffMm?: number; evaluationLengthMm?: number; samplingLengths?: number };
  if (f.words) return f.words;
  if (f.kind === 'none') return 'none: the trace taken as a roughness profile already';
  if (f.cutoffMm !== undefined) {
    const length = f.evaluationLengthMm !== undefined ? `, ${Number(f.evaluationLengthMm.toFixed(3))} mm evaluated${f.samplingLengths !== undefined ? ` (${f.samplingLengths} sampling lengths)` : ''}` : '';
    return `${f.kind === 'gaussian' || f.kind === undefined ? 'Gaussian' : f.kind}, cut-off ${f.cutoffMm} mm${length}`;
  }
  return JSON.stringify(filter);
}

// --- sections -------------------------------------------------------------------

export const SECTION_VERDICT_WORDS: Readonly<Record<SectionVerdict, string>> = {
  conforms: 'Conforms',
  fails: 'Fails',
  'not-proven': 'Not proven',
  'not-judged': 'Not fully judged',
  recorded: 'Recorded',
};

/** The unit a check's limit is written in ("≤ 0.0030 in" → "in"), to print beside its value. */
const unitOfLimit = (allowed: string) => /(g·mm|µm|mm|in|cc|lbf|N|g|°)\s*$/.exec(allowed)?.[1];

/** A section check's value in words: its own words (a crack test's result), or the number with its limit's unit. */
export function checkValueText(check: LimitCheck): string {
  if (check.valueText) return check.valueText;
  const unit = unitOfLimit(check.allowed);
  const number = Number(check.value.toPrecision(6)).toString();
  return unit ? `${number}${unit === '°' ? '' : ' '}${unit}` : number;
}

export const figureText = (figure: SectionFigure) => `${figure.value}${figure.unit ? ` ${figure.unit}` : ''}`;

/** The checks and not-judged items one section covers. */
export function sectionParts(section: SectionResult, results: InspectionResults): { checks: LimitCheck[]; notJudged: NotJudged[] } {
  const covered = (s: string | undefined) => s !== undefined && section.covers.includes(s);
  return { checks: results.checks.filter((check) => covered(check.section)), notJudged: (results.notJudged ?? []).filter((item) => covered(item.section)) };
}

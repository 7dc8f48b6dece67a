/**
 * An inspection record's status and overall result in words, the same on the
 * job page, the web certificate and the PDF certificate.
 */
import { recordConforms } from './calc/conformance';
import { RECORD_STATUS } from './glossary';
import { boreSpecFor } from './calc/bore-spec';
import type { LengthUnit } from './calc/units';
import type { InspectionResults, InspectionVersion, LimitCheck, NotJudged } from './schemas/inspection';
import type { SectionFigure, SectionResult, SectionVerdict } from './schemas/inspection-sections';

/** Every status a version can have, in words (the glossary's names). */
export const INSPECTION_STATUS_WORDS: Readonly<Record<InspectionVersion['status'], string>> = {
  submitted: RECORD_STATUS.submitted.label,
  accepted: RECORD_STATUS.accepted.label,
  rejected: RECORD_STATUS.rejected.label,
  superseded: RECORD_STATUS.superseded.label,
};

export type ResultTone = 'none' | 'pass' | 'fail' | 'open';

/** True when the job gave no limit at all that the record was judged against (the deck has a common-practice table of its own). */
export function nothingJudged(results: InspectionResults, spec: Parameters<typeof boreSpecFor>[0], unit: LengthUnit): boolean {
  const bore = boreSpecFor(spec, unit);
  // A size tolerance (the job's or a default) judges nothing without a target size.
  const sizeJudged = bore.targetBore !== undefined && bore.targetTolerance !== undefined;
  const boreLimits = sizeJudged || [bore.clearanceMin, bore.clearanceMax, bore.maxTaper, bore.maxOutOfRound].some((v) => v !== undefined);
  const notJudged = (results as { notJudged?: unknown[] }).notJudged ?? [];
  return results.checks.length === 0 && notJudged.length === 0 && !results.deck && !boreLimits;
}

/** The overall result line: nothing judged, conforms, or why not. */
export function resultHeadline(results: InspectionResults, spec: Parameters<typeof boreSpecFor>[0], unit: LengthUnit): { tone: ResultTone; text: string } {
  if (nothingJudged(results, spec, unit)) return { tone: 'none', text: 'No limits given: nothing judged' };
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

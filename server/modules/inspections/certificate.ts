import { checkFigures } from '../../../shared/calc/check-figures';
import { figureAgainstLimit, lengthDecimals } from '../../../shared/calc/figures';
import { SECTION_VERDICT_WORDS, versionStatusWords, checkValueText, figureText, methodLines, resultHeadline, sectionParts } from '../../../shared/inspection-words';
import type { InspectionInput, InspectionResults, InspectionVersion } from '../../../shared/schemas/inspection';
import type { JobInput } from '../../../shared/schemas/jobs';
import { stamp, startDocument } from '../../lib/pdf/document';

export interface CertificateData {
  jobTitle: string;
  jobId: string;
  engineFamily: string;
  builderName: string;
  shopName: string;
  shopPlace: string;
  version: number;
  status: InspectionVersion['status'];
  /** The version that replaced this one, if any. */
  replacedBy: number | null;
  submittedAt: Date;
  /** The job's limits, to print each figure against its limit with enough decimals. */
  spec: JobInput;
  input: InspectionInput;
  results: InspectionResults;
}

export const GUIDANCE =
  'Figures are guidance. Engine and piston makers’ specifications, calibrated instruments, local codes and licensed practice govern machine work.';

/**
 * The printable certificate of an inspection record: every reading, every
 * figure worked out from it, pass or fail against the job's limits, the
 * conditions, how it was judged, the shop's sign-off and the guidance
 * caution. Built with pdfkit in Manrope (embedded, subset to the glyphs used),
 * so its text stays searchable.
 */
/** A check's verdict in one word; a verdict this code does not know prints as itself. */
function checkWord(check: InspectionResults['checks'][number]): string {
  const verdict = (check as { verdict?: string }).verdict;
  if (verdict === undefined) return check.pass ? 'pass' : 'FAIL';
  return ({ conforms: 'pass', fails: 'FAIL', 'not-proven': 'NOT PROVEN' } as Record<string, string>)[verdict] ?? verdict.toUpperCase();
}

export function certificatePdf(data: CertificateData): Promise<Buffer> {
  const { input, results } = data;
  const unit = input.conditions.unit;
  const decimals = lengthDecimals(unit, input.conditions.gaugeResolution);
  const len = (value: number) => value.toFixed(decimals);
  const printed = startDocument({ title: `Inspection record: ${data.jobTitle}`, author: data.shopName, heading: 'Tenthmark inspection record' });
  const { doc, heading, line } = printed;
  line(`${data.jobTitle} — ${data.engineFamily}`);
  line(`Job number ${data.jobId} · version ${data.version} · submitted ${stamp(data.submittedAt)}`);
  line(`Status: ${versionStatusWords(data)}`);
  line(`Builder: ${data.builderName} · Shop: ${[data.shopName, data.shopPlace].filter(Boolean).join(', ')}`);
  doc.moveDown(0.5).font('Body-Bold').fontSize(11).text(`Result: ${resultHeadline(results).text}`).font('Body').fontSize(9.5);

  heading('Conditions');
  const conditions = input.conditions as InspectionInput['conditions'] & { temperatureC?: number; temperatureF?: number };
  const temperature = conditions.temperatureC !== undefined ? `${conditions.temperatureC} °C` : conditions.temperatureF !== undefined ? `${conditions.temperatureF} °F` : 'not given';
  line(`Units: ${unit === 'in' ? 'inch' : 'millimetre'} · gauge resolution ${input.conditions.gaugeResolution} ${unit} · temperature at measurement ${temperature} · torque plate ${input.conditions.torquePlate ? 'fitted' : 'not fitted'}`);
  // How the record was judged: the decision rule, the temperature correction and the roughness filter, when the results carry them.
  const method = methodLines(results);
  if (method.length > 0) {
    heading('How it was judged');
    for (const m of method) line(`${m.label}: ${m.text}`);
  }

  if (input.cylinders && results.bores) {
    const bores = results.bores;
    heading(`Bores (${unit})`);
    line('Cyl | top thrust / axial | middle thrust / axial | bottom thrust / axial | piston | mean | taper | out-of-round | clearance | result');
    input.cylinders.forEach((c, i) => {
      const r = bores.cylinders[i];
      line(
        `${i + 1} | ${len(c.top.thrust)} / ${len(c.top.axial)} | ${len(c.middle.thrust)} / ${len(c.middle.axial)} | ${len(c.bottom.thrust)} / ${len(c.bottom.axial)} | ${c.piston !== undefined ? len(c.piston) : '—'} | ${len(r.mean)} | ${len(r.taper)} | ${len(r.outOfRound)} | ${r.clearance !== undefined ? len(r.clearance) : '—'} | ${r.pass ? 'pass' : 'FAIL'}`,
      );
    });
    line(`Largest taper ${len(bores.worst.taper)} · largest out-of-round ${len(bores.worst.outOfRound)}.`);
    line('Taper: on the diameter, the largest minus the smallest reading over the three depths in one direction (the larger direction counts). Out-of-round: two-point, the difference of the thrust and axial diameters at one depth (the largest depth counts).');
  }

  if (input.deck && results.deck) {
    heading('Deck');
    const readings = [...(input.deck.readings ?? []).map(len), ...(input.deck.straightedge ?? []).map((r) => `${r.position} ${len(r.value)}`)];
    line(`Straightedge readings (${unit}): ${readings.join(', ')}`);
    const deck = figureAgainstLimit(results.deck.outOfFlat, results.deck.limit, decimals);
    line(`Out-of-flat ${deck.value} against ≤ ${deck.limit} (${results.deck.limitSource === 'shop' ? 'the job’s limit' : 'common-practice table'}): ${results.deck.pass ? 'pass' : 'FAIL'}${input.deck.raUm !== undefined ? ` · deck Ra ${input.deck.raUm} µm` : ''}`);
  }
  if (results.finish) {
    heading('Bore finish (µm)');
    const f = results.finish;
    line(
      [['Ra', f.raUm], ['Rq', f.rqUm], ['Rz', f.rzUm], ['Rk', f.rkUm], ['Rpk', f.rpkUm], ['Rvk', f.rvkUm]]
        .filter(([, v]) => v !== undefined)
        .map(([k, v]) => `${k} ${(v as number).toFixed(3)}`)
        .join(' · ') + (f.mr1 !== undefined ? ` · Mr1 ${f.mr1.toFixed(1)} % · Mr2 ${f.mr2?.toFixed(1)} %` : '') + (input.finish?.mode === 'profile' ? ' (computed from the uploaded trace)' : ''),
    );
  }
  if (results.crosshatch) {
    heading('Crosshatch');
    line(
      input.crosshatch?.mode === 'settings'
        ? `Included angle ${results.crosshatch.includedAngleDeg.toFixed(1)}°, computed from settings (mid-stroke), not measured: ${input.crosshatch.spindleRpm} rpm, ${input.crosshatch.strokeLength} ${unit} stroke, ${input.crosshatch.cyclesPerMinute} full up-and-down cycles per minute. Across the horizontal.`
        : `Included angle ${results.crosshatch.includedAngleDeg.toFixed(1)}°, measured across the horizontal.`,
    );
  }
  // One part per ordered operation: its verdict, figures and checks.
  for (const section of results.sections ?? []) {
    heading(`${section.name}: ${SECTION_VERDICT_WORDS[section.verdict]}`);
    if (section.figures.length > 0) line(section.figures.map((figure) => `${figure.label} ${figureText(figure)}`).join(' · '));
    const parts = sectionParts(section, results);
    for (const check of parts.checks) line(`${checkWord(check)} — ${check.what}: ${checkValueText(check)} (allowed ${check.allowed})${check.note ? `; ${check.note}` : ''}`);
    for (const item of parts.notJudged) line(`NOT JUDGED — ${item.what}: ${item.why}`);
    for (const statement of section.statements) line(statement);
  }
  heading('Checks against the job’s limits');
  if (results.checks.length === 0) line(resultHeadline(results).tone === 'none' ? 'The job gave no limits, so nothing was judged.' : 'No limit failed.');
  const ctx = { spec: data.spec, results, unit, resolution: input.conditions.gaugeResolution };
  for (const check of results.checks) {
    const figures = checkFigures(check, ctx);
    line(`${checkWord(check)} — ${check.what}: ${figures.value} (allowed ${figures.allowed})`);
  }
  for (const item of (results as { notJudged?: Array<{ what: string; why: string }> }).notJudged ?? []) line(`NOT JUDGED — ${item.what}: ${item.why}`);

  heading('Sign-off');
  line(`Measured and signed by ${input.signedOffBy} for ${data.shopName}.`);
  if (input.notes) line(`Notes: ${input.notes}`);
  printed.footnote(GUIDANCE);
  return printed.finish();
}

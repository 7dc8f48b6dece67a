import PDFDocument from 'pdfkit';
import type { InspectionInput, InspectionResults } from '../../../shared/schemas/inspection';

export interface CertificateData {
  jobTitle: string;
  jobId: string;
  engineFamily: string;
  builderName: string;
  shopName: string;
  shopPlace: string;
  version: number;
  status: string;
  submittedAt: Date;
  input: InspectionInput;
  results: InspectionResults;
}

export const GUIDANCE =
  'Figures are guidance. Engine and piston makers’ specifications, calibrated instruments, local codes and licensed practice govern machine work.';

/**
 * The printable certificate of an inspection record: every reading, every
 * figure worked out from it, pass or fail against the job's limits, the
 * conditions, the shop's sign-off and the guidance caution. Built with
 * pdfkit; the standard Helvetica fonts keep the file small and its text
 * searchable.
 */
export function certificatePdf(data: CertificateData): Promise<Buffer> {
  const { input, results } = data;
  const unit = input.conditions.unit;
  const len = (value: number) => value.toFixed(unit === 'in' ? 4 : 3);
  const doc = new PDFDocument({ size: 'A4', margin: 48, info: { Title: `Inspection record: ${data.jobTitle}`, Author: data.shopName, Creator: 'Tenthmark' } });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const heading = (text: string) => doc.moveDown(0.8).font('Helvetica-Bold').fontSize(12).fillColor('#1d4e6b').text(text).fillColor('#16232d').font('Helvetica').fontSize(9.5);
  const line = (text: string) => doc.text(text);

  doc.font('Helvetica-Bold').fontSize(18).fillColor('#1d4e6b').text('Tenthmark inspection record');
  doc.font('Helvetica').fontSize(10).fillColor('#16232d');
  line(`${data.jobTitle} — ${data.engineFamily}`);
  line(`Job ${data.jobId} · version ${data.version} · ${data.status} · submitted ${data.submittedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`);
  line(`Builder: ${data.builderName} · Shop: ${data.shopName}, ${data.shopPlace}`);
  doc.moveDown(0.5).font('Helvetica-Bold').fontSize(11).text(`Result: ${results.pass ? 'PASS — every check within the job’s limits' : 'FAIL — see the checks below'}`).font('Helvetica').fontSize(9.5);

  heading('Conditions');
  line(`Units: ${unit === 'in' ? 'inch' : 'millimetre'} · gauge resolution ${input.conditions.gaugeResolution} ${unit} · temperature ${input.conditions.temperatureC} °C · torque plate ${input.conditions.torquePlate ? 'fitted' : 'not fitted'}`);

  heading(`Bores (${unit})`);
  line('Cyl | top thrust / axial | middle thrust / axial | bottom thrust / axial | piston | mean | taper | out-of-round | clearance | result');
  input.cylinders.forEach((c, i) => {
    const r = results.bores.cylinders[i];
    line(
      `${i + 1} | ${len(c.top.thrust)} / ${len(c.top.axial)} | ${len(c.middle.thrust)} / ${len(c.middle.axial)} | ${len(c.bottom.thrust)} / ${len(c.bottom.axial)} | ${c.piston !== undefined ? len(c.piston) : '—'} | ${len(r.mean)} | ${len(r.taper)} | ${len(r.outOfRound)} | ${r.clearance !== undefined ? len(r.clearance) : '—'} | ${r.pass ? 'pass' : 'FAIL'}`,
    );
  });
  line(`Largest taper ${len(results.bores.worst.taper)} · largest out-of-round ${len(results.bores.worst.outOfRound)} (two-point: the difference of the two directions).`);

  if (input.deck && results.deck) {
    heading('Deck');
    line(`Straightedge readings (${unit}): ${input.deck.readings.map(len).join(', ')}`);
    line(`Out-of-flat ${len(results.deck.outOfFlat)} against ${len(results.deck.limit)} (${results.deck.limitSource === 'shop' ? 'the job’s limit' : 'common-practice table'}): ${results.deck.pass ? 'pass' : 'FAIL'}${input.deck.raUm !== undefined ? ` · deck Ra ${input.deck.raUm} µm` : ''}`);
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
    line(`Included angle ${results.crosshatch.includedAngleDeg.toFixed(1)}° (measured across the horizontal${input.crosshatch?.mode === 'settings' ? '; worked out from the hone settings' : ''}).`);
  }
  heading('Checks against the job’s limits');
  if (results.checks.length === 0) line('No limit failed.');
  for (const check of results.checks) line(`${check.pass ? 'pass' : 'FAIL'} — ${check.what}: ${Number(check.value.toFixed(6))} (allowed ${check.allowed})`);

  heading('Sign-off');
  line(`Measured and signed by ${input.signedOffBy} for ${data.shopName}.`);
  if (input.notes) line(`Notes: ${input.notes}`);
  doc.moveDown(1).fontSize(8.5).fillColor('#5d6b75').text(GUIDANCE);
  doc.end();
  return done;
}

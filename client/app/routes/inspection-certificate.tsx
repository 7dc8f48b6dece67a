import { Link, useParams } from 'react-router-dom';
import { checkFigures, figureAgainstLimit, lengthDecimals, micrometresToMicroinches } from '@shared/calc';
import { methodLines, resultHeadline, versionStatusWords } from '@shared/inspection-words';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { RecordSections, useInspection, finishFilterWords } from '@client/features/inspections';
import { useJob } from '@client/features/jobs';
import { formatDateTime } from '@client/lib/dates';

const GUIDANCE =
  'Figures are guidance. Engine and piston makers’ specifications, calibrated instruments, local codes and licensed practice govern machine work.';

/** The printable certificate of one inspection record version: everything the PDF holds, in the same words. */
export function InspectionCertificateRoute() {
  const { jobId = '', version = '1' } = useParams();
  const job = useJob(jobId);
  const inspection = useInspection(jobId);
  if (job.isPending || inspection.isPending) return <p className="text-ink-soft">Loading the record …</p>;
  if (job.isError || inspection.isError) {
    const retry = () => void Promise.all([job.isError && job.refetch(), inspection.isError && inspection.refetch()]);
    return (
      <Notice tone="error" title="The record could not be loaded" onRetry={retry}>
        {(job.error ?? inspection.error)?.message}
      </Notice>
    );
  }
  const record = inspection.data.versions.find((v) => v.version === Number(version));
  if (!record) return <Notice tone="error">There is no version {version} of this record.</Notice>;
  const { input, results } = record;
  const unit = input.conditions.unit;
  const decimals = lengthDecimals(unit, input.conditions.gaugeResolution);
  const len = (value: number | undefined) => (value === undefined ? '—' : value.toFixed(decimals));
  const spec = job.data.spec;
  const shop = inspection.data.shop;
  const headline = resultHeadline(results);
  // The finish section below names the roughness filter in its own words; here only the rule, the temperature and the statements.
  const method = methodLines(results).filter((m) => m.label !== 'Roughness filter');
  const notJudged = results.notJudged ?? [];
  const temperature =
    input.conditions.temperatureC !== undefined ? `${input.conditions.temperatureC} °C` : input.conditions.temperatureF !== undefined ? `${input.conditions.temperatureF} °F` : 'not given';
  const verdictWord = (check: (typeof results.checks)[number]) =>
    check.verdict === undefined ? (check.pass ? 'pass' : 'FAIL') : ({ conforms: 'pass', fails: 'FAIL', 'not-proven': 'NOT PROVEN' } as Record<string, string>)[check.verdict] ?? check.verdict.toUpperCase();

  return (
    <article className="mx-auto max-w-5xl bg-white p-6 print:p-0" aria-labelledby="certificate-title">
      <div className="mb-4 flex flex-wrap gap-3 print:hidden">
        <Button onClick={() => window.print()}>Print</Button>
        <a
          className="inline-flex min-h-11 items-center rounded-lg px-4 font-semibold text-slate-700 ring-1 ring-slate-300 hover:bg-slate-50"
          href={`/api/jobs/${jobId}/inspection/${record.version}/certificate.pdf`}
        >
          Download the PDF
        </a>
        <Link className="inline-flex min-h-11 items-center px-2 font-semibold text-slate-700 underline" to={`/jobs/${jobId}`}>
          Back to the job
        </Link>
      </div>
      <h1 id="certificate-title" className="text-2xl font-extrabold text-slate-700">
        Tenthmark inspection record
      </h1>
      <p>
        {job.data.title} — {job.data.engineFamily}
      </p>
      <p data-testid="certificate-job">
        Job number {jobId} · version {record.version} · submitted {formatDateTime(record.submittedAt)}
      </p>
      <p data-testid="certificate-status">Status: {versionStatusWords(record)}</p>
      <p data-testid="certificate-parties">
        Builder: {job.data.builder.displayName} · Shop: {[shop?.name, shop?.place].filter(Boolean).join(', ') || '—'}
      </p>
      <p className="mt-2 text-lg font-bold" data-testid="certificate-result">
        {headline.text}
      </p>

      <h2 className="mt-4 text-lg font-bold">Conditions</h2>
      <p>
        Units {unit === 'in' ? 'inch' : 'millimetre'} · gauge resolution {input.conditions.gaugeResolution} {unit} · temperature at measurement {temperature} · torque
        plate {input.conditions.torquePlate ? 'fitted' : 'not fitted'}
      </p>
      {method.length > 0 && (
        <>
          <h2 className="mt-4 text-lg font-bold">How it was judged</h2>
          <ul className="list-disc pl-5" data-testid="certificate-method">
            {method.map((m, i) => (
              <li key={i}>
                {m.label}: {m.text}
              </li>
            ))}
          </ul>
        </>
      )}

      {input.cylinders && results.bores && (
        <>
          <h2 className="mt-4 text-lg font-bold">Bores ({unit})</h2>
          <div className="relative overflow-x-auto">
            <table className="w-full text-sm tabular-nums">
              <caption className="sr-only">Readings and figures per cylinder</caption>
              <thead>
                <tr className="border-b text-left">
                  {['Cyl', 'Top thrust', 'Top axial', 'Mid thrust', 'Mid axial', 'Bottom thrust', 'Bottom axial', 'Piston', 'Mean', 'Taper', 'Out-of-round', 'Clearance', 'Result'].map((h) => (
                    <th key={h} scope="col" className="py-1 pr-2">
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {(input.cylinders ?? []).map((c, i) => {
                  const r = results.bores!.cylinders[i];
                  return (
                    <tr key={i} className="border-b border-slate-100">
                      <th scope="row" className="py-1 pr-2">
                        {i + 1}
                      </th>
                      {[c.top.thrust, c.top.axial, c.middle.thrust, c.middle.axial, c.bottom.thrust, c.bottom.axial, c.piston, r.mean, r.taper, r.outOfRound, r.clearance].map((v, j) => (
                        <td key={j} className="py-1 pr-2">
                          {len(v)}
                        </td>
                      ))}
                      <td className={r.pass ? 'text-pass' : 'font-bold text-fail'}>{r.pass ? 'pass' : 'FAIL'}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <p className="mt-1 text-sm">
            Taper: on the diameter, the largest minus the smallest reading over the three depths in one direction (the larger direction counts). Out-of-round:
            two-point, the difference of the thrust and axial diameters at one depth (the largest depth counts).
          </p>
        </>
      )}

      {results.deck && (
        <>
          <h2 className="mt-4 text-lg font-bold">Deck</h2>
          <p>
            Out-of-flat {figureAgainstLimit(results.deck.outOfFlat, results.deck.limit, decimals).value} {unit} against ≤{' '}
            {figureAgainstLimit(results.deck.outOfFlat, results.deck.limit, decimals).limit} {unit} (
            {results.deck.limitSource === 'shop' ? 'the job’s limit' : 'common-practice table'}): {results.deck.pass ? 'pass' : 'FAIL'}
          </p>
        </>
      )}
      {results.finish && (
        <>
          <h2 className="mt-4 text-lg font-bold">Bore finish (µm)</h2>
          <p>
            Ra {results.finish.raUm.toFixed(3)} ({micrometresToMicroinches(results.finish.raUm).toFixed(1)} µin)
            {results.finish.rkUm !== undefined && ` · Rk ${results.finish.rkUm.toFixed(3)}`}
            {results.finish.rpkUm !== undefined && ` · Rpk ${results.finish.rpkUm.toFixed(3)}`}
            {results.finish.rvkUm !== undefined && ` · Rvk ${results.finish.rvkUm.toFixed(3)}`}
          </p>
          {results.finish.filter && <p>Filter: {finishFilterWords(results.finish.filter)}.</p>}
        </>
      )}
      {results.crosshatch && (
        <>
          <h2 className="mt-4 text-lg font-bold">Crosshatch</h2>
          <p>
            {input.crosshatch?.mode === 'settings'
              ? `Included angle ${results.crosshatch.includedAngleDeg.toFixed(1)}°, computed from settings (mid-stroke), not measured: ${input.crosshatch.spindleRpm} rpm, ${input.crosshatch.strokeLength} ${unit} stroke, ${input.crosshatch.cyclesPerMinute} full up-and-down cycles per minute. Across the horizontal.`
              : `Included angle ${results.crosshatch.includedAngleDeg.toFixed(1)}°, measured across the horizontal.`}
          </p>
        </>
      )}
      {results.sections && results.sections.length > 0 && (
        <section data-testid="certificate-sections">
          <h2 className="mt-4 text-lg font-bold">Each operation ordered</h2>
          <RecordSections results={results} />
        </section>
      )}
      <h2 className="mt-4 text-lg font-bold">Checks against the job’s limits</h2>
      {results.checks.length === 0 && notJudged.length === 0 ? (
        <p>{headline.tone === 'none' ? 'The job gave no limits, so nothing was judged.' : 'No limit failed.'}</p>
      ) : (
        <ul className="list-disc pl-5" data-testid="certificate-checks">
          {results.checks.map((check, i) => {
            const figures = checkFigures(check, { spec, results, unit, resolution: input.conditions.gaugeResolution });
            return (
              <li key={i}>
                {verdictWord(check)} — {check.what}: {figures.value} (allowed {figures.allowed})
              </li>
            );
          })}
          {notJudged.map((item, i) => (
            <li key={`nj-${i}`}>
              NOT JUDGED — {item.what}: {item.why}
            </li>
          ))}
        </ul>
      )}
      <h2 className="mt-4 text-lg font-bold">Sign-off</h2>
      <p>
        Measured and signed by {input.signedOffBy}
        {shop ? ` for ${shop.name}` : ''}.
      </p>
      {input.notes && <p>Notes: {input.notes}</p>}
      <p className="mt-6 text-sm text-ink-soft">{GUIDANCE}</p>
    </article>
  );
}

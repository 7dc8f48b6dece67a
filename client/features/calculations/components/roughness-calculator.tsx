import { useDeferredValue, useId, useMemo, useState, type ChangeEvent } from 'react';
import {
  MIN_PROFILE_POINTS,
  STANDARD_CUTOFFS_MM,
  type RoughnessFilter,
  gaussianFilterProblem,
  materialRatioCurve,
  microinchesToMicrometres,
  micrometresToMicroinches,
  roughness,
  roughnessProfiles,
} from '@shared/calc';
import { roughnessRequestSchema } from '@shared/schemas/calculations';
import { Button } from '@client/components/ui/button';
import { SelectField } from '@client/components/ui/select-field';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { formatNumber, toNumber } from '@client/lib/numbers';
import { runLiveCalculation } from '../hooks/use-live-calculation';
import { readProfileText } from '../lib/profile-text';
import { SYNTHETIC_SPACING_UM, syntheticPlateauProfile } from '../lib/synthetic-profile';
import { CalculatorCard, CardColumns, FigureList, GuidanceNote, MissingHint, NumberField, ResultsPanel } from './calculator-parts';
import { MaterialRatioChart } from './material-ratio-chart';

/** Largest file read in the browser. */
const MAX_FILE_BYTES = 20 * 1024 * 1024;

interface LoadedProfile {
  kind: 'file' | 'example';
  label: string;
  heights: number[];
  headerSkipped: boolean;
}

const identity = <T,>(value: T) => value;
const heightsSchema = roughnessRequestSchema.shape.heightsUm;
const spacingSchema = roughnessRequestSchema.shape.spacingUm;

function um(value: number) {
  return `${formatNumber(value, 3)} µm`;
}
function microinches(value: number) {
  return `${formatNumber(micrometresToMicroinches(value), 1)} µin`;
}
function millimetres(value: number) {
  return `${formatNumber(value, 3)} mm`;
}

type HeightUnit = 'um' | 'uin';
const HEIGHT_UNITS = [
  { value: 'um', label: 'Micrometres (µm)' },
  { value: 'uin', label: 'Microinches (µin)' },
] as const;

/** No filter, or the Gaussian filter at one of the standard cut-offs. */
const FILTER_CHOICES = [
  { value: 'none', label: 'None: the heights are a roughness profile already' },
  ...STANDARD_CUTOFFS_MM.map((cutoff) => ({ value: String(cutoff), label: `Gaussian, cut-off ${cutoff} mm` })),
];

function filterFor(choice: string): RoughnessFilter {
  return choice === 'none' ? { kind: 'none' } : { kind: 'gaussian', cutoffMm: Number(choice) };
}

export function RoughnessCalculator() {
  const fileId = useId();
  const [text, setText] = useState('');
  const [spacing, setSpacing] = useState('');
  const [loaded, setLoaded] = useState<LoadedProfile | null>(null);
  const [fileError, setFileError] = useState<string>();
  const [reading, setReading] = useState(false);
  const [heightUnit, setHeightUnit] = useState<HeightUnit>('um');
  const [filterChoice, setFilterChoice] = useState<string>('none');
  const filter = useMemo(() => filterFor(filterChoice), [filterChoice]);

  // The heavy work follows the heights only: parsing waits for typing to pause (deferred), and the
  // parameters and the curve are recomputed when the list of heights changes, never for the spacing.
  const deferredText = useDeferredValue(text);
  const fromText = useMemo(() => readProfileText(deferredText), [deferredText]);
  const entered = loaded ? loaded.heights : fromText.kind === 'heights' ? fromText.heights : undefined;
  // Heights typed or read in microinches are worked in micrometres (1 µin = 0.0254 µm exactly).
  const heights = useMemo(() => (entered && heightUnit === 'uin' ? entered.map(microinchesToMicrometres) : entered), [entered, heightUnit]);
  const heightsCheck = useMemo(() => (heights ? runLiveCalculation(heightsSchema, heights, identity) : undefined), [heights]);
  const spacingCheck = useMemo(() => runLiveCalculation(spacingSchema, toNumber(spacing), identity), [spacing]);
  // Without a filter the spacing changes nothing, so only the heights trigger the work; the Gaussian filter needs the spacing too.
  const filterSpacing = filter.kind === 'gaussian' ? spacingCheck.result : undefined;
  const filterError =
    filter.kind === 'gaussian' && heightsCheck?.result && filterSpacing !== undefined
      ? gaussianFilterProblem(heightsCheck.result.length, filterSpacing, filter.cutoffMm)?.message
      : undefined;
  const computed = useMemo(() => {
    if (!heightsCheck?.result) return undefined;
    if (filter.kind === 'none') return { parameters: roughness(heightsCheck.result), curve: materialRatioCurve(heightsCheck.result, 201) };
    if (filterSpacing === undefined || gaussianFilterProblem(heightsCheck.result.length, filterSpacing, filter.cutoffMm)) return undefined;
    // The chart shows the ISO 13565-1 profile the Rk figures come from, heights from its own mean line.
    const profiles = roughnessProfiles(heightsCheck.result, filterSpacing, filter.cutoffMm);
    return { parameters: roughness(heightsCheck.result, filterSpacing, filter), curve: materialRatioCurve(profiles.plateau, 201, 0) };
  }, [heightsCheck, filter, filterSpacing]);

  const tooFew = heights !== undefined && heights.length < MIN_PROFILE_POINTS;
  const heightsError =
    !loaded && fromText.kind === 'error'
      ? fromText.message
      : heightsCheck && !heightsCheck.result && !tooFew
        ? (heightsCheck.formError ??
          Object.entries(heightsCheck.errors)
            .slice(0, 1)
            .map(([index, message]) => `Height ${Number(index) + 1}: ${message}`)[0])
        : undefined;
  const spacingError = spacingCheck.formError;
  const stale = text !== deferredText;

  const missing = [
    ...(heights === undefined && !heightsError ? ['heights'] : []),
    ...(tooFew ? ['more'] : []),
    ...(spacingCheck.missing.length > 0 ? ['spacing'] : []),
  ];
  const missingWords: Record<string, string> = {
    heights: 'the profile heights (type, paste, upload a file or load the example)',
    more: `at least ${MIN_PROFILE_POINTS} heights (${heights?.length ?? 0} so far)`,
    spacing: 'the sample spacing',
  };

  const onFile = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = ''; // choosing the same file again reads it again
    if (!file) return;
    setFileError(undefined);
    if (file.size > MAX_FILE_BYTES) {
      setFileError(`That file is ${formatNumber(file.size / 1024 / 1024, 1)} MB; the largest this page reads is 20 MB.`);
      return;
    }
    setReading(true);
    const reader = new FileReader();
    reader.onload = () => {
      setReading(false);
      const read = readProfileText(String(reader.result ?? ''));
      if (read.kind === 'error') setFileError(`${file.name}: ${read.message}`);
      else if (read.kind === 'empty') setFileError(`${file.name} holds no heights.`);
      else setLoaded({ kind: 'file', label: file.name, heights: read.heights, headerSkipped: read.headerSkipped });
    };
    reader.onerror = () => {
      setReading(false);
      setFileError(`${file.name} could not be read.`);
    };
    reader.readAsText(file);
  };

  const loadExample = () => {
    setFileError(undefined);
    setText('');
    setSpacing(String(SYNTHETIC_SPACING_UM));
    setHeightUnit('um');
    setLoaded({ kind: 'example', label: 'Synthetic example', heights: syntheticPlateauProfile(), headerSkipped: false });
  };

  const result = computed && spacingCheck.result !== undefined ? computed.parameters : undefined;
  const applied = result?.filter;

  return (
    <CalculatorCard
      id="roughness"
      title="Surface roughness"
      intro={
        <>
          Ra, Rq and Rz from a profile trace, and the plateau-honing figures Rk, Rpk, Rvk, Mr1 and Mr2 from its material-ratio curve
          (ISO 13565-2). Heights at equal spacing. Choose no filter when the instrument already gives a roughness profile, or the
          Gaussian filter (ISO 16610-21) to remove the form and waviness here; the results say which was used.
        </>
      }
    >
      <CardColumns
        inputs={
          <>
            {loaded ? (
              <div className="flex flex-wrap items-center justify-between gap-3 rounded-lg bg-slate-50 px-4 py-3 ring-1 ring-slate-200" data-testid="loaded-profile">
                <p>
                  <strong>{loaded.kind === 'example' ? 'Synthetic example' : `From ${loaded.label}`}</strong>:{' '}
                  {formatNumber(loaded.heights.length, 0)} heights
                  {loaded.headerSkipped && ' (header line skipped)'}.
                  {loaded.kind === 'example' && (
                    <span className="block text-sm text-ink-soft">Made up in this page to look like a plateau-honed bore, not measured.</span>
                  )}
                </p>
                <Button variant="secondary" onClick={() => setLoaded(null)}>
                  Clear
                </Button>
              </div>
            ) : (
              <TextAreaField
                label={`Profile heights (${heightUnit === 'uin' ? 'µin' : 'µm'})`}
                rows={5}
                placeholder="0.12 -0.05 0.08 -2.41 …"
                hint={tooFew ? `${heights?.length} heights so far; a profile needs at least ${MIN_PROFILE_POINTS}.` : 'One per line, or separated by spaces or commas.'}
                value={text}
                onChange={(event) => setText(event.target.value)}
                error={heightsError}
                spellCheck={false}
              />
            )}
            <div className="flex flex-col gap-1">
              <label htmlFor={fileId} className="text-sm font-semibold text-ink">
                Or read a CSV or text file
              </label>
              <input
                id={fileId}
                type="file"
                accept=".csv,.txt,.dat,text/csv,text/plain"
                onChange={onFile}
                aria-describedby={`${fileId}-note${fileError ? ` ${fileId}-error` : ''}`}
                aria-invalid={fileError ? true : undefined}
                className="text-sm text-ink file:mr-3 file:min-h-11 file:rounded-lg file:border-0 file:bg-paper-raised file:px-4 file:font-semibold file:text-slate-800 file:ring-1 file:ring-inset file:ring-slate-300 hover:file:bg-slate-50"
              />
              <p id={`${fileId}-note`} className="text-sm text-ink-faint">
                One height per line or comma-separated; a first line of column names is skipped. The file stays in your browser.
              </p>
              {reading && <p className="text-sm text-ink-soft">Reading the file…</p>}
              {fileError && (
                <p id={`${fileId}-error`} role="alert" className="text-sm font-semibold text-fail">
                  {fileError}
                </p>
              )}
              {loaded?.kind === 'file' && heightsError && <p className="text-sm font-semibold text-fail">{heightsError}</p>}
            </div>
            <div className="flex flex-wrap items-end gap-4">
              <SelectField
                label="Heights in"
                value={heightUnit}
                onChange={(event) => setHeightUnit(event.target.value === 'uin' ? 'uin' : 'um')}
                options={HEIGHT_UNITS}
                className="w-56"
              />
              <SelectField
                label="Filter"
                value={filterChoice}
                onChange={(event) => setFilterChoice(event.target.value)}
                options={FILTER_CHOICES}
                error={filterError}
                hint={filter.kind === 'gaussian' ? 'Least-squares line removed, half a cut-off dropped at each end, whole cut-offs evaluated.' : undefined}
                className="min-w-64 flex-1"
              />
            </div>
            <div className="flex flex-wrap items-end gap-4">
              <NumberField label="Sample spacing (µm)" value={spacing} onValueChange={setSpacing} error={spacingError} className="w-48" />
              <Button variant="secondary" onClick={loadExample}>
                Load the synthetic example
              </Button>
            </div>
          </>
        }
        results={
          <ResultsPanel>
            {result ? (
              <div className="flex flex-col gap-3" data-testid="roughness-result" aria-busy={stale || undefined}>
                <table className="w-full text-base tabular-nums">
                  <caption className="sr-only">Roughness parameters</caption>
                  <thead>
                    <tr className="text-left text-sm text-ink-soft">
                      <th scope="col" className="py-1 font-semibold">Parameter</th>
                      <th scope="col" className="py-1 text-right font-semibold">µm</th>
                      <th scope="col" className="py-1 text-right font-semibold">µin</th>
                    </tr>
                  </thead>
                  <tbody>
                    {(
                      [
                        ['Ra', result.ra, 'mean deviation'],
                        ['Rq', result.rq, 'root mean square'],
                        ['Rz', result.rz, 'mean peak-to-valley of five segments'],
                        ['Rk', result.rk, 'core depth'],
                        ['Rpk', result.rpk, 'reduced peak height'],
                        ['Rvk', result.rvk, 'reduced valley depth'],
                      ] as const
                    ).map(([name, value, words]) => (
                      <tr key={name} className="border-t border-slate-200">
                        <th scope="row" className="py-1 text-left">
                          <span className="font-bold">{name}</span> <span className="text-sm font-normal text-ink-soft">{words}</span>
                        </th>
                        <td className="py-1 text-right font-semibold" data-testid={`roughness-${name.toLowerCase()}`}>
                          {um(value)}
                        </td>
                        <td className="py-1 text-right text-ink-soft">{microinches(value)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                <FigureList
                  items={[
                    { label: <><strong>Mr1</strong> peaks above the core</>, value: `${formatNumber(result.mr1, 1)} %`, testId: 'roughness-mr1' },
                    { label: <><strong>Mr2</strong> material above the valleys</>, value: `${formatNumber(result.mr2, 1)} %`, testId: 'roughness-mr2' },
                    { label: 'Heights', value: formatNumber(result.points, 0) },
                    { label: 'Traced length', value: `${formatNumber(((result.points - 1) * (spacingCheck.result ?? 0)) / 1000, 3)} mm` },
                    {
                      label: 'Filter',
                      value: applied?.kind === 'gaussian' ? `Gaussian, cut-off ${applied.cutoffMm} mm` : 'None (heights as sent)',
                      testId: 'roughness-filter',
                    },
                    applied?.kind === 'gaussian' && {
                      label: 'Evaluated',
                      value: `${millimetres(applied.evaluationLengthMm)} (${applied.samplingLengths} × ${applied.cutoffMm} mm)`,
                      testId: 'roughness-evaluation',
                    },
                    applied?.kind === 'gaussian' && {
                      label: 'Dropped at the ends',
                      value: `${millimetres(applied.trimmedStartMm)} and ${millimetres(applied.trimmedEndMm)}`,
                    },
                  ]}
                />
                <p className="text-sm text-ink-soft" data-testid="roughness-filter-method">
                  {applied?.kind === 'gaussian'
                    ? 'Ra, Rq and Rz on the Gaussian roughness profile (form removed by a least-squares line); Rk, Rpk, Rvk, Mr1 and Mr2 on the ISO 13565-1 valley-suppressed profile.'
                    : 'No filter: Ra and the other figures are those of the heights as sent, measured from their mean.'}
                </p>
                <GuidanceNote>The ring and engine makers&apos; finish figures and a calibrated profilometer govern.</GuidanceNote>
              </div>
            ) : (
              <MissingHint
                missing={missing}
                errors={{
                  ...(heightsError ? { heights: heightsError } : {}),
                  ...(spacingError ? { spacing: spacingError } : {}),
                  ...(filterError ? { filter: filterError } : {}),
                }}
                labels={(key) => missingWords[key] ?? key}
              />
            )}
          </ResultsPanel>
        }
      />
      {result && computed && <MaterialRatioChart curve={computed.curve} parameters={computed.parameters} />}
    </CalculatorCard>
  );
}

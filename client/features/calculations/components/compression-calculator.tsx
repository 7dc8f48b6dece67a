import { useMemo } from 'react';
import { CalculationError, type CompressionResult, type LengthUnit, type MachiningEffect, compressionRatio, machiningEffect } from '@shared/calc';
import { type CompressionRatioRequest, compressionRatioRequestSchema } from '@shared/schemas/calculations';
import { formatChange, formatLength, formatNumber, isBlank, toNumber } from '@client/lib/numbers';
import { runLiveCalculation, useLiveCalculation } from '../hooks/use-live-calculation';
import { type FieldKind, useUnitForm } from '../hooks/use-unit-form';
import { machiningChangeSchema } from '../lib/form-schemas';
import { CompressionFieldGrid, compressionInitial, compressionInput, compressionLabels, compressionLengthKeys } from './compression-fields';
import { CalculatorLayout, FieldGrid, FigureList, GuidanceNote, HeadlineFigure, MissingHint, NumberField } from './calculator-parts';

const initial = { ...compressionInitial, cylinders: '', overbore: '', deckCut: '' };
const lengthKeys = new Set([...compressionLengthKeys, 'overbore', 'deckCut']);
const kindOf = (key: string): FieldKind => (lengthKeys.has(key) ? 'length' : 'other');
const labels: Record<string, string> = { ...compressionLabels, cylinders: 'the number of cylinders' };

const computeRatio = (data: CompressionRatioRequest): CompressionResult => compressionRatio(data);
const identity = <T,>(data: T) => data;

function ratioText(ratio: number) {
  return `${formatNumber(ratio, 2)} : 1`;
}

function EffectTable({ effect, unit }: { effect: MachiningEffect; unit: LengthUnit }) {
  const rows = [
    { label: 'Bore', before: formatLength(effect.before.bore, unit), after: formatLength(effect.after.bore, unit), change: null },
    {
      label: 'Deck clearance',
      before: formatLength(effect.before.deckClearance, unit),
      after: formatLength(effect.after.deckClearance, unit),
      change: null,
    },
    {
      label: 'Displacement',
      before: `${formatNumber(effect.before.displacement.cc, 1)} cc`,
      after: `${formatNumber(effect.after.displacement.cc, 1)} cc`,
      change: `${formatChange(effect.change.cc, 1)} cc`,
    },
    {
      label: 'Compression ratio',
      before: ratioText(effect.before.compression.ratio),
      after: ratioText(effect.after.compression.ratio),
      change: formatChange(effect.change.ratio, 2),
    },
  ];
  return (
    <table className="w-full text-sm tabular-nums" data-testid="machining-effect">
      <caption className="sr-only">Before and after the overbore and deck cut</caption>
      <thead>
        <tr className="text-left text-ink-soft">
          <th scope="col" className="py-1 pr-2 font-semibold">
            <span className="sr-only">Figure</span>
          </th>
          <th scope="col" className="py-1 pr-2 text-right font-semibold">Now</th>
          <th scope="col" className="py-1 pr-2 text-right font-semibold">After</th>
          <th scope="col" className="py-1 text-right font-semibold">Change</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={row.label} className="border-t border-slate-200">
            <th scope="row" className="py-1.5 pr-2 text-left font-semibold">
              {row.label}
            </th>
            <td className="py-1.5 pr-2 text-right">{row.before}</td>
            <td className="py-1.5 pr-2 text-right font-semibold">{row.after}</td>
            <td className="py-1.5 text-right">{row.change ?? '—'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function CompressionCalculator({ unit }: { unit: LengthUnit }) {
  const { values, setValue } = useUnitForm(unit, initial, kindOf);
  const input = useMemo(() => compressionInput(unit, values), [unit, values]);
  const ratio = useLiveCalculation(compressionRatioRequestSchema, input, computeRatio);

  const wantsEffect = !isBlank(values.overbore) || !isBlank(values.deckCut);
  const change = useMemo(
    () =>
      runLiveCalculation(
        machiningChangeSchema,
        { cylinders: toNumber(values.cylinders), overbore: toNumber(values.overbore), deckCut: toNumber(values.deckCut) },
        identity,
      ),
    [values.cylinders, values.overbore, values.deckCut],
  );
  const effect = useMemo((): { value?: MachiningEffect; error?: string } => {
    if (!ratio.result || !change.result || !wantsEffect) return {};
    const parsed = compressionRatioRequestSchema.parse(input);
    try {
      return { value: machiningEffect({ ...parsed, cylinders: change.result.cylinders }, change.result) };
    } catch (error) {
      if (error instanceof CalculationError) {
        return { error: 'After this deck cut there is no space left above the piston. Use a smaller cut or a thicker gasket.' };
      }
      throw error;
    }
  }, [ratio.result, change.result, wantsEffect, input]);

  const field = (key: keyof typeof initial, label: string, hint?: string) => (
    <NumberField
      label={label}
      value={values[key]}
      onValueChange={(text) => setValue(key, text)}
      error={ratio.errors[key] ?? change.errors[key]}
      hint={hint}
    />
  );

  return (
    <CalculatorLayout
      id="compression"
      title="Compression ratio"
      intro={
        <>
          Static ratio of one cylinder: (swept volume + clearance volume) ÷ clearance volume. The clearance volume is the chamber, the
          gasket, the space above a piston below the deck and the piston&apos;s own dish or dome.
        </>
      }
      inputs={
        <>
          <CompressionFieldGrid unit={unit} values={values} errors={ratio.errors} onValueChange={setValue} />
          <fieldset className="rounded-lg border border-slate-200 p-4">
            <legend className="px-1 text-sm font-bold text-ink">Optional: overbore and deck cut</legend>
            <p className="mb-3 text-sm text-ink-soft">
              Assumes new pistons with the same dish or dome, the same gasket, head, stroke and rods. A deck cut lowers the deck, so
              the deck clearance falls by the cut.
            </p>
            <FieldGrid>
              {field('overbore', `Overbore on the diameter (${unit})`)}
              {field('deckCut', `Deck cut (${unit})`)}
              {field('cylinders', 'Cylinders', 'Needed for the displacement.')}
            </FieldGrid>
          </fieldset>
        </>
      }
      results={
        <>
          {ratio.result ? (
            <div className="flex flex-col gap-3" data-testid="compression-result">
              <HeadlineFigure label="Compression ratio" value={ratioText(ratio.result.ratio)} testId="compression-ratio" />
              <FigureList
                items={[
                  { label: 'Swept volume, one cylinder', value: `${formatNumber(ratio.result.sweptCc, 1)} cc` },
                  { label: 'Clearance volume', value: `${formatNumber(ratio.result.clearanceCc, 2)} cc` },
                  { label: <span className="pl-4">chamber</span>, value: `${formatNumber(ratio.result.chamberCc, 2)} cc` },
                  { label: <span className="pl-4">gasket</span>, value: `${formatNumber(ratio.result.gasketCc, 2)} cc` },
                  { label: <span className="pl-4">above the piston to the deck</span>, value: `${formatNumber(ratio.result.deckCc, 2)} cc` },
                  { label: <span className="pl-4">piston dish or dome</span>, value: `${formatNumber(ratio.result.pistonCc, 2)} cc` },
                ]}
              />
            </div>
          ) : (
            <MissingHint missing={ratio.missing} errors={ratio.errors} labels={(key) => labels[key] ?? key} formError={ratio.formError} />
          )}

          {wantsEffect && (
            <div className="flex flex-col gap-2 border-t border-slate-200 pt-3">
              <h4 className="font-bold">After the overbore and deck cut</h4>
              {effect.value ? (
                <>
                  <EffectTable effect={effect.value} unit={unit} />
                  {effect.value.boreExceedsGasket && (
                    <p className="text-sm font-semibold text-fail">The new bore is larger than the gasket bore: a larger gasket is needed.</p>
                  )}
                  {effect.value.after.deckClearance < 0 && (
                    <p className="text-sm font-semibold text-caution">
                      The piston will stand {formatLength(-effect.value.after.deckClearance, unit)} above the deck: check the
                      piston-to-head clearance.
                    </p>
                  )}
                </>
              ) : effect.error ? (
                <p className="text-sm font-semibold text-fail">{effect.error}</p>
              ) : ratio.result ? (
                <MissingHint missing={change.missing} errors={change.errors} labels={(key) => labels[key] ?? key} />
              ) : (
                <p className="text-sm text-ink-soft">Complete the figures above first.</p>
              )}
            </div>
          )}
          {ratio.result && (
            <GuidanceNote>Pump-fuel limits, cam timing and the makers&apos; figures decide what ratio an engine can live with.</GuidanceNote>
          )}
        </>
      }
    />
  );
}

/**
 * The pieces every calculator card is built from: the card with its heading
 * and anchor, the inputs/results columns, a number input, the results panel,
 * the "still to enter" hint, pass/fail marks and the short guidance note.
 */
import { createContext, useContext, type ReactNode } from 'react';
import { Card } from '@client/components/ui/card';
import { TextField, type TextFieldProps } from '@client/components/ui/text-field';
import { cn } from '@client/lib/cn';

/** The title of the card a part sits in, so its results panel gets a name of its own on a page of several cards. */
const CardTitle = createContext<string | undefined>(undefined);

export function CalculatorCard({ id, title, intro, children }: { id: string; title: string; intro: ReactNode; children: ReactNode }) {
  return (
    <CardTitle.Provider value={title}>
      <div id={id} role="region" aria-labelledby={`${id}-title`} className="scroll-mt-24">
        <Card className="flex flex-col gap-5">
          <header>
            <h2 id={`${id}-title`} className="text-2xl font-bold tracking-tight">
              {title}
            </h2>
            <div className="mt-1 max-w-3xl text-ink-soft">{intro}</div>
          </header>
          {children}
        </Card>
      </div>
    </CardTitle.Provider>
  );
}

/** Inputs and results side by side on a wide screen, results below on a tablet. */
export function CardColumns({ inputs, results, wide = false }: { inputs: ReactNode; results: ReactNode; wide?: boolean }) {
  return (
    <div className={cn('grid grid-cols-1 gap-6', wide ? 'lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]' : 'lg:grid-cols-2')}>
      <div className="flex min-w-0 flex-col gap-4">{inputs}</div>
      <div className="min-w-0">{results}</div>
    </div>
  );
}

/** A grid of inputs: two across from tablet width up. */
export function FieldGrid({ children, className }: { children: ReactNode; className?: string }) {
  return <div className={cn('grid gap-4 sm:grid-cols-2', className)}>{children}</div>;
}

export interface NumberFieldProps extends Omit<TextFieldProps, 'onChange' | 'value'> {
  value: string;
  onValueChange: (text: string) => void;
}

/** A TextField for a decimal number: keeps the text as typed, shows a decimal keypad on touch screens. */
export function NumberField({ value, onValueChange, ...rest }: NumberFieldProps) {
  return (
    <TextField
      type="text"
      inputMode="decimal"
      autoComplete="off"
      spellCheck={false}
      value={value}
      onChange={(event) => onValueChange(event.target.value)}
      {...rest}
    />
  );
}

/**
 * A maker of NumberFields for one card: each field shows the typed text of
 * its key, writes back through `setValue` and shows that key's error.
 */
export function numberFieldsFor<K extends string>(
  values: Record<K, string>,
  setValue: (key: K, text: string) => void,
  errors: Record<string, string | undefined>,
) {
  return function field(key: K, label: string, hint?: string) {
    return <NumberField label={label} value={values[key]} onValueChange={(text) => setValue(key, text)} error={errors[key]} hint={hint} />;
  };
}

/** The results column: a tinted panel that announces changes politely to screen readers. */
export function ResultsPanel({ title = 'Results', children, className }: { title?: string; children: ReactNode; className?: string }) {
  const card = useContext(CardTitle);
  return (
    <section aria-label={card ? `${title}: ${card}` : title} className={cn('flex h-full flex-col gap-4 rounded-lg bg-slate-50 p-4 ring-1 ring-slate-200', className)}>
      <h3 className="text-sm font-bold uppercase tracking-wider text-slate-700">{title}</h3>
      {children}
    </section>
  );
}

/** The main figure of a result, large. */
export function HeadlineFigure({ label, value, note, testId }: { label: string; value: ReactNode; note?: ReactNode; testId?: string }) {
  return (
    <div>
      <p className="text-sm font-semibold text-ink-soft">{label}</p>
      <p className="text-3xl font-extrabold tabular-nums tracking-tight text-ink" data-testid={testId}>
        {value}
      </p>
      {note && <p className="text-sm text-ink-soft">{note}</p>}
    </div>
  );
}

/** Label–value pairs. */
export function FigureList({ items }: { items: Array<{ label: ReactNode; value: ReactNode; testId?: string } | false | null | undefined> }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-base">
      {items.filter(Boolean).map((item, index) => {
        const { label, value, testId } = item as { label: ReactNode; value: ReactNode; testId?: string };
        return (
          <div key={index} className="contents">
            <dt className="text-ink-soft">{label}</dt>
            <dd className="text-right font-semibold tabular-nums text-ink" data-testid={testId}>
              {value}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}

function listInWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * What stands between the visitor and a result: fields marked as wrong, and
 * the fields still empty, named in plain words (at most `limit` of them).
 */
export function MissingHint({
  missing,
  errors,
  labels,
  formError,
  limit = 4,
}: {
  missing: string[];
  errors: Record<string, string>;
  labels: (key: string) => string;
  formError?: string;
  limit?: number;
}) {
  const wrong = Object.keys(errors).length;
  const named = missing.slice(0, limit).map(labels);
  const more = missing.length - named.length;
  return (
    <div className="rounded-lg border border-dashed border-slate-300 bg-white px-4 py-3 text-ink-soft" data-testid="missing-hint">
      {formError && <p className="font-semibold text-fail">{formError}</p>}
      {wrong > 0 && <p className="font-semibold text-fail">Correct the {wrong === 1 ? 'field' : `${wrong} fields`} marked in red to see the result.</p>}
      {missing.length > 0 && (
        <p className={cn((wrong > 0 || formError) && 'mt-1')}>
          Still to enter: {listInWords(more > 0 ? [...named, `${more} more`] : named)}.
        </p>
      )}
    </div>
  );
}

export function PassMark({ pass, passText = 'Within limits', failText = 'Outside limits' }: { pass: boolean; passText?: string; failText?: string }) {
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1 rounded-full px-2.5 py-0.5 text-sm font-bold ring-1',
        pass ? 'bg-pass-soft text-pass ring-pass/30' : 'bg-fail-soft text-fail ring-fail/30',
      )}
    >
      <span aria-hidden>{pass ? '✓' : '✕'}</span>
      <span>{pass ? passText : failText}</span>
    </span>
  );
}

/** The short caution shown beside results that could harm an engine. */
export function GuidanceNote({ children }: { children?: ReactNode }) {
  return (
    <p className="border-l-4 border-caution pl-3 text-sm text-caution">
      <strong>Guidance only.</strong> {children ?? "The engine and piston makers' figures and your calibrated instruments govern."}
    </p>
  );
}

/** A small tag marking a figure or a default as common practice rather than a published source. */
export function CommonPractice({ children }: { children?: ReactNode }) {
  return (
    <span className="text-sm text-ink-soft">
      <span className="mr-1 rounded bg-brass-50 px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide text-brass-800 ring-1 ring-brass-200">
        Common practice
      </span>
      {children}
    </span>
  );
}

/** Text for screen readers only. */
export function VisuallyHidden({ children }: { children: ReactNode }) {
  return <span className="sr-only">{children}</span>;
}

/** The layout most calculators share: a card with the inputs beside the results panel. */
export function CalculatorLayout({
  id,
  title,
  intro,
  inputs,
  results,
  wide,
}: {
  id: string;
  title: string;
  intro: ReactNode;
  inputs: ReactNode;
  results: ReactNode;
  wide?: boolean;
}) {
  return (
    <CalculatorCard id={id} title={title} intro={intro}>
      <CardColumns wide={wide} inputs={inputs} results={<ResultsPanel>{results}</ResultsPanel>} />
    </CalculatorCard>
  );
}

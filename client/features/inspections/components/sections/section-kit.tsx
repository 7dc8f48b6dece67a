/**
 * The small pieces every record section is made of: a reading bound to its
 * request path, a choice, words, a row count, a table of readings, and the
 * section's frame with its live verdict and checks beside the fields.
 */
import type { ReactNode } from 'react';
import type { LengthUnit } from '@shared/calc';
import type { InspectionResults } from '@shared/schemas/inspection';
import type { JobDetail } from '@shared/schemas/jobs';
import { SelectField } from '@client/components/ui/select-field';
import { TableHead } from '@client/components/ui/table-head';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { UNIT_WORDS } from '@client/lib/numbers';
import { fieldId } from '../../lib/record-form';
import { RecordSectionBlock } from '../record-section-block';

/** What each section's fields are given. */
export interface SectionContext {
  fields: Record<string, string>;
  setFields: (changes: Record<string, string>) => void;
  errors: Record<string, string>;
  unit: LengthUnit;
  job: JobDetail;
  /** The live results, once anything can be judged. */
  results?: InspectionResults;
}

export const unitShort = (ctx: SectionContext) => UNIT_WORDS[ctx.unit].short;

/** The first message for a path or anything under it. */
export const errorUnder = (errors: Record<string, string>, path: string) => errors[path] ?? Object.entries(errors).find(([key]) => key.startsWith(`${path}.`))?.[1];

/** A reading typed as text, kept at its request path. */
export function Reading({ ctx, path, label, hint, inputMode = 'decimal' }: { ctx: SectionContext; path: string; label: string; hint?: string; inputMode?: 'decimal' | 'text' }) {
  return (
    <TextField
      id={fieldId(path)}
      label={label}
      hint={hint}
      type="text"
      inputMode={inputMode}
      autoComplete="off"
      spellCheck={false}
      value={ctx.fields[path] ?? ''}
      onChange={(event) => ctx.setFields({ [path]: event.target.value })}
      error={ctx.errors[path]}
    />
  );
}

export function Choice({ ctx, path, label, options }: { ctx: SectionContext; path: string; label: string; options: ReadonlyArray<{ value: string; label: string }> }) {
  return (
    <SelectField
      id={fieldId(path)}
      label={label}
      value={ctx.fields[path] ?? ''}
      onChange={(event) => ctx.setFields({ [path]: event.target.value })}
      options={[{ value: '', label: 'Choose …' }, ...options]}
      error={ctx.errors[path]}
    />
  );
}

export function Words({ ctx, path, label }: { ctx: SectionContext; path: string; label: string }) {
  return (
    <TextAreaField
      id={fieldId(path)}
      label={label}
      rows={2}
      value={ctx.fields[path] ?? ''}
      onChange={(event) => ctx.setFields({ [path]: event.target.value })}
      error={ctx.errors[path]}
    />
  );
}

/** How many rows a table has, kept in the form as `rows.<name>` so a draft keeps it. */
export function rowCount(ctx: SectionContext, name: string, fallback: number, max: number): number {
  const n = Number(ctx.fields[`rows.${name}`]);
  return Number.isInteger(n) && n >= 1 && n <= max ? n : fallback;
}

export function RowCount({ ctx, name, label, fallback, max }: { ctx: SectionContext; name: string; label: string; fallback: number; max: number }) {
  const path = `rows.${name}`;
  return (
    <SelectField
      id={`field-rows-${name}`}
      label={label}
      value={String(rowCount(ctx, name, fallback, max))}
      onChange={(event) => ctx.setFields({ [path]: event.target.value })}
      options={Array.from({ length: max }, (_, i) => ({ value: String(i + 1), label: String(i + 1) }))}
      className="max-w-[10rem]"
    />
  );
}

export interface ReadingColumn {
  label: string;
  /** The request path of this column's reading in row `i`. */
  path: (i: number) => string;
}

/** Columns under one row path: `${base(i)}.${key}` for each key. */
export const columnsUnder = (base: (i: number) => string, columns: ReadonlyArray<{ key: string; label: string }>): ReadingColumn[] =>
  columns.map((column) => ({ label: column.label, path: (i) => `${base(i)}.${column.key}` }));

/** A table of readings: one row per item, one input per column. */
export function ReadingTable({ ctx, caption, rows, columns }: { ctx: SectionContext; caption: string; rows: ReadonlyArray<string>; columns: ReadonlyArray<ReadingColumn> }) {
  return (
    <div className="relative overflow-x-auto">
      <table className="min-w-full text-left text-sm">
        <caption className="pb-1 text-left text-sm font-semibold text-ink">{caption}</caption>
        <TableHead columns={[{ label: 'Where', srOnly: true }, ...columns.map((column) => column.label)]} dense />
        <tbody>
          {rows.map((row, i) => (
            <tr key={row} className="align-top">
              <th scope="row" className="py-1 pr-2 font-semibold whitespace-nowrap">
                {row}
              </th>
              {columns.map((column) => {
                const path = column.path(i);
                const error = errorUnder(ctx.errors, path);
                return (
                  <td key={column.label} className="py-1 pr-2">
                    <input
                      id={fieldId(path)}
                      aria-label={`${row}, ${column.label}`}
                      type="text"
                      inputMode="decimal"
                      autoComplete="off"
                      spellCheck={false}
                      value={ctx.fields[path] ?? ''}
                      onChange={(event) => ctx.setFields({ [path]: event.target.value })}
                      aria-invalid={error ? true : undefined}
                      title={error}
                      className={`w-24 rounded border px-2 py-1 tabular-nums ${error ? 'border-fail' : 'border-slate-300'}`}
                    />
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Messages for the paths under a prefix that a table cannot show beside a cell. */
export function SectionErrors({ ctx, prefix }: { ctx: SectionContext; prefix: string }) {
  const messages = [...new Set(Object.entries(ctx.errors).filter(([path]) => path === prefix || path.startsWith(`${prefix}.`)).map(([, message]) => message))];
  if (messages.length === 0) return null;
  return (
    <ul className="list-disc pl-5 text-sm font-semibold text-fail">
      {messages.slice(0, 4).map((message) => (
        <li key={message}>{message}</li>
      ))}
    </ul>
  );
}

/** A section's frame: its fields, then its verdict and checks as the numbers go in. */
export function OperationSection({ ctx, operation, title, intro, prefix, children }: { ctx: SectionContext; operation: string; title: string; intro?: ReactNode; prefix: string; children: ReactNode }) {
  return (
    <fieldset className="flex min-w-0 flex-col gap-3 rounded-lg border border-slate-200 p-4" data-testid={`entry-section-${operation}`}>
      <legend className="px-1 text-base font-bold text-ink">{title}</legend>
      {intro && <p className="text-sm text-ink-soft">{intro}</p>}
      {children}
      <SectionErrors ctx={ctx} prefix={prefix} />
      <LiveSection ctx={ctx} operation={operation} />
    </fieldset>
  );
}

/** An operation's verdict and checks so far, from the live results. */
export function LiveSection({ ctx, operation }: { ctx: SectionContext; operation: string }) {
  const live = ctx.results?.sections?.find((section) => section.operation === operation);
  return live && ctx.results ? <RecordSectionBlock section={live} results={ctx.results} headingLevel={4} /> : null;
}

/** Row labels "Bore 1", "Bore 2", … */
export const numbered = (word: string, count: number) => Array.from({ length: count }, (_, i) => `${word} ${i + 1}`);

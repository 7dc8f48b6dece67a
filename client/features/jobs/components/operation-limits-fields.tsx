/**
 * The job's limits for each ordered kind of work beyond the bores, rendered
 * from their one declaration (shared/operation-limits.ts): a fieldset per
 * operation, a field per limit in the job's unit, and beside each the figure
 * that applies when it is left empty, with where that figure comes from.
 */
import { useId } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import type { LengthUnit } from '@shared/calc';
import { findOperation } from '@shared/catalogue';
import { BALANCE_GRADE_CHOICES, limitGroupOperation, type LimitField, type LimitGroup } from '@shared/operation-limits';
import { FieldFrame, inputBorder, useFieldIds } from '@client/components/ui/field-frame';
import { GuidanceCaution } from '@client/components/ui/guidance-caution';
import { cn } from '@client/lib/cn';
import { limitEntries, limitRequired } from './job-scope';
import { formatLimit, limitDefaultWords, limitUnitSuffix } from './job-words';

interface LimitInputProps {
  field: LimitField;
  label: string;
  unit: LengthUnit;
  error?: string;
  registration: UseFormRegisterReturn;
}

/** One limit: a text box (a list of grades for a balance grade), its hint or error, and its default always in view. */
function LimitInput({ field, label, unit, error, registration }: LimitInputProps) {
  const defaultId = useId();
  const defaultWords = limitDefaultWords(field, unit);
  const ids = useFieldIds({ hint: field.hint, error, extra: defaultWords ? defaultId : undefined });
  const common = {
    id: ids.inputId,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': ids.describedBy,
    className: cn('min-h-11 rounded-lg border bg-white px-3 py-2 text-base text-ink placeholder:text-ink-faint', inputBorder(error)),
    ...registration,
  };
  return (
    <FieldFrame label={label} hint={field.hint} error={error} {...ids}>
      {field.kind === 'grade' ? (
        <select {...common}>
          <option value="">{field.default ? `Empty: the default, ${formatLimit(field.default[unit], 'grade', unit)}` : 'Choose…'}</option>
          {BALANCE_GRADE_CHOICES.map((grade) => (
            <option key={grade} value={String(grade)}>
              {formatLimit(grade, 'grade', unit)}
            </option>
          ))}
        </select>
      ) : (
        <input
          type="text"
          inputMode={field.kind === 'speed' ? 'numeric' : 'decimal'}
          autoComplete="off"
          spellCheck={false}
          placeholder={field.default ? String(field.default[unit]) : undefined}
          {...common}
        />
      )}
      {defaultWords && (
        <p id={defaultId} className="text-sm text-ink-soft" data-testid="limit-default">
          {defaultWords}
        </p>
      )}
    </FieldFrame>
  );
}

export interface OperationLimitsFieldsProps {
  groups: readonly LimitGroup[];
  unit: LengthUnit;
  /** The registration of a limit's input, by its path ("limits.lineHone.housingMax"). */
  register: (path: string) => UseFormRegisterReturn;
  /** A limit's message, by its path. */
  errorFor: (path: string) => string | undefined;
}

/** A fieldset "Limits for <operation>" per ordered operation that has limits, and the guidance caution under them. */
export function OperationLimitsFields({ groups, unit, register, errorFor }: OperationLimitsFieldsProps) {
  if (groups.length === 0) return null;
  return (
    <>
      {groups.map((group) => {
        const name = findOperation(limitGroupOperation[group])?.name ?? group;
        return (
          <fieldset key={group} className="flex flex-col gap-3" data-testid={`limits-${group}`}>
            <legend className="mb-1 text-base font-bold text-ink">Limits for {name.toLowerCase()}</legend>
            <div className="grid gap-4 sm:grid-cols-2">
              {limitEntries(group).map(([key, field]) => {
                const path = `limits.${group}.${key}`;
                const optional = !limitRequired(group, key) && field.kind !== 'grade';
                return (
                  <LimitInput
                    key={key}
                    field={field}
                    unit={unit}
                    label={`${field.label}${limitUnitSuffix(field.kind, unit)}${optional ? ', optional' : ''}`}
                    error={errorFor(path)}
                    registration={register(path)}
                  />
                );
              })}
            </div>
          </fieldset>
        );
      })}
      <GuidanceCaution />
    </>
  );
}

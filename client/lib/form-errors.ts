import { get, type FieldValues, type Path, type UseFormReturn, type UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * Puts the server's per-field messages beside the matching inputs and returns
 * the message for the form as a whole. What the user typed stays in the form.
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: Array<Path<T>>): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  let placed = false;
  for (const [name, message] of Object.entries(error.fields)) {
    if ((fields as string[]).includes(name)) {
      setError(name as Path<T>, { type: 'server', message });
      placed = true;
    }
  }
  return placed && error.status === 400 ? 'Please correct the marked fields.' : error.message;
}

/**
 * The props that tie an input to a react-hook-form field: its registration and
 * its message. `const field = fieldProps(form)`, then `<TextField {...field('email')} />`.
 */
export function fieldProps<T extends FieldValues>(form: UseFormReturn<T>) {
  return (name: Path<T>) => ({ ...form.register(name), error: (get(form.formState.errors, name) as { message?: string } | undefined)?.message });
}

/** What `fieldProps` gives one field. */
export type FieldProps = ReturnType<ReturnType<typeof fieldProps>>;

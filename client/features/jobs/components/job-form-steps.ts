/**
 * The job form's steps and which step holds each field, so that Next checks
 * only the step's own fields (picked by path from a full parse with the shared
 * schema) and a message from the server opens the step that holds its field.
 */
import { BORE_FIELDS, DECK_FIELDS } from './job-scope';

export interface JobFormStep {
  title: string;
  /** The top-level fields (first segment of a path) this step holds. */
  fields: readonly string[];
}

export const jobFormSteps: readonly JobFormStep[] = [
  { title: 'What you send and the work', fields: ['title', 'engineFamily', 'layout', 'cylinders', 'parts', 'blockMaterial', 'operations'] },
  { title: 'Sizes and limits', fields: ['unit', 'decisionRule', ...BORE_FIELDS, ...DECK_FIELDS, 'deckNotes', 'limits'] },
  { title: 'Getting there, place and date', fields: ['logistics', 'country', 'region', 'city', 'postalCode', 'neededBy'] },
  { title: 'Notes and photos', fields: ['notes'] },
  { title: 'Check and save', fields: [] },
];

export const SUMMARY_STEP = jobFormSteps.length - 1;

/** The step holding a field path such as "limits.lineHone.housingMax" or "operations.0.quantity"; the first step when unknown. */
export function stepOfPath(path: string): number {
  const head = path.split('.')[0] ?? '';
  const index = jobFormSteps.findIndex((step) => step.fields.includes(head));
  return index < 0 ? 0 : index;
}

/** The paths of every leaf message in react-hook-form's nested errors object. */
export function errorPaths(errors: object, prefix = ''): string[] {
  const paths: string[] = [];
  for (const [key, value] of Object.entries(errors)) {
    if (!value || typeof value !== 'object' || key === 'ref') continue;
    const path = prefix ? `${prefix}.${key}` : key;
    if (typeof (value as { message?: unknown }).message === 'string') paths.push(path);
    else paths.push(...errorPaths(value as object, path));
  }
  return paths;
}

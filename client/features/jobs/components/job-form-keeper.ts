/**
 * What the job form keeps on this device while it is typed into, so nothing
 * is lost on leaving the page, reloading or a crash.
 *
 * Why local storage and not a draft on the server: a job is stored only once
 * its spec passes the shared job schema (`POST /api/jobs` saves a whole draft,
 * and the form's "Save draft" does exactly that); a half-typed spec is not a
 * job yet, and the schema's rules stay as they are. So the half-typed form is
 * kept in this browser, under a key naming the signed-in person (and the job,
 * for an edit), until it is saved or the person starts afresh. It does not
 * follow the person to another device; the saved draft does.
 */
import type { JobFormValues } from '@shared/schemas/jobs';

export interface KeptJobForm {
  values: Partial<JobFormValues>;
  /** The step the person was on. */
  step: number;
  /** When it was last kept (ISO). */
  keptAt: string;
}

const PREFIX = 'tenthmark.job-form';

/** The key for a new job's form, or one job's edit, of one person. */
export const keptFormKey = (userId: string, jobId?: string) => `${PREFIX}.${userId}.${jobId ?? 'new'}`;

export function readKeptForm(key: string): KeptJobForm | undefined {
  try {
    const text = window.localStorage.getItem(key);
    if (!text) return undefined;
    const kept = JSON.parse(text) as KeptJobForm;
    return kept && typeof kept === 'object' && kept.values && typeof kept.values === 'object' ? kept : undefined;
  } catch {
    return undefined;
  }
}

export function writeKeptForm(key: string, values: Partial<JobFormValues>, step: number): void {
  try {
    window.localStorage.setItem(key, JSON.stringify({ values, step, keptAt: new Date().toISOString() } satisfies KeptJobForm));
  } catch {
    // Storage full or turned off: the leave warning still stands guard.
  }
}

export function forgetKeptForm(key: string): void {
  try {
    window.localStorage.removeItem(key);
  } catch {
    // Nothing kept, nothing to forget.
  }
}

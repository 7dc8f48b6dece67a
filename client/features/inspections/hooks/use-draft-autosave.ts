import { useCallback, useEffect, useRef, useState } from 'react';
import { putInspectionDraft, useSaveInspectionDraft } from '../api/inspections';

export type DraftStatus = { kind: 'idle' } | { kind: 'saving' } | { kind: 'saved'; at: string } | { kind: 'failed'; message: string };

/**
 * Keeps the shop's unfinished record on the server: a save a moment after the
 * typing stops (debounced), one more as the page closes if something changed
 * since, and none after `stop()` (the record was submitted).
 */
export function useDraftAutosave<T>(jobId: string, value: T, toDraft: (value: T) => Record<string, unknown>, options: { delayMs?: number; savedAt?: string | null } = {}) {
  const delay = options.delayMs ?? 1_000;
  const [status, setStatus] = useState<DraftStatus>(options.savedAt ? { kind: 'saved', at: options.savedAt } : { kind: 'idle' });
  const save = useSaveInspectionDraft(jobId);
  const first = useRef(true);
  const stopped = useRef(false);
  const dirty = useRef(false);
  const latest = useRef({ value, toDraft });
  latest.current = { value, toDraft };

  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    if (stopped.current) return;
    dirty.current = true;
    const timer = setTimeout(() => {
      if (stopped.current) return;
      dirty.current = false;
      setStatus({ kind: 'saving' });
      save.mutate(latest.current.toDraft(latest.current.value), {
        onSuccess: ({ savedAt }) => {
          if (!stopped.current) setStatus({ kind: 'saved', at: savedAt });
        },
        onError: (error) => {
          dirty.current = true;
          setStatus({ kind: 'failed', message: error.message });
        },
      });
    }, delay);
    return () => clearTimeout(timer);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only a new value starts a save; `save.mutate` is read when the timer fires.
  }, [value, delay]);

  // Leaving the page within the debounce still keeps the last keystrokes.
  useEffect(
    () => () => {
      if (dirty.current && !stopped.current) void putInspectionDraft(jobId, latest.current.toDraft(latest.current.value)).catch(() => undefined);
    },
    [jobId],
  );

  const stop = useCallback(() => {
    stopped.current = true;
    dirty.current = false;
  }, []);
  /** Saving again after a submission failed; the next change is saved as before. */
  const resume = useCallback(() => {
    stopped.current = false;
  }, []);

  return { status, stop, resume };
}

// Plain values of a standing (no zod, so a page can show them cheaply); shared/schemas/standing.ts re-exports them.

/** Below this many counted events a figure is not shown: a share of three jobs says little about a shop. */
export const STANDING_MIN_COUNT = 5;

/**
 * A shop's standing reads its latest this-many won jobs (by award) and conversations (by last message): it says
 * how the shop works now, and reading it costs the same for a shop with ten years on Tenthmark.
 */
export const STANDING_RECENT = 100;

/** A builder pays on time when the award's payment arrives within this many calendar days of the award. */
export const PAY_WITHIN_DAYS = 3;

/** `count` of `of` with its share, or null while `of` is below the minimum. */
export function shareOrNull(count: number, of: number): { count: number; of: number; share: number } | null {
  return of >= STANDING_MIN_COUNT && of > 0 ? { count, of, share: count / of } : null;
}

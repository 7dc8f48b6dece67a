/**
 * Decision rules: how a measured value is judged against a limit when the
 * measurement itself is uncertain.
 *
 * - Simple acceptance (ILAC-G8): a value within its limit conforms, one
 *   outside it fails; the uncertainty is stated but not used.
 * - Guarded acceptance after ISO 14253-1: with expanded uncertainty U, a value
 *   conforms only inside the limit reduced by U (the conformance zone) and
 *   fails only outside the limit widened by U; in between, neither is proven.
 *
 * Every comparison allows a slack of 1e-9 in the value's unit so that
 * floating-point noise never moves a value across a boundary; the slack is
 * far below any gauge's resolution.
 */
export type DecisionRule = 'simple' | 'guarded';
export const DECISION_RULES: readonly DecisionRule[] = ['simple', 'guarded'];

export type Verdict = 'conforms' | 'fails' | 'not-proven';

export const DECISION_RULE_WORDS: Record<DecisionRule, { name: string; words: string }> = {
  simple: {
    name: 'Simple acceptance (ILAC-G8)',
    words: 'A reading within its limit conforms and one outside it fails; the measurement uncertainty is stated but not used in the decision.',
  },
  guarded: {
    name: 'Guarded acceptance (ISO 14253-1)',
    words:
      'A reading conforms only when it is inside its limit by at least the measurement uncertainty, and fails only when it is outside the limit by more than the uncertainty; in between, neither is proven.',
  },
};

const SLACK = 1e-9;

/** A value that must not be larger than `max`. */
export function judgeMax(value: number, max: number, rule: DecisionRule, uncertainty: number): Verdict {
  const u = rule === 'guarded' ? uncertainty : 0;
  if (value <= max - u + SLACK) return 'conforms';
  if (value > max + u + SLACK) return 'fails';
  return 'not-proven';
}

/** A value that must not be smaller than `min`. */
export function judgeMin(value: number, min: number, rule: DecisionRule, uncertainty: number): Verdict {
  const u = rule === 'guarded' ? uncertainty : 0;
  if (value >= min + u - SLACK) return 'conforms';
  if (value < min - u - SLACK) return 'fails';
  return 'not-proven';
}

const RANK: Record<Verdict, number> = { conforms: 0, 'not-proven': 1, fails: 2 };

/** The worse of two verdicts: fails over not proven over conforms. */
export function worseVerdict(a: Verdict, b: Verdict): Verdict {
  return RANK[b] > RANK[a] ? b : a;
}

/** A value that must lie within [min, max]. */
export function judgeRange(value: number, min: number, max: number, rule: DecisionRule, uncertainty: number): Verdict {
  return worseVerdict(judgeMin(value, min, rule, uncertainty), judgeMax(value, max, rule, uncertainty));
}

export function verdictRank(verdict: Verdict): number {
  return RANK[verdict];
}

/**
 * Clue ablation
 * =============
 *
 * Drops each clue in turn, re-ranks without it, and classifies the clue by what changes:
 *
 * - `necessary`   — without it the best answer changes (or nothing is left);
 * - `narrowing`   — the best answer stays, but the verdict gets worse (e.g. unique → tied):
 *                   the clue is what singles the answer out;
 * - `redundant`   — the best answer and the verdict stay the same;
 * - `conflicting` — the best answer stays and the verdict gets better without it.
 *
 * Independently, a clue "pulls towards" another answer when, taken alone (its own per-clue
 * score part), it ranks a different candidate first.
 *
 * [Reference] Leave-one-out ablation of input features is common practice (e.g. Kohavi &
 * John, "Wrappers for feature subset selection", Artificial Intelligence 97, 1997, for the
 * drop-one evaluation; from memory).
 */
import type { EntityRef, Verdict, VerdictStatus } from "../model/index.js";

/** Options of ablation; all optional. */
export interface AblationOptions {
  /** Run ablation at all (it costs one re-ranking per clue). @default true */
  readonly enabled?: boolean;
}

/** The defaults of {@link AblationOptions}. */
export const DEFAULTS = { enabled: true } as const;

/** The role of one clue. */
export type ClueRole = "necessary" | "narrowing" | "redundant" | "conflicting";

/** One clue's ablation result. */
export interface AblationEntry {
  readonly clue: EntityRef;
  readonly role: ClueRole;
  /** Best answer without this clue (null when nothing is ranked). */
  readonly topWithout: EntityRef | null;
  /** The verdict without this clue. */
  readonly verdictWithout: Verdict;
  /** The candidate this clue alone ranks first, when it is not the best answer. */
  readonly pullsTowards: EntityRef | null;
}

const ORDER: Record<VerdictStatus, number> = { unique: 3, tied: 2, weak: 1, none: 0 };

/** Classifies one clue from the result with and without it (see the header). */
export function clueRole(top: EntityRef | null, verdict: Verdict, topWithout: EntityRef | null, verdictWithout: Verdict): ClueRole {
  if (top === null || topWithout === null || top.id !== topWithout.id) return "necessary";
  const a = ORDER[verdict.status];
  const b = ORDER[verdictWithout.status];
  if (b < a) return "narrowing";
  if (b > a) return "conflicting";
  return "redundant";
}

/**
 * The candidate that clue `clue` alone ranks first (its per-clue part; ties by node num),
 * or null when no candidate has a positive part.
 */
export function preferredByClue(candidates: readonly { readonly node: number; readonly perClue: readonly number[] }[], clue: number): number | null {
  let best: number | null = null;
  let bestScore = 0;
  for (const c of candidates) {
    const s = c.perClue[clue] ?? 0;
    if (s > bestScore || (s === bestScore && s > 0 && best !== null && c.node < best)) {
      best = c.node;
      bestScore = s;
    }
  }
  return best;
}

/**
 * The basic verdict of a ranking, used where explain's verdict has nothing to work on (no
 * clue linked, no candidate reached) and as a plain fallback.
 *
 * Rule (common practice for ranked retrieval: a relative-gap test on the top scores):
 * - `none`: no clue was linked, or no candidate was reached;
 * - `tied`: the candidates right after the best one that cover as many clues and score at
 *   least `tieRatio` × its score (listed in `tiedWith`);
 * - `weak`: the best candidate is not supported by every clue, or its relative lead
 *   (s₁ − s₂)/s₁ is below `weakMargin`;
 * - `unique` otherwise.
 */
import type { Verdict } from "../model/index.js";
import type { Ranked, RankedCandidate } from "../ranking/index.js";

/** Options of {@link basicVerdict}; all optional. */
export interface VerdictOptions {
  /** Score ratio to the best candidate from which another one counts as tied. @default 0.9 */
  readonly tieRatio?: number;
  /** Smallest relative lead of a unique answer. @default 0.15 */
  readonly weakMargin?: number;
}

/** Defaults of {@link VerdictOptions}. */
export const DEFAULTS = { tieRatio: 0.9, weakMargin: 0.15 } as const;

/** The verdict on a ranking; `idOf` maps a node to its entity id. */
export function basicVerdict(ranked: Ranked, idOf: (node: number) => string, options: VerdictOptions = {}): Verdict {
  const tieRatio = options.tieRatio ?? DEFAULTS.tieRatio;
  const weakMargin = options.weakMargin ?? DEFAULTS.weakMargin;
  const c = ranked.candidates;
  if (ranked.clues.length === 0) return { status: "none", margin: 0, tiedWith: [], reason: "no clue entity was linked" };
  if (c.length === 0) return { status: "none", margin: 0, tiedWith: [], reason: "no candidate answer is reachable from the clues" };
  const top = c[0]!;
  const second = c[1];
  const margin = second === undefined ? 1 : top.score > 0 ? Math.max(0, (top.score - second.score) / top.score) : 0;
  const tied: RankedCandidate[] = [];
  for (const x of c.slice(1)) {
    if (x.covered !== top.covered || x.score < tieRatio * top.score) break;
    tied.push(x);
  }
  const all = ranked.clues.length;
  if (tied.length > 0) {
    return { status: "tied", margin, tiedWith: tied.map((x) => idOf(x.node)), reason: `${tied.length + 1} candidates score within ${Math.round((1 - tieRatio) * 100)}% of each other` };
  }
  if (top.covered < all) return { status: "weak", margin, tiedWith: [], reason: `the best answer is supported by ${top.covered} of ${all} clues` };
  if (margin < weakMargin) return { status: "weak", margin, tiedWith: [], reason: `the lead over the next answer is small (${Math.round(margin * 100)}%)` };
  return { status: "unique", margin, tiedWith: [], reason: all > 1 ? `supported by all ${all} clues, clearly ahead` : "clearly ahead" };
}

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

/** Options of {@link readingVerdict}; all optional. */
export interface ReadingVerdictOptions {
  /** A clue linked below this confidence leaves the verdict as the scores decided it (link doubt: issue 17's rules). @default 0.5 */
  readonly minLinkConfidence?: number;
  /** Longest clue pattern that counts as a constraint (rank's `chainMaxSteps`). @default 3 */
  readonly maxSteps?: number;
}

/** Defaults of {@link ReadingVerdictOptions}. */
export const READING_DEFAULTS = { minLinkConfidence: 0.5, maxSteps: 3 } as const;

/**
 * The verdict as the question's reading decides it (analysis query-graph.ts, evaluated by
 * the ranking: `Ranked.matched` entities satisfy every clue's relation-path pattern).
 * When every clue is constrained by a pattern and linked with confidence:
 * - several entities satisfy the reading: `tied`, all of them (a plural question asks for
 *   the set; a singular one has no single answer), whatever evidence along relations the
 *   question does not name says;
 * - exactly one: `unique` (rivals off the reading do not tie with it);
 * - none (`fallback`): the score-based verdict stands (the ranking's note says the answers
 *   fit only part of the reading).
 * Otherwise the score-based verdict stands.
 */
export function readingVerdict(
  verdict: Verdict,
  reading: { readonly chains: readonly { readonly steps: readonly unknown[] }[]; readonly plural: boolean },
  analysis: { readonly mentions: readonly { readonly confidence: number }[] },
  ranked: Ranked,
  refOf: (node: number) => { id: string; label: string },
  options: ReadingVerdictOptions = {},
): Verdict {
  const o = { ...READING_DEFAULTS, ...options };
  if (ranked.matched === undefined || ranked.candidates.length === 0 || verdict.status === "none") return verdict;
  // no entity satisfies the whole reading: the reader may have missed the structure, so the
  // score-based verdict stands (its own pattern check already says weak for a clue off its pattern)
  if (ranked.fallback) return verdict;
  const constrained =
    reading.chains.length === ranked.clues.length &&
    (ranked.open ?? 0) === 0 &&
    reading.chains.every((ch) => ch.steps.length <= o.maxSteps) &&
    ranked.clues.every((c) => (analysis.mentions[c.mention]?.confidence ?? 0) >= o.minLinkConfidence);
  if (!constrained) return verdict;
  const set = ranked.candidates.slice(0, ranked.matched);
  if (set.length >= 2) {
    const names = set.slice(0, 5).map((c) => refOf(c.node).label).join(", ") + (set.length > 5 ? `, … (${set.length} in all)` : "");
    return {
      status: "tied",
      margin: 0,
      tiedWith: set.slice(1).map((c) => refOf(c.node).id),
      reason: `${set.length} entities satisfy the reading${reading.plural ? " (the question asks for all of them)" : ""}: ${names}`,
    };
  }
  if (set.length === 1 && verdict.status !== "unique") {
    return { status: "unique", margin: verdict.margin, tiedWith: [], reason: `only ${refOf(set[0]!.node).label} satisfies the reading of the question` };
  }
  return verdict;
}

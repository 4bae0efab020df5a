/**
 * The uniqueness verdict
 * ======================
 *
 * Decides whether the best answer is the only one that fits the question, from the ranking
 * scores and the clue coverage:
 *
 * - `none`   — no clue was linked, no candidate was ranked, or no clue reaches the best
 *              candidate within N hops.
 * - `tied`   — the best answer is reached by every clue and other candidates fit about
 *              equally well: either their score is at least `tieRatio` × the best score
 *              with the same clue coverage (and their paths follow the cued relations
 *              wherever the best answer's do), or their evidence is structurally equivalent
 *              (the relation pattern of every clue's best path reaches them too, see
 *              relation-pattern.ts) and their score is at least `equivalentFloor` × the best.
 * - `weak`   — a best answer exists but some clue does not reach it within N hops, or
 *              does not reach it along the relation-path pattern the question's wording
 *              names for that clue (ranking `chainMissOf`: "which country borders A, B and
 *              C" when none borders all three), or
 *              another candidate's evidence dominates it (every clue reaches the other in
 *              no more hops, and some clue in fewer along relations the question names:
 *              the path evidence disagrees with the score — unless the other fits the
 *              relation-path pattern of the question's wording less well, ranking
 *              `chainFit`), or its relative lead over the
 *              runner-up is below `weakMargin`.
 * - `unique` — otherwise: one answer clearly ahead and supported by every clue.
 *
 * `margin` = (s₁ − s₂) / s₁, the relative lead of the best score s₁ over s₂, the best score
 * among the other candidates that the ranking counts as covering as many clues and whose
 * best paths follow the question's cued relations wherever the best answer's do (1 when
 * there is none: the best answer is ahead on coverage or on agreement with the words).
 *
 * [Reference] Score-ratio ties and relative margins are common practice in answer ranking
 * (cf. the "margin" confidence of Scheffer et al., "Active hidden Markov models for
 * information extraction", IDA 2001: the gap between the two best hypotheses); the
 * thresholds below are tiepoint's own defaults, documented in the README ("Verdicts").
 */
import type { Verdict } from "../model/index.js";

/** Options of {@link decideVerdict}; all optional. */
export interface VerdictOptions {
  /** A rival with score ≥ tieRatio × best and the same coverage is tied. @default 0.9 */
  readonly tieRatio?: number;
  /** A structurally equivalent rival with score ≥ equivalentFloor × best is tied. @default 0.25 */
  readonly equivalentFloor?: number;
  /** A lead below this relative margin makes the answer weak. @default 0.15 */
  readonly weakMargin?: number;
}

/** The defaults of {@link VerdictOptions}. */
export const DEFAULTS = { tieRatio: 0.9, equivalentFloor: 0.25, weakMargin: 0.15 } as const;

/** A ranked candidate as the verdict sees it. */
export interface VerdictCandidate {
  readonly node: number;
  readonly id: string;
  readonly label: string;
  readonly score: number;
  /** Per clue: reached within N hops. Undefined when not computed (beyond the top rows). */
  readonly reached?: readonly boolean[];
  /** The ranking's clue coverage count, when known. */
  readonly covered?: number;
  /** Per clue: hops of the best path (null when not reached), when computed. */
  readonly hops?: readonly (number | null)[];
  /** Per clue: true when the best path walks only relations cued by the question, when computed. */
  readonly cued?: readonly boolean[];
  /** The ranking's relation-path pattern factor (1: the path the question's wording implies reaches it), when known. */
  readonly chainFit?: number;
  /** Clues (indexes into the clue list) whose relation-path pattern misses this candidate, when checked (best candidate only). */
  readonly chainMissed?: readonly number[];
}

/** What the verdict is decided from. */
export interface VerdictInput {
  /** Clue labels, in clue order. */
  readonly clues: readonly string[];
  /** Candidates, best first. */
  readonly candidates: readonly VerdictCandidate[];
  /** Nodes whose evidence is structurally equivalent to the best answer's (null: unknown). */
  readonly equivalent: ReadonlySet<number> | null;
  /** The N of "within N hops". */
  readonly maxHops: number;
}

const fmt = (x: number): string => x.toFixed(2);

/** Decides the verdict (see the file header for the rules). */
export function decideVerdict(input: VerdictInput, options: VerdictOptions = {}): Verdict {
  const o = { ...DEFAULTS, ...options };
  for (const [k, v] of Object.entries(o)) {
    if (!(v >= 0 && v <= 1)) throw new RangeError(`explain/verdict: ${k} must be in [0, 1], got ${String(v)}`);
  }
  if (input.clues.length === 0) return { status: "none", margin: 0, tiedWith: [], reason: "no part of the question was linked to a catalog entity" };
  const top = input.candidates[0];
  if (!top || !(top.score > 0)) return { status: "none", margin: 0, tiedWith: [], reason: "no candidate of the expected type is reachable from the clues" };
  const reachedTop = top.reached ?? input.clues.map(() => true);
  if (!reachedTop.some((r) => r)) {
    return { status: "none", margin: 0, tiedWith: [], reason: `no clue reaches a candidate within ${input.maxHops} hops` };
  }
  const s1 = top.score;
  const cueBehind = (c: VerdictCandidate): boolean => {
    const a = top.cued;
    const b = c.cued;
    if (a === undefined || b === undefined || a.length !== b.length) return false;
    return a.every((x, i) => x || !b[i]) && a.some((x, i) => x && !b[i]);
  };
  const rival = input.candidates
    .slice(1)
    .find((c) => (c.covered === undefined || top.covered === undefined || c.covered >= top.covered) && !cueBehind(c));
  const s2 = rival?.score ?? 0;
  const margin = s1 > 0 ? Math.max(0, Math.min(1, (s1 - s2) / s1)) : 0;
  const sameCoverage = (c: VerdictCandidate): boolean => c.reached !== undefined && c.reached.every((r, i) => r === reachedTop[i]);
  const tied: VerdictCandidate[] = [];
  for (const c of input.candidates.slice(1)) {
    const ratio = c.score / s1;
    const close = ratio >= o.tieRatio && sameCoverage(c) && !cueBehind(c);
    const equivalent = input.equivalent !== null && input.equivalent.has(c.node) && ratio >= o.equivalentFloor;
    // a candidate off the question's relation-path pattern (ranking chainFit) does not fit as well
    if ((close || equivalent) && (c.chainFit ?? 1) >= (top.chainFit ?? 1)) tied.push(c);
  }
  const tiedWith = tied.map((c) => c.id);
  const missing = input.clues.filter((_, i) => !reachedTop[i]);
  if (missing.length > 0) {
    const which = missing.map((m) => `"${m}"`).join(", ");
    return { status: "weak", margin, tiedWith, reason: `${which} ${missing.length === 1 ? "does" : "do"} not reach ${top.label} within ${input.maxHops} hops` };
  }
  const offPattern = (top.chainMissed ?? []).filter((i) => i >= 0 && i < input.clues.length);
  if (offPattern.length > 0) {
    const which = offPattern.map((i) => `"${input.clues[i]}"`).join(", ");
    return { status: "weak", margin, tiedWith, reason: `${which} ${offPattern.length === 1 ? "does" : "do"} not reach ${top.label} along the relations the question names for ${offPattern.length === 1 ? "it" : "them"}` };
  }
  const topHops = top.hops;
  if (topHops !== undefined) {
    for (const c of input.candidates.slice(1)) {
      const h = c.hops;
      if (h === undefined || h.length !== topHops.length) continue;
      // a shorter path off the relation-path pattern the question implies is no better evidence
      if ((c.chainFit ?? 1) < (top.chainFit ?? 1)) continue;
      const noWorse = h.every((x, i) => x !== null && (topHops[i] === null || x <= topHops[i]!));
      const better = h.findIndex((x, i) => x !== null && topHops[i] !== null && x < topHops[i]! && c.cued?.[i] === true);
      if (noWorse && better >= 0) {
        return {
          status: "weak",
          margin,
          tiedWith,
          reason: `${c.label} fits "${input.clues[better]}" more directly than ${top.label} (${h[better]} hop${h[better] === 1 ? "" : "s"} against ${topHops[better]}) and every other clue as well`,
        };
      }
    }
  }
  if (tied.length > 0) {
    const names = tied.slice(0, 5).map((c) => c.label).join(", ") + (tied.length > 5 ? `, … (${tied.length} in all)` : "");
    return { status: "tied", margin, tiedWith, reason: `${names} fit${tied.length === 1 ? "s" : ""} the clues as well as ${top.label}` };
  }
  if (margin < o.weakMargin) {
    const next = rival!;
    return { status: "weak", margin, tiedWith, reason: `${top.label} leads ${next.label} by only ${fmt(margin)} (below ${fmt(o.weakMargin)})` };
  }
  return { status: "unique", margin, tiedWith, reason: `every clue reaches ${top.label}, and it leads by ${fmt(margin)}` };
}

/**
 * Clue combination: one score per candidate from its per-clue proximities.
 *
 * Method: a weighted geometric mean with a floor, S(v) = Π_c max(p̂_c(v), f)^(w_c / Σw),
 * where p̂_c is clue c's personalized PageRank normalised by its largest value among the
 * candidates (so every clue counts on the same scale), w_c the clue's link confidence and
 * f the floor, plus a coverage count (clues with p̂_c(v) ≥ `coverThreshold`). Candidates are
 * ordered by coverage first, then S, then id, so an answer close to every clue beats one
 * close to a single clue however close. The geometric mean is the product-of-experts /
 * "AND" combination of independent evidence (Hinton 2002, "Training products of experts by
 * minimizing contrastive divergence", Neural Computation 14(8)); the floor keeps one
 * unreached clue from zeroing a candidate (additive smoothing, common practice).
 */

/** Options of {@link combineClueScores}; all optional. */
export interface CombineOptions {
  /** Floor f of a normalised per-clue score. @default 1e-4 */
  readonly floor?: number;
  /** Normalised per-clue score from which a clue counts as covering the candidate. @default 1e-3 */
  readonly coverThreshold?: number;
}

/** Defaults of {@link CombineOptions}. */
export const DEFAULTS = { floor: 1e-4, coverThreshold: 1e-3 } as const;

/** The combined score of one candidate. */
export interface Combined {
  /** Weighted geometric mean with floor, in [floor, 1]. */
  readonly score: number;
  /** Clues whose normalised score reaches the cover threshold. */
  readonly covered: number;
}

/**
 * Combines one candidate's normalised per-clue scores (`scores[c]` in [0, 1]) with clue
 * weights `weights[c]` (> 0). With no clue at all the score is 0.
 */
export function combineClueScores(scores: ArrayLike<number>, weights: ArrayLike<number>, options: CombineOptions = {}): Combined {
  const floor = options.floor ?? DEFAULTS.floor;
  const cover = options.coverThreshold ?? DEFAULTS.coverThreshold;
  if (!(floor > 0 && floor < 1)) throw new RangeError(`ranking/combine: floor must be in (0, 1), got ${floor}`);
  if (scores.length !== weights.length) throw new RangeError(`ranking/combine: ${scores.length} scores but ${weights.length} weights`);
  let total = 0;
  let logSum = 0;
  let covered = 0;
  for (let c = 0; c < scores.length; c++) {
    const w = weights[c]!;
    if (!(w > 0)) throw new RangeError(`ranking/combine: clue weight ${c} must be positive, got ${w}`);
    const s = scores[c]!;
    if (s >= cover) covered++;
    logSum += w * Math.log(Math.max(s, floor));
    total += w;
  }
  if (total === 0) return { score: 0, covered: 0 };
  return { score: Math.exp(logSum / total), covered };
}

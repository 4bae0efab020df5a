/**
 * Personalized PageRank by power iteration (the exact reference)
 * ==============================================================
 *
 * Iterates x ← α s + (1 − α) P'ᵀ x from x = s until the L1 change is below `tolerance`,
 * over the walk of transition.ts (dangling mass back to the seeds). Work per iteration is
 * O(nodes + entries); the error after convergence is at most tolerance·(1 − α)/α in L1.
 * Used for tests and benchmarks, not on the query path.
 *
 * [Reference]: Page, Brin, Motwani & Winograd, "The PageRank citation ranking: bringing
 * order to the web", 1999; Haveliwala, "Topic-sensitive PageRank", WWW 2002 (restart
 * vector s). Difference from Page et al.: dangling mass goes to s, not uniformly.
 */
import { TiepointError } from "../model/index.js";
import type { RelationIndex } from "./relation-index.js";
import { Walk } from "./transition.js";
import { checkAlpha, checkCount, checkPositive, normaliseSeeds, PPR_DEFAULTS, type PprOptions, type Seed } from "./ppr-options.js";

/** Defaults of {@link pprPower}. */
export const DEFAULTS = Object.freeze({
  alpha: PPR_DEFAULTS.alpha,
  /** Stop when ‖x_{k+1} − x_k‖₁ < tolerance. */
  tolerance: 1e-12,
  maxIterations: 10_000,
});

const WHERE = "ranking/ppr-power";

/**
 * Exact personalized PageRank (to `tolerance`) of every node, as a dense Float64Array
 * indexed by node id, summing to 1. Throws a TiepointError `ranking/not-converged` when
 * `maxIterations` is reached first, RangeError on bad arguments.
 */
export function pprPower(index: RelationIndex, seeds: readonly Seed[], options: PprOptions = {}): Float64Array {
  const alpha = checkAlpha(WHERE, options.alpha ?? DEFAULTS.alpha);
  const tolerance = checkPositive(WHERE, "tolerance", options.tolerance ?? DEFAULTS.tolerance);
  const maxIterations = checkCount(WHERE, "maxIterations", options.maxIterations ?? DEFAULTS.maxIterations);
  const s = normaliseSeeds(WHERE, index, seeds);
  const walk = new Walk(index, options);
  const c = walk.csr;
  const n = index.nodeCount;
  // per-entry probabilities once; dangling rows flagged
  const prob = new Float64Array(c.targets.length);
  const dangling: number[] = [];
  for (let u = 0; u < n; u++) {
    const start = c.offsets[u]!;
    const end = c.offsets[u + 1]!;
    const total = start === end ? 0 : walk.rowTotal(u);
    if (!(total > 0)) {
      dangling.push(u);
      continue;
    }
    for (let e = start; e < end; e++) prob[e] = walk.weight(e) / total;
  }
  let x = new Float64Array(n);
  let y = new Float64Array(n);
  for (let i = 0; i < s.nodes.length; i++) x[s.nodes[i]!] = s.weights[i]!;
  const follow = 1 - alpha;
  let change = Infinity;
  for (let it = 0; it < maxIterations; it++) {
    y.fill(0);
    let lost = 0;
    for (const u of dangling) lost += x[u]!;
    for (let u = 0; u < n; u++) {
      const xu = x[u]!;
      if (xu === 0) continue;
      const end = c.offsets[u + 1]!;
      const f = follow * xu;
      for (let e = c.offsets[u]!; e < end; e++) y[c.targets[e]!]! += f * prob[e]!;
    }
    const back = alpha + follow * lost;
    for (let i = 0; i < s.nodes.length; i++) y[s.nodes[i]!]! += back * s.weights[i]!;
    change = 0;
    for (let u = 0; u < n; u++) change += Math.abs(y[u]! - x[u]!);
    const t = x;
    x = y;
    y = t;
    if (change < tolerance) return x;
  }
  throw new TiepointError(
    "ranking/not-converged",
    `${WHERE}: no convergence after ${maxIterations} iterations (L1 change ${change.toExponential(2)} > tolerance ${tolerance}); raise maxIterations or tolerance`,
  );
}

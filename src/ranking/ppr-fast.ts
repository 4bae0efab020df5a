/**
 * Personalized PageRank at query time: forward push + random walks (FORA)
 * =======================================================================
 *
 * Phase 1, forward push (ppr-push.ts) to a coarse threshold ε under a work budget, leaves a
 * reserve p and a residual r with π = p + Σ_u r(u)·π_u exactly. Phase 2 estimates the
 * remaining Σ_u r(u)·π_u by `walks` random walks of the same transition matrix
 * (transition.ts): each walk stops with probability α at every step (a dangling node jumps
 * to the seed distribution), and its end node receives r_sum / walks. Start nodes are drawn
 * proportionally to r by systematic sampling (one uniform offset, then a regular grid over
 * the cumulative residual), which is unbiased and uses exactly `walks` walks. So the
 * estimate is unbiased, E[π̂] = π, and each walk costs on average 1/α steps whatever the hubs
 * (sampling one step is a binary search in the row's prefix sums). Work per query is bounded
 * by `maxWork` (push) + `walks`/α expected steps (walks), independent of the catalog size.
 *
 * The walks use a seeded PRNG (mulberry32): the same question gives the same scores.
 *
 * [Reference]: Wang, Yang, Xiao, Wei & Yang, "FORA: Simple and Effective Approximate
 * Single-Source Personalized PageRank", KDD 2017 (push, then walks from the residual).
 * Differences: the walk count is an option (FORA derives it from a relative-error target
 * and failure probability: ω = r_sum·(2ε/3 + 2)·ln(2/p_f)/(ε²δ)); start nodes are sampled
 * systematically instead of ⌈r(u)·ω/r_sum⌉ walks per node; dangling mass goes to the seeds.
 *
 * Measured choice of defaults (src/bench, README "Benchmarks"): with the hub-damped walk and
 * measure-normalised push thresholds, push at ε = 1e-4 alone already agrees ≥ 0.99 with
 * exact PPR on the top 20 at α ≥ 0.3, and walks cost more per unit of accuracy than a finer
 * push (≈ 0.5 µs per walk step against ≈ 40 ns per pushed entry). So by default the walks are
 * spent only when the push work budget was hit (hub-heavy seeds), where they keep the
 * estimate unbiased at bounded cost; set `walks` to always run them.
 */
import type { RelationIndex } from "./relation-index.js";
import { Walk } from "./transition.js";
import { mulberry32 } from "./prng.js";
import { collect, pushInto, workspaceFor } from "./ppr-push.js";
import { checkAlpha, checkCount, checkPositive, normaliseSeeds, PPR_DEFAULTS, type PprOptions, type Seed, type SparseScores } from "./ppr-options.js";

/** Defaults of {@link pprFast} (chosen by measurement: src/bench/ppr.ts, README "Benchmarks"). */
export const DEFAULTS = Object.freeze({
  alpha: PPR_DEFAULTS.alpha,
  /** ε of the push phase: push while r(u) > ε·μ(u). */
  tolerance: 1e-4,
  /** Random walks spent on the residual when the push phase hit its work budget (`walks` unset). */
  walksWhenCut: 5_000,
  /** Budget of adjacency entries touched by the push phase. */
  maxWork: 400_000,
  /** PRNG seed of the walks. */
  randomSeed: 0x5eed,
});

/** Options of {@link pprFast}; all optional. */
export interface FastOptions extends PprOptions {
  /**
   * Random walks of the second phase, always spent (0 = push only). When unset: none if the
   * push finished within its budget, else `walksWhenCut` (5,000) walks spread the residual.
   */
  readonly walks?: number;
  /** Budget of adjacency entries touched by the push phase. @default 400,000 */
  readonly maxWork?: number;
  /** Seed of the PRNG driving the walks. @default 0x5eed */
  readonly randomSeed?: number;
}

/** Work done by one {@link pprFast} call. */
export interface FastStats {
  readonly pushes: number;
  /** Adjacency entries touched by the push phase. */
  readonly work: number;
  /** Residual mass left to the walks (= ‖π − p‖₁ after the push). */
  readonly residualSum: number;
  readonly walks: number;
  /** Steps taken by all walks. */
  readonly steps: number;
  /** False when the push work budget was reached. */
  readonly pushComplete: boolean;
}

/** Sparse personalized PageRank estimate (nodes ascending) with the work it took. */
export interface FastScores extends SparseScores {
  readonly stats: FastStats;
}

const WHERE = "ranking/ppr-fast";

/**
 * Fast approximate personalized PageRank from `seeds` (the query-time method): sparse
 * scores summing to 1 (up to rounding), nodes ascending. RangeError on bad arguments.
 */
export function pprFast(index: RelationIndex, seeds: readonly Seed[], options: FastOptions = {}): FastScores {
  const alpha = checkAlpha(WHERE, options.alpha ?? DEFAULTS.alpha);
  const epsilon = checkPositive(WHERE, "tolerance", options.tolerance ?? DEFAULTS.tolerance);
  const maxWork = checkPositive(WHERE, "maxWork", options.maxWork ?? DEFAULTS.maxWork);
  if (options.walks !== undefined && options.walks !== 0) checkCount(WHERE, "walks", options.walks);
  const randomSeed = options.randomSeed ?? DEFAULTS.randomSeed;
  if (!Number.isInteger(randomSeed)) throw new RangeError(`${WHERE}: randomSeed must be an integer, got ${String(randomSeed)}`);
  const s = normaliseSeeds(WHERE, index, seeds);
  const walk = new Walk(index, options);
  const ws = workspaceFor(walk.csr);
  try {
    const push = pushInto(walk, s.nodes, s.weights, alpha, epsilon, maxWork, ws);
    const walks = options.walks ?? (push.complete ? 0 : DEFAULTS.walksWhenCut);
    const { p, q } = ws;
    const mu = walk.measure;
    let residualSum = 0;
    let steps = 0;
    let done = 0;
    if (walks > 0) {
      // the residual's nodes in first-touch order (deterministic), duplicates skipped
      const residualNodes = new Int32Array(ws.touchedCount);
      let rn = 0;
      for (let i = 0; i < ws.touchedCount; i++) {
        const v = ws.touched[i]!;
        if (ws.mark[v] === 1 || q[v] === 0) continue;
        ws.mark[v] = 1;
        residualNodes[rn++] = v;
        residualSum += q[v]! * mu[v]!;
      }
      for (let i = 0; i < rn; i++) ws.mark[residualNodes[i]!] = 0;
      if (residualSum > 0) {
        const random = mulberry32(randomSeed);
        const share = residualSum / walks;
        let next = random() * share; // systematic sampling grid: next, next + share, …
        let acc = 0;
        const ends = new Int32Array(walks);
        for (let i = 0; i < rn && done < walks; i++) {
          const u = residualNodes[i]!;
          const ru = q[u]! * mu[u]!;
          if (ru === 0) continue;
          acc += ru;
          while (next < acc && done < walks) {
            next += share;
            let cur = u;
            while (random() >= alpha) {
              const nx = walk.step(cur, random);
              steps++;
              if (nx >= 0) {
                cur = nx;
              } else {
                let x = random();
                let k = 0;
                while (k < s.nodes.length - 1 && x >= s.weights[k]!) x -= s.weights[k++]!;
                cur = s.nodes[k]!;
              }
            }
            ends[done++] = cur;
          }
        }
        for (let i = 0; i < done; i++) {
          const v = ends[i]!;
          if (p[v] === 0 && q[v] === 0) ws.touch(v);
          if (p[v] === 0) ws.settle(v);
          p[v]! += share;
        }
      }
    }
    // the scores' nodes are those with p ≠ 0: the settled list (sorted), not the whole touched set
    const out = collect(ws.settledNodes(), p);
    // push only: the residual left (a statistic), by conservation of mass (push and dangling
    // steps move mass between p and r, the seeds' weights sum to 1): 1 − Σ p, read from the
    // settled nodes, not from the whole touched set
    if (walks === 0) {
      let settled = 0;
      for (let i = 0; i < out.scores.length; i++) settled += out.scores[i]!;
      residualSum = Math.max(0, 1 - settled);
    }
    return {
      nodes: out.nodes,
      scores: out.scores,
      stats: { pushes: push.pushes, work: push.work, residualSum, walks: done, steps, pushComplete: push.complete },
    };
  } finally {
    ws.reset();
  }
}

/**
 * Seeds and options shared by every personalized PageRank variant, with their checks.
 * The walk itself (relation weights, hub damping, dangling nodes) is defined in
 * transition.ts; this file only fixes the restart side.
 */
import type { RelationIndex } from "./relation-index.js";
import type { TransitionOptions } from "./transition.js";

/** Defaults shared by the PageRank variants. */
export const PPR_DEFAULTS = Object.freeze({
  /** Restart probability α (Page et al.'s damping factor is 1 − α = 0.85). */
  alpha: 0.15,
});

/** A restart node of a personalized PageRank and its (positive) weight; weights are normalised to sum 1. */
export interface Seed {
  readonly node: number;
  readonly weight: number;
}

/** Options of every PageRank variant; all optional. */
export interface PprOptions extends TransitionOptions {
  /** Restart probability α in (0, 1). @default 0.15 */
  readonly alpha?: number;
  /** Convergence tolerance (meaning per variant: L1 change for power iteration, residual threshold for push). */
  readonly tolerance?: number;
  /** Iteration cap of power iteration. */
  readonly maxIterations?: number;
}

/** Sparse scores: `nodes` ascending, `scores[i]` belongs to `nodes[i]`; nodes not listed score 0. */
export interface SparseScores {
  readonly nodes: Int32Array;
  readonly scores: Float64Array;
}

/** Checks α. @internal */
export function checkAlpha(where: string, alpha: number): number {
  if (typeof alpha !== "number" || !(alpha > 0 && alpha < 1)) throw new RangeError(`${where}: alpha (restart probability) must be in (0, 1), got ${String(alpha)}`);
  return alpha;
}

/** Checks a positive finite option. @internal */
export function checkPositive(where: string, name: string, v: number): number {
  if (typeof v !== "number" || !(v > 0) || !Number.isFinite(v)) throw new RangeError(`${where}: ${name} must be a positive finite number, got ${String(v)}`);
  return v;
}

/** Checks a positive integer option. @internal */
export function checkCount(where: string, name: string, v: number): number {
  if (!Number.isInteger(v) || v < 1) throw new RangeError(`${where}: ${name} must be a positive integer, got ${String(v)}`);
  return v;
}

/**
 * Checks seeds and merges duplicates: nodes ascending, weights summing to 1. @internal
 */
export function normaliseSeeds(where: string, index: RelationIndex, seeds: readonly Seed[]): { nodes: Int32Array; weights: Float64Array } {
  if (!Array.isArray(seeds) || seeds.length === 0) throw new RangeError(`${where}: at least one seed is needed`);
  const merged = new Map<number, number>();
  let total = 0;
  for (const s of seeds) {
    if (!Number.isInteger(s.node) || s.node < 0 || s.node >= index.nodeCount) throw new RangeError(`${where}: seed node ${String(s.node)} is not in 0..${index.nodeCount - 1}`);
    if (typeof s.weight !== "number" || !(s.weight > 0) || !Number.isFinite(s.weight)) throw new RangeError(`${where}: seed weight of node ${s.node} must be positive and finite, got ${String(s.weight)}`);
    merged.set(s.node, (merged.get(s.node) ?? 0) + s.weight);
    total += s.weight;
  }
  const keys = [...merged.keys()].sort((a, b) => a - b);
  const nodes = Int32Array.from(keys);
  const weights = Float64Array.from(keys, (k) => merged.get(k)! / total);
  return { nodes, weights };
}

/**
 * Salience: how well known an entity is in its catalog
 * ====================================================
 *
 * Global PageRank over the relation index (both directions of every stored edge, each
 * adjacency entry weighted 1, uniform teleport over the linked entities; no entity with edges is dangling), by power
 * iteration; then each entity's **salience percentile**: the share of linked entities (degree
 * > 0) whose PageRank is below its own, ties sharing the lower rank, so the best-known entity
 * has percentile 1 and the least known 0. Entities without edges get 0. Used to price clues by
 * how well known their entities are (explain's clue cost, the compose stage).
 *
 * Unlike the question walk (transition.ts) there are no relation weights and no hub damping:
 * salience is meant to favour hubs. The result depends only on the index and is computed once
 * per index (kept in a WeakMap).
 *
 * [Reference] Page, Brin, Motwani & Winograd, "The PageRank citation ranking: bringing order
 * to the web", Stanford InfoLab 1999 (damping 0.85, uniform teleport; power iteration).
 */
import { csrOf, type RelationIndex } from "./relation-index.js";

/** Defaults of {@link salienceOf}. */
export const DEFAULTS = Object.freeze({
  /** Damping factor (follow probability) of Page et al. */
  damping: 0.85,
  /** Stop when the L1 change of one iteration is below this (percentiles need ranks, not digits). */
  tolerance: 1e-6,
  /** Iteration cap (the error then is at most 0.85^k in L1; common practice). */
  maxIterations: 100,
});

/** Options of {@link salienceOf}; all optional. */
export interface SalienceOptions {
  /** @default 0.85 */
  readonly damping?: number;
  /** @default 1e-6 */
  readonly tolerance?: number;
  /** @default 100 */
  readonly maxIterations?: number;
}

/** Global PageRank and salience percentiles of every node. */
export interface Salience {
  /** PageRank per node id (sums to 1 over the nodes with edges; 0 without edges). */
  readonly pagerank: Float64Array;
  /** Salience percentile per node id in [0, 1] (1: the best known; 0 without edges). */
  readonly percentile: Float32Array;
  /** Power iterations used. */
  readonly iterations: number;
}

const cache = new WeakMap<RelationIndex, Salience>();

/** Takes `s` as the salience of `index` at the default options (read from the snapshot, snapshot.ts). */
export function adoptSalience(index: RelationIndex, s: Salience): void {
  cache.set(index, s);
}

/**
 * The salience of every node of `index` (computed on first use with the default options, then
 * kept). With `stop` (a question's time budget, asked after each power iteration) the
 * computation may end early: undefined then, and nothing is kept (a later call computes it again).
 */
export function salienceOf(index: RelationIndex, options?: SalienceOptions): Salience;
export function salienceOf(index: RelationIndex, options: SalienceOptions, stop: () => boolean): Salience | undefined;
export function salienceOf(index: RelationIndex, options: SalienceOptions = {}, stop?: () => boolean): Salience | undefined {
  const custom = options.damping !== undefined || options.tolerance !== undefined || options.maxIterations !== undefined;
  if (!custom) {
    const hit = cache.get(index);
    if (hit) return hit;
  }
  const damping = options.damping ?? DEFAULTS.damping;
  if (!(damping > 0 && damping < 1)) throw new RangeError(`ranking/salience: damping must be in (0, 1), got ${String(damping)}`);
  const tolerance = options.tolerance ?? DEFAULTS.tolerance;
  const maxIterations = options.maxIterations ?? DEFAULTS.maxIterations;
  const { offsets, targets } = csrOf(index);
  const n = index.nodeCount;
  // the linked nodes (with edges) only: every loop runs over them, so an index whose edges
  // touch a few of its nodes (an attached catalog's pulled neighbourhood) costs by its edges,
  // not by its node count; the others keep PageRank 0 and percentile 0
  let linked = 0;
  for (let u = 0; u < n; u++) if (offsets[u + 1]! > offsets[u]!) linked++;
  const nodes = new Int32Array(linked);
  for (let u = 0, k = 0; u < n; u++) if (offsets[u + 1]! > offsets[u]!) nodes[k++] = u;
  let x = new Float64Array(n);
  let y = new Float64Array(n);
  // x[u] / deg(u), once per iteration, so the pull loop reads one array at random
  const share = new Float64Array(n);
  const inv = new Float64Array(n);
  for (const u of nodes) inv[u] = 1 / (offsets[u + 1]! - offsets[u]!);
  let iterations = 0;
  if (linked > 0) {
    for (const u of nodes) x[u] = 1 / linked;
    for (; iterations < maxIterations; ) {
      iterations++;
      for (const u of nodes) share[u] = x[u]! * inv[u]!;
      // pull form over the symmetric adjacency: y[v] = Σ_{u ~ v} x[u] / deg(u)
      const teleport = (1 - damping) / linked;
      let change = 0;
      for (const v of nodes) {
        const s = offsets[v]!;
        const e = offsets[v + 1]!;
        let sum = 0;
        for (let i = s; i < e; i++) sum += share[targets[i]!]!;
        const nv = teleport + damping * sum;
        change += Math.abs(nv - x[v]!);
        y[v] = nv;
      }
      const t = x;
      x = y;
      y = t;
      if (change < tolerance) break;
      if (stop?.()) return undefined;
    }
  }
  const pr = x;
  // percentile = (linked entities with a strictly smaller PageRank) / (linked − 1): a native
  // sort of the values, then a binary search per entity (ties share the lower rank)
  const values = new Float64Array(linked);
  for (let k = 0; k < linked; k++) values[k] = pr[nodes[k]!]!;
  values.sort();
  const percentile = new Float32Array(n);
  const denom = Math.max(linked - 1, 1);
  for (const u of nodes) {
    const v = pr[u]!;
    let lo = 0;
    let hi = linked;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (values[mid]! < v) lo = mid + 1;
      else hi = mid;
    }
    percentile[u] = linked === 1 ? 1 : lo / denom;
  }
  const out: Salience = { pagerank: pr, percentile, iterations };
  if (!custom) cache.set(index, out);
  return out;
}

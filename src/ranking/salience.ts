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
  /** Stop when the L1 change of one iteration is below this. */
  tolerance: 1e-9,
  /** Iteration cap (the error then is at most 0.85^k in L1; common practice). */
  maxIterations: 100,
});

/** Options of {@link salienceOf}; all optional. */
export interface SalienceOptions {
  /** @default 0.85 */
  readonly damping?: number;
  /** @default 1e-9 */
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

/** The salience of every node of `index` (computed on first use with the default options, then kept). */
export function salienceOf(index: RelationIndex, options: SalienceOptions = {}): Salience {
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
  let linked = 0;
  for (let u = 0; u < n; u++) if (offsets[u + 1]! > offsets[u]!) linked++;
  let x = new Float64Array(n);
  let y = new Float64Array(n);
  let iterations = 0;
  if (linked > 0) {
    for (let u = 0; u < n; u++) if (offsets[u + 1]! > offsets[u]!) x[u] = 1 / linked;
    for (; iterations < maxIterations; ) {
      iterations++;
      y.fill(0);
      // pull form over the symmetric adjacency: y[v] = Σ_{u ~ v} x[u] / deg(u)
      for (let v = 0; v < n; v++) {
        const s = offsets[v]!;
        const e = offsets[v + 1]!;
        let sum = 0;
        for (let i = s; i < e; i++) {
          const u = targets[i]!;
          sum += x[u]! / (offsets[u + 1]! - offsets[u]!);
        }
        y[v] = sum;
      }
      const teleport = (1 - damping) / linked;
      let change = 0;
      for (let v = 0; v < n; v++) {
        if (offsets[v + 1]! === offsets[v]!) continue;
        const nv = teleport + damping * y[v]!;
        change += Math.abs(nv - x[v]!);
        y[v] = nv;
      }
      const t = x;
      x = y;
      y = t;
      if (change < tolerance) break;
    }
  }
  const pr = x;
  const order: number[] = [];
  for (let u = 0; u < n; u++) if (offsets[u + 1]! > offsets[u]!) order.push(u);
  order.sort((a, b) => pr[a]! - pr[b]! || a - b);
  const percentile = new Float32Array(n);
  const denom = Math.max(order.length - 1, 1);
  for (let i = 0; i < order.length; ) {
    let j = i;
    while (j + 1 < order.length && pr[order[j + 1]!] === pr[order[i]!]) j++;
    for (let k = i; k <= j; k++) percentile[order[k]!] = order.length === 1 ? 1 : i / denom;
    i = j + 1;
  }
  const out: Salience = { pagerank: pr, percentile, iterations };
  if (!custom) cache.set(index, out);
  return out;
}

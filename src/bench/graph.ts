/**
 * Seeded power-law edge generator for the PageRank benchmarks (Chung–Lu model).
 *
 * Node i gets expected degree ∝ (i + i₀)^(−1/(γ − 1)) (γ = 2.3 by default, a typical
 * exponent of real knowledge graphs' degree distributions, from memory); each edge picks
 * its two ends independently by that weight, and a relation from a Zipf(1) law over
 * `relations` ids. Self-loops are re-drawn; duplicates are dropped.
 *
 * [Reference]: Chung & Lu, "Connected components in random graphs with given expected
 * degree sequences", Annals of Combinatorics 6, 2002.
 */

import { mulberry32 } from "../ranking/index.js";

/** Defaults of {@link powerLawEdges}. */
export const DEFAULTS = Object.freeze({ gamma: 2.3, relations: 24, seed: 42 });

/** Generated edges as flat arrays (node ids from 1, relation ids from 1). */
export interface GeneratedEdges {
  readonly nodeCount: number;
  readonly relationCount: number;
  readonly src: Int32Array;
  readonly rel: Int32Array;
  readonly dst: Int32Array;
}

/** `edges` distinct edges over nodes 1..nodes. */
export function powerLawEdges(nodes: number, edges: number, options: { gamma?: number; relations?: number; seed?: number } = {}): GeneratedEdges {
  const gamma = options.gamma ?? DEFAULTS.gamma;
  const relations = options.relations ?? DEFAULTS.relations;
  const random = mulberry32(options.seed ?? DEFAULTS.seed);
  const expo = -1 / (gamma - 1);
  const cum = new Float64Array(nodes);
  let t = 0;
  for (let i = 0; i < nodes; i++) {
    t += Math.pow(i + 10, expo);
    cum[i] = t;
  }
  const pick = () => {
    const x = random() * t;
    let lo = 0;
    let hi = nodes - 1;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (cum[mid]! > x) hi = mid;
      else lo = mid + 1;
    }
    return lo + 1;
  };
  const rcum = new Float64Array(relations);
  let rt = 0;
  for (let r = 0; r < relations; r++) {
    rt += 1 / (r + 1);
    rcum[r] = rt;
  }
  const pickRel = () => {
    const x = random() * rt;
    let r = 0;
    while (rcum[r]! <= x) r++;
    return r + 1;
  };
  const seen = new Set<number>();
  const src = new Int32Array(edges);
  const rel = new Int32Array(edges);
  const dst = new Int32Array(edges);
  let k = 0;
  let guard = 0;
  while (k < edges && guard++ < edges * 20) {
    const a = pick();
    const b = pick();
    if (a === b) continue;
    const r = pickRel();
    const key = (a * (nodes + 1) + b) * (relations + 1) + r;
    if (seen.has(key)) continue;
    seen.add(key);
    src[k] = a;
    rel[k] = r;
    dst[k] = b;
    k++;
  }
  return { nodeCount: nodes + 1, relationCount: relations + 1, src: src.subarray(0, k), rel: rel.subarray(0, k), dst: dst.subarray(0, k) };
}

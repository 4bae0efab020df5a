/**
 * Bounded bidirectional breadth-first search
 * ==========================================
 *
 * A fewest-hops path between two nodes of the full relation index, for the long paths the
 * evidence subgraph does not hold: two breadth-first frontiers grow alternately (the smaller
 * one first) from the source and from the target until they meet, the total depth reaches
 * `maxHops`, or the visited-node budget is spent. Both stored directions are walkable. Among
 * the adjacency entries joining two consecutive nodes of the path, the cheapest step under
 * the path cost model is reported.
 *
 * [Reference]
 * Pohl, "Bi-directional Search", Machine Intelligence 6, 1971 (the bidirectional scheme);
 * Moore 1959 (breadth-first search).
 */
import type { PathCostModel } from "./path-cost.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link bidirectionalBfs}; all optional. */
export interface BfsOptions {
  /** Longest path searched, in hops. @default 6 */
  readonly maxHops?: number;
  /** Most nodes visited by both frontiers together. @default 200000 */
  readonly nodeBudget?: number;
}

/** The defaults of {@link BfsOptions}. */
export const DEFAULTS = { maxHops: 6, nodeBudget: 200000 } as const;

/** One step of a found path (entity nums). */
export interface NumStep {
  readonly from: number;
  readonly to: number;
  readonly rel: number;
  readonly inverse: boolean;
  readonly cost: number;
}

/** The cheapest single step u → v (both directions of stored edges), or undefined. */
export function cheapestStep(graph: WalkGraph, cost: PathCostModel, u: number, v: number): NumStep | undefined {
  let best: NumStep | undefined;
  graph.forEach(u, (w, rel, inverse) => {
    if (w !== v) return;
    const c = cost.stepCost(u, v, rel, inverse);
    if (best === undefined || c < best.cost || (c === best.cost && (rel < best.rel || (rel === best.rel && !inverse && best.inverse)))) {
      best = { from: u, to: v, rel, inverse, cost: c };
    }
  });
  return best;
}

/**
 * A fewest-hops path `source → target` as steps, `[]` when source = target, or null when none
 * is found within the bounds. Expansion order follows the index's adjacency order, so the
 * result is deterministic.
 */
export function bidirectionalBfs(graph: WalkGraph, cost: PathCostModel, source: number, target: number, options: BfsOptions = {}): NumStep[] | null {
  const maxHops = options.maxHops ?? DEFAULTS.maxHops;
  const budget = options.nodeBudget ?? DEFAULTS.nodeBudget;
  if (source === target) return [];
  const parentF = new Map<number, number>([[source, -1]]);
  const parentB = new Map<number, number>([[target, -1]]);
  let frontF = [source];
  let frontB = [target];
  let depth = 0;
  let meet = -1;
  while (depth < maxHops && frontF.length > 0 && frontB.length > 0 && parentF.size + parentB.size < budget) {
    const forward = frontF.length <= frontB.length;
    const front = forward ? frontF : frontB;
    const mine = forward ? parentF : parentB;
    const other = forward ? parentB : parentF;
    const next: number[] = [];
    for (const u of front) {
      graph.forEach(u, (v) => {
        if (meet >= 0 || mine.has(v)) return;
        mine.set(v, u);
        if (other.has(v)) meet = v;
        else next.push(v);
      });
      if (meet >= 0) break;
    }
    depth++;
    if (meet >= 0) break;
    if (forward) frontF = next;
    else frontB = next;
  }
  if (meet < 0) return null;
  const nodes: number[] = [];
  for (let x = meet; x !== -1; x = parentF.get(x)!) nodes.unshift(x);
  for (let x = parentB.get(meet)!; x !== -1; x = parentB.get(x)!) nodes.push(x);
  const steps: NumStep[] = [];
  for (let i = 0; i + 1 < nodes.length; i++) {
    const s = cheapestStep(graph, cost, nodes[i]!, nodes[i + 1]!);
    if (!s) return null;
    steps.push(s);
  }
  return steps;
}

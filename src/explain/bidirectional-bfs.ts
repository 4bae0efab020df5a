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
 * Bounds: besides `maxHops` and the visited-node budget, a budget of scanned adjacency
 * entries (`workBudget`), and within each frontier the hubs (degree above `hubLimit`) are
 * expanded after every other node, so a meeting through small nodes is found before a hub's
 * long list is read. Parents live in per-graph stamped arrays (scratch.ts), not maps.
 *
 * [Reference]
 * Pohl, "Bi-directional Search", Machine Intelligence 6, 1971 (the bidirectional scheme);
 * Moore 1959 (breadth-first search).
 */
import { linkInverse, linkRelation } from "../ranking/index.js";
import type { PathCostModel } from "./path-cost.js";
import { scratch } from "./scratch.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link bidirectionalBfs}; all optional. */
export interface BfsOptions {
  /** Longest path searched, in hops. @default 6 */
  readonly maxHops?: number;
  /** Most nodes visited by both frontiers together. @default 200000 */
  readonly nodeBudget?: number;
  /** Most adjacency entries scanned by both frontiers together. @default 1000000 */
  readonly workBudget?: number;
  /** Nodes of larger degree are expanded last within their frontier. @default 2000 */
  readonly hubLimit?: number;
}

/** The defaults of {@link BfsOptions}. */
export const DEFAULTS = { maxHops: 6, nodeBudget: 200000, workBudget: 1000000, hubLimit: 2000 } as const;

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
  const walk = cost.flatWalk();
  if (walk !== undefined && u >= 0 && u < graph.nodeCount) {
    // one pass over u's row (a hub's row is long): the walk's probability per (relation,
    // direction) of the entries to v, summed in index order as the cost model's row is
    const { offsets, targets, links } = walk.rows;
    const total = walk.rowTotal(u);
    const keys: number[] = [];
    const ps: number[] = [];
    for (let e = offsets[u]!, end = offsets[u + 1]!; e < end; e++) {
      if (targets[e] !== v) continue;
      const l = links[e]!;
      const p = total > 0 ? walk.weight(e) / total : 0;
      const i = keys.indexOf(l);
      if (i < 0) {
        keys.push(l);
        ps.push(p);
      } else ps[i]! += p;
    }
    let found: NumStep | undefined;
    for (let i = 0; i < keys.length; i++) {
      const rel = linkRelation(keys[i]!);
      const inverse = linkInverse(keys[i]!);
      const c = ps[i]! > 0 ? cost.hopCost - Math.log(ps[i]!) : Infinity;
      if (found === undefined || c < found.cost || (c === found.cost && (rel < found.rel || (rel === found.rel && !inverse && found.inverse)))) {
        found = { from: u, to: v, rel, inverse, cost: c };
      }
    }
    return found;
  }
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
  const workBudget = options.workBudget ?? DEFAULTS.workBudget;
  const hubLimit = options.hubLimit ?? DEFAULTS.hubLimit;
  if (source === target) return [];
  if (!(source >= 0 && source < graph.nodeCount && target >= 0 && target < graph.nodeCount)) return null;
  // parent + 1 (0 = a root) in two stamped arrays
  const parentF = scratch(graph, 3);
  const parentB = scratch(graph, 4);
  parentF.set(source, 0);
  parentB.set(target, 0);
  let visited = 2;
  let work = 0;
  let frontF = [source];
  let frontB = [target];
  let depth = 0;
  let meet = -1;
  while (depth < maxHops && frontF.length > 0 && frontB.length > 0 && visited < budget && work < workBudget) {
    const forward = frontF.length <= frontB.length;
    const front = forward ? frontF : frontB;
    const mine = forward ? parentF : parentB;
    const other = forward ? parentB : parentF;
    const next: number[] = [];
    const hubs: number[] = [];
    const expand = (u: number) => {
      work += graph.degree(u);
      graph.forEach(u, (v) => {
        if (meet >= 0 || mine.has(v)) return;
        mine.set(v, u + 1);
        visited++;
        if (other.has(v)) meet = v;
        else next.push(v);
      });
    };
    for (const u of front) {
      if (graph.degree(u) > hubLimit) hubs.push(u);
      else expand(u);
      if (meet >= 0 || work >= workBudget) break;
    }
    for (const u of hubs) {
      if (meet >= 0 || work >= workBudget) break;
      expand(u);
    }
    depth++;
    if (meet >= 0) break;
    if (work >= workBudget) break;
    if (forward) frontF = next;
    else frontB = next;
  }
  if (meet < 0) return null;
  const nodes: number[] = [];
  for (let x = meet; x !== -1; x = parentF.get(x) - 1) nodes.unshift(x);
  for (let x = parentB.get(meet) - 1; x !== -1; x = parentB.get(x) - 1) nodes.push(x);
  const steps: NumStep[] = [];
  for (let i = 0; i + 1 < nodes.length; i++) {
    const s = cheapestStep(graph, cost, nodes[i]!, nodes[i + 1]!);
    if (!s) return null;
    steps.push(s);
  }
  return steps;
}

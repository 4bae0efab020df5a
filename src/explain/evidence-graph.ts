/**
 * Evidence subgraph
 * =================
 *
 * The part of the relation graph that can explain the answers: every node that lies on some
 * walk of at most `maxHops` steps from a clue to one of the top answers, found by a
 * breadth-first search from each clue and from each answer (a node x is kept when
 * min_c dist(c, x) + min_a dist(x, a) ≤ maxHops), and every adjacency entry between kept
 * nodes. It becomes a graphology `DirectedGraph` (node key = entity num as a string) with one
 * edge per ordered node pair: the cheapest step between them under the path cost model, its
 * relation and direction kept as edge attributes. Both stored directions are walkable, so a
 * stored triple `a r b` gives the edge a→b (inverse false) and b→a (inverse true).
 *
 * [Reference]
 * Breadth-first search: Moore, "The shortest path through a maze", 1959. Restricting a
 * k-shortest-path search to the union of bounded balls around both endpoints is common
 * practice (it is exactly the set of nodes on walks of length ≤ maxHops).
 *
 * Hubs (degree above `hubLimit`) are kept as nodes but not expanded, and each search stops
 * after `nodeBudget` nodes, so the subgraph stays small on a million-entity catalog; paths
 * the subgraph misses are left to the bounded bidirectional search on the full index.
 */
import { DirectedGraph } from "graphology";
import type { PathCostModel } from "./path-cost.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link buildEvidenceGraph}; all optional. */
export interface EvidenceOptions {
  /** Longest clue-to-answer walk the subgraph must contain. @default 4 */
  readonly maxHops?: number;
  /** Nodes of larger degree are not expanded (the endpoints always are). @default 2000 */
  readonly hubLimit?: number;
  /** Most nodes one breadth-first search visits. @default 50000 */
  readonly nodeBudget?: number;
}

/** The defaults of {@link EvidenceOptions}. */
export const DEFAULTS = { maxHops: 4, hubLimit: 2000, nodeBudget: 50000 } as const;

/** Attributes of an evidence edge. */
export interface EvidenceEdge {
  /** Path cost of the step (see path-cost.ts). */
  readonly cost: number;
  /** Relation num. */
  readonly rel: number;
  /** True when the stored triple is `target rel source`. */
  readonly inverse: boolean;
}

/** Hop distances from `start` up to `maxHops`. */
export function bfsDistances(graph: WalkGraph, start: number, maxHops: number, hubLimit: number, nodeBudget: number): Map<number, number> {
  const dist = new Map<number, number>([[start, 0]]);
  let frontier = [start];
  for (let d = 1; d <= maxHops && frontier.length > 0 && dist.size < nodeBudget; d++) {
    const next: number[] = [];
    for (const u of frontier) {
      if (u !== start && graph.degree(u) > hubLimit) continue;
      graph.forEach(u, (v) => {
        if (!dist.has(v) && dist.size < nodeBudget) {
          dist.set(v, d);
          next.push(v);
        }
      });
    }
    frontier = next;
  }
  return dist;
}

/**
 * Builds the evidence subgraph for `clues` and `answers` (entity nums).
 * Node iteration and edge insertion follow ascending node num, so the graph is deterministic.
 */
export function buildEvidenceGraph(
  graph: WalkGraph,
  cost: PathCostModel,
  clues: readonly number[],
  answers: readonly number[],
  options: EvidenceOptions = {},
): DirectedGraph<Record<string, never>, EvidenceEdge> {
  const maxHops = options.maxHops ?? DEFAULTS.maxHops;
  const hubLimit = options.hubLimit ?? DEFAULTS.hubLimit;
  const nodeBudget = options.nodeBudget ?? DEFAULTS.nodeBudget;
  if (!Number.isInteger(maxHops) || maxHops < 1) throw new RangeError(`explain/evidence-graph: maxHops must be a positive integer, got ${maxHops}`);
  const minDist = (starts: readonly number[]): Map<number, number> => {
    const best = new Map<number, number>();
    for (const s of new Set(starts)) {
      for (const [x, d] of bfsDistances(graph, s, maxHops, hubLimit, nodeBudget)) {
        const b = best.get(x);
        if (b === undefined || d < b) best.set(x, d);
      }
    }
    return best;
  };
  const fromClues = minDist(clues);
  const toAnswers = minDist(answers);
  const keep: number[] = [];
  for (const [x, dc] of fromClues) {
    const da = toAnswers.get(x);
    if (da !== undefined && dc + da <= maxHops) keep.push(x);
  }
  for (const x of [...clues, ...answers]) if (!fromClues.has(x) || !toAnswers.has(x)) keep.push(x);
  const nodes = [...new Set(keep)].sort((a, b) => a - b);
  const kept = new Set(nodes);
  const g = new DirectedGraph<Record<string, never>, EvidenceEdge>();
  for (const u of nodes) g.addNode(String(u));
  for (const u of nodes) {
    const best = new Map<number, EvidenceEdge>();
    graph.forEach(u, (v, rel, inverse) => {
      if (v === u || !kept.has(v)) return;
      const c = cost.stepCost(u, v, rel, inverse);
      if (!Number.isFinite(c)) return;
      const b = best.get(v);
      if (b === undefined || c < b.cost || (c === b.cost && (rel < b.rel || (rel === b.rel && !inverse && b.inverse)))) {
        best.set(v, { cost: c, rel, inverse });
      }
    });
    for (const v of [...best.keys()].sort((a, b) => a - b)) g.addEdge(String(u), String(v), best.get(v)!);
  }
  return g;
}

/**
 * Clue-to-answer paths
 * ====================
 *
 * For one question: the cheapest path from every clue to every top answer under the path
 * cost model (single-source Dijkstra per clue on the evidence subgraph), up to `k`
 * alternative loopless paths per clue for the first `alternativesFor` answers (Yen 1971 on
 * the same subgraph), and, when the subgraph holds no path, a fewest-hops path on the full
 * index (bounded bidirectional BFS). A path longer than `maxHops` counts as not reached.
 *
 * A clue may restart the walk at several seeds (its linked entity and, when the link is
 * unsure, its alternatives, as the ranking does). Each clue gets a virtual source node with
 * one edge to each seed costing −ln(seed share), so Dijkstra and Yen pick the seed and the
 * path together: the cheapest path is still the walk carrying the most of the score.
 *
 * [Reference]
 * Dijkstra, "A note on two problems in connexion with graphs", Numerische Mathematik 1, 1959
 * (graphology-shortest-path's implementation); Yen 1971 (yen.ts); Pohl 1971
 * (bidirectional-bfs.ts).
 */
import dijkstra from "graphology-shortest-path/dijkstra.js";
import type { DirectedGraph } from "graphology";
import { bidirectionalBfs, type NumStep } from "./bidirectional-bfs.js";
import { buildEvidenceGraph, type EvidenceEdge } from "./evidence-graph.js";
import type { PathCostModel } from "./path-cost.js";
import type { WalkGraph } from "./types.js";
import { yenKShortestPaths } from "./yen.js";

/** Options of {@link findPaths}; all optional. */
export interface PathOptions {
  /** Alternative paths per clue (beyond the best one). @default 2 */
  readonly alternatives?: number;
  /** An alternative may have at most this many hops more than the best path. @default 2 */
  readonly alternativeSlack?: number;
  /** How many of the answers (best first) get alternatives. @default 3 */
  readonly alternativesFor?: number;
  /** Longest walk the evidence subgraph holds. @default 4 */
  readonly evidenceHops?: number;
  /** Longest path at all ("not reached within N hops" beyond it). @default 6 */
  readonly maxHops?: number;
  /** Hubs above this degree are not expanded when building the evidence subgraph. @default 2000 */
  readonly hubLimit?: number;
  /** Node budget of each breadth-first search. @default 50000 */
  readonly nodeBudget?: number;
}

/** The defaults of {@link PathOptions}. */
export const DEFAULTS = { alternatives: 2, alternativeSlack: 2, alternativesFor: 3, evidenceHops: 4, maxHops: 6, hubLimit: 2000, nodeBudget: 50000 } as const;

/** A restart node of a clue and its weight (shares are normalised per clue). */
export interface ClueSeed {
  readonly node: number;
  readonly weight: number;
}

/** A found path between entity nums. */
export interface NumPath {
  /** Index of the clue in the clue list. */
  readonly clue: number;
  /** The seed the path starts at (the clue's entity or one of its seeded alternatives). */
  readonly start: number;
  readonly answer: number;
  readonly steps: readonly NumStep[];
  /** Sum of step costs (−ln of the walk's probability mass along the path). */
  readonly cost: number;
  /** Where it was found: the evidence subgraph or the full-index fallback. */
  readonly via: "evidence" | "fallback";
}

/** Paths of one answer: per clue, best first (empty when not reached within maxHops). */
export interface AnswerPaths {
  readonly answer: number;
  readonly byClue: readonly (readonly NumPath[])[];
}

/** All paths of one question plus the evidence subgraph they were searched on. */
export interface PathSet {
  readonly answers: readonly AnswerPaths[];
  readonly evidence: DirectedGraph<Record<string, never>, EvidenceEdge>;
  readonly maxHops: number;
}

function stepsOf(g: DirectedGraph<Record<string, never>, EvidenceEdge>, nodes: readonly string[]): NumStep[] {
  const steps: NumStep[] = [];
  for (let i = 0; i + 1 < nodes.length; i++) {
    const e = g.edge(nodes[i]!, nodes[i + 1]!)!;
    const a = g.getEdgeAttributes(e);
    steps.push({ from: Number(nodes[i]), to: Number(nodes[i + 1]), rel: a.rel, inverse: a.inverse, cost: a.cost });
  }
  return steps;
}

const sum = (steps: readonly NumStep[]): number => steps.reduce((s, x) => s + x.cost, 0);

const VIRTUAL = "clue#";

/**
 * Finds the paths from each clue (a list of seeds per clue, in clue order; a single seed
 * of weight 1 is the plain case) to each answer (best first).
 */
export function findPaths(graph: WalkGraph, cost: PathCostModel, clues: readonly (readonly ClueSeed[])[], answers: readonly number[], options: PathOptions = {}): PathSet {
  const o = { ...DEFAULTS, ...options };
  const allSeeds = [...new Set(clues.flatMap((c) => c.map((s) => s.node)))];
  const evidence = buildEvidenceGraph(graph, cost, allSeeds, answers, { maxHops: o.evidenceHops, hubLimit: o.hubLimit, nodeBudget: o.nodeBudget });
  clues.forEach((seeds, ci) => {
    const v = `${VIRTUAL}${ci}`;
    evidence.addNode(v);
    const total = seeds.reduce((t, s) => t + Math.max(0, s.weight), 0);
    for (const s of seeds) {
      if (!(s.weight > 0) || !evidence.hasNode(String(s.node)) || evidence.hasEdge(v, String(s.node))) continue;
      evidence.addEdge(v, String(s.node), { cost: -Math.log(s.weight / total), rel: -1, inverse: false });
    }
  });
  const offset = (ci: number, start: number): number => {
    const e = evidence.edge(`${VIRTUAL}${ci}`, String(start));
    return e === undefined ? 0 : evidence.getEdgeAttribute(e, "cost");
  };
  const single = clues.map((_, ci) => dijkstra.singleSource(evidence, `${VIRTUAL}${ci}`, "cost") as Record<string, string[]>);
  const out: AnswerPaths[] = answers.map((a, ai) => {
    const byClue = clues.map((seeds, ci): NumPath[] => {
      if (seeds.some((s) => s.node === a)) return [];
      const paths: NumPath[] = [];
      const add = (nodes: readonly string[]) => {
        const start = Number(nodes[1]);
        const steps = stepsOf(evidence, nodes.slice(1));
        if (steps.length > 0) paths.push({ clue: ci, start, answer: a, steps, cost: sum(steps) + offset(ci, start), via: "evidence" });
      };
      if (ai < o.alternativesFor && o.alternatives > 0) {
        for (const p of yenKShortestPaths(evidence, `${VIRTUAL}${ci}`, String(a), { k: o.alternatives + 1 })) add(p.nodes);
      } else {
        const nodes = single[ci]![String(a)];
        if (nodes) add(nodes);
      }
      if (paths.length === 0) {
        let best: NumPath | undefined;
        for (const s of seeds) {
          const steps = bidirectionalBfs(graph, cost, s.node, a, { maxHops: o.maxHops, nodeBudget: o.nodeBudget * 4 });
          if (!steps || steps.length === 0) continue;
          const c = sum(steps) + offset(ci, s.node);
          if (!best || c < best.cost) best = { clue: ci, start: s.node, answer: a, steps, cost: c, via: "fallback" };
        }
        if (best) paths.push(best);
      }
      const bestHops = paths[0]?.steps.length ?? 0;
      return paths.filter((p, i) => p.steps.length <= o.maxHops && (i === 0 || p.steps.length <= bestHops + o.alternativeSlack));
    });
    return { answer: a, byClue };
  });
  for (let ci = 0; ci < clues.length; ci++) evidence.dropNode(`${VIRTUAL}${ci}`);
  return { answers: out, evidence, maxHops: o.maxHops };
}

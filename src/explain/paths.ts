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
 * When the ranking matched the question's reading for a clue (ranking `Ranked.patterns`), the
 * path along that pattern to each answer (pattern-path.ts: the cheapest walk taking the
 * reading's relations hop by hop, in their directions, through entities of the hops' types) is
 * the clue's *lead* path, shown before the others: the explanation follows the structure the
 * question was read as. The cheapest path stays the walk's evidence (the verdict reads it).
 *
 * A clue may restart the walk at several seeds (its linked entity and, when the link is
 * unsure, its alternatives, as the ranking does). Each clue gets a virtual source node with
 * one edge to each seed costing −ln(seed share), so Dijkstra and Yen pick the seed and the
 * path together: the cheapest path is still the walk carrying the most of the score.
 *
 * [Reference]
 * Dijkstra, "A note on two problems in connexion with graphs", Numerische Mathematik 1, 1959
 * (dijkstra.ts, on the compact evidence subgraph); Yen 1971 (yen.ts, yenOnArcs); Pohl 1971
 * (bidirectional-bfs.ts).
 */
import type { Deadline } from "../model/index.js";
import { bidirectionalBfs, type NumStep } from "./bidirectional-bfs.js";
import { arcsTo, dijkstra, DijkstraScratch, type ShortestPathTree } from "./dijkstra.js";
import { evidenceSubgraph, type EvidenceSubgraph } from "./evidence-graph.js";
import type { PathCostModel } from "./path-cost.js";
import { patternWalks, relaxations, type PatternWalks } from "./pattern-path.js";
import type { ExplainPattern, WalkGraph } from "./types.js";
import { yenOnArcs } from "./yen.js";

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
  /** Adjacency entries each side of the evidence search may scan. @default 10000 */
  readonly workBudget?: number;
  /** Most nodes of the evidence subgraph besides clues and answers. @default 400 */
  readonly maxNodes?: number;
  /** Adjacency entries one fallback search (full index) may scan. @default 100000 */
  readonly fallbackWork?: number;
  /**
   * Per clue: the reading's relation-path pattern the ranking matched (ranking
   * `Ranked.patterns`); the path along it, when one reaches the answer, leads the clue's
   * paths. @default none
   */
  readonly patterns?: readonly (ExplainPattern | undefined)[];
  /** True when the ranking found `answer` off clue `clue`'s pattern even loosely (ranking `chainMissOf`): no lead path is searched. @default never */
  readonly offPattern?: (clue: number, answer: number) => boolean;
  /** Adjacency entries the layers of one pattern may scan (pattern-path.ts). @default 200000 */
  readonly patternWork?: number;
}

/** The defaults of {@link PathOptions}. */
export const DEFAULTS = {
  alternatives: 2,
  alternativeSlack: 2,
  alternativesFor: 3,
  evidenceHops: 4,
  maxHops: 6,
  hubLimit: 2000,
  nodeBudget: 50000,
  workBudget: 10000,
  maxNodes: 400,
  fallbackWork: 100000,
  patternWork: 200000,
} as const;

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
  /** Where it was found: the evidence subgraph, the full-index fallback, or along the reading's pattern. */
  readonly via: "evidence" | "fallback" | "reading";
}

/** Paths of one answer: per clue, best first (empty when not reached within maxHops). */
export interface AnswerPaths {
  readonly answer: number;
  /** Per clue: the cheapest path first (the walk's evidence), then the alternatives. */
  readonly byClue: readonly (readonly NumPath[])[];
  /**
   * Per clue: the paths as shown — the lead path along the reading's pattern first (when the
   * clue has one to this answer), then `byClue`'s others, at most `alternatives` + 1.
   */
  readonly shown: readonly (readonly NumPath[])[];
}

const sum = (steps: readonly NumStep[]): number => steps.reduce((s, x) => s + x.cost, 0);

/** All paths of one question plus the evidence subgraph they were searched on. */
export interface PathSet {
  readonly answers: readonly AnswerPaths[];
  /** The compact evidence subgraph (with one virtual source per clue). */
  readonly evidence: EvidenceSubgraph;
  readonly maxHops: number;
}

/**
 * Finds the paths from each clue (a list of seeds per clue, in clue order; a single seed
 * of weight 1 is the plain case) to each answer (best first).
 */
export function findPaths(
  graph: WalkGraph,
  cost: PathCostModel,
  clues: readonly (readonly ClueSeed[])[],
  answers: readonly number[],
  options: PathOptions = {},
  deadline?: Deadline,
): PathSet {
  const o = { ...DEFAULTS, ...options };
  const ev = evidenceSubgraph(graph, cost, clues, answers, {
    maxHops: o.evidenceHops,
    hubLimit: o.hubLimit,
    nodeBudget: o.nodeBudget,
    workBudget: o.workBudget,
    maxNodes: o.maxNodes,
    virtual: true,
  });
  const keyOf = (u: number): string => (u < ev.realCount ? String(ev.nums[u]) : `clue#${u - ev.realCount}`);
  const trees: (ShortestPathTree | undefined)[] = [];
  const treeOf = (ci: number): ShortestPathTree => (trees[ci] ??= dijkstra(ev, ev.virtualOf(ci)));
  // the spur searches of every Yen call on this subgraph share one set of arrays
  const spurScratch = new DijkstraScratch(ev);
  const toPath = (ci: number, a: number, arcs: readonly number[]): NumPath | undefined => {
    if (arcs.length < 2) return undefined;
    const start = ev.nums[ev.heads[arcs[0]!]!]!;
    const offset = ev.costs[arcs[0]!]!;
    const steps: NumStep[] = arcs.slice(1).map((e) => ({
      from: ev.nums[ev.tails[e]!]!,
      to: ev.nums[ev.heads[e]!]!,
      rel: ev.rels[e]!,
      inverse: ev.inverse[e] === 1,
      cost: ev.costs[e]!,
    }));
    return { clue: ci, start, answer: a, steps, cost: sum(steps) + offset, via: "evidence" };
  };
  // per clue, the layers of its pattern and of each relaxation, built when first asked
  const walks: (PatternWalks | null)[][] = clues.map(() => []);
  const leadOf = (ci: number, a: number): NumPath | undefined => {
    const pattern = o.patterns?.[ci];
    const start = clues[ci]![0]?.node;
    if (!pattern || start === undefined || o.offPattern?.(ci, a)) return undefined;
    const total = clues[ci]!.reduce((x, s) => x + s.weight, 0);
    const share = (clues[ci]!.find((s) => s.node === start)?.weight ?? 0) / (total > 0 ? total : 1);
    const tries = relaxations(pattern);
    for (let r = 0; r < tries.length; r++) {
      if (walks[ci]![r] === undefined) walks[ci]![r] = patternWalks(graph, cost, start, tries[r]!, { maxVisits: o.patternWork });
      const steps = walks[ci]![r]?.path(a);
      if (steps) return { clue: ci, start, answer: a, steps, cost: sum(steps) - Math.log(share > 0 ? share : 1), via: "reading" };
    }
    return undefined;
  };
  const same = (p: NumPath, q: NumPath) => p.start === q.start && p.steps.length === q.steps.length && p.steps.every((s, i) => s.to === q.steps[i]!.to && s.rel === q.steps[i]!.rel && s.inverse === q.steps[i]!.inverse);
  const out: AnswerPaths[] = answers.map((a, ai) => {
    // the time budget: the best answer always gets its paths, later ones none once it is spent
    if (ai > 0 && deadline?.stop("paths")) return { answer: a, byClue: clues.map(() => []), shown: clues.map(() => []) };
    const target = ev.localOf(a);
    const byClue = clues.map((seeds, ci): NumPath[] => {
      if (seeds.some((s) => s.node === a)) return [];
      const paths: NumPath[] = [];
      if (target >= 0) {
        // the time budget: once spent, the first answer keeps its cheapest path only (no alternatives)
        if (ai < o.alternativesFor && o.alternatives > 0 && !(ai === 0 && deadline?.stop("paths"))) {
          for (const p of yenOnArcs(ev, ev.virtualOf(ci), target, o.alternatives + 1, keyOf, spurScratch)) {
            const np = toPath(ci, a, p.arcs);
            if (np) paths.push(np);
          }
        } else {
          const arcs = arcsTo(ev, treeOf(ci), ev.virtualOf(ci), target);
          const np = arcs ? toPath(ci, a, arcs) : undefined;
          if (np) paths.push(np);
        }
      }
      if (paths.length === 0) {
        let best: NumPath | undefined;
        for (const s of seeds) {
          const steps = bidirectionalBfs(graph, cost, s.node, a, { maxHops: o.maxHops, nodeBudget: o.nodeBudget * 4, workBudget: o.fallbackWork, hubLimit: o.hubLimit });
          if (!steps || steps.length === 0) continue;
          const vl = ev.localOf(s.node);
          const e = vl >= 0 ? ev.arc(ev.virtualOf(ci), vl) : -1;
          const c = sum(steps) + (e >= 0 ? ev.costs[e]! : 0);
          if (!best || c < best.cost) best = { clue: ci, start: s.node, answer: a, steps, cost: c, via: "fallback" };
        }
        if (best) paths.push(best);
      }
      const bestHops = paths[0]?.steps.length ?? 0;
      return paths.filter((p, i) => p.steps.length <= o.maxHops && (i === 0 || p.steps.length <= bestHops + o.alternativeSlack));
    });
    const shown = byClue.map((paths, ci) => {
      const lead = clues[ci]!.some((s) => s.node === a) ? undefined : leadOf(ci, a);
      return lead ? [lead, ...paths.filter((p) => !same(p, lead))].slice(0, o.alternatives + 1) : paths;
    });
    return { answer: a, byClue, shown };
  });
  return { answers: out, evidence: ev, maxHops: o.maxHops };
}

/**
 * Paths along the reading's pattern
 * =================================
 *
 * The cheapest walk from a clue to an answer that follows a relation-path pattern hop by hop:
 * each hop takes one of its relations in its direction, and the node a hop reaches before the
 * last has the hop's types. With the pattern the ranking matched for the clue (ranking
 * `Ranked.patterns`, from the question's reading), this is the explanation's first path per
 * clue: the structure the question was read as, through the entities that satisfy it.
 *
 * Method: shortest path in the product of the graph and the pattern (one layer per hop; a
 * node is in layer h when h hops of the pattern reach it), solved layer by layer by dynamic
 * programming (Bellman 1957, "Dynamic Programming", the principle of optimality) — the
 * product construction of regular path query evaluation (Mendelzon & Wood 1995, "Finding
 * regular simple paths in graph databases", SIAM J. Comput. 24(6)) with the path cost model's
 * step costs (path-cost.ts), so among the walks on the pattern the one carrying the most of
 * the walk's mass is shown. The layers before the last hop are built once per clue. The last
 * hop costs each answer one read of its own row, its entries walked backwards, until those
 * reads would pass the last layer's rows: then it is taken forwards once for all answers (when
 * those rows fit in the budget). Both give the same path (the cheapest option, by the same
 * order; the backward read is the one used when that option walks a node twice), so a hub in
 * the last layer is read only when the answers' own rows cost more. A walk that comes
 * back to a node it passed is not shown (the best simple one is taken instead, when the last
 * hop offers one).
 */
import type { NumStep } from "./bidirectional-bfs.js";
import type { PathCostModel } from "./path-cost.js";
import type { ExplainPattern, WalkGraph } from "./types.js";

/** Options of {@link patternWalks}; all optional. */
export interface PatternPathOptions {
  /** Adjacency entries the layers before the last hop may scan (over it: no pattern path). @default 200000 */
  readonly maxVisits?: number;
}

/** Defaults of {@link PatternPathOptions} (the ranking's pattern search budget, chain-reach.ts). */
export const DEFAULTS = { maxVisits: 200_000 } as const;

/** The pattern walks of one clue: the cheapest path to any answer, on demand. */
export interface PatternWalks {
  /** The cheapest simple path from the clue to `answer` along the pattern; undefined when there is none. */
  path(answer: number): NumStep[] | undefined;
}

/** One layer: per node reached, its cost and the step that reached it. */
type Layer = Map<number, { readonly cost: number; readonly step?: NumStep }>;

/** Relation → allowed directions (bit 1: along the stored triple, bit 2: against it); null: any relation either way. */
function allowedOf(hop: ExplainPattern["hops"][number], directed: boolean): Map<number, number> | null {
  if (hop.length === 0) return null;
  const m = new Map<number, number>();
  for (const o of hop) m.set(o.relation, (m.get(o.relation) ?? 0) | (directed ? (o.inverse ? 2 : 1) : 3));
  return m;
}

const allows = (a: Map<number, number> | null, rel: number, inverse: boolean): boolean => a === null || ((a.get(rel) ?? 0) & (inverse ? 2 : 1)) !== 0;

/**
 * The layers of `pattern` from `start`, ready to give the path to each answer; null when the
 * pattern has no hop or the budget runs out.
 */
export function patternWalks(graph: WalkGraph, cost: PathCostModel, start: number, pattern: ExplainPattern, options: PatternPathOptions = {}): PatternWalks | null {
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  const k = pattern.hops.length;
  if (k === 0 || !(start >= 0 && start < graph.nodeCount)) return null;
  const allowed = pattern.hops.map((h) => allowedOf(h, pattern.directed));
  const stepCost = (u: number, v: number, rel: number): number => {
    const p = cost.entryProbability(u, v, rel);
    return p > 0 ? cost.hopCost - Math.log(p) : Infinity;
  };
  // layers 0 … k − 1: layer h + 1 from layer h through hop h, nodes filtered by hop h's types
  const layers: Layer[] = [new Map([[start, { cost: 0 }]])];
  let visits = 0;
  for (let h = 0; h < k - 1; h++) {
    const next: Layer = new Map();
    const types = pattern.types[h] !== undefined && pattern.types[h]!.length > 0 ? new Set(pattern.types[h]) : undefined;
    // ascending node order, so ties keep the lower predecessor (deterministic)
    for (const [u, at] of [...layers[h]!].sort((a, b) => a[0] - b[0])) {
      visits += graph.degree(u);
      if (visits > maxVisits) return null;
      graph.forEach(u, (v, rel, inverse) => {
        if (v === start || !allows(allowed[h]!, rel, inverse) || (types && !graph.isA(v, types))) return;
        const c = at.cost + stepCost(u, v, rel);
        const old = next.get(v);
        if (!(c < Infinity) || (old && old.cost <= c)) return;
        next.set(v, { cost: c, step: { from: u, to: v, rel, inverse, cost: c - at.cost } });
      });
    }
    if (next.size === 0) return { path: () => undefined };
    layers.push(next);
  }
  const last = layers[k - 1]!;
  const back = (u: number): NumStep[] => {
    const steps: NumStep[] = [];
    for (let h = k - 1, x = u; h > 0; h--) {
      const s = layers[h]!.get(x)!.step!;
      steps.unshift(s);
      x = s.from;
    }
    return steps;
  };
  type Option = { u: number; rel: number; inverse: boolean; total: number; step: number };
  const before = (a: Option, b: Option) => a.total - b.total || a.u - b.u || a.rel - b.rel || Number(a.inverse) - Number(b.inverse);
  // the last hop taken forwards once for every answer, when the last layer's rows fit in what
  // is left of the budget: per node reached, its best option (same order as the per-answer scan)
  let ahead: Map<number, Option> | null | undefined;
  // entries of the last layer's rows, and those of the answers' rows read so far
  let lastWork = -1;
  let answerWork = 0;
  const forward = (): Map<number, Option> | null => {
    if (visits + lastWork > maxVisits) return null;
    const best = new Map<number, Option>();
    for (const [u, at] of last) {
      graph.forEach(u, (v, rel, inverse) => {
        if (v === start || !allows(allowed[k - 1]!, rel, inverse)) return;
        const c = stepCost(u, v, rel);
        if (!(c < Infinity)) return;
        const o = { u, rel, inverse, total: at.cost + c, step: c };
        const old = best.get(v);
        if (!old || before(o, old) < 0) best.set(v, o);
      });
    }
    return best;
  };
  return {
    path(answer: number): NumStep[] | undefined {
      if (!(answer >= 0 && answer < graph.nodeCount) || answer === start) return undefined;
      if (ahead === undefined) {
        if (lastWork < 0) {
          lastWork = 0;
          for (const u of last.keys()) lastWork += graph.degree(u);
        }
        answerWork += graph.degree(answer);
        if (answerWork > lastWork) ahead = forward();
      }
      if (ahead !== undefined && ahead !== null) {
        const o = ahead.get(answer);
        if (!o) return undefined;
        const steps = [...back(o.u), { from: o.u, to: answer, rel: o.rel, inverse: o.inverse, cost: o.step }];
        // the best walk passes a node twice: the full scan below looks at the next ones
        if (new Set([start, ...steps.map((x) => x.to)]).size === steps.length + 1) return steps;
      }
      // the last hop, read from the answer's row: an entry (u, rel, inverse) at the answer is
      // the step u → answer walked the other way
      const options: Option[] = [];
      graph.forEach(answer, (u, rel, inverse) => {
        const at = last.get(u);
        if (!at || !allows(allowed[k - 1]!, rel, !inverse)) return;
        const c = stepCost(u, answer, rel);
        if (c < Infinity) options.push({ u, rel, inverse: !inverse, total: at.cost + c, step: c });
      });
      options.sort(before);
      for (const o of options) {
        const steps = [...back(o.u), { from: o.u, to: answer, rel: o.rel, inverse: o.inverse, cost: o.step }];
        const nodes = new Set([start, ...steps.map((s) => s.to)]);
        if (nodes.size === steps.length + 1) return steps;
      }
      return undefined;
    },
  };
}

/**
 * The pattern and its relaxations, strictest first, as the ranking relaxes it (rank.ts
 * `chainLoose`): without the intermediate types, then without the directions.
 */
export function relaxations(pattern: ExplainPattern): ExplainPattern[] {
  const out: ExplainPattern[] = [pattern];
  const untyped = { ...pattern, types: pattern.types.map(() => []) };
  if (pattern.types.some((t) => t.length > 0)) out.push(untyped);
  if (pattern.directed) out.push({ ...untyped, directed: false });
  return out;
}

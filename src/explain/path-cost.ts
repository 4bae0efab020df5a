/**
 * Path cost model
 * ===============
 *
 * The cost of walking one edge is the negative log of the probability that the random walk
 * with restart (the walk behind personalized PageRank) takes it:
 *
 *     cost(u → v) = −ln( (1 − α) · w(u, v, rel, inverse) / W(u) )
 *
 * where `w` is the walk's unnormalised transition weight (relation weight from the
 * question's relation cues × hub damping of the target), `W(u)` the sum of `w` over all of
 * u's adjacency entries, and `α` the restart probability (so −ln(1 − α) is the price of one
 * more hop). A path's cost is then −ln of the probability mass that this one walk carries
 * from the clue to the answer in the PageRank sum, so the cheapest path is the walk that
 * contributes most to the answer's score: explanation and ranking agree by construction.
 *
 * [Reference]
 * Jeh & Widom, "Scaling Personalized Web Search", WWW 2003 (PPR as a sum over walks, each
 * walk weighted α(1−α)^len ∏ P). Using −log probabilities as additive path lengths is common
 * practice (e.g. most-probable-path problems solved by Dijkstra).
 *
 * The step probabilities come from ranking's one walk definition when it is given
 * (`transition`, ranking/transition.ts); otherwise the same formula is evaluated here:
 * w = relation weight × deg(v)^(−β), P = w / Σ w over u's entries.
 */
import type { WalkGraph } from "./types.js";

/** The walk's transition probabilities (ranking's `Transition` is one). */
export interface TransitionLike {
  /** Calls `fn` for every adjacency entry of `u` with the probability of taking it. */
  forEachTransition(u: number, fn: (v: number, rel: number, inverse: boolean, probability: number) => void): void;
  /** W(u), the row's total weight (0: dangling); lets one entry be priced without reading the row. */
  rowTotal?(u: number): number;
  /** The adjacency as flat arrays (ranking's `TransitionRows`), for the hot loops. */
  readonly rows?: FlatRows;
  /** w(e) of adjacency entry e: P(u → targets[e] via e) = weight(e) / rowTotal(u). */
  weight?(e: number): number;
}

/** Flat adjacency arrays: row u is entries offsets[u] … offsets[u + 1] − 1; links[e] = relation · 2 + inverse. */
export interface FlatRows {
  readonly offsets: ArrayLike<number>;
  readonly targets: ArrayLike<number>;
  readonly links: ArrayLike<number>;
}

/** The walk as flat arrays plus its weights: what the evidence subgraph's loops read. */
export interface FlatWalk {
  readonly rows: FlatRows;
  weight(e: number): number;
  rowTotal(u: number): number;
}

/** Options of {@link PathCostModel}; all optional. */
export interface PathCostOptions {
  /** Restart probability α of the walk (the hop price is −ln(1 − α)). @default 0.15 */
  readonly restart?: number;
  /** Hub damping exponent β of the fallback weight deg(v)^(−β). @default 0.5 */
  readonly hubExponent?: number;
  /** Per relation num weight (default 1), e.g. from the question's relation cues. */
  readonly relationWeights?: Float64Array;
  /** The ranking's walk; replaces the fallback formula when given. */
  readonly transition?: TransitionLike;
}

/** The defaults of {@link PathCostOptions}. */
export const DEFAULTS = { restart: 0.15, hubExponent: 0.5 } as const;

/** A numeric key of (target, relation, direction), exact for node nums < 2^32 and relation nums < 2^20. */
function entryKey(v: number, rel: number, inverse: boolean): number {
  return (v * 1048576 + rel) * 2 + (inverse ? 1 : 0);
}

/** Step and path costs over one graph for one question (caches each visited row). */
export class PathCostModel {
  /** The graph walked. */
  readonly graph: WalkGraph;
  private readonly hop: number;
  private readonly beta: number;
  private readonly rw: Float64Array | undefined;
  private readonly transition: TransitionLike | undefined;
  private readonly rows = new Map<number, Map<number, number>>();
  private readonly totals = new Map<number, number>();

  constructor(graph: WalkGraph, options: PathCostOptions = {}) {
    const restart = options.restart ?? DEFAULTS.restart;
    if (!(restart > 0 && restart < 1)) throw new RangeError(`explain/path-cost: restart must be in (0, 1), got ${restart}`);
    const beta = options.hubExponent ?? DEFAULTS.hubExponent;
    if (!(beta >= 0)) throw new RangeError(`explain/path-cost: hubExponent must be ≥ 0, got ${beta}`);
    this.graph = graph;
    this.hop = -Math.log(1 - restart);
    this.beta = beta;
    this.rw = options.relationWeights;
    this.transition = options.transition;
  }

  /**
   * Calls `fn` for every adjacency entry of `u` with the walk's probability of taking it
   * (index order; no caching: the evidence subgraph reads each row once).
   */
  forEachProbability(u: number, fn: (v: number, rel: number, inverse: boolean, probability: number) => void): void {
    if (this.transition) {
      this.transition.forEachTransition(u, fn);
      return;
    }
    const vs: number[] = [];
    const rels: number[] = [];
    const invs: boolean[] = [];
    const ws: number[] = [];
    let total = 0;
    this.graph.forEach(u, (v, rel, inverse) => {
      const rho = this.rw && rel < this.rw.length ? this.rw[rel]! : 1;
      const d = this.graph.degree(v);
      const w = rho * (d > 0 && this.beta > 0 ? Math.pow(d, -this.beta) : 1);
      vs.push(v);
      rels.push(rel);
      invs.push(inverse);
      ws.push(w);
      total += w;
    });
    for (let i = 0; i < vs.length; i++) fn(vs[i]!, rels[i]!, invs[i]!, total > 0 ? ws[i]! / total : 0);
  }

  private row(u: number): Map<number, number> {
    let r = this.rows.get(u);
    if (r) return r;
    const row = new Map<number, number>();
    this.forEachProbability(u, (v, rel, inverse, p) => {
      const k = entryKey(v, rel, inverse);
      row.set(k, (row.get(k) ?? 0) + p);
    });
    this.rows.set(u, row);
    return row;
  }

  /**
   * P(u → v via one entry of relation `rel`) = ρ[rel]·deg(v)^(−β) / W(u), computed from the
   * formula and the row total instead of reading u's row (for hubs, whose rows are long); it
   * equals {@link probability} for an entry that occurs once in the row.
   */
  entryProbability(u: number, v: number, rel: number): number {
    if (!this.transition?.rowTotal) return this.probabilityFromFormula(u, v, rel);
    let total = this.totals.get(u);
    if (total === undefined) {
      total = this.transition.rowTotal(u);
      this.totals.set(u, total);
    }
    if (!(total > 0)) return 0;
    const rho = this.rw && rel < this.rw.length ? this.rw[rel]! : 1;
    const d = this.graph.degree(v);
    const h = d === 0 || this.beta === 0 ? 1 : Math.pow(d, -this.beta);
    return (rho * h) / total;
  }

  private probabilityFromFormula(u: number, v: number, rel: number): number {
    let total = 0;
    let w = 0;
    this.graph.forEach(u, (x, r) => {
      const rho = this.rw && r < this.rw.length ? this.rw[r]! : 1;
      const d = this.graph.degree(x);
      const wx = rho * (d > 0 && this.beta > 0 ? Math.pow(d, -this.beta) : 1);
      total += wx;
      if (x === v && r === rel) w = wx;
    });
    return total > 0 ? w / total : 0;
  }

  /** The walk probability of the step (without the (1 − α) factor), 0..1. */
  probability(u: number, v: number, rel: number, inverse: boolean): number {
    return this.row(u).get(entryKey(v, rel, inverse)) ?? 0;
  }

  /** cost(u → v) = −ln((1 − α) · P(u → v)); Infinity for a step the walk never takes. */
  stepCost(u: number, v: number, rel: number, inverse: boolean): number {
    const p = this.probability(u, v, rel, inverse);
    return p > 0 ? this.hop - Math.log(p) : Infinity;
  }

  /**
   * The walk's flat rows and weights when the model prices steps with ranking's walk (which
   * offers them), else undefined: loops over many entries read the arrays directly and
   * price only the entries they keep. P(u → targets[e]) = weight(e) / rowTotal(u), exactly
   * what {@link forEachProbability} reports.
   */
  flatWalk(): FlatWalk | undefined {
    const t = this.transition;
    if (t === undefined || t.rows === undefined || t.weight === undefined || t.rowTotal === undefined) return undefined;
    return t as FlatWalk;
  }

  /** The price of one hop, −ln(1 − α). */
  get hopCost(): number {
    return this.hop;
  }
}

/**
 * The walk: the one transition matrix of tiepoint
 * ===============================================
 *
 * Every personalized PageRank variant (power iteration, forward push, push + random walks)
 * and explain's path costs use this definition and nothing else.
 *
 * From node u the walker picks one adjacency entry e = (u → v, relation r, inverse flag) of
 * the relation index with probability
 *
 *     P(u → v via e) = w(e) / W(u),   w(e) = ρ[r] · deg(v)^(−β),   W(u) = Σ_{e at u} w(e)
 *
 * - Both directions are walkable: an entry exists for the stored direction and for the
 *   reverse, with the same weight (a question may run against the stored direction).
 * - ρ = per-relation weights from the question's relation cues (`relationWeights`, a
 *   Float64Array indexed by relation num, default 1 everywhere; ≥ 0 and finite).
 * - Hub damping: the target's degree (both directions) to the power −β (`hubExponent`,
 *   default β = 0.5), so hubs do not swallow the mass. β = 0 gives the plain walk.
 *   With ρ symmetric in direction, this walk is reversible: it is the simple random walk on
 *   the symmetric weights ρ[r]·(deg u · deg v)^(−β) (the factor deg(u)^(−β) cancels in the
 *   normalisation), with stationary measure ∝ deg(u)^(−β)·W(u). Forward push's per-node
 *   error bound uses that measure.
 * - Dangling nodes (degree 0, or W(u) = 0 because every relation at u has weight 0) send
 *   their mass back to the seed (restart) distribution. This differs from Page et al. 1999,
 *   who spread it uniformly; for a personalized walk it keeps all mass near the question.
 * - A partial index (an attached catalog's pulled neighbourhood, `RelationIndex.withPulledEdges`)
 *   may hold only some of a node's entries; it carries every node's whole-graph degree. W(u)
 *   is then scaled to the whole row, W(u)·deg(u)/entries(u) (the missing entries taken at the
 *   present ones' mean weight), so the missing entries' share of the mass leaves the walk, as
 *   it would leave the pulled region on the whole graph, instead of flowing back into it; a
 *   random walk that takes such an entry stops as at a dangling node. Nodes whose row is whole
 *   (every entry present) are unchanged.
 *
 * PageRank with restart probability α and restart distribution s is then the fixed point
 *     π = α s + (1 − α) P'ᵀ π,   P' = P with dangling rows replaced by sᵀ,
 * i.e. π = α (I − (1 − α) P'ᵀ)⁻¹ s  (Page et al. 1999; Haveliwala 2002).
 *
 * [Reference]: Page, Brin, Motwani & Winograd, "The PageRank citation ranking: bringing
 * order to the web", Stanford tech. report 1999; Haveliwala, "Topic-sensitive PageRank",
 * WWW 2002. Degree damping of hubs is common practice (e.g. degree-normalised walks).
 */
import { csrOf, type Csr, type RelationIndex } from "./relation-index.js";
import type { Random } from "./prng.js";

/** Defaults of {@link TransitionOptions}. */
export const DEFAULTS = Object.freeze({
  /** β in w(e) = ρ[r] · deg(v)^(−β). */
  hubExponent: 0.5,
});

/** Options shaping the walk; all optional. */
export interface TransitionOptions {
  /** Weight per relation num (length ≥ index.relationCount), each ≥ 0 and finite. @default 1 for every relation */
  readonly relationWeights?: Float64Array;
  /** β of the hub damping deg(v)^(−β), in [0, 4]. @default 0.5 */
  readonly hubExponent?: number;
}

/** Per-(index, β) precomputed arrays: hub factors, default row totals, row prefix sums. */
interface HubTables {
  readonly hub: Float64Array;
  /** W(u) with ρ = 1. */
  readonly rowTotal: Float64Array;
  /** Per node deg(u)/entries(u) of a partial index (≥ 1), null when every row is whole. */
  readonly rowScale: Float64Array | null;
  /** μ₀(u) = deg(u)^(−β) · W(u) with ρ = 1 (the walk's stationary measure up to a constant); 1 at dangling nodes. */
  readonly measure: Float64Array;
  /** Prefix sums of hub[target] along each row (built on first sampling). */
  cum: Float64Array | null;
  /** Row totals under custom ρ, valid where rowStamp[u] equals the walk's stamp (no per-query reset). */
  rowCache: Float64Array | null;
  rowStamp: Uint32Array | null;
  stamp: number;
  /** The relation weights the current stamp's row totals belong to (a walk with the same weights reuses them). */
  stampKey: string | null;
  /** Per adjacency entry: hub[target] / measure[target] (push in measure-normalised units; built on first push). */
  scaled: Float64Array | null;
  /** Per adjacency entry: hub[target], so weighted row totals read sequentially (built with `scaled`). */
  hubAt: Float64Array | null;
}

const tables_ = new WeakMap<Csr, Map<number, HubTables>>();

/**
 * Hub factors deg(u)^(−β) of a partial index, kept per degree array and β: an attached
 * catalog builds an index per question over the same whole-graph degrees, so the factors
 * (one power per node of the catalog) are computed once per session, not per question.
 */
const hubsByDegrees_ = new WeakMap<ArrayBufferLike, Map<string, Float64Array>>();

function hubFactors(c: Csr, beta: number): Float64Array {
  const n = c.nodeCount;
  const degrees = c.degrees;
  const key = degrees ? `${beta} ${degrees.byteOffset} ${n}` : "";
  let byKey = degrees ? hubsByDegrees_.get(degrees.buffer) : undefined;
  const kept = byKey?.get(key);
  if (kept) return kept;
  const hub = new Float64Array(n);
  for (let u = 0; u < n; u++) {
    const d = degrees ? degrees[u]! : c.offsets[u + 1]! - c.offsets[u]!;
    hub[u] = d === 0 ? 1 : beta === 0 ? 1 : Math.pow(d, -beta);
  }
  if (degrees) {
    if (!byKey) hubsByDegrees_.set(degrees.buffer, (byKey = new Map()));
    byKey.set(key, hub);
  }
  return hub;
}

function hubTables(c: Csr, beta: number): HubTables {
  let byBeta = tables_.get(c);
  if (!byBeta) {
    byBeta = new Map();
    tables_.set(c, byBeta);
  }
  let t = byBeta.get(beta);
  if (!t) {
    const n = c.nodeCount;
    const hub = hubFactors(c, beta);
    const rowTotal = new Float64Array(n);
    const rowScale = c.degrees ? new Float64Array(n).fill(1) : null;
    for (let u = 0; u < n; u++) {
      let s = 0;
      const end = c.offsets[u + 1]!;
      for (let e = c.offsets[u]!; e < end; e++) s += hub[c.targets[e]!]!;
      // a partial row: scaled to the whole row (file header)
      const have = end - c.offsets[u]!;
      if (rowScale && have > 0 && c.degrees![u]! > have) rowScale[u] = c.degrees![u]! / have;
      rowTotal[u] = rowScale ? s * rowScale[u]! : s;
    }
    const measure = new Float64Array(n);
    for (let u = 0; u < n; u++) measure[u] = rowTotal[u]! > 0 ? hub[u]! * rowTotal[u]! : 1;
    t = { hub, rowTotal, rowScale, measure, cum: null, rowCache: null, rowStamp: null, stamp: 0, stampKey: null, scaled: null, hubAt: null };
    byBeta.set(beta, t);
  }
  return t;
}

/**
 * The walk's adjacency as flat arrays, for hot loops in other stages (read them, never
 * write them): row u is the entries e = offsets[u] … offsets[u + 1] − 1, in index order;
 * targets[e] is the node entry e leads to, links[e] = relation num · 2 + (1 when inverse).
 */
export interface TransitionRows {
  readonly offsets: Uint32Array;
  readonly targets: Int32Array;
  readonly links: Uint32Array;
}

/**
 * The packed link of an adjacency entry (`TransitionRows.links[e]`): relation num · 2 + 1 when
 * the entry walks its stored triple backwards. Relation nums must be below 2^31 (links are
 * 32-bit unsigned); {@link linkRelation} and {@link linkInverse} read it back.
 */
export function packLink(rel: number, inverse: boolean): number {
  return rel * 2 + (inverse ? 1 : 0);
}

/** The relation num of a packed link ({@link packLink}). */
export function linkRelation(link: number): number {
  return link >>> 1;
}

/** True when a packed link ({@link packLink}) walks its stored triple backwards. */
export function linkInverse(link: number): boolean {
  return (link & 1) === 1;
}

/**
 * The walk's precomputed arrays for one β (what the relation-index snapshot stores, so a
 * query process does not rebuild them): per node deg^(−β), the unit-weight row total W₁ and
 * the measure μ₀; per adjacency entry hub[target]/μ₀(target) and hub[target].
 */
export interface WalkTables {
  readonly hubExponent: number;
  readonly hub: Float64Array;
  readonly rowTotal: Float64Array;
  readonly measure: Float64Array;
  readonly scaled: Float64Array;
  readonly hubAt: Float64Array;
}

/** The walk tables of `index` at β = `hubExponent` (built once per index and β). */
export function walkTables(index: RelationIndex, hubExponent: number = DEFAULTS.hubExponent): WalkTables {
  const w = new Walk(index, { hubExponent });
  const t = hubTables(w.csr, hubExponent);
  return { hubExponent, hub: t.hub, rowTotal: t.rowTotal, measure: t.measure, scaled: w.scaledEntries(), hubAt: w.entryHubs() };
}

/**
 * Installs walk tables read from a snapshot for `index` (they must have been computed by
 * {@link walkTables} for an index with the same arrays); the walk then skips building them.
 */
export function adoptWalkTables(index: RelationIndex, tables: WalkTables): void {
  const c = csrOf(index);
  const n = c.nodeCount;
  const m = c.targets.length;
  if (tables.hub.length !== n || tables.rowTotal.length !== n || tables.measure.length !== n || tables.scaled.length !== m || tables.hubAt.length !== m) {
    throw new RangeError("ranking/transition: walk tables do not match the index's size");
  }
  let byBeta = tables_.get(c);
  if (!byBeta) {
    byBeta = new Map();
    tables_.set(c, byBeta);
  }
  byBeta.set(tables.hubExponent, {
    hub: tables.hub,
    rowTotal: tables.rowTotal,
    rowScale: null,
    measure: tables.measure,
    cum: null,
    rowCache: null,
    rowStamp: null,
    stamp: 0,
    stampKey: null,
    scaled: tables.scaled,
    hubAt: tables.hubAt,
  });
}

/** The walk's transition probabilities for one set of options (what other stages see). */
export interface Transition {
  /** β of the hub damping. */
  readonly hubExponent: number;
  /** The adjacency the walk runs on (see {@link TransitionRows}). */
  readonly rows: TransitionRows;
  /** w(e), the unnormalised weight of adjacency entry e: P(u → targets[e] via e) = weight(e) / rowTotal(u). */
  weight(e: number): number;
  /** W(u), the total weight at u; 0 means u is dangling (its mass restarts at the seeds). */
  rowTotal(u: number): number;
  /**
   * Calls `fn(v, rel, inverse, probability)` for every adjacency entry of `u`, in index order,
   * with the probability P(u → v via that entry) (0 at a dangling u).
   */
  forEachTransition(u: number, fn: (v: number, rel: number, inverse: boolean, probability: number) => void): void;
}

/**
 * The transition probabilities of the walk over `index` with `options` (relation weights,
 * hub damping): the one matrix used by every PageRank variant, for path costs and the like.
 */
export function transition(index: RelationIndex, options: TransitionOptions = {}): Transition {
  return new Walk(index, options);
}

/**
 * The resolved walk for one set of options over one index. Cheap to create (tables are
 * cached per index and β); hold one per PageRank call.
 */
/** @internal */
export class Walk implements Transition {
  /** @internal */ readonly csr: Csr;
  /** @internal */ readonly hub: Float64Array;
  /** @internal */ readonly rho: Float64Array | null;
  /** μ₀(u) = deg(u)^(−β)·W(u) at ρ = 1, the reversible measure of the walk (push thresholds). @internal */
  readonly measure: Float64Array;
  /** β of this walk. */
  readonly hubExponent: number;
  private readonly tables: HubTables;
  private readonly rhoMax: number;
  private readonly stamp: number;
  private readonly rowCache: Float64Array;
  private readonly rowStamp: Uint32Array;

  /** Resolves and checks `options` against `index`. */
  constructor(index: RelationIndex, options: TransitionOptions = {}) {
    const beta = options.hubExponent ?? DEFAULTS.hubExponent;
    if (typeof beta !== "number" || !Number.isFinite(beta) || beta < 0 || beta > 4) {
      throw new RangeError(`ranking/transition: hubExponent must be a number in [0, 4], got ${String(beta)}`);
    }
    this.csr = csrOf(index);
    this.hubExponent = beta;
    this.tables = hubTables(this.csr, beta);
    this.hub = this.tables.hub;
    this.measure = this.tables.measure;
    const rho = options.relationWeights;
    let rhoMax = 1;
    // the weights as text (every entry ≠ 1, exact: a number's shortest round-trip form)
    let rhoKey = "";
    if (rho !== undefined) {
      if (!(rho instanceof Float64Array)) throw new TypeError("ranking/transition: relationWeights must be a Float64Array indexed by relation num");
      if (rho.length < index.relationCount) {
        throw new RangeError(`ranking/transition: relationWeights has ${rho.length} entries, the index has ${index.relationCount} relation ids`);
      }
      rhoMax = 0;
      for (let i = 0; i < rho.length; i++) {
        const w = rho[i]!;
        if (!(w >= 0) || !Number.isFinite(w)) throw new RangeError(`ranking/transition: relationWeights[${i}] = ${w}; weights must be finite and ≥ 0`);
        if (w > rhoMax) rhoMax = w;
        if (w !== 1) rhoKey += `${i}=${w};`;
      }
    }
    this.rho = rho ?? null;
    this.rhoMax = rhoMax;
    const t = this.tables;
    if (this.rho !== null && t.rowCache === null) {
      t.rowCache = new Float64Array(this.csr.nodeCount);
      t.rowStamp = new Uint32Array(this.csr.nodeCount);
    }
    if (this.rho === null) {
      this.stamp = 0; // unit weights read the precomputed totals, not the cache
    } else if (t.stampKey === rhoKey) {
      // the same weights as the weighted walk before (the other clues of a question, its
      // explanation, the next question with the same relation cues): its cached totals are valid
      this.stamp = t.stamp;
    } else {
      if (t.stamp >= 0xfffffffe) {
        t.stamp = 0;
        t.rowStamp?.fill(0);
      }
      this.stamp = ++t.stamp;
      t.stampKey = rhoKey;
    }
    this.rowCache = t.rowCache ?? new Float64Array(0);
    this.rowStamp = t.rowStamp ?? new Uint32Array(0);
  }

  /** The CSR arrays of the index (offsets, targets, links). */
  get rows(): TransitionRows {
    return this.csr;
  }

  /** w(e) of adjacency entry `e` (an index into the CSR arrays). */
  weight(e: number): number {
    const h = this.hub[this.csr.targets[e]!]!;
    return this.rho === null ? h : this.rho[this.csr.links[e]! >>> 1]! * h;
  }

  /** W(u), the total weight of u's entries (0 means dangling). */
  rowTotal(u: number): number {
    const rho = this.rho;
    if (rho === null) return this.tables.rowTotal[u]!;
    if (this.rowStamp[u] === this.stamp) return this.rowCache[u]!;
    const c = this.csr;
    const links = c.links;
    // hub[targets[e]] laid out per entry: the same products in the same order, read sequentially
    const hubAt = this.entryHubs();
    let s = 0;
    const end = c.offsets[u + 1]!;
    for (let e = c.offsets[u]!; e < end; e++) s += rho[links[e]! >>> 1]! * hubAt[e]!;
    if (this.tables.rowScale) s *= this.tables.rowScale[u]!;
    this.rowCache[u] = s;
    this.rowStamp[u] = this.stamp;
    return s;
  }

  forEachTransition(u: number, fn: (v: number, rel: number, inverse: boolean, probability: number) => void): void {
    const c = this.csr;
    if (!(u >= 0 && u < c.nodeCount)) return;
    const total = this.rowTotal(u);
    const end = c.offsets[u + 1]!;
    for (let e = c.offsets[u]!; e < end; e++) {
      const l = c.links[e]!;
      fn(c.targets[e]!, l >>> 1, (l & 1) === 1, total > 0 ? this.weight(e) / total : 0);
    }
  }

  /** P(u → target(e) via e) for an entry e of row u. @internal */
  probability(u: number, e: number): number {
    return this.weight(e) / this.rowTotal(u);
  }

  /**
   * Samples one step from `u`: the next node, or −1 when u is dangling (the caller restarts
   * at the seed distribution). Exact sampling: binary search in the row's prefix sums of
   * deg^(−β), then acceptance with probability ρ[r]/max ρ (rejection sampling), falling back
   * to a linear scan after 32 rejections.
   */
  step(u: number, random: Random): number {
    const c = this.csr;
    const start = c.offsets[u]!;
    const end = c.offsets[u + 1]!;
    if (start === end) return -1;
    const cum = this.cumulative();
    const rowSum = this.tables.rowTotal[u]!;
    for (let tries = 0; tries < 32; tries++) {
      const x = random() * rowSum;
      // a partial row: beyond its present entries the walk left the pulled region (file header)
      if (x >= cum[end - 1]!) return -1;
      // first e in [start, end) with cum[e] > x (cum is the inclusive prefix within the row)
      let lo = start;
      let hi = end - 1;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (cum[mid]! > x) hi = mid;
        else lo = mid + 1;
      }
      if (this.rho === null) return c.targets[lo]!;
      const w = this.rho[c.links[lo]! >>> 1]!;
      if (random() * this.rhoMax < w) return c.targets[lo]!;
    }
    // many rejections: ρ is small on this row; sample exactly by a linear scan (or find it dangling)
    const total = this.rowTotal(u);
    if (!(total > 0)) return -1;
    let x = random() * total;
    for (let e = start; e < end; e++) {
      x -= this.weight(e);
      if (x < 0) return c.targets[e]!;
    }
    if (this.tables.rowScale && this.tables.rowScale[u]! > 1) return -1;
    for (let e = end - 1; e >= start; e--) if (this.weight(e) > 0) return c.targets[e]!;
    return -1;
  }

  /** Per adjacency entry e: deg(v)^(−β) / μ₀(v) for v = target(e), so push can work in units of μ₀ with sequential reads. @internal */
  scaledEntries(): Float64Array {
    if (this.tables.scaled === null) this.buildEntryTables();
    return this.tables.scaled!;
  }

  /** Per adjacency entry e: hub[targets[e]] (deg(v)^(−β) of the entry's target). @internal */
  entryHubs(): Float64Array {
    if (this.tables.hubAt === null) this.buildEntryTables();
    return this.tables.hubAt!;
  }

  /** Builds the per-entry tables `scaled` and `hubAt` in one pass over the entries. */
  private buildEntryTables(): void {
    const c = this.csr;
    const m = c.targets.length;
    const sc = new Float64Array(m);
    const ha = new Float64Array(m);
    for (let e = 0; e < m; e++) {
      const v = c.targets[e]!;
      const h = this.hub[v]!;
      ha[e] = h;
      sc[e] = h / this.measure[v]!;
    }
    this.tables.scaled = sc;
    this.tables.hubAt = ha;
  }

  private cumulative(): Float64Array {
    let cum = this.tables.cum;
    if (cum === null) {
      const c = this.csr;
      cum = new Float64Array(c.targets.length);
      for (let u = 0; u < c.nodeCount; u++) {
        let s = 0;
        const end = c.offsets[u + 1]!;
        for (let e = c.offsets[u]!; e < end; e++) {
          s += this.hub[c.targets[e]!]!;
          cum[e] = s;
        }
      }
      this.tables.cum = cum;
    }
    return cum;
  }
}

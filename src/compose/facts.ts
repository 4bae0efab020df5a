/**
 * Candidate clue facts about a target
 * ===================================
 *
 * The properties a referring expression for the target may use, each with its cost and its
 * extension (the entities it is true of), read from the compact relation index:
 *
 * - **relation**: the target is joined to a named entity v by relation r, either direction
 *   (`t r v` or `v r t`); extension: every x with the same edge to v.
 * - **chain**: two hops through a middle entity m described by its type and its own relation
 *   to a named entity w (`t r1 m`, `m r2 w`, "…carries the instrument that W designed");
 *   extension: every x joined by r1 to some m' of m's type joined by r2 to w. Only when w is
 *   better known than m (higher salience): the chain's point is to avoid naming m.
 * - **attribute**: a numeric literal value of the target (`t p "1977"`), read back by the
 *   question reader as an equality condition; extension: the entities with that value.
 * - the **type** (the question's head noun, "Which vessel …") is not a fact here: the search
 *   starts from the members of the target's most specific type (compose.ts).
 *
 * Exclusions (the issue's rules): a named entity is never the target, never an avoided entity,
 * never one whose label contains the target's label or one of its aliases (clue-cost.ts
 * `givesAway`); an avoided relation is never used. Costs are explain's `clueCost` (salience
 * percentile of the named entity, hops, label length, label shared by others).
 *
 * Work is bounded: direct facts are pre-priced by salience alone and only the cheapest
 * `maxDirect` read their labels; chains scan at most `maxChainScan` second-hop entries through
 * middles of degree ≤ `middleHub`, keep the cheapest `maxChains`, and a chain whose named end
 * has more than `chainFanout` middles is dropped.
 *
 * [Reference] Krahmer, van Erk & Verleg, "Graph-based generation of referring expressions",
 * Computational Linguistics 29(1), 2003: the scene is a labelled directed graph, a property is
 * an edge (a loop for a one-place property, here the type and attributes), a description is a
 * connected subgraph containing the target — here of depth at most two.
 */
import { clueCost, givesAway, type ClueCostOptions } from "../explain/index.js";
import type { RelationIndex } from "../ranking/index.js";

/** Defaults of {@link candidateFacts}. */
export const DEFAULTS = Object.freeze({
  /** Direct relation facts kept (cheapest first). */
  maxDirect: 80,
  /** Second-hop entries scanned for chains. */
  maxChainScan: 20_000,
  /** Chain facts kept (cheapest first). */
  maxChains: 40,
  /** Middle entities of larger degree are not used for chains. */
  middleHub: 2_000,
  /** A chain whose named end reaches more middles than this is dropped (its extension would be most of the catalog). */
  chainFanout: 500,
  /** Attribute values longer than this are not used (an identifier, a long text). */
  maxValueChars: 16,
});

/** Options of {@link candidateFacts}; all optional. */
export interface FactOptions {
  readonly maxDirect?: number;
  readonly maxChainScan?: number;
  readonly maxChains?: number;
  readonly middleHub?: number;
  readonly chainFanout?: number;
  readonly maxValueChars?: number;
  /** Use chain facts. @default true */
  readonly chains?: boolean;
  /** Use attribute facts. @default true */
  readonly attributes?: boolean;
  /** Entities never named (nor used as a chain's middle). */
  readonly avoidEntities?: ReadonlySet<number>;
  /** Relations never used. */
  readonly avoidRelations?: ReadonlySet<number>;
  /** How clues are priced. */
  readonly cost?: ClueCostOptions;
}

/** What the fact finder reads about the catalog (the compose stage fills it from a Session). */
export interface FactSource {
  readonly graph: RelationIndex;
  /** An entity's label. */
  label(num: number): string;
  /** How many entities carry this label or alias (1 = unambiguous). */
  labelCount(label: string): number;
  /** Salience percentile in [0, 1] (ranking's salienceOf). */
  salience(num: number): number;
  /** Numeric-looking literal attributes of an entity. */
  attributes(num: number): readonly { readonly predicate: number; readonly label: string; readonly value: string }[];
  /** Entities carrying exactly this value of the predicate, ascending. */
  withValue(predicate: number, value: string): readonly number[];
  /** The type used to describe an entity (its most specific direct type), or undefined. */
  describingType(num: number): number | undefined;
}

/** One candidate clue about the target. */
export interface Fact {
  /** Stable key (kind, relations, entities). */
  readonly key: string;
  readonly kind: "relation" | "chain" | "attribute";
  /** The named clue entity (relation: v; chain: w). */
  readonly entity?: number;
  /** First hop at the target: the entry (neighbour, rel, inverse) of the target's adjacency. */
  readonly rel?: number;
  readonly inverse?: boolean;
  /** The middle entity of a chain (the target's own neighbour; a witness) and its describing type. */
  readonly middle?: number;
  readonly middleType?: number;
  /** The chain's second hop: the entry (w, rel2, inverse2) of the middle's adjacency. */
  readonly rel2?: number;
  readonly inverse2?: boolean;
  /** Attribute predicate num, label and value. */
  readonly predicate?: number;
  readonly attributeLabel?: string;
  readonly value?: string;
  /** Salience percentile of the named entity (undefined for attributes). */
  readonly salience?: number;
  readonly cost: number;
}

/**
 * The candidate facts about `target`, cheapest first (ties by key). `names` are the target's
 * label and aliases (never given away).
 */
export function candidateFacts(src: FactSource, target: number, names: readonly string[], options: FactOptions = {}): Fact[] {
  const o = { ...DEFAULTS, ...options };
  const g = src.graph;
  const avoidE = options.avoidEntities ?? new Set<number>();
  const avoidR = options.avoidRelations ?? new Set<number>();
  const costOf = (s: number | undefined, hops: number, label: string, ambiguous: boolean) =>
    clueCost({ ...(s !== undefined ? { salience: s } : {}), hops, label, ambiguous }, o.cost);
  const usable = (v: number) => v !== target && !avoidE.has(v);
  // direct facts: pre-price by salience (and hop) alone, then read labels of the cheapest
  const direct = new Map<string, { v: number; rel: number; inverse: boolean; pre: number }>();
  g.forEach(target, (v, rel, inverse) => {
    if (!usable(v) || avoidR.has(rel)) return;
    const key = `r:${rel}:${inverse ? 1 : 0}:${v}`;
    if (!direct.has(key)) direct.set(key, { v, rel, inverse, pre: costOf(src.salience(v), 1, "", false) });
  });
  const out: Fact[] = [];
  const byPre = [...direct.entries()].sort((a, b) => a[1].pre - b[1].pre || (a[0] < b[0] ? -1 : 1));
  for (const [key, d] of byPre.slice(0, o.maxDirect)) {
    const label = src.label(d.v);
    if (givesAway(label, names)) continue;
    const s = src.salience(d.v);
    out.push({ key, kind: "relation", entity: d.v, rel: d.rel, inverse: d.inverse, salience: s, cost: costOf(s, 1, label, src.labelCount(label) > 1) });
  }
  if (options.chains !== false) out.push(...chainFacts(src, target, names, o, avoidE, avoidR, costOf));
  if (options.attributes !== false) {
    for (const a of src.attributes(target)) {
      if (!/^-?\d+(\.\d+)?$/.test(a.value.trim()) || a.value.length > o.maxValueChars) continue;
      if (givesAway(`${a.label} ${a.value}`, names)) continue;
      out.push({ key: `a:${a.predicate}:${a.value}`, kind: "attribute", predicate: a.predicate, attributeLabel: a.label, value: a.value, cost: costOf(undefined, 1, `${a.label} ${a.value}`, false) });
    }
  }
  return out.sort((a, b) => a.cost - b.cost || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
}

function chainFacts(
  src: FactSource,
  target: number,
  names: readonly string[],
  o: { readonly [K in keyof typeof DEFAULTS]: number },
  avoidE: ReadonlySet<number>,
  avoidR: ReadonlySet<number>,
  costOf: (s: number | undefined, hops: number, label: string, ambiguous: boolean) => number,
): Fact[] {
  const g = src.graph;
  const found = new Map<string, { f: Omit<Fact, "cost" | "salience">; pre: number; w: number }>();
  let scanned = 0;
  const middles: { m: number; rel: number; inverse: boolean; type: number }[] = [];
  g.forEach(target, (m, rel, inverse) => {
    if (m === target || avoidE.has(m) || avoidR.has(rel) || g.degree(m) > o.middleHub) return;
    const type = src.describingType(m);
    if (type !== undefined) middles.push({ m, rel, inverse, type });
  });
  // the best-known middles' neighbours first would bias to hubs; take them in index order (deterministic)
  for (const mid of middles) {
    if (scanned >= o.maxChainScan) break;
    const known = src.salience(mid.m);
    g.forEach(mid.m, (w, rel2, inverse2) => {
      scanned++;
      // a chain replaces naming the middle by naming a better-known entity beside it
      if (w === target || w === mid.m || avoidE.has(w) || avoidR.has(rel2) || src.salience(w) <= known) return;
      const key = `c:${mid.rel}:${mid.inverse ? 1 : 0}:${mid.type}:${rel2}:${inverse2 ? 1 : 0}:${w}`;
      if (found.has(key)) return;
      found.set(key, {
        f: { key, kind: "chain", entity: w, rel: mid.rel, inverse: mid.inverse, middle: mid.m, middleType: mid.type, rel2, inverse2 },
        pre: costOf(src.salience(w), 2, "", false),
        w,
      });
    });
  }
  const out: Fact[] = [];
  const sorted = [...found.values()].sort((a, b) => a.pre - b.pre || (a.f.key < b.f.key ? -1 : 1));
  for (const c of sorted) {
    if (out.length >= o.maxChains) break;
    const label = src.label(c.w);
    if (givesAway(label, names) || givesAway(src.label(c.f.middleType!), names)) continue;
    // the middles reached from w: bounded fan-out
    let fan = 0;
    g.forEach(c.w, (_m, rel, inv) => {
      if (rel === c.f.rel2 && inv !== c.f.inverse2) fan++;
    });
    if (fan > o.chainFanout) continue;
    const s = src.salience(c.w);
    // the words read are the middle's type noun and the named end's label
    out.push({ ...c.f, salience: s, cost: costOf(s, 2, `${src.label(c.f.middleType!)} ${label}`, src.labelCount(label) > 1) });
  }
  return out;
}

/**
 * The extension of a fact: every entity it is true of, ascending (the target among them).
 * `isType(x)` keeps a chain's middles to the described type.
 */
export function extensionOf(src: FactSource, fact: Fact): Int32Array {
  const g = src.graph;
  if (fact.kind === "attribute") return Int32Array.from(src.withValue(fact.predicate!, fact.value!)).sort();
  const seen = new Set<number>();
  // at v, the entry towards an x that has (v, rel, inverse) is (x, rel, !inverse)
  const around = (v: number, rel: number, inverse: boolean, fn: (x: number) => void) =>
    g.forEach(v, (x, r, inv) => {
      if (r === rel && inv !== inverse) fn(x);
    });
  if (fact.kind === "relation") around(fact.entity!, fact.rel!, fact.inverse!, (x) => seen.add(x));
  else {
    const typeSet = new Set([fact.middleType!]);
    around(fact.entity!, fact.rel2!, fact.inverse2!, (m) => {
      if (g.isA(m, typeSet)) around(m, fact.rel!, fact.inverse!, (x) => seen.add(x));
    });
  }
  return Int32Array.from(seen).sort();
}

/** The entities in both sorted arrays, ascending (a merge; linear in the sum of lengths, or a binary search per element of the much smaller one). */
export function intersectSorted(a: Int32Array, b: Int32Array): Int32Array {
  const [small, large] = a.length <= b.length ? [a, b] : [b, a];
  const out = new Int32Array(small.length);
  let n = 0;
  if (small.length * 16 < large.length) {
    for (let i = 0; i < small.length; i++) {
      const x = small[i]!;
      let lo = 0;
      let hi = large.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (large[mid]! < x) lo = mid + 1;
        else hi = mid;
      }
      if (lo < large.length && large[lo] === x) out[n++] = x;
    }
    return out.subarray(0, n);
  }
  let i = 0;
  let j = 0;
  while (i < small.length && j < large.length) {
    const x = small[i]!;
    const y = large[j]!;
    if (x === y) {
      out[n++] = x;
      i++;
      j++;
    } else if (x < y) i++;
    else j++;
  }
  return out.subarray(0, n);
}

/** The search's view of the facts: costs (ascending) and extensions. */
export interface SearchSpace {
  /** Fact costs, ascending. */
  readonly costs: readonly number[];
  /** The extension of fact i, cut to the type, ascending (the target among them). */
  ext(i: number): Int32Array;
  /** Entities before any fact (the type's members). */
  readonly start: number;
}

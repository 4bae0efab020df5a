/**
 * Compose: from an intended answer to a question that singles it out
 * ==================================================================
 *
 * Referring-expression generation over the compact relation index. For a target entity:
 *
 * 1. the head noun: the target's most specific direct type (fewest members); the search
 *    starts from that type's members (Dale & Reiter always include the type);
 * 2. the candidate facts (facts.ts: relations to named entities in either direction, two-hop
 *    chains through a described middle entity, numeric attributes), each priced by explain's
 *    `clueCost` (salience percentile of the named entity, hops, label length, ambiguity;
 *    `difficulty` trades well-known clues for obscure ones), `--avoid` and the give-away rule
 *    applied;
 * 3. the cheapest minimal distinguishing sets (cost-search.ts: Krahmer et al.'s branch and
 *    bound seeded by Dale & Reiter's incremental algorithm), or the greedy baseline
 *    (greedy.ts: most discriminating first, salience ignored);
 * 4. each set, in cost order with a penalty for facts already shown (variety), becomes a
 *    question (wording.ts) with its proof — the candidate count after the type and after each
 *    clue, shrinking to one — and its round trip: the question is asked back through the same
 *    Session as `ask`; only `unique` with the target first is `verified`, anything else keeps
 *    the reason. Verified proposals are returned (up to `count`); when none verifies, the
 *    unverified ones are returned with their reasons.
 *
 * [Reference] Dale & Reiter, "Computational interpretations of the Gricean maxims in the
 * generation of referring expressions", Cognitive Science 19(2), 1995 (the incremental
 * algorithm); Krahmer, van Erk & Verleg, "Graph-based generation of referring expressions",
 * Computational Linguistics 29(1), 2003 (cost-driven subgraph search).
 */
import { normalize, type Catalog } from "../catalog/index.js";
import { DIFFICULTIES, givesAway, type ClueCostOptions } from "../explain/index.js";
import { TiepointError, type EntityRef, type VerdictStatus } from "../model/index.js";
import type { Session } from "../pipeline/index.js";
import { salienceOf, type RelationIndex } from "../ranking/index.js";
import { cheapestSets, type ClueSet, type SearchOptions } from "./cost-search.js";
import { candidateFacts, extensionOf, intersectSorted, type Fact, type FactOptions, type FactSource, type SearchSpace } from "./facts.js";
import { greedySet } from "./greedy.js";
import { clauseOf, questionOf, spokenOrder, type Clause } from "./wording.js";

/** Defaults of {@link Composer.compose}. */
export const DEFAULTS = Object.freeze({
  /** Proposals returned. */
  count: 3,
  /** Extra cost per fact a proposal shares with one already chosen (variety). */
  repeatPenalty: 0.75,
  /** Sets asked back per target: count + this many. */
  extraTries: 3,
  /** Time budget of one round-trip question (ms; the `ask` default). */
  roundTripMs: 3000,
  /** Rings of neighbours around the target whose edges an attached catalog pulls from its store (facts reach two hops; hubs are not expanded, store-edges.ts). */
  storeRings: 2,
});

/** Options of {@link Composer.compose}; all optional. */
export interface ComposeOptions {
  /** Proposals returned. @default 3 */
  readonly count?: number;
  /** 0 = well-known clues … 1 = obscure clues (or "easy", "medium", "hard"). @default 0 */
  readonly difficulty?: number | string;
  /** Entities (ids, labels) or relations (ids, labels) never used. */
  readonly avoid?: readonly string[];
  /** "cost" (the default) or "greedy" (the baseline: most discriminating first, no salience). */
  readonly strategy?: "cost" | "greedy";
  /** Ask each proposal back (false: proposals are unchecked, `verified` false). @default true */
  readonly roundTrip?: boolean;
  readonly repeatPenalty?: number;
  readonly extraTries?: number;
  readonly roundTripMs?: number;
  /** Candidate-fact options (facts.ts). */
  readonly facts?: Omit<FactOptions, "avoidEntities" | "avoidRelations" | "cost">;
  /** Search options (cost-search.ts). */
  readonly search?: SearchOptions;
  /** Clue pricing (explain's clue-cost.ts); `difficulty` above wins. */
  readonly cost?: ClueCostOptions;
}

/** One step of a clue's path, from the named entity towards the target (contract path step). */
export interface ComposeStep {
  readonly from: string;
  readonly relation: string;
  readonly to: string;
  readonly inverse: boolean;
}

/** One clue of a proposal. */
export interface ComposedClue {
  /** The clause ("lives in Maelhaven"); for the type, "Which researcher". */
  readonly text: string;
  readonly kind: "type" | "relation" | "chain" | "attribute";
  /** The named entity (relation, chain), or the type. */
  readonly entity?: EntityRef;
  /** Salience percentile of the named entity in [0, 1]. */
  readonly salience?: number;
  /** Walking order from the named entity to the target (empty for the type and attributes). */
  readonly steps: readonly ComposeStep[];
  /** The steps with labels, e.g. `Morten Morrow ←collaborates with— Fenna Hask` (arrows point from subject to object). */
  readonly path?: string;
  /** A chain's middle: the type it is described by (any entity of it, or of a subtype, may stand in the middle). */
  readonly middleType?: EntityRef;
  /** The attribute of an attribute clue. */
  readonly attribute?: { readonly id: string; readonly label: string; readonly value: string };
  /** Entities satisfying this clue and every earlier one. */
  readonly candidates: number;
}

/** One proposed question. */
export interface Proposal {
  readonly question: string;
  /** True only when the question asked back came out `unique` with the target first. */
  readonly verified: boolean;
  /** Entities satisfying the first i+1 clues (the type first). */
  readonly candidates: readonly number[];
  readonly clues: readonly ComposedClue[];
  /** The verdict of the round trip (status "none" and a reason when it was not run). */
  readonly verdict: { readonly status: VerdictStatus; readonly tiedWith?: readonly string[] };
  /** The answer the round trip put first. */
  readonly first?: EntityRef;
  /** Why it is not verified. */
  readonly reason?: string;
  /** Total clue cost (lower is better). */
  readonly cost: number;
}

/** Milliseconds per part of one composition. */
export interface ComposeTimings {
  readonly facts: number;
  readonly search: number;
  readonly roundTrip: number;
  readonly total: number;
}

/** The result of composing for one target. */
export interface Composition {
  readonly target: EntityRef;
  /** The head type (undefined when the target has none). */
  readonly type?: EntityRef;
  readonly proposals: readonly Proposal[];
  /** Candidate facts considered. */
  readonly facts: number;
  /** Distinguishing sets found by the search. */
  readonly sets: number;
  /** Sets asked back. */
  readonly tried: number;
  readonly notes: readonly string[];
  readonly timings: ComposeTimings;
}

/** The entities a name refers to: by id, by exact label, then by normalised label, then alias (also `show`'s lookup). */
export function resolveTarget(cat: Catalog, name: string): number[] {
  return cat.resolveName(name);
}

/** Reads a difficulty: a number in [0, 1] or easy / medium / hard. */
export function parseDifficulty(value: number | string | undefined): number {
  if (value === undefined) return 0;
  if (typeof value === "number" && value >= 0 && value <= 1) return value;
  const s = String(value).trim().toLowerCase();
  if (s in DIFFICULTIES) return DIFFICULTIES[s]!;
  if (/^(0(\.\d+)?|1(\.0+)?)$/.test(s)) return Number(s);
  throw new TiepointError("cli/usage", `--difficulty "${String(value)}": expected easy, medium, hard or a number from 0 (well-known clues) to 1 (obscure clues)`);
}

/** One session's composer: the catalog lookups and caches compose needs, kept across targets. */
export class Composer implements FactSource {
  /** The relation index the facts are read from: the session's, or (an attached catalog) the target's neighbourhood pulled from the store. */
  graph: RelationIndex;
  private readonly labels = new Map<number, string>();
  private readonly labelCounts = new Map<string, number>();
  private readonly typeCounts = new Map<number, number>();
  private readonly rels: Map<number, { id: string; label: string; aliases: readonly string[] }>;
  private readonly predNums: Map<string, number>;
  private entityCount: number | undefined;

  constructor(readonly session: Session) {
    this.graph = session.index;
    const preds = session.catalog.predicates();
    this.rels = new Map(preds.map((p) => [p.num, { id: p.id, label: p.label, aliases: p.aliases }]));
    this.predNums = new Map(preds.map((p) => [p.id, p.num]));
  }

  label(num: number): string {
    let l = this.labels.get(num);
    if (l === undefined) {
      l = this.session.ref(num).label;
      this.labels.set(num, l);
    }
    return l;
  }

  labelCount(label: string): number {
    let n = this.labelCounts.get(label);
    if (n === undefined) {
      n = new Set(this.session.catalog.byNorm(normalize(label)).map((h) => h.entity)).size;
      this.labelCounts.set(label, n);
    }
    return n;
  }

  salience(num: number): number {
    // salienceOf keeps one result per index (the session's, computed once)
    return salienceOf(this.graph).percentile[num] ?? 0;
  }

  attributes(num: number): { predicate: number; label: string; value: string }[] {
    return this.session.catalog
      .attributes(num)
      .filter((a) => a.num !== null && this.predNums.has(a.predicate))
      .map((a) => ({ predicate: this.predNums.get(a.predicate)!, label: a.label, value: a.value }));
  }

  withValue(predicate: number, value: string): readonly number[] {
    return this.session.catalog.entitiesWithValue(predicate, value);
  }

  relation(rel: number): { id: string; label: string; aliases: readonly string[] } {
    return this.rels.get(rel) ?? { id: `#${rel}`, label: `relation ${rel}`, aliases: [] };
  }

  /** Entities of type `t` (or a subtype), by the index's isA. */
  typeCount(t: number): number {
    let n = this.typeCounts.get(t);
    if (n === undefined) {
      n = 0;
      const set = new Set([t]);
      for (let u = 1; u < this.graph.nodeCount; u++) if (this.graph.isA(u, set)) n++;
      this.typeCounts.set(t, n);
    }
    return n;
  }

  describingType(num: number): number | undefined {
    let best: number | undefined;
    for (const t of this.graph.typesOf(num)) {
      if (best === undefined || this.typeCount(t) < this.typeCount(best) || (this.typeCount(t) === this.typeCount(best) && t < best)) best = t;
    }
    return best;
  }

  /** The label and aliases of an entity. */
  names(num: number): string[] {
    return [...new Set(this.session.catalog.aliasRows(num).map((r) => r[0]))];
  }

  /** Entity and relation nums named by `--avoid` values (ids or labels); an unknown one is an error. */
  avoidSets(values: readonly string[]): { entities: Set<number>; relations: Set<number> } {
    const entities = new Set<number>();
    const relations = new Set<number>();
    for (const v of values) {
      const es = resolveTarget(this.session.catalog, v);
      const want = normalize(v);
      const rs = [...this.rels.entries()].filter(([, r]) => r.id === v || normalize(r.label) === want || r.aliases.some((a) => normalize(a) === want)).map(([n]) => n);
      if (es.length === 0 && rs.length === 0) throw new TiepointError("compose/avoid", `--avoid ${JSON.stringify(v)}: no entity or relation has this id or label`);
      for (const e of es) entities.add(e);
      for (const r of rs) relations.add(r);
    }
    return { entities, relations };
  }

  /**
   * Composes up to `count` questions whose only answer is `target` (an entity num), on any
   * catalog: an attached one first pulls the target's neighbourhood from its store (the facts
   * are read from it), and every round trip is asked through `Session.askAsync`.
   */
  async compose(target: number, options: ComposeOptions = {}): Promise<Composition> {
    const t0 = performance.now();
    this.graph = (await this.session.around([target], DEFAULTS.storeRings)).index;
    const count = options.count ?? DEFAULTS.count;
    if (!Number.isInteger(count) || count < 1) throw new TiepointError("cli/usage", `--count ${String(count)}: expected a positive whole number`);
    const difficulty = parseDifficulty(options.difficulty);
    const cost: ClueCostOptions = { ...options.cost, difficulty };
    const avoid = this.avoidSets(options.avoid ?? []);
    const ref = this.session.ref(target);
    const names = this.names(target);
    const type = this.describingType(target);
    const typeSet = type !== undefined ? new Set([type]) : undefined;
    const start = type !== undefined ? this.typeCount(type) : this.entities();
    const facts = candidateFacts(this, target, names, { ...options.facts, avoidEntities: avoid.entities, avoidRelations: avoid.relations, cost });
    const exts = new Map<number, Int32Array>();
    const space: SearchSpace = {
      costs: facts.map((f) => f.cost),
      start,
      ext: (i) => {
        let e = exts.get(i);
        if (!e) {
          const all = extensionOf(this, facts[i]!);
          e = typeSet ? all.filter((x) => x === target || this.graph.isA(x, typeSet)) : all;
          exts.set(i, e);
        }
        return e;
      },
    };
    const t1 = performance.now();
    const sets = options.strategy === "greedy" ? greedySets(space, count + (options.extraTries ?? DEFAULTS.extraTries)) : cheapestSets(space, options.search);
    const ordered = varied(sets, options.repeatPenalty ?? DEFAULTS.repeatPenalty);
    const t2 = performance.now();
    const typeRef = type !== undefined ? this.session.ref(type) : undefined;
    const notes: string[] = [];
    const verified: Proposal[] = [];
    const unverified: Proposal[] = [];
    let tried = 0;
    let given = 0;
    const maxTries = count + (options.extraTries ?? DEFAULTS.extraTries);
    for (const set of ordered) {
      if (verified.length >= count || tried >= maxTries) break;
      const p = this.proposal(target, ref, typeRef, start, facts, set, space);
      if (givesAway(p.question, names)) {
        given++;
        continue;
      }
      tried++;
      const checked = options.roundTrip === false ? { ...p, verdict: { status: "none" as const }, reason: "not asked back (round trip off)" } : await this.roundTrip(p, ref, options.roundTripMs ?? DEFAULTS.roundTripMs);
      (checked.verified ? verified : unverified).push(checked);
    }
    const t3 = performance.now();
    if (facts.length === 0) notes.push(`${ref.label} has no usable fact (no relation to a named entity and no numeric attribute after the exclusions)`);
    else if (sets.length === 0) notes.push(`no combination of at most ${options.search?.maxClues ?? 4} clues singles out ${ref.label} among the ${start} ${typeRef ? `entities of type ${typeRef.label}` : "entities"}: another entity shares every fact used`);
    if (given > 0) notes.push(`${given} clue set${given === 1 ? "" : "s"} left out: the question would contain the answer's name`);
    const proposals = verified.length > 0 ? verified.slice(0, count) : unverified.slice(0, count);
    return {
      target: ref,
      ...(typeRef ? { type: typeRef } : {}),
      proposals,
      facts: facts.length,
      sets: sets.length,
      tried,
      notes,
      timings: { facts: t1 - t0, search: t2 - t1, roundTrip: t3 - t2, total: t3 - t0 },
    };
  }

  private entities(): number {
    if (this.entityCount === undefined) this.entityCount = this.session.catalog.db.prepare("SELECT count(*) FROM entity").pluck().get() as number;
    return this.entityCount;
  }

  /** The question, clues and proof of one set (clues in spoken order; counts after each). */
  private proposal(target: number, ref: EntityRef, typeRef: EntityRef | undefined, start: number, facts: readonly Fact[], set: ClueSet, space: SearchSpace): Proposal {
    const clauses: Clause[] = set.facts.map((i) => clauseOf(facts[i]!, this));
    const order = spokenOrder(clauses);
    const question = questionOf(typeRef?.label, order.map((k) => clauses[k]!));
    const clues: ComposedClue[] = [];
    const candidates: number[] = [];
    if (typeRef) {
      clues.push({ text: `Which ${typeRef.label}`, kind: "type", entity: typeRef, steps: [], candidates: start });
      candidates.push(start);
    }
    let cur: Int32Array | null = null;
    for (const k of order) {
      const i = set.facts[k]!;
      const f = facts[i]!;
      cur = cur ? intersectSorted(cur, space.ext(i)) : space.ext(i);
      candidates.push(cur.length);
      clues.push(this.clueDoc(f, clauses[k]!.text, target, ref, cur.length));
    }
    return { question, verified: false, candidates, clues, verdict: { status: "none" }, cost: set.cost };
  }

  private clueDoc(f: Fact, text: string, target: number, ref: EntityRef, candidates: number): ComposedClue {
    if (f.kind === "attribute") {
      const id = [...this.predNums.entries()].find(([, n]) => n === f.predicate)?.[0] ?? `#${f.predicate}`;
      return { text, kind: "attribute", steps: [], attribute: { id, label: f.attributeLabel!, value: f.value! }, candidates };
    }
    const entity = this.session.ref(f.entity!);
    const step = (from: number, rel: number, to: number, inverseAtTo: boolean): ComposeStep => ({
      from: this.session.ref(from).id,
      relation: this.relation(rel).id,
      to: to === target ? ref.id : this.session.ref(to).id,
      // the entry (from, rel, inverseAtTo) at `to`: stored `from rel to` when inverseAtTo
      inverse: !inverseAtTo,
    });
    const hops: [number, number, number, boolean][] = f.kind === "relation" ? [[f.entity!, f.rel!, target, f.inverse!]] : [[f.entity!, f.rel2!, f.middle!, f.inverse2!], [f.middle!, f.rel!, target, f.inverse!]];
    const steps = hops.map(([a, r, b, inv]) => step(a, r, b, inv));
    const path = [this.label(f.entity!), ...hops.map(([, r, b, inv]) => `${inv ? "—" : "←"}${this.relation(r).label}${inv ? "→" : "—"} ${this.label(b)}`)].join(" ");
    const middleType = f.middleType !== undefined ? this.session.ref(f.middleType) : undefined;
    return { text, kind: f.kind, entity, ...(f.salience !== undefined ? { salience: f.salience } : {}), steps, path, ...(middleType ? { middleType } : {}), candidates };
  }

  /** Asks a proposal's question back through the session (as `ask`) and marks it. */
  private async roundTrip(p: Proposal, ref: EntityRef, timeLimitMs: number): Promise<Proposal> {
    let result;
    try {
      result = (await this.session.askAsync(p.question, { top: 3, timeLimitMs })).result;
    } catch (e) {
      if (!(e instanceof TiepointError)) throw e;
      return { ...p, verdict: { status: "none" }, reason: `asked back, it failed: ${e.message}` };
    }
    const first = result.answers[0];
    const status = result.verdict.status;
    const ok = status === "unique" && first?.id === ref.id;
    const tied = result.verdict.tiedWith ?? [];
    let reason: string | undefined;
    if (!ok) {
      if (!first) reason = `asked back, it found no answer (${status})`;
      else if (first.id !== ref.id) reason = `asked back, it put ${first.label} [${first.id}] first (${status})`;
      else reason = `asked back, ${ref.label} comes first but the verdict is ${status}${tied.length > 0 ? ` (tied with ${tied.slice(0, 3).join(", ")}${tied.length > 3 ? ", …" : ""})` : ""}`;
    }
    return {
      ...p,
      verified: ok,
      verdict: { status, ...(tied.length > 0 ? { tiedWith: tied } : {}) },
      ...(first ? { first: { id: first.id, label: first.label } } : {}),
      ...(reason ? { reason } : {}),
    };
  }
}

/** Up to `n` greedy sets, each banning the first fact of the ones before (the baseline's alternatives). */
function greedySets(space: SearchSpace, n: number): ClueSet[] {
  const out: ClueSet[] = [];
  const banned = new Set<number>();
  for (let k = 0; k < n; k++) {
    const s = greedySet(space, banned);
    if (!s) break;
    out.push({ facts: s, cost: s.reduce((a, i) => a + space.costs[i]!, 0) });
    banned.add(s[0]!);
  }
  return out;
}

/** Sets in the order they are offered: cheapest first, each later one paying `penalty` per fact shared with those already taken. */
function varied(sets: readonly ClueSet[], penalty: number): ClueSet[] {
  const left = [...sets];
  const out: ClueSet[] = [];
  const used = new Map<number, number>();
  while (left.length > 0) {
    let best = 0;
    let bestScore = Infinity;
    left.forEach((s, i) => {
      const score = s.cost + penalty * s.facts.reduce((a, f) => a + (used.get(f) ?? 0), 0);
      if (score < bestScore) {
        best = i;
        bestScore = score;
      }
    });
    const s = left.splice(best, 1)[0]!;
    out.push(s);
    for (const f of s.facts) used.set(f, (used.get(f) ?? 0) + 1);
  }
  return out;
}

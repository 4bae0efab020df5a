/**
 * Applying a question's conditions to its ranked candidates: comparisons and exclusions as
 * filters (the reason kept per candidate), superlatives and ordinals as an ordering of the
 * candidates that fit the other clues, and a count of those candidates.
 *
 * Method: selection, ordering and counting over the candidate set, the relational-algebra
 * reading of comparative, superlative and "how many" questions (selection σ, ORDER BY …
 * LIMIT/OFFSET, COUNT; Codd 1970, "A Relational Model of Data for Large Shared Data Banks",
 * CACM 13(6); the SQL forms as in ISO/IEC 9075). The candidate set comes from the walk, so
 * "the candidates that fit the other clues" has to be decided from the graph: the fit set is
 * the candidates that every clue reaches (full coverage), with the fewest unused cue words,
 * at each clue's smallest hop distance among them (breadth-first search up to `maxHops`);
 * at one hop, those linked to the clue by a relation the question's words cue, when there are any.
 * "Which country in R has the largest area" then compares the countries one hop from R, not
 * the ones reached through a neighbour. When the question's reading has a structure that some
 * candidates satisfy (rank.ts `Ranked.matched`: every clue's relation-path pattern reaches
 * them), the whole matched set is the fit set instead (`Ranked.matchedNodes`: also the
 * entities beyond the ranking's top candidates, so a count or an ordering covers all of them). A question with no clue left (all of its mentions
 * excluded, or none linked) but an expected answer type takes every entity of that type as
 * candidates, all equally fit.
 *
 * An attribute is chosen per condition from its `choices` (best word match first): the best
 * score among those some fit candidate carries, ties going to the attribute most fit
 * candidates carry, then by id. A multi-valued attribute passes a comparison when some value
 * does; a superlative uses the largest (for "max") or smallest value. Candidates without the
 * attribute fail comparisons and come last in an ordering. Ties of value keep the ranking's
 * order (score, then node). Where the conditions change the order, each candidate's score is
 * capped at the one before it (a running minimum), so scores stay best first.
 */
import type { Deadline } from "../model/index.js";
import type { AttributeChoice, Analysis, Condition, ComparisonCondition, SuperlativeCondition } from "../analysis/index.js";
import { words } from "../analysis/index.js";
import type { Ranked, RankedCandidate } from "./rank.js";
import type { RelationIndex } from "./relation-index.js";
import { absenceTest, attributeValues, exclusionSelfOnly, exclusionSet, literalHolds, orderOf, pickAttribute, satisfies, type AttributeLookup, type AttributeValues } from "./attribute-values.js";

export { satisfies, type AttributeLookup };

/** Options of {@link applyConditions}; all optional. */
export interface ApplyConditionsOptions {
  /** Hop limit of the fit-set distance search. @default 3 */
  readonly maxHops?: number;
  /** Node visits per clue of that search. @default 200000 */
  readonly maxVisits?: number;
  /** The question's time budget: the enumeration of every entity of the expected type (no clue left) stops once it is spent. */
  readonly deadline?: Deadline;
  /** Candidates returned in the ranking (the count and the ties cover the whole set). @default 200 */
  readonly limit?: number;
}

/** Defaults of {@link ApplyConditionsOptions}. */
export const DEFAULTS = { maxHops: 3, maxVisits: 200000, limit: 200 } as const;

/** How one condition went for one candidate. */
export interface ConditionCheck {
  /** Index into the conditions. */
  readonly condition: number;
  /** Attribute predicate num used (comparisons, superlatives). */
  readonly attribute?: number;
  /** The values read (empty: the candidate has none). */
  readonly values: readonly number[];
  /** True when the candidate satisfies the condition (superlatives: true at the asked position). */
  readonly satisfied: boolean;
  /** For superlatives: the candidate's 1-based place in the ordering. */
  readonly place?: number;
  /** For exclusions: the excluded entity it is, or is linked to. */
  readonly excludedBy?: number;
  /** For literal conditions: the text values read. */
  readonly texts?: readonly string[];
}

/** A condition after the attribute was chosen. */
export interface AppliedCondition {
  readonly condition: Condition;
  /** The attribute used (null: none of the choices is carried by any candidate, or there were none). */
  readonly attribute: AttributeChoice | null;
  /** Candidates before and after this condition (filters) or ordered (superlatives). */
  readonly before: number;
  readonly after: number;
}

/** The outcome of {@link applyConditions}. */
export interface ConditionOutcome {
  /** The ranking with the conditions applied (candidates filtered and ordered, notes added). */
  readonly ranked: Ranked;
  readonly applied: readonly AppliedCondition[];
  /** Per candidate node: how each condition went (also for the candidates removed), made when asked. */
  readonly checks: { get(node: number): readonly ConditionCheck[] | undefined };
  /** The fit set after the filters (nodes, in answer order). */
  readonly fit: readonly number[];
  /** A count question: the number and the entities counted (answer order). */
  readonly count?: { readonly value: number; readonly entities: readonly number[] };
  /** A superlative: the candidates sharing the asked value with the first answer (ties), besides it. */
  readonly tiedWith?: readonly number[];
}

/**
 * Hop distances from `start` (both directions), up to `maxHops`, at most `maxVisits` nodes:
 * a dense array over the index's nodes (-1: not reached), so a search that visits 10^5
 * nodes costs no map of 10^5 entries.
 */
function hopDistances(index: RelationIndex, start: number, maxHops: number, maxVisits: number): Int8Array {
  const dist = new Int8Array(index.nodeCount).fill(-1);
  dist[start] = 0;
  let visited = 1;
  let frontier = [start];
  for (let d = 1; d <= maxHops && frontier.length > 0 && visited < maxVisits; d++) {
    const next: number[] = [];
    for (const u of frontier) {
      index.forEach(u, (v) => {
        if (dist[v] === -1 && visited < maxVisits) {
          dist[v] = d;
          visited++;
          next.push(v);
        }
      });
    }
    frontier = next;
  }
  return dist;
}

/**
 * The note for a comparison or superlative whose attributes no candidate carries: which
 * question words named the attribute (or that none did, when only the adjective's dimension
 * chose it), rather than every attribute the candidates lack.
 */
function unmatchedNote(question: string, c: ComparisonCondition | SuperlativeCondition, candidates: number, what: "condition" | "ordering"): string {
  const ws = words(question);
  const best = c.choices[0]!;
  const named = [...new Set([...best.wordIndexes].sort((x, y) => x - y).map((k) => ws[k]?.text).filter((t): t is string => t !== undefined))];
  const none = `none of the ${candidates} candidate${candidates === 1 ? "" : "s"} has`;
  return named.length > 0
    ? `"${c.words}": the word${named.length === 1 ? "" : "s"} "${named.join(" ")}" matched the attribute ${best.label}, but ${none} it, so the ${what} is not applied`
    : `"${c.words}": no word of the question names an attribute that the candidates have (nearest by meaning: ${best.label}), so the ${what} is not applied`;
}

/** The entities of a set of types, per index (the clue-less candidates), at most {@link MEMBER_SETS_KEPT} sets per index. */
const membersCache = new WeakMap<RelationIndex, Map<string, readonly number[]>>();
const MEMBER_SETS_KEPT = 8;

/**
 * The k-th best of the keys that are not NaN (k ≥ 1, at most their number): the k-th largest
 * for "max", the k-th smallest for "min", duplicates counted — what a sort of those keys puts
 * at place k, found with a binary heap of the k best seen (Williams 1964, "Algorithm 232:
 * Heapsort", CACM 7(6)), so a set of 10^5 keys needs no sorted copy. "min" runs as "max" on
 * the negated keys (`sign` −1), so the loop calls no comparison function: it runs once per
 * question over sets of 10^5, often before the engine has compiled it.
 */
function kthBest(keys: Float64Array, k: number, dir: "max" | "min"): number {
  const sign = dir === "max" ? 1 : -1;
  // a min-heap of the k largest signed keys seen: the root is the worst of them
  const heap = new Float64Array(k);
  let size = 0;
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i]!;
    if (key !== key) continue; // NaN: no value
    const v = sign * key;
    if (size < k) {
      // sift up
      let c = size++;
      while (c > 0) {
        const p = (c - 1) >> 1;
        if (!(v < heap[p]!)) break;
        heap[c] = heap[p]!;
        c = p;
      }
      heap[c] = v;
    } else if (heap[0]! < v) {
      // replace the root and sift down
      let c = 0;
      for (;;) {
        let w = 2 * c + 1;
        if (w >= size) break;
        if (w + 1 < size && heap[w + 1]! < heap[w]!) w++;
        if (!(heap[w]! < v)) break;
        heap[c] = heap[w]!;
        c = w;
      }
      heap[c] = v;
    }
  }
  return sign * heap[0]!;
}

/** How many of `keys` are not NaN. */
function countValued(keys: Float64Array): number {
  let valued = 0;
  for (let i = 0; i < keys.length; i++) if (keys[i] === keys[i]) valued++;
  return valued;
}

/** How a filter or an ordering judges one node, asked only for the nodes shown (answers, why-not). */
type Judge = (node: number) => ConditionCheck;

/**
 * Applies the conditions to a ranking. The work is proportional to the candidate set (the
 * ranking's candidates and the reading's whole matched set): filters and orderings run over
 * node numbers and the attributes' typed columns; ranked-candidate records are made only for
 * the first `limit` of the result, and the per-node checks only when asked for.
 */
export function applyConditions(
  analysis: Analysis,
  ranked: Ranked,
  conditions: readonly Condition[],
  index: RelationIndex,
  lookup: AttributeLookup,
  options: ApplyConditionsOptions = {},
): ConditionOutcome {
  const maxHops = options.maxHops ?? DEFAULTS.maxHops;
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  const limit = options.limit ?? DEFAULTS.limit;
  const notes: string[] = [];
  const typeSet = new Set(analysis.answerTypes.map((t) => t.num));
  const C = ranked.clues.length;

  // candidates as node numbers in the ranking's order; a candidate the ranking did not
  // return (beyond its top or its walk) gets `extra`'s record
  const byNode = new Map<number, RankedCandidate>();
  let order: number[] = [];
  /** The candidates that fit the clues (null: every candidate does). */
  let fit: ReadonlySet<number> | null;
  let extra = { score: 1, perClue: [] as readonly number[], covered: 0 };
  let matchedAll: number | undefined;
  const usable = conditions.some((c) => c.kind === "count" || c.kind === "exclusion" || c.kind === "absence" || c.choices.length > 0);
  const literalSeed = conditions.find((c) => c.kind === "literal" && !c.negated);
  /** A literal value that describes a node one hop from the answer (its entities are of none of the expected types). */
  let hoppedLiteral: Condition | undefined;
  if (ranked.clues.length === 0 && literalSeed?.kind === "literal" && lookup.entitiesWith) {
    // no clue: the entities that carry the asked value (of the expected type) are the candidates
    const attr = literalSeed.choices[0]!;
    const seeds = lookup.entitiesWith(attr.num, literalSeed.value);
    order = seeds.filter((v) => typeSet.size === 0 || index.isA(v, typeSet));
    fit = null;
    if (order.length === 0 && seeds.length > 0 && typeSet.size > 0) {
      // the value belongs to a node one hop from the answer ("countries that use a currency
      // whose symbol is ₩"): the entities of the expected types linked to the value's entities,
      // by the relations the question's words cue (any relation when they cue none)
      const cued = new Set(analysis.relationCues.map((c) => c.relation));
      const reached = new Set<number>();
      for (const u of seeds) index.forEach(u, (v, rel) => {
        if ((cued.size === 0 || cued.has(rel)) && index.isA(v, typeSet)) reached.add(v);
      });
      order = [...reached].sort((a, b) => a - b);
      hoppedLiteral = literalSeed;
      notes.push(`no clue entity: the ${analysis.answerTypes.map((t) => t.label).join(" or ")} entities linked${cued.size > 0 ? " by the cued relation" : ""} to the ${seeds.length} whose ${attr.label} is ${literalSeed.value} are the candidates (${order.length})`);
    } else notes.push(`no clue entity: the entities whose ${attr.label} is ${literalSeed.value} are the candidates (${order.length})`);
  } else if (ranked.clues.length === 0 && typeSet.size > 0 && usable) {
    // every entity of the expected types: a function of the index alone, enumerated once per index and kept
    const key = [...typeSet].sort((a, b) => a - b).join(",");
    const kept = membersCache.get(index)?.get(key);
    // the kept list is never changed in place (every step below makes a new array)
    if (kept) order = kept as number[];
    else {
      // the time budget, looked at every 4,096 nodes: the candidates enumerated so far are kept
      const members = index.membersOf(typeSet, options.deadline ? () => options.deadline!.stop("conditions") : undefined);
      order = members.nodes;
      if (members.cut !== undefined) notes.push(`time limit reached: only the entities numbered below ${members.cut} of ${index.nodeCount} were considered`);
      else {
        const perIndex = membersCache.get(index) ?? new Map<string, readonly number[]>();
        if (perIndex.size >= MEMBER_SETS_KEPT) perIndex.delete(perIndex.keys().next().value!);
        perIndex.set(key, order);
        membersCache.set(index, perIndex);
      }
    }
    fit = null;
    if (order.length > 0) notes.push(`no clue entity: every ${analysis.answerTypes.map((t) => t.label).join(" or ")} of the catalog is a candidate (${order.length})`);
  } else {
    for (const c of ranked.candidates) {
      byNode.set(c.node, c);
      order.push(c.node);
    }
    if (ranked.matched !== undefined && ranked.matched > 0) {
      // the reading's whole matched set (rank.ts: every clue's pattern reaches them), not only
      // the ranking's top: a set of 6,000 is counted and ordered in full
      const all = ranked.matchedNodes ? ranked.matchedNodes() : ranked.candidates.slice(0, ranked.matched).map((c) => c.node);
      fit = new Set(all);
      matchedAll = all.length;
      const last = ranked.candidates[Math.min(ranked.matched, ranked.candidates.length) - 1];
      extra = { score: last?.score ?? 0, perClue: new Array<number>(C).fill(0), covered: C };
      for (const v of all) if (!byNode.has(v)) order.push(v);
    } else {
      fit = fitSet(analysis, ranked, index, maxHops, maxVisits);
    }
  }
  const isFit = (v: number) => fit === null || fit.has(v);
  const universe = order;

  const columns = new Map<number, AttributeValues>();
  const valuesOf = (attr: number): AttributeValues => {
    let a = columns.get(attr);
    if (a === undefined) columns.set(attr, (a = attributeValues(lookup, attr)));
    return a;
  };
  const applied: AppliedCondition[] = [];
  /** The filters' judges in condition order, then the orderings' (each asked only for the nodes that reached it). */
  const filters: Judge[] = [];
  const orderings: Judge[] = [];
  const pick = (choices: readonly AttributeChoice[]): AttributeChoice | null => {
    const pool = fit === null ? order : order.filter(isFit);
    return pickAttribute(choices, pool.length > 0 ? pool : order, valuesOf);
  };

  // filters first: exclusions and comparisons
  conditions.forEach((c, ci) => {
    const before = order.length;
    if (c.kind === "exclusion") {
      const linked = exclusionSet(c, typeSet, index);
      const selfOnly = exclusionSelfOnly(c, typeSet, index);
      order = order.filter((v) => !linked.has(v));
      filters.push((v) => (linked.has(v) ? { condition: ci, values: [], satisfied: false, excludedBy: c.node } : { condition: ci, values: [], satisfied: true }));
      applied.push({ condition: c, attribute: null, before, after: order.length });
      notes.push(`${c.words}: ${before - order.length} candidate${before - order.length === 1 ? "" : "s"} excluded (${selfOnly ? `${c.label} itself` : `${c.label} and what is linked to it${c.relations.length > 0 ? " by the cued relation" : ""}`})`);
    } else if (c.kind === "absence") {
      const lacks = absenceTest(c, index);
      order = order.filter(lacks);
      filters.push((v) => ({ condition: ci, values: [], satisfied: lacks(v) }));
      applied.push({ condition: c, attribute: null, before, after: order.length });
      notes.push(`${c.words}: ${before - order.length} candidate${before - order.length === 1 ? "" : "s"} removed (they have such a link)`);
    } else if (c.kind === "literal") {
      const attr = c.choices[0]!;
      if (c === hoppedLiteral) {
        // met one hop away: the candidates were reached from the entities that carry the value
        applied.push({ condition: c, attribute: attr, before, after: before });
        return;
      }
      const texts = (v: number) => (lookup.texts ? lookup.texts(v, attr.num) : []);
      // an attribute no candidate carries describes another node of the question ("the capital of the *landlocked* country"): not applied here
      if (!order.some((v) => texts(v).length > 0)) {
        applied.push({ condition: c, attribute: null, before, after: before });
        notes.push(`"${c.words}": no candidate has ${attr.label}, so the condition is not applied`);
        return;
      }
      const ok = (ts: readonly string[]) => literalHolds(c, ts);
      order = order.filter((v) => ok(texts(v)));
      filters.push((v) => {
        const ts = texts(v);
        return { condition: ci, attribute: attr.num, values: [], texts: ts, satisfied: ok(ts) };
      });
      applied.push({ condition: c, attribute: attr, before, after: order.length });
      notes.push(`${attr.label} ${c.negated ? "!=" : "="} ${c.value}: ${order.length} of ${before} candidates kept`);
    } else if (c.kind === "comparison") {
      const attr = pick(c.choices);
      if (attr === null) {
        applied.push({ condition: c, attribute: null, before, after: before });
        if (c.choices.length > 0) notes.push(unmatchedNote(analysis.question, c, before, "condition"));
        return;
      }
      const vals = valuesOf(attr.num);
      const test = (x: number) => satisfies(c, x);
      order = order.filter((v) => vals.some(v, test));
      filters.push((v) => ({ condition: ci, attribute: attr.num, values: vals.list(v), satisfied: vals.some(v, test) }));
      applied.push({ condition: c, attribute: attr, before, after: order.length });
      notes.push(`${attr.label} ${c.operator} ${c.values.join(" and ")}: ${order.length} of ${before} candidates kept`);
    }
  });
  // after the filters, the candidates that fit every clue come first (each group in ranking order)
  if (ranked.clues.length > 0 && fit !== null) {
    const first = order.filter(isFit);
    if (first.length === 0 && order.length > 0 && applied.length > 0) notes.push("no candidate that fits every clue satisfies the conditions: the answers shown fit only part of the question");
    order = first.concat(order.filter((v) => !isFit(v)));
  }

  // orderings: superlatives among the fit candidates
  let tiedWith: number[] | undefined;
  conditions.forEach((c, ci) => {
    if (c.kind !== "superlative") return;
    const attr = pick(c.choices);
    const before = order.length;
    if (attr === null) {
      applied.push({ condition: c, attribute: null, before, after: before });
      if (c.choices.length > 0) notes.push(unmatchedNote(analysis.question, c, before, "ordering"));
      return;
    }
    const dir = orderOf(c, attr);
    const vals = valuesOf(attr.num);
    // (plain loops and concat, no spreads: the sets run to tens of thousands)
    let inFit: number[] = order;
    let rest: number[] = [];
    if (fit !== null) {
      inFit = [];
      for (const v of order) (isFit(v) ? inFit : rest).push(v);
    }
    // one key per fit candidate (largest value for "max", smallest for "min"), NaN: none
    const keys = vals.extremes(inFit, dir);
    const n = inFit.length;
    const valued = countValued(keys);
    const better = (i: number, j: number) => (dir === "max" ? keys[j]! - keys[i]! : keys[i]! - keys[j]!) || i - j;
    // only the first `limit` + position places need their order (a selection, then a sort of
    // those: Hoare's FIND idea, common practice for top-k); ties of value keep the ranking order (index).
    // The head: every candidate with a value when they are few, else those at least as good as
    // the k-th best value (signed: "min" compares the negated keys, so one test serves both)
    const k = Math.min(valued, limit + c.position);
    const sign = dir === "max" ? 1 : -1;
    const bound = sign * (valued > 2 * k ? kthBest(keys, k, dir) : dir === "max" ? -Infinity : Infinity);
    const head: number[] = [];
    for (let i = 0; i < n; i++) if (sign * keys[i]! >= bound) head.push(i);
    head.sort(better);
    // the new order in one array of its final length (the sets run to 10^5: no growing copies):
    // the asked place first, the other head places in order, the rest of the valued ones and
    // those without a value (each in ranking order, in one pass), then the candidates that do not fit
    const pos = Math.min(c.position, valued) - 1;
    const next = new Array<number>(n + rest.length);
    let w = 0;
    if (valued > 0) {
      const first = head[pos]!;
      next[w++] = inFit[first]!;
      for (let j = 0; j < head.length; j++) if (j !== pos) next[w++] = inFit[head[j]!]!;
      // every other candidate with the asked place's value, in ranking order: all in the head
      // (their value is the asked place's, at least as good as the bound), which is in that order
      const top = keys[first]!;
      const tied: number[] = [];
      for (let j = 0; j < head.length; j++) if (j !== pos && keys[head[j]!] === top) tied.push(inFit[head[j]!]!);
      tiedWith = tied;
    }
    // the valued ones outside the head fill [w, w + valued − head), those without a value follow
    let wNone = w + valued - head.length;
    for (let i = 0; i < n; i++) {
      const v = keys[i]!;
      if (v !== v) next[wNone++] = inFit[i]!;
      else if (!(sign * v >= bound)) next[w++] = inFit[i]!;
    }
    w = wNone;
    for (const v of rest) next[w++] = v;
    orderings.push((v) => {
      // the place is the rank among the fit candidates with a value (asked place first: the rest keep theirs);
      // the judge is asked for the nodes shown only, so a scan costs less than a map of every candidate
      const i = inFit.lastIndexOf(v);
      if (i < 0) return { condition: ci, attribute: attr.num, values: [], satisfied: false };
      if (Number.isNaN(keys[i]!)) return { condition: ci, attribute: attr.num, values: [], satisfied: false };
      let place = 1;
      for (let j = 0; j < n; j++) if (j !== i && !Number.isNaN(keys[j]!) && better(j, i) < 0) place++;
      return { condition: ci, attribute: attr.num, values: vals.list(v), satisfied: place === c.position, place };
    });
    order = next;
    applied.push({ condition: c, attribute: attr, before, after: order.length });
    notes.push(`ordered by ${attr.label} (${dir === "max" ? "largest" : "smallest"} first${c.position > 1 ? `, place ${c.position} asked` : ""}) among ${valued} candidate${valued === 1 ? "" : "s"} that fit the clues and have it`);
  });

  const fitNow = fit === null ? order : order.filter(isFit);
  const countCond = conditions.find((c) => c.kind === "count");
  let count: ConditionOutcome["count"];
  if (countCond) {
    // the counted entities first
    if (fit !== null) order = fitNow.concat(order.filter((v) => !isFit(v)));
    count = { value: fitNow.length, entities: fitNow };
    applied.push({ condition: countCond, attribute: null, before: order.length, after: fitNow.length });
    notes.push(`counted ${fitNow.length} entit${fitNow.length === 1 ? "y" : "ies"} that fit every clue and condition`);
  }
  if (order.length === 0 && ranked.candidates.length > 0) notes.push("no candidate satisfies the conditions");
  // the new order is the answer order: each score is capped at the previous one's (a running
  // minimum), so scores stay best first; records only for the first `limit`
  const candidates: RankedCandidate[] = [];
  let prev = Infinity;
  for (let i = 0; i < order.length && i < limit; i++) {
    const v = order[i]!;
    const base = byNode.get(v) ?? { node: v, ...extra };
    const score = Math.min(base.score, prev);
    prev = score;
    candidates.push(score === base.score ? base : { ...base, score });
  }
  // the per-node checks, made when asked (answers shown, why-not): the filters up to the first
  // one failed, then (still a fit candidate) the orderings
  let inUniverse: Set<number> | undefined;
  const checks = {
    get(node: number): readonly ConditionCheck[] | undefined {
      inUniverse ??= new Set(universe);
      if (!inUniverse.has(node)) return undefined;
      const out: ConditionCheck[] = [];
      for (const judge of filters) {
        const ch = judge(node);
        out.push(ch);
        if (!ch.satisfied) return out;
      }
      if (isFit(node)) for (const judge of orderings) out.push(judge(node));
      return out.length > 0 ? out : undefined;
    },
  };
  return {
    ranked: { ...ranked, candidates, notes: [...ranked.notes, ...notes], ...(matchedAll !== undefined ? { matched: matchedAll } : {}) },
    applied,
    checks,
    fit: fitNow,
    ...(count ? { count } : {}),
    ...(tiedWith !== undefined ? { tiedWith } : {}),
  };
}

/**
 * The candidates that fit the other clues: full clue coverage, fewest unused cue words, and
 * at every clue's smallest hop distance among those.
 */
function fitSet(analysis: Analysis, ranked: Ranked, index: RelationIndex, maxHops: number, maxVisits: number): Set<number> {
  const cued = new Set(analysis.relationCues.map((c) => c.relation));
  if (ranked.candidates.length === 0) return new Set();
  const maxCovered = Math.max(...ranked.candidates.map((c) => c.covered));
  let pool = ranked.candidates.filter((c) => c.covered === maxCovered);
  const minMiss = Math.min(...pool.map((c) => c.cueMissing ?? 0));
  pool = pool.filter((c) => (c.cueMissing ?? 0) <= minMiss + 1e-9);
  for (const clue of ranked.clues) {
    if (clue.node < 0 || clue.node >= index.nodeCount) continue;
    const dist = hopDistances(index, clue.node, maxHops, maxVisits);
    const d = (n: number) => (n >= 0 && n < dist.length && dist[n]! >= 0 ? dist[n]! : Infinity);
    const min = Math.min(...pool.map((c) => d(c.node)));
    if (min === Infinity) continue;
    pool = pool.filter((c) => d(c.node) === min);
    if (min === 1 && cued.size > 0) {
      // one hop away: when some candidates are linked to the clue by a relation the question names, only they fit
      const linked = new Set<number>();
      index.forEach(clue.node, (v, rel) => {
        if (cued.has(rel)) linked.add(v);
      });
      const named = pool.filter((c) => linked.has(c.node));
      if (named.length > 0) pool = named;
    }
  }
  return new Set(pool.map((c) => c.node));
}

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
 * them), those candidates are the fit set instead. A question with no clue left (all of its mentions
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

/** Options of {@link applyConditions}; all optional. */
export interface ApplyConditionsOptions {
  /** Hop limit of the fit-set distance search. @default 3 */
  readonly maxHops?: number;
  /** Node visits per clue of that search. @default 200000 */
  readonly maxVisits?: number;
  /** The question's time budget: the enumeration of every entity of the expected type (no clue left) stops once it is spent. */
  readonly deadline?: Deadline;
}

/** Defaults of {@link ApplyConditionsOptions}. */
export const DEFAULTS = { maxHops: 3, maxVisits: 200000 } as const;

/** Reads numeric attribute values (the catalog's `attributeNumbers`). */
export interface AttributeLookup {
  /** Numeric values of `predicate` on `entity`, smallest first. */
  numbers(entity: number, predicate: number): readonly number[];
  /** Text values of `predicate` on `entity`, as stored (literal conditions). @default none */
  texts?(entity: number, predicate: number): readonly string[];
  /** Entities with the literal `value` of `predicate` (a literal condition without a clue). @default none */
  entitiesWith?(predicate: number, value: string): readonly number[];
}

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
  /** Per candidate node: how each condition went (also for the candidates removed). */
  readonly checks: ReadonlyMap<number, readonly ConditionCheck[]>;
  /** The fit set after the filters (nodes, in answer order). */
  readonly fit: readonly number[];
  /** A count question: the number and the entities counted (answer order). */
  readonly count?: { readonly value: number; readonly entities: readonly number[] };
  /** A superlative: the candidates sharing the asked value with the first answer (ties), besides it. */
  readonly tiedWith?: readonly number[];
  /** Candidates removed by a filter, with the first failed condition. */
  readonly removed: readonly { readonly node: number; readonly condition: number }[];
}

/** True when the value lies in the comparison's range (negated: outside it). */
export function satisfies(c: ComparisonCondition, v: number): boolean {
  const inRange =
    (c.min === undefined || (c.minStrict ? v > c.min : v >= c.min)) && (c.max === undefined || (c.maxStrict ? v < c.max : v <= c.max));
  return c.negated ? !inRange : inRange;
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

/** Applies the conditions to a ranking. */
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
  const notes: string[] = [];
  const typeSet = new Set(analysis.answerTypes.map((t) => t.num));

  // candidates: the ranking's, or (no clue left) every entity of the expected type
  let cands: RankedCandidate[] = [...ranked.candidates];
  let fit: Set<number>;
  const usable = conditions.some((c) => c.kind === "count" || c.kind === "exclusion" || c.choices.length > 0);
  const literalSeed = conditions.find((c) => c.kind === "literal" && !c.negated);
  if (ranked.clues.length === 0 && literalSeed?.kind === "literal" && lookup.entitiesWith) {
    // no clue: the entities that carry the asked value (of the expected type) are the candidates
    const with_ = lookup.entitiesWith(literalSeed.choices[0]!.num, literalSeed.value).filter((v) => typeSet.size === 0 || index.isA(v, typeSet));
    cands = with_.map((v) => ({ node: v, score: 1, perClue: [], covered: 0 }));
    fit = new Set(with_);
    notes.push(`no clue entity: the entities whose ${literalSeed.choices[0]!.label} is ${literalSeed.value} are the candidates (${cands.length})`);
  } else if (ranked.clues.length === 0 && typeSet.size > 0 && usable) {
    cands = [];
    for (let v = 0; v < index.nodeCount; v++) {
      // the time budget, looked at every 4,096 nodes: the candidates enumerated so far are kept
      if ((v & 4095) === 0 && v > 0 && options.deadline?.stop("conditions")) {
        notes.push(`time limit reached: only the entities numbered below ${v} of ${index.nodeCount} were considered`);
        break;
      }
      if (!typeSet.has(v) && index.isA(v, typeSet)) cands.push({ node: v, score: 1, perClue: [], covered: 0 });
    }
    fit = new Set(cands.map((c) => c.node));
    if (cands.length > 0) notes.push(`no clue entity: every ${analysis.answerTypes.map((t) => t.label).join(" or ")} of the catalog is a candidate (${cands.length})`);
  } else if (ranked.matched !== undefined && ranked.matched > 0) {
    // the reading's structure decides which candidates fit the clues (rank.ts: every clue's pattern reaches them)
    fit = new Set(ranked.candidates.slice(0, ranked.matched).map((c) => c.node));
  } else {
    fit = fitSet(analysis, ranked, index, maxHops, maxVisits);
  }

  const checks = new Map<number, ConditionCheck[]>();
  const addCheck = (node: number, c: ConditionCheck) => {
    const list = checks.get(node) ?? [];
    list.push(c);
    checks.set(node, list);
  };
  const applied: AppliedCondition[] = [];
  const removed: { node: number; condition: number }[] = [];
  // the lookup is the cache (the session's per-predicate columns): one call per candidate and attribute
  const values = (node: number, attr: number) => lookup.numbers(node, attr);
  const pick = (choices: readonly AttributeChoice[]): AttributeChoice | null => {
    const pool = cands.filter((c) => fit.has(c.node));
    const scope = pool.length > 0 ? pool : cands;
    let best: AttributeChoice | null = null;
    let bestCarry = 0;
    for (const a of choices) {
      const carry = scope.filter((c) => values(c.node, a.num).length > 0).length;
      if (carry === 0) continue;
      if (best === null || a.score > best.score + 1e-9 || (Math.abs(a.score - best.score) <= 1e-9 && carry > bestCarry)) {
        best = a;
        bestCarry = carry;
      }
    }
    return best;
  };

  // filters first: exclusions and comparisons
  conditions.forEach((c, ci) => {
    if (c.kind === "exclusion") {
      const before = cands.length;
      const linked = new Set<number>([c.node]);
      const selfOnly = c.mode === "other" && typeSet.size > 0 && index.isA(c.node, typeSet);
      if (!selfOnly && c.node >= 0 && c.node < index.nodeCount) {
        const rels = new Set(c.relations);
        index.forEach(c.node, (v, rel) => {
          if (rels.size === 0 || rels.has(rel)) linked.add(v);
        });
      }
      cands = cands.filter((x) => {
        const out = linked.has(x.node);
        addCheck(x.node, { condition: ci, values: [], satisfied: !out, ...(out ? { excludedBy: c.node } : {}) });
        if (out) removed.push({ node: x.node, condition: ci });
        return !out;
      });
      applied.push({ condition: c, attribute: null, before, after: cands.length });
      notes.push(`${c.words}: ${before - cands.length} candidate${before - cands.length === 1 ? "" : "s"} excluded (${selfOnly ? `${c.label} itself` : `${c.label} and what is linked to it${c.relations.length > 0 ? " by the cued relation" : ""}`})`);
    } else if (c.kind === "literal") {
      const attr = c.choices[0]!;
      const before = cands.length;
      const want = c.value.toLowerCase();
      // an attribute no candidate carries describes another node of the question ("the capital of the *landlocked* country"): not applied here
      if (!cands.some((x) => (lookup.texts ? lookup.texts(x.node, attr.num) : []).length > 0)) {
        applied.push({ condition: c, attribute: null, before, after: before });
        notes.push(`"${c.words}": no candidate has ${attr.label}, so the condition is not applied`);
        return;
      }
      cands = cands.filter((x) => {
        const ts = lookup.texts ? lookup.texts(x.node, attr.num) : [];
        const ok = ts.some((t) => t.toLowerCase() === want) !== c.negated;
        addCheck(x.node, { condition: ci, attribute: attr.num, values: [], texts: ts, satisfied: ok });
        if (!ok) removed.push({ node: x.node, condition: ci });
        return ok;
      });
      applied.push({ condition: c, attribute: attr, before, after: cands.length });
      notes.push(`${attr.label} ${c.negated ? "!=" : "="} ${c.value}: ${cands.length} of ${before} candidates kept`);
    } else if (c.kind === "comparison") {
      const attr = pick(c.choices);
      const before = cands.length;
      if (attr === null) {
        applied.push({ condition: c, attribute: null, before, after: before });
        if (c.choices.length > 0) notes.push(unmatchedNote(analysis.question, c, before, "condition"));
        return;
      }
      cands = cands.filter((x) => {
        const vs = values(x.node, attr.num);
        const ok = vs.some((v) => satisfies(c, v));
        addCheck(x.node, { condition: ci, attribute: attr.num, values: vs, satisfied: ok });
        if (!ok) removed.push({ node: x.node, condition: ci });
        return ok;
      });
      applied.push({ condition: c, attribute: attr, before, after: cands.length });
      notes.push(`${attr.label} ${c.operator} ${c.values.join(" and ")}: ${cands.length} of ${before} candidates kept`);
    }
  });
  const kept = new Set(cands.map((c) => c.node));
  // after the filters, the candidates that fit every clue come first (each group in ranking order)
  if (ranked.clues.length > 0) {
    const first = cands.filter((c) => fit.has(c.node));
    if (first.length === 0 && cands.length > 0 && applied.length > 0) notes.push("no candidate that fits every clue satisfies the conditions: the answers shown fit only part of the question");
    cands = [...first, ...cands.filter((c) => !fit.has(c.node))];
  }
  const fitOrder = () => cands.filter((c) => fit.has(c.node));

  // orderings: superlatives among the fit candidates
  let tiedWith: number[] | undefined;
  conditions.forEach((c, ci) => {
    if (c.kind !== "superlative") return;
    const attr = pick(c.choices);
    const before = cands.length;
    if (attr === null) {
      applied.push({ condition: c, attribute: null, before, after: before });
      if (c.choices.length > 0) notes.push(unmatchedNote(analysis.question, c, before, "ordering"));
      return;
    }
    const order = orderOf(c, attr);
    const inFit = fitOrder();
    const rest = cands.filter((x) => !fit.has(x.node));
    // one key per fit candidate (largest value for "max", smallest for "min"), NaN: none
    const keys = new Float64Array(inFit.length);
    const withIdx: number[] = [];
    const without: RankedCandidate[] = [];
    inFit.forEach((x, i) => {
      const vs = values(x.node, attr.num);
      keys[i] = vs.length === 0 ? NaN : order === "max" ? vs[vs.length - 1]! : vs[0]!;
      if (vs.length === 0) without.push(x);
      else withIdx.push(i);
    });
    // stable: ties of value keep the ranking order (by index)
    withIdx.sort((i, j) => (order === "max" ? keys[j]! - keys[i]! : keys[i]! - keys[j]!) || i - j);
    const withValue = withIdx.map((i) => inFit[i]!);
    const pos = Math.min(c.position, withValue.length) - 1;
    const ordered = pos > 0 ? [withValue[pos]!, ...withValue.slice(0, pos), ...withValue.slice(pos + 1)] : withValue;
    const placeOf = (k: number) => (pos > 0 ? (k === 0 ? pos + 1 : k <= pos ? k : k + 1) : k + 1);
    ordered.forEach((x, k) => {
      const place = placeOf(k);
      addCheck(x.node, { condition: ci, attribute: attr.num, values: values(x.node, attr.num), satisfied: place === c.position, place });
    });
    for (const x of without) addCheck(x.node, { condition: ci, attribute: attr.num, values: [], satisfied: false });
    if (ordered.length > 0) {
      const top = keys[withIdx[pos > 0 ? pos : 0]!]!;
      tiedWith = ordered.slice(1).filter((_, k) => keys[withIdx[placeOf(k + 1) - 1]!] === top).map((x) => x.node);
    }
    cands = [...ordered, ...without, ...rest];
    applied.push({ condition: c, attribute: attr, before, after: cands.length });
    notes.push(`ordered by ${attr.label} (${order === "max" ? "largest" : "smallest"} first${c.position > 1 ? `, place ${c.position} asked` : ""}) among ${withValue.length} candidate${withValue.length === 1 ? "" : "s"} that fit the clues and have it`);
  });

  const fitNow = fitOrder().map((c) => c.node).filter((n) => kept.has(n));
  const countCond = conditions.find((c) => c.kind === "count");
  let count: ConditionOutcome["count"];
  if (countCond) {
    // the counted entities first
    const set = new Set(fitNow);
    cands = [...cands.filter((c) => set.has(c.node)), ...cands.filter((c) => !set.has(c.node))];
    count = { value: fitNow.length, entities: fitNow };
    applied.push({ condition: countCond, attribute: null, before: cands.length, after: fitNow.length });
    notes.push(`counted ${fitNow.length} entit${fitNow.length === 1 ? "y" : "ies"} that fit every clue and condition`);
  }
  if (cands.length === 0 && ranked.candidates.length > 0) notes.push("no candidate satisfies the conditions");
  // the new order is the answer order: each score is capped at the previous one's (a running minimum), so scores stay best first
  for (let i = 1; i < cands.length; i++) if (cands[i]!.score > cands[i - 1]!.score) cands[i] = { ...cands[i]!, score: cands[i - 1]!.score };
  return {
    ranked: { ...ranked, candidates: cands, notes: [...ranked.notes, ...notes] },
    applied,
    checks,
    fit: fitNow,
    ...(count ? { count } : {}),
    ...(tiedWith !== undefined ? { tiedWith } : {}),
    removed,
  };
}

/** The direction of a superlative on the chosen attribute: a temporal word on a non-temporal attribute ("oldest" on an age) flips. */
function orderOf(c: SuperlativeCondition, attr: AttributeChoice): "max" | "min" {
  const temporalAttr = attr.unit !== undefined ? /year|date/i.test(attr.unit) : true;
  if (c.temporal && !temporalAttr) return c.order === "max" ? "min" : "max";
  return c.order;
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

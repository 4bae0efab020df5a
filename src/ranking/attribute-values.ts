/**
 * Reading a condition's attribute and testing one entity against a condition: numeric values
 * per entity through the attribute's CSR column (catalog numeric-column.ts), the range test of
 * a comparison, the direction of a superlative on its attribute, and the entities an exclusion
 * removes. Shared by the conditions on the answer (conditions.ts) and on an inner node of the
 * query graph (node-select.ts).
 *
 * Method: selection predicates of the relational algebra (Codd 1970, "A Relational Model of
 * Data for Large Shared Data Banks", CACM 13(6)) over one attribute column each; the
 * exclusion is an anti-join with the excluded entity's neighbourhood (NOT EXISTS in SQL,
 * ISO/IEC 9075).
 */
import type { AbsenceCondition, AttributeChoice, ComparisonCondition, ExclusionCondition, LiteralCondition, SuperlativeCondition } from "../analysis/index.js";
import { rowIndex } from "../catalog/index.js";
import type { RelationIndex } from "./relation-index.js";

/** Reads numeric attribute values (the catalog's `attributeNumbers`). */
export interface AttributeLookup {
  /** Numeric values of `predicate` on `entity`, smallest first. */
  numbers(entity: number, predicate: number): readonly number[];
  /** Text values of `predicate` on `entity`, as stored (literal conditions). @default none */
  texts?(entity: number, predicate: number): readonly string[];
  /** Entities with the literal `value` of `predicate` (a literal condition without a clue). @default none */
  entitiesWith?(predicate: number, value: string): readonly number[];
  /** The predicate's numbers as a CSR column (catalog numeric-column.ts): ascending entities, row offsets, values smallest first per row. @default read through `numbers` */
  column?(predicate: number): { readonly entities: Int32Array; readonly offsets: Int32Array; readonly values: Float64Array };
}


/** True when the value lies in the comparison's range (negated: outside it). */
export function satisfies(c: ComparisonCondition, v: number): boolean {
  const inRange =
    (c.min === undefined || (c.minStrict ? v > c.min : v >= c.min)) && (c.max === undefined || (c.maxStrict ? v < c.max : v <= c.max));
  return c.negated ? !inRange : inRange;
}


/** One numeric attribute's values per entity, read through the attribute's CSR column when the lookup has one. */
export interface AttributeValues {
  /** The values of `node`, smallest first (empty: none). */
  list(node: number): readonly number[];
  /** True when some value of `node` passes `test`. */
  some(node: number, test: (v: number) => boolean): boolean;
  /** The largest ("max") or smallest value of each of `nodes`, NaN for none (one merge pass over the column while `nodes` ascend, as a set enumerated by num does). */
  extremes(nodes: readonly number[], order: "max" | "min"): Float64Array;
  /** How many of `nodes` carry a value (the same pass as {@link extremes}, nothing allocated); the count stops at `atLeast` when given. */
  carriers(nodes: readonly number[], atLeast?: number): number;
}

export function attributeValues(lookup: AttributeLookup, predicate: number): AttributeValues {
  const col = lookup.column?.(predicate);
  if (col) {
    const { entities, offsets, values } = col;
    return {
      list: (n) => {
        const r = rowIndex(entities, n);
        return r < 0 ? [] : Array.from(values.subarray(offsets[r]!, offsets[r + 1]!));
      },
      some: (n, test) => {
        const r = rowIndex(entities, n);
        if (r < 0) return false;
        for (let k = offsets[r]!; k < offsets[r + 1]!; k++) if (test(values[k]!)) return true;
        return false;
      },
      extremes: (nodes, order) => {
        const out = new Float64Array(nodes.length);
        // a row's largest value is its last, its smallest its first: values[offsets[r + last] − last]
        const last = order === "max" ? 1 : 0;
        let at = 0;
        let ascending = true;
        for (let i = 0; i < nodes.length; i++) {
          const n = nodes[i]!;
          if (i > 0 && n < nodes[i - 1]!) ascending = false;
          let r: number;
          if (ascending) {
            while (at < entities.length && entities[at]! < n) at++;
            r = at < entities.length && entities[at] === n ? at : -1;
          } else r = rowIndex(entities, n);
          out[i] = r < 0 ? NaN : values[offsets[r + last]! - last]!;
        }
        return out;
      },
      carriers: (nodes, atLeast = Infinity) => {
        let count = 0;
        let at = 0;
        let ascending = true;
        for (let i = 0; i < nodes.length && count < atLeast; i++) {
          const n = nodes[i]!;
          if (i > 0 && n < nodes[i - 1]!) ascending = false;
          if (ascending) {
            while (at < entities.length && entities[at]! < n) at++;
            if (at < entities.length && entities[at] === n) count++;
          } else if (rowIndex(entities, n) >= 0) count++;
        }
        return count;
      },
    };
  }
  return {
    list: (n) => lookup.numbers(n, predicate),
    some: (n, test) => lookup.numbers(n, predicate).some(test),
    extremes: (nodes, order) =>
      Float64Array.from(nodes, (n) => {
        const vs = lookup.numbers(n, predicate);
        return vs.length === 0 ? NaN : order === "max" ? vs[vs.length - 1]! : vs[0]!;
      }),
    carriers: (nodes, atLeast = Infinity) => {
      let count = 0;
      for (let i = 0; i < nodes.length && count < atLeast; i++) if (lookup.numbers(nodes[i]!, predicate).length > 0) count++;
      return count;
    },
  };
}


/**
 * The entities an exclusion removes: the excluded entity itself for "other than X" of the
 * answer type; otherwise the entities linked to it by the relations in the negation's scope
 * (any relation when none) and the entity too — except for the negation of a directed
 * relation ("do not depend on X"): the entities linked in the sentence's direction only, X
 * itself kept (it does not depend on itself). A relation stored both ways at X (each of X's
 * edges of it has its reverse: "borders") has no direction to read: X and its partners go,
 * as "which neighbour of B does not border X" presupposes the answer is not X.
 */
export function exclusionSet(c: ExclusionCondition, typeSet: ReadonlySet<number>, index: RelationIndex): Set<number> {
  const inNodes = c.node >= 0 && c.node < index.nodeCount;
  const rels = new Set(c.relations);
  const directed = c.mode === "not" && c.inverse !== undefined && c.relations.length > 0 && inNodes && !reciprocalAt(index, c.node, rels);
  const linked = new Set<number>(directed ? [] : [c.node]);
  if (exclusionSelfOnly(c, typeSet, index) || !inNodes) return linked;
  index.forEach(c.node, (v, rel, inverse) => {
    if (rels.size === 0) linked.add(v);
    else if (directed ? c.relations.some((r, k) => r === rel && c.inverse![k] === inverse) : rels.has(rel)) linked.add(v);
  });
  return linked;
}

/**
 * True when an exclusion removes only the excluded entity: "other than X" (and "apart from",
 * "besides" …) where X is of the answer type, or where the question names no answer type —
 * then X is taken as a peer of the answers ("what does A depend on apart from X"), since a
 * question excluding what is linked to a non-peer names the answers' type ("countries other
 * than those in X").
 */
export function exclusionSelfOnly(c: ExclusionCondition, typeSet: ReadonlySet<number>, index: RelationIndex): boolean {
  return c.mode === "other" && (typeSet.size === 0 || index.isA(c.node, typeSet));
}

/** True when every edge of `rels` at `node` is stored both ways (and there is one): the relation is symmetric there. */
function reciprocalAt(index: RelationIndex, node: number, rels: ReadonlySet<number>): boolean {
  const seen = new Set<string>();
  index.forEach(node, (v, rel, inverse) => {
    if (rels.has(rel)) seen.add(`${v}:${rel}:${inverse ? 1 : 0}`);
  });
  if (seen.size === 0) return false;
  for (const k of seen) {
    const [v, rel, inv] = k.split(":");
    if (!seen.has(`${v}:${rel}:${inv === "1" ? 0 : 1}`)) return false;
  }
  return true;
}

/** The direction of a superlative on the chosen attribute: a temporal word on a non-temporal attribute ("oldest" on an age) flips. */
export function orderOf(c: SuperlativeCondition, attr: AttributeChoice): "max" | "min" {
  const temporalAttr = attr.unit !== undefined ? /year|date/i.test(attr.unit) : true;
  if (c.temporal && !temporalAttr) return c.order === "max" ? "min" : "max";
  return c.order;
}


/**
 * The attribute a condition uses among its `choices` (best word match first): the best score
 * among those some entity of `scope` carries, ties going to the one most of them carry, then
 * the choices' order; null when none is carried. The carriers are counted in full only for
 * choices tied on score (otherwise one carrier is enough, often found in the scope's first entities).
 */
export function pickAttribute(choices: readonly AttributeChoice[], scope: readonly number[], values: (attr: number) => AttributeValues): AttributeChoice | null {
  let best: AttributeChoice | null = null;
  /** The best choice's carriers: counted when a tie asks for it. */
  let bestCarry = -1;
  for (const a of choices) {
    if (best !== null && a.score < best.score - 1e-9) continue;
    const tie = best !== null && Math.abs(a.score - best.score) <= 1e-9;
    const carry = values(a.num).carriers(scope, tie ? Infinity : 1);
    if (carry === 0) continue;
    if (best === null || a.score > best.score + 1e-9) {
      best = a;
      bestCarry = -1;
    } else if (tie) {
      if (bestCarry < 0) bestCarry = values(best.num).carriers(scope);
      if (carry > bestCarry) {
        best = a;
        bestCarry = carry;
      }
    }
  }
  return best;
}

/** True for an entity with no edge of the absence's relations, in its direction, to an entity of its types (NOT EXISTS). */
export function absenceTest(c: AbsenceCondition, index: RelationIndex): (v: number) => boolean {
  const types = new Set(c.types);
  return (v) => {
    if (!(v >= 0 && v < index.nodeCount)) return true;
    let found = false;
    index.forEach(v, (w, rel, inverse) => {
      if (!found && c.relations.some((r) => r.relation === rel && r.inverse === inverse) && (types.size === 0 || index.isA(w, types))) found = true;
    });
    return !found;
  };
}

/** True when an entity's text values of a literal condition's attribute hold its value, case-blind (false for a negated one). */
export function literalHolds(c: LiteralCondition, texts: readonly string[]): boolean {
  const want = c.value.toLowerCase();
  return texts.some((t) => t.toLowerCase() === want) !== c.negated;
}

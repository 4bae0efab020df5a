/**
 * Conditions on an inner node of the query graph ("the capital of the *largest* country in
 * R": the superlative orders the countries, not the capitals): the entities a chain reaches
 * at that node are filtered (comparisons, literal values, exclusions) and ordered
 * (superlatives and ordinals: the entities at the asked place, ties included) before the
 * chain's next hop goes on from what is left.
 *
 * Method: a nested selection, a subquery with WHERE and ORDER BY … FETCH FIRST in SQL terms
 * (ISO/IEC 9075), σ then the top-k of the relational algebra (Codd 1970, "A Relational Model
 * of Data for Large Shared Data Banks", CACM 13(6)), evaluated on one frontier of the
 * level-synchronous path search (chain-reach.ts; Mendelzon & Wood 1995). The attribute is
 * chosen as for the answer's conditions (conditions.ts): the best-scoring choice that some
 * entity of the set carries, ties to the one most of them carry. A condition no entity of the
 * set can be tested on (no choice carried, no literal value) leaves the set as it is.
 */
import type { AttributeChoice, Condition } from "../analysis/index.js";
import { absenceTest, attributeValues, literalHolds, exclusionSet, orderOf, pickAttribute, satisfies, type AttributeLookup } from "./attribute-values.js";
import type { RelationIndex } from "./relation-index.js";

/** The entities of `nodes` that satisfy `conditions` (filters first, then each ordering keeps its asked place); `types`: the node's types (an "other than X" of that type removes X alone). */
export function selectAt(nodes: ReadonlySet<number>, conditions: readonly Condition[], lookup: AttributeLookup, index: RelationIndex, types: ReadonlySet<number> = new Set()): Set<number> {
  let set = [...nodes].sort((a, b) => a - b);
  const pick = (choices: readonly AttributeChoice[]) => pickAttribute(choices, set, (a) => attributeValues(lookup, a));
  for (const c of conditions) {
    if (c.kind === "absence") set = set.filter(absenceTest(c, index));
    else if (c.kind === "exclusion") {
      const out = exclusionSet(c, types, index);
      set = set.filter((v) => !out.has(v));
    } else if (c.kind === "comparison") {
      const attr = pick(c.choices);
      if (attr === null) continue;
      const vals = attributeValues(lookup, attr.num);
      set = set.filter((v) => vals.some(v, (x) => satisfies(c, x)));
    } else if (c.kind === "literal" && lookup.texts) {
      const attr = c.choices[0]!;
      const texts = (v: number) => lookup.texts!(v, attr.num);
      if (!set.some((v) => texts(v).length > 0)) continue;
      set = set.filter((v) => literalHolds(c, texts(v)));
    }
  }
  for (const c of conditions) {
    if (c.kind !== "superlative") continue;
    const attr = pick(c.choices);
    if (attr === null) continue;
    const dir = orderOf(c, attr);
    const keys = attributeValues(lookup, attr.num).extremes(set, dir);
    const values = [...keys].filter((k) => !Number.isNaN(k)).sort((a, b) => (dir === "max" ? b - a : a - b));
    const asked = values[c.position - 1];
    set = asked === undefined ? [] : set.filter((_, i) => keys[i] === asked);
  }
  return new Set(set);
}

/**
 * Questions answered by attribute values instead of a walk: a value question ("What is the
 * depth of X?", "How tall is X?") and a comparison between named entities ("Which is
 * bigger, A or B?"), as read by analysis/conditions.ts.
 *
 * Method: a selection and an ordering over the named entities' attribute values (the
 * relational reading of a comparative question, Codd 1970; Androutsopoulos et al. 1995 §4).
 * The attribute is the first of the condition's choices that some named entity carries; when
 * the words name none, the one numeric attribute all compared entities carry, if exactly one.
 * Value question: the answer is the entity, its values (with unit and source triple) are
 * listed in `values`; verdict `unique` for one stated value, `tied` for several, `none` for
 * none. Comparison: the named entities ordered by the value (the `order` of the comparative;
 * a temporal word on a non-temporal attribute flips it, as for superlatives); `tied` when
 * the two best values are equal, `weak` when an entity has no value, `none` when none has.
 * Identity ("Which package is the lightweight PDF viewer?"): the answer is the entity the
 * description is linked to, then the mention's other senses of an expected type in the
 * linker's order; `unique` unless an other sense has at least `senseRatio` of the chosen
 * one's confidence (explain/verdict.ts DEFAULTS, the rule for senses in doubt), then `weak`.
 */
import type { Catalog } from "../catalog/index.js";
import type { Analysis, AttributeChoice, EntityComparison, IdentityQuestion, ValueQuestion } from "../analysis/index.js";
import type { Answer, ValueDoc, Verdict } from "../model/index.js";

/** What a direct answer produced. */
export interface DirectAnswer {
  readonly answers: Answer[];
  readonly values: ValueDoc[];
  readonly verdict: Verdict;
  readonly notes: string[];
}

/** The values of one entity's attribute, as documents. */
function valueDocs(catalog: Catalog, node: number, attr: AttributeChoice): ValueDoc[] {
  const ref = catalog.ref(node);
  return catalog
    .attributes(node)
    .filter((a) => a.predicate === attr.id)
    .map((a) => ({
      entity: { id: ref.id, label: ref.label },
      attribute: { id: attr.id, label: attr.label, ...(attr.unit !== undefined ? { unit: attr.unit } : {}) },
      value: a.value,
      ...(a.num !== null ? { number: a.num } : {}),
      triple: { subject: ref.id, predicate: attr.id, object: a.value, literal: true as const },
    }));
}

function answerOf(catalog: Catalog, node: number, score: number): Answer {
  const ref = catalog.ref(node);
  return { id: ref.id, label: ref.label, score, types: catalog.typesOf(node).map((t) => catalog.ref(t).id), paths: [] };
}

/** The first choice some of the nodes carry. */
function pickAttribute(catalog: Catalog, nodes: readonly number[], choices: readonly AttributeChoice[]): AttributeChoice | undefined {
  return choices.find((a) => nodes.some((n) => catalog.attributeNumbers(n, a.num).length > 0 || catalog.attributes(n).some((x) => x.predicate === a.id)));
}

/** Answers a value question. */
export function answerValue(catalog: Catalog, v: ValueQuestion): DirectAnswer {
  const attr = pickAttribute(catalog, [v.node], v.choices);
  const label = catalog.ref(v.node).label;
  if (!attr) {
    const asked = v.choices.map((a) => a.label).join(" or ");
    return { answers: [answerOf(catalog, v.node, 1)], values: [], verdict: { status: "none", margin: 0, tiedWith: [], reason: `${label} has no ${asked} in the catalog` }, notes: [`"${v.words}": ${label} has no ${asked} in the catalog`] };
  }
  const values = valueDocs(catalog, v.node, attr);
  const unit = attr.unit !== undefined ? ` ${attr.unit}` : "";
  const verdict: Verdict =
    values.length === 1
      ? { status: "unique", margin: 1, tiedWith: [], reason: `the catalog states one ${attr.label} of ${label}: ${values[0]!.value}${unit}` }
      : { status: "tied", margin: 0, tiedWith: [], reason: `the catalog states ${values.length} values of ${attr.label} for ${label}: ${values.map((x) => x.value).join(", ")}` };
  return { answers: [answerOf(catalog, v.node, 1)], values, verdict, notes: [`the answer is the ${attr.label} of ${label}, read from the catalog (see "values")`] };
}

/** Answers a comparison between named entities. */
export function answerComparison(catalog: Catalog, c: EntityComparison, numeric: readonly AttributeChoice[] = []): DirectAnswer {
  const nodes = [...new Set(c.nodes)];
  // no attribute named ("which takes more disk space"): the one numeric attribute every compared entity carries, if there is exactly one
  const shared = numeric.filter((a) => nodes.every((n) => catalog.attributeNumbers(n, a.num).length > 0));
  const attr = pickAttribute(catalog, nodes, c.choices) ?? (shared.length === 1 ? shared[0] : undefined);
  const names = nodes.map((n) => catalog.ref(n).label);
  if (!attr) {
    const asked = c.choices.length > 0 ? c.choices.map((a) => a.label).join(" or ") : `an attribute for "${c.words}"`;
    return {
      answers: nodes.map((n, i) => answerOf(catalog, n, 1 / (i + 1))),
      values: [],
      verdict: { status: "none", margin: 0, tiedWith: [], reason: `none of ${names.join(", ")} has ${asked} in the catalog` },
      notes: [`"${c.words}": no attribute of the catalog matches, so ${names.join(" and ")} cannot be compared`],
    };
  }
  // a temporal word on a non-temporal attribute (an age) flips the order, as for superlatives
  const temporalAttr = attr.unit !== undefined ? /year|date/i.test(attr.unit) : true;
  const order = c.temporal && !temporalAttr ? (c.order === "max" ? "min" : "max") : c.order;
  const key = (n: number): number | null => {
    const vs = catalog.attributeNumbers(n, attr.num);
    return vs.length === 0 ? null : order === "max" ? vs[vs.length - 1]! : vs[0]!;
  };
  const withValue = nodes.filter((n) => key(n) !== null).sort((a, b) => (order === "max" ? key(b)! - key(a)! : key(a)! - key(b)!) || a - b);
  const without = nodes.filter((n) => key(n) === null);
  const ordered = [...withValue, ...without];
  const answers = ordered.map((n, i) => answerOf(catalog, n, 1 / (i + 1)));
  const values = withValue.flatMap((n) => valueDocs(catalog, n, attr));
  const word = order === "max" ? "largest" : "smallest";
  let verdict: Verdict;
  if (withValue.length === 0) verdict = { status: "none", margin: 0, tiedWith: [], reason: `none of ${names.join(", ")} has a ${attr.label} in the catalog` };
  else if (without.length > 0) verdict = { status: "weak", margin: 0, tiedWith: [], reason: `${without.map((n) => catalog.ref(n).label).join(", ")} ha${without.length === 1 ? "s" : "ve"} no ${attr.label} in the catalog` };
  else {
    const top = key(withValue[0]!)!;
    const tied = withValue.slice(1).filter((n) => key(n) === top);
    const second = withValue[1] !== undefined ? key(withValue[1]!)! : top;
    const margin = top !== 0 ? Math.min(1, Math.abs(top - second) / Math.abs(top)) : 0;
    verdict =
      tied.length > 0
        ? { status: "tied", margin: 0, tiedWith: tied.map((n) => catalog.ref(n).id), reason: `${[withValue[0]!, ...tied].map((n) => catalog.ref(n).label).join(" and ")} have the same ${attr.label}` }
        : { status: "unique", margin, tiedWith: [], reason: `${catalog.ref(withValue[0]!).label} has the ${word} ${attr.label} of ${names.join(", ")}` };
  }
  return { answers, values, verdict, notes: [`compared by ${attr.label} (${word} first), read from the catalog (see "values")`] };
}

/** Answers an identity question: the described entity, then the description's other senses of an expected type. */
export function answerIdentity(catalog: Catalog, q: IdentityQuestion, analysis: Analysis, senseRatio: number, isExpected: (node: number) => boolean): DirectAnswer {
  const m = analysis.mentions[q.mention]!;
  const others = m.alternatives.filter((a) => a.num !== undefined && isExpected(a.num));
  const answers = [answerOf(catalog, q.node, m.confidence), ...others.map((a) => answerOf(catalog, a.num!, a.confidence))];
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  const next = others[0];
  const verdict: Verdict =
    next !== undefined && next.confidence >= senseRatio * m.confidence
      ? { status: "weak", margin: 0, tiedWith: [], reason: `"${m.text}" names ${m.entity.label} (${pct(m.confidence)}); it may also be ${next.label} (${pct(next.confidence)})` }
      : { status: "unique", margin: next !== undefined ? Math.min(1, 1 - next.confidence / m.confidence) : 1, tiedWith: [], reason: `the question asks which entity "${m.text}" is: ${m.entity.label} (${pct(m.confidence)})` };
  return { answers, values: [], verdict, notes: [`"${q.words}": the answer is the entity "${m.text}" names itself, not what is linked to it`] };
}

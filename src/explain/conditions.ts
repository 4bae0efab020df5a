/**
 * Conditions in the explanation: each recognised condition as a JSON-shaped record, each
 * answer's condition steps (the attribute value that satisfied or failed the condition), the
 * count of a "how many" question, and the verdict of an ordering or a count.
 *
 * Method: the explanation is the evaluation trace of the selection/ordering/counting
 * (ranking/conditions.ts): per answer and condition the value read, the comparison made and
 * its outcome — a "why" explanation of a query answer in the sense of Buneman, Khanna &
 * Tan 2001, "Why and Where: A Characterization of Data Provenance" (ICDT), restricted to the
 * attribute facts that decided it.
 *
 * The verdict of a question with conditions is decided with every other one's in
 * explain/verdict.ts (rule 2).
 */
import type { Catalog } from "../catalog/index.js";
import type { Condition } from "../analysis/index.js";
import type { ConditionCheck, ConditionOutcome, RelationIndex } from "../ranking/index.js";
import type { Explanation } from "./explain.js";
import { suggestClues, type FactLookup } from "./suggest.js";
import type { Answer, ConditionDoc, ConditionStepDoc, CountDoc, Deadline, EntityRef, Verdict } from "../model/index.js";

/** A value on the catalog's scale as text: dates back as ISO 8601, other numbers with thousands separators. */
export function formatValue(v: number, temporal: boolean): string {
  if (temporal && !Number.isInteger(v)) {
    const y = Math.floor(v);
    const start = Date.UTC(y, 0, 1);
    const end = Date.UTC(y + 1, 0, 1);
    const d = new Date(Math.round((start + (v - y) * (end - start)) / 86400000) * 86400000);
    return d.toISOString().slice(0, 10);
  }
  if (temporal) return String(v);
  if (Math.abs(v) < 10000) return String(v);
  // an integer grouped by threes as en-US writes it, without the locale machinery (its first
  // use in a process costs tens of milliseconds of a question's time); fractions through it
  if (Number.isSafeInteger(v)) return (v < 0 ? "-" : "") + String(Math.abs(v)).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return (FRACTIONS ??= new Intl.NumberFormat("en-US", { maximumFractionDigits: 6 })).format(v);
}

let FRACTIONS: Intl.NumberFormat | undefined;

function isTemporalUnit(unit: string | undefined): boolean {
  return unit !== undefined && /year|date/i.test(unit);
}

/** The `conditions` records of one question. */
export function conditionDocs(conditions: readonly Condition[], outcome: ConditionOutcome | undefined): ConditionDoc[] {
  return conditions.map((c) => {
    const a = outcome?.applied.find((x) => x.condition === c);
    const base = { words: c.words, start: c.start, end: c.end };
    const counts = a ? { before: a.before, after: a.after } : {};
    const attribute = a?.attribute ? { id: a.attribute.id, label: a.attribute.label, ...(a.attribute.unit !== undefined ? { unit: a.attribute.unit } : {}) } : null;
    switch (c.kind) {
      case "comparison":
        return {
          kind: c.kind,
          ...base,
          attribute,
          operator: c.operator,
          values: c.values,
          range: { ...(c.min !== undefined ? { min: c.min } : {}), ...(c.minStrict ? { minStrict: true } : {}), ...(c.max !== undefined ? { max: c.max } : {}), ...(c.maxStrict ? { maxStrict: true } : {}), negated: c.negated },
          applied: attribute !== null,
          ...counts,
        };
      case "superlative":
        return { kind: c.kind, ...base, attribute, order: c.order, position: c.position, applied: attribute !== null, ...counts };
      case "exclusion":
        return { kind: c.kind, ...base, entity: { id: c.id, label: c.label }, mode: c.mode, applied: true, ...counts };
      case "literal":
        return { kind: c.kind, ...base, attribute: { id: c.choices[0]!.id, label: c.choices[0]!.label }, operator: c.negated ? "!=" : "=", values: [c.value], applied: true, ...counts };
      default:
        return { kind: c.kind, ...base, applied: true, ...counts };
    }
  });
}

/** The condition steps of one answer: for every condition, the value read and whether it satisfied it. */
export function conditionSteps(node: number, conditions: readonly Condition[], outcome: ConditionOutcome): ConditionStepDoc[] {
  const checks: readonly ConditionCheck[] = outcome.checks.get(node) ?? [];
  return checks.map((ch) => {
    const c = conditions[ch.condition]!;
    const a = outcome.applied.find((x) => x.condition === c)?.attribute ?? null;
    const temporal = isTemporalUnit(a?.unit);
    const shown = ch.values.map((v) => formatValue(v, temporal)).join(", ");
    const unit = a?.unit !== undefined && !temporal ? ` ${a.unit}` : "";
    let text: string;
    if (c.kind === "comparison") {
      text = ch.values.length === 0 ? `${a?.label ?? "attribute"}: no value, so not ${c.operator} ${c.values.join(" and ")}` : `${a?.label}: ${shown}${unit} ${ch.satisfied ? "satisfies" : "fails"} ${c.operator} ${c.values.join(" and ")}`;
    } else if (c.kind === "superlative") {
      text = ch.values.length === 0 ? `${a?.label ?? "attribute"}: no value, so not ordered` : `${a?.label}: ${shown}${unit}, place ${ch.place} by ${c.order === "max" ? "largest" : "smallest"} first`;
    } else if (c.kind === "literal") {
      text = `${c.choices[0]!.label}: ${ch.texts?.join(", ") || "no value"} ${ch.satisfied ? "satisfies" : "fails"} ${c.negated ? "!=" : "="} ${c.value}`;
    } else if (c.kind === "absence") {
      text = ch.satisfied ? c.words : `has such a link, against "${c.words}"`;
    } else if (c.kind === "exclusion") {
      const directed = c.mode === "not" && c.inverse !== undefined;
      text = ch.satisfied ? (directed ? c.words : `not ${c.label} and not linked to it`) : directed ? `excluded by "${c.words}"` : `excluded: ${ch.excludedBy === node ? "is" : "is linked to"} ${c.label}`;
    } else text = "counted";
    return {
      condition: ch.condition,
      ...(a ? { attribute: a.id, label: a.label } : c.kind === "literal" ? { attribute: c.choices[0]!.id, label: c.choices[0]!.label } : {}),
      values: ch.values,
      text,
      satisfied: ch.satisfied,
      ...(ch.place !== undefined ? { place: ch.place } : {}),
    };
  });
}

/** The count of a count question. */
export function countDoc(outcome: ConditionOutcome, catalog: Catalog): CountDoc | undefined {
  if (!outcome.count) return undefined;
  return { value: outcome.count.value, entities: catalog.refsOf(outcome.count.entities).map((r) => r.id) };
}

/** Catalog facts for suggested clues (the explain stage's lookup, read straight from the catalog). */
class CatalogFacts implements FactLookup {
  private readonly rels: Map<number, EntityRef & { readonly aliases: readonly string[] }>;
  constructor(private readonly catalog: Catalog) {
    this.rels = new Map(catalog.predicates().map((p) => [p.num, { id: p.id, label: p.label, aliases: p.aliases }]));
  }
  ref(num: number): EntityRef {
    return this.catalog.ref(num);
  }
  relation(rel: number): EntityRef {
    return this.rels.get(rel) ?? { id: String(rel), label: String(rel) };
  }
  relationAliases(rel: number): readonly string[] {
    return this.rels.get(rel)?.aliases ?? [];
  }
  attributes(num: number): readonly { predicate: string; label: string; value: string }[] {
    return this.catalog.attributes(num);
  }
  labelCount(label: string): number {
    return this.catalog.byLabelOrId(label).length;
  }
}

/**
 * The explanation of a question whose conditions set its verdict: the explain stage's own
 * (when there was one) with this verdict, and — for a tie without suggestions — the clues
 * that would single out the first answer (suggest.ts, over the catalog's facts). A question
 * without a clue gets an explanation of its own: no paths, no coverage, no ablation.
 */
export function conditionExplanation(
  question: string,
  answers: readonly Answer[],
  verdict: Verdict,
  outcome: ConditionOutcome,
  index: RelationIndex,
  catalog: Catalog,
  base: Explanation | undefined,
  options: { readonly suggestions?: boolean; readonly deadline?: Deadline } = {},
): Explanation {
  const explanation: Explanation = base
    ? { ...base, answers, verdict }
    : { answers, verdict, coverage: { clues: [], rows: [], maxHops: 0 }, ablation: [], suggestions: [], whyNot: [], labels: {} };
  if (verdict.status !== "tied" || explanation.suggestions.length > 0 || options.suggestions === false) return explanation;
  if (options.deadline?.stop("suggestions")) return explanation;
  const first = outcome.ranked.candidates[0]?.node;
  if (first === undefined) return explanation;
  // the tied entities as nodes (the verdict's ids came from them): no catalog read per candidate
  const rivals = outcome.tiedWith ?? (outcome.count ? outcome.count.entities.filter((n) => n !== first) : outcome.ranked.candidates.slice(1).map((c) => c.node));
  const exclude = new Set(outcome.ranked.clues.map((c) => c.node));
  return { ...explanation, suggestions: suggestClues(index, new CatalogFacts(catalog), question, first, rivals, exclude) };
}

/**
 * The question in plain English
 * =============================
 *
 * A clue set becomes one question: the head noun is the target's type label ("Which
 * vessel …"; "What …" without a type), each fact a clause phrased by explain's `factPhrase`
 * from the catalog's relation label (or its passive alias) and the named entity's label, a
 * chain's middle entity as "the TYPE CLAUSE" ("…carries the instrument that Kai Dunleth
 * designed"), a numeric attribute as "…has a LABEL of VALUE" (`attributePhrase`). Clauses
 * whose subject is the answer drop their "that" ("Which researcher lives in Maelhaven and
 * supervises Orla Kell?"); they come first, then the others ("…whose home port is Tolvane"),
 * joined by commas and a final "and". The word-order rules are common practice of English
 * grammar and use nothing but the catalog's own labels.
 */
import { attributePhrase, factPhrase } from "../explain/index.js";
import type { Fact } from "./facts.js";

/** The words wording needs about the catalog. */
export interface WordSource {
  label(num: number): string;
  relation(rel: number): { readonly label: string; readonly aliases: readonly string[] };
}

/** One fact as a clause, and whether the answer is its subject (so "that" can go). */
export interface Clause {
  readonly text: string;
  readonly subjectFirst: boolean;
}

/** The clause of one fact, seen from the answer. */
export function clauseOf(fact: Fact, w: WordSource): Clause {
  if (fact.kind === "attribute") return { text: attributePhrase(fact.attributeLabel!, fact.value!), subjectFirst: true };
  const named = w.label(fact.entity!);
  let object = named;
  if (fact.kind === "chain") {
    const r2 = w.relation(fact.rel2!);
    object = `the ${w.label(fact.middleType!)} ${factPhrase(r2.label, r2.aliases, named, fact.inverse2!)}`;
  }
  const r = w.relation(fact.rel!);
  const text = factPhrase(r.label, r.aliases, object, fact.inverse!);
  return { text, subjectFirst: text.startsWith("that ") && !text.startsWith(`that ${object}`) };
}

/** The order clauses are spoken in: subject clauses first (stable). Returns indexes into `clauses`. */
export function spokenOrder(clauses: readonly Clause[]): number[] {
  const idx = clauses.map((_, i) => i);
  return [...idx.filter((i) => clauses[i]!.subjectFirst), ...idx.filter((i) => !clauses[i]!.subjectFirst)];
}

/** The question of a clue set: head noun (type label or undefined) and clauses in spoken order. */
export function questionOf(typeLabel: string | undefined, clauses: readonly Clause[]): string {
  const parts = clauses.map((c) => (c.subjectFirst ? c.text.replace(/^that /, "") : c.text));
  const head = typeLabel !== undefined ? `Which ${typeLabel}` : "What";
  const body = parts.length <= 1 ? (parts[0] ?? "") : `${parts.slice(0, -1).join(", ")} and ${parts[parts.length - 1]}`;
  return `${head} ${body}`.trim() + "?";
}

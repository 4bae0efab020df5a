/**
 * Suggested clues
 * ===============
 *
 * For a tied or weak question: the facts that hold for the intended (best) answer and not
 * for its rivals, each phrased as a clue a question writer could append. A fact is a
 * relation edge at the answer (relation + direction + neighbour) or a literal attribute
 * (attribute + value). Facts are ordered by how many rivals they rule out (most first), then
 * relation facts before attribute facts (the ranking walks relations, so a relation clue
 * is the one the pipeline can use), then by clue cost (clue-cost.ts, the compose stage's
 * pricing: well-known neighbours by their salience percentile, short names, a label that
 * names one entity only, so linking picks the right one), then by text. A neighbour whose
 * label contains the answer's label is never used (it would give the answer away).
 *
 * The phrasing uses the neighbour's label and the relation's label (or, against the stored
 * direction, a passive alias such as "led by" when the relation has one), so linking finds
 * the neighbour and analysis finds the relation cue: `…that is moored at Harrowgate` for
 * the stored fact `answer mooredAt Harrowgate`, `…whose home port is Tolvane` for a
 * noun-phrase relation, `…that is led by Ada Quell` or `…that Ada Quell leads` for `Ada
 * Quell leads answer`, `…whose captain is Ada Quell` for `Ada Quell captainOf answer`,
 * `…that has a birth year of 1971` for a numeric attribute (read back as an equality
 * condition), `…whose code is XQ` for another. The word-shape rules (a final preposition,
 * a verb ending in -s or -ed, a final "by" or "of") are common practice of English grammar
 * and use nothing but the catalog's own labels.
 *
 * [Reference] Choosing the attribute that separates a target from distractors, ordered by
 * how many distractors it rules out, follows Dale & Reiter, "Computational interpretations
 * of the Gricean maxims in the generation of referring expressions", Cognitive Science 19,
 * 1995 (the incremental algorithm's discriminatory power; from memory).
 */
import type { EntityRef } from "../model/index.js";
import { clueCost, givesAway, type ClueCostOptions } from "./clue-cost.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link suggestClues}; all optional. */
export interface SuggestOptions {
  /** Most suggestions returned. @default 5 */
  readonly max?: number;
  /** Most rivals considered. @default 10 */
  readonly maxRivals?: number;
  /** Neighbours of larger degree are skipped (a hub says little). @default 5000 */
  readonly hubLimit?: number;
  /** How clues are priced (clue-cost.ts), e.g. `difficulty`. */
  readonly cost?: ClueCostOptions;
}

/** The defaults of {@link SuggestOptions}. */
export const DEFAULTS = { max: 5, maxRivals: 10, hubLimit: 5000 } as const;

/** The triple behind a suggested clue (ids; `object` is a literal value for attributes). */
export interface FactTriple {
  readonly subject: string;
  readonly predicate: string;
  readonly object: string;
  /** True when `object` is a literal value (an attribute). */
  readonly literal: boolean;
}

/** One suggested clue. */
export interface SuggestedClue {
  /** The clue as a writer would append it, e.g. `that is moored at Harrowgate`. */
  readonly text: string;
  /** The question with the clue appended. */
  readonly question: string;
  readonly kind: "relation" | "attribute";
  readonly triple: FactTriple;
  /** Ids of the rivals the fact rules out. */
  readonly rulesOut: readonly string[];
  /** Set by the pipeline when it re-asked the extended question: did it come out unique with the same answer? */
  readonly verified?: boolean;
}

/** What suggestClues reads about entities (the explain stage fills it from the catalog). */
export interface FactLookup {
  ref(num: number): EntityRef;
  relation(rel: number): EntityRef;
  /** The relation's aliases (other phrasings), when known. */
  relationAliases?(rel: number): readonly string[];
  attributes(num: number): readonly { readonly predicate: string; readonly label: string; readonly value: string }[];
  /** How many catalog entities share this label (1 = unambiguous). */
  labelCount(label: string): number;
  /** Salience percentile of an entity in [0, 1] (ranking's salienceOf); without it every neighbour counts as middling. */
  salience?(num: number): number;
}

const AUX = new Set(["is", "was", "are", "were", "has", "had", "have", "does", "did"]);
const IRREGULAR_PAST = new Set(["took", "made", "led", "held", "built", "wrote", "ran", "went", "gave", "sent", "found", "won", "met", "kept", "bought", "sold", "taught", "brought"]);
const PREP = new Set(["by", "at", "in", "on", "to", "from", "aboard", "with", "for", "of", "into", "onto", "under", "near", "as"]);

const wordsOf = (label: string): string[] => label.trim().toLowerCase().split(/\s+/);

/** True when the label reads as a verb phrase: an auxiliary, a verb in -s, or a past tense not followed by a preposition. */
function isVerbal(label: string): boolean {
  const w = wordsOf(label);
  const first = w[0] ?? "";
  if (AUX.has(first)) return true;
  if (/[^s]s$/.test(first) && w.length <= 3) return true; // leads, belongs to, works in
  return (/ed$|en$/.test(first) || IRREGULAR_PAST.has(first)) && !(w[1] && PREP.has(w[1])); // past tense: commissioned X
}

/** True when the label is a bare noun phrase ("home port"): not verbal and not ending in a preposition. */
function isNounPhrase(label: string): boolean {
  const w = wordsOf(label);
  return !isVerbal(label) && !PREP.has(w[w.length - 1] ?? "") && !/(ed|en)$/.test(w[0] ?? "");
}

/** `is` + label when the label reads as a participle or a prepositional phrase ("moored at", "member of"). */
export function relationPhrase(label: string): string {
  return isVerbal(label) ? label : `is ${label}`;
}

/**
 * A clue stating `answer rel neighbour` (inverse false) or `neighbour rel answer` (inverse
 * true), phrased with the relation's label or aliases and the neighbour's label.
 */
export function factPhrase(label: string, aliases: readonly string[], neighbour: string, inverse: boolean): string {
  const last = wordsOf(label).at(-1) ?? "";
  if (!inverse) {
    if (isNounPhrase(label)) return `whose ${label} is ${neighbour}`;
    return `that ${relationPhrase(label)} ${neighbour}`;
  }
  if (last === "by") return `that ${neighbour} is ${label}`;
  if (last === "of" && wordsOf(label).length >= 2) return `whose ${label.trim().replace(/\s+of$/i, "")} is ${neighbour}`;
  // an active verb ("leads") whose alias is its passive ("led by"): the passive reads from the answer's side
  const passive = isVerbal(label) ? aliases.find((a) => wordsOf(a).length === 2 && wordsOf(a)[1] === "by" && (/(ed|en)$/.test(wordsOf(a)[0]!) || IRREGULAR_PAST.has(wordsOf(a)[0]!))) : undefined;
  if (passive) return `that is ${passive} ${neighbour}`;
  if (isNounPhrase(label)) return `that is the ${label} of ${neighbour}`;
  if (!isVerbal(label)) return `that ${neighbour} is ${label}`;
  return `that ${neighbour} ${label}`;
}

/** A clue stating an attribute value: numbers as `that has a LABEL of VALUE` (the condition reader's equality), other values `whose LABEL is VALUE`. */
export function attributePhrase(label: string, value: string): string {
  return /^-?\d+(\.\d+)?$/.test(value.trim()) ? `that has ${/^[aeiou]/i.test(label) ? "an" : "a"} ${label} of ${value.trim()}` : `whose ${label} is ${value}`;
}

/** Appends a clue to a question: "Which vessel…?" + "that is moored at X" → "Which vessel… that is moored at X?". */
export function appendClue(question: string, clue: string): string {
  const q = question.trim();
  const m = /^(.*?)([?.!]*)$/s.exec(q)!;
  return `${m[1]!.trimEnd()} ${clue}${m[2] || "?"}`;
}

interface Fact {
  readonly key: string;
  readonly kind: "relation" | "attribute";
  readonly text: string;
  readonly triple: FactTriple;
  /** clue-cost.ts price (salience, name length, ambiguity). */
  readonly cost: number;
}

/**
 * Facts of `answer` that rule out rivals, best first (see the header for the order).
 * `exclude` holds nodes not to use as neighbours (the clues, the answer itself).
 */
export function suggestClues(
  graph: WalkGraph,
  lookup: FactLookup,
  question: string,
  answer: number,
  rivals: readonly number[],
  exclude: ReadonlySet<number>,
  options: SuggestOptions = {},
): SuggestedClue[] {
  const o = { ...DEFAULTS, ...options };
  const rs = rivals.filter((r) => r !== answer).slice(0, o.maxRivals);
  if (rs.length === 0) return [];
  const aRef = lookup.ref(answer);
  const answerNames = [aRef.label];
  const relKey = (rel: number, inverse: boolean, v: number) => `${rel}:${inverse ? 1 : 0}:${v}`;
  const factsOf = (u: number): Set<string> => {
    const s = new Set<string>();
    graph.forEach(u, (v, rel, inverse) => s.add(relKey(rel, inverse, v)));
    for (const a of lookup.attributes(u)) s.add(`@${a.predicate}\u0000${a.value}`);
    return s;
  };
  const facts = new Map<string, Fact>();
  graph.forEach(answer, (v, rel, inverse) => {
    if (exclude.has(v) || v === answer || graph.degree(v) > o.hubLimit) return;
    const key = relKey(rel, inverse, v);
    if (facts.has(key)) return;
    const n = lookup.ref(v);
    if (givesAway(n.label, answerNames)) return;
    const r = lookup.relation(rel);
    const text = factPhrase(r.label, lookup.relationAliases?.(rel) ?? [], n.label, inverse);
    const triple = inverse
      ? { subject: n.id, predicate: r.id, object: aRef.id, literal: false }
      : { subject: aRef.id, predicate: r.id, object: n.id, literal: false };
    const salience = lookup.salience?.(v);
    const cost = clueCost({ ...(salience !== undefined ? { salience } : {}), hops: 1, label: n.label, ambiguous: lookup.labelCount(n.label) > 1 }, o.cost);
    facts.set(key, { key, kind: "relation", text, triple, cost });
  });
  for (const a of lookup.attributes(answer)) {
    const key = `@${a.predicate}\u0000${a.value}`;
    if (facts.has(key)) continue;
    facts.set(key, {
      key,
      kind: "attribute",
      text: attributePhrase(a.label, a.value),
      triple: { subject: aRef.id, predicate: a.predicate, object: a.value, literal: true },
      cost: clueCost({ hops: 1, label: `${a.label} ${a.value}` }, o.cost),
    });
  }
  const rivalFacts = rs.map((r) => ({ id: lookup.ref(r).id, facts: factsOf(r) }));
  const scored = [...facts.values()]
    .map((f) => ({ f, out: rivalFacts.filter((r) => !r.facts.has(f.key)).map((r) => r.id) }))
    .filter((x) => x.out.length > 0);
  scored.sort(
    (a, b) =>
      b.out.length - a.out.length ||
      (a.f.kind === b.f.kind ? 0 : a.f.kind === "relation" ? -1 : 1) ||
      a.f.cost - b.f.cost ||
      (a.f.text < b.f.text ? -1 : a.f.text > b.f.text ? 1 : 0),
  );
  return scored.slice(0, o.max).map(({ f, out }) => ({
    text: f.text,
    question: appendClue(question, f.text),
    kind: f.kind,
    triple: f.triple,
    rulesOut: out,
  }));
}

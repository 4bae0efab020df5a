/**
 * The link facts the verdict reads (explain/verdict.ts rules 1, 4 and 5): which clue mentions
 * name nothing the catalog holds, and which are in doubt between two senses, with what the
 * question gives when read with the other sense.
 *
 * Not found: a mention the linker reports below its floor (linking `LinkResult.notFound`,
 * `notFoundBelow`), or a written code whose number the linked name does not carry. A code's
 * digits identify it (a part number, a version: "KX-999" is not "KX-114", "gcc-19" is not
 * "gcc") — common practice for identifiers; so when the word the mention stands in (the run of
 * characters between spaces, sentence punctuation stripped) holds a group of digits that no
 * name of the linked entity (label or alias) holds, the mention is not found and the linked
 * entity is only the nearest name.
 *
 * Partial: a clue mention the linker matched by part of a name only (match `partial`,
 * "Ardent Tern" for "Project Tern"); the verdict treats it as not found when the question's
 * reading fits nothing (verdict.ts rule 1).
 *
 * Doubt: a clue mention whose next sense has at least `faintRatio` × the chosen sense's
 * confidence (verdict.ts DEFAULTS, reasons there), unless the user pinned it. When the word is
 * the chosen sense's whole name (its label or alias, or derived from its whole label:
 * "African" ← Africa), a sense that takes it as one word of a longer name ("Central African
 * Republic", "South Africa") is no other sense: a generic word of a long form does not name
 * that entity (issue 16, names not written as the catalog writes them); the next sense that
 * is not such a part is read instead. Up to
 * `maxSenses` such mentions are evaluated: the question is read again with the mention pinned
 * to the other sense, and the answers that satisfy that reading (ranking `Ranked.matched`,
 * after the conditions' filters) are the other sense's answers — when every clue of that
 * reading is held by a relation-path pattern, or, for an other sense of the very same name,
 * when the reading matched with a clue held by a neighbour constraint (otherwise the reading
 * selects nothing and the other sense is not evaluated).
 *
 * A name in close apposition after a common noun ("the engineer Ilse Varrick", "the vessel
 * Harnesk": Quirk, Greenbaum, Leech & Svartvik 1985, *A Comprehensive Grammar of the English
 * Language*, §17.70 ff.) has its sense restricted by that noun, which the linker reads and
 * the query graph does not; such a mention is marked `modified` (verdict.ts rule 4).
 */
import { isFunctionWord, words, type Analysis, type Clue } from "../analysis/index.js";
import type { LinkResult } from "../linking/index.js";
import type { MentionFacts, SenseDoubt } from "../explain/index.js";
import { VERDICT_DEFAULTS } from "../explain/index.js";
import type { EntityRef, NotFoundDoc } from "../model/index.js";

/** Options of {@link linkFacts}; all optional. */
export const DEFAULTS = {
  /** Doubtful mentions evaluated with their other sense (each costs one more reading and ranking). */
  maxSenses: 2,
} as const;

/** True when the mention's word is its sense's whole name: the label or an alias, or derived from the whole label ("African" ← Africa). */
export function wholeName(m: Analysis["mentions"][number]): boolean {
  return m.match === "label" || m.match === "alias" || (m.match === "derived" && m.derivation?.base.toLowerCase() === m.entity.label.toLowerCase());
}

/** True when an other sense takes the word as one word of a longer name ("Central African Republic", "South Africa" for "African"). */
export function partOfLongerName(a: Analysis["mentions"][number]["alternatives"][number]): boolean {
  return a.match === "partial" || (a.match === "derived" && words(a.label).length > 1);
}

/** The word of the question a span stands in: extended over the characters up to the next space, sentence punctuation left out. */
export function writtenWord(question: string, start: number, end: number): { text: string; start: number; end: number } {
  let a = start;
  let b = end;
  while (a > 0 && !/[\s"'“”‘’(\[]/u.test(question[a - 1]!)) a--;
  while (b < question.length && !/[\s"'“”‘’)\]?!,;:]/u.test(question[b]!)) b++;
  // a full stop, or a hyphen, at the end of the word ends a sentence or a clause, not a code
  while (b > end && /[.\-‐‑]/u.test(question[b - 1]!)) b--;
  return { text: question.slice(a, b), start: a, end: b };
}

/** The groups of digits of a text ("KX-114b 2" → ["114", "2"]). */
function digitGroups(text: string): string[] {
  return text.match(/\p{Nd}+/gu) ?? [];
}

/** True when the written word holds a group of digits no name of the entity holds (a code the catalog does not have). */
export function codeMismatch(written: string, names: readonly string[]): boolean {
  const groups = digitGroups(written);
  if (groups.length === 0) return false;
  const held = new Set(names.flatMap((n) => digitGroups(n)));
  return groups.some((g) => !held.has(g));
}

/** Determiners that open a noun phrase in close apposition (closed class; Quirk et al. 1985 §5.10 ff.). */
const APPOSITION_OPENERS = new Set(["the", "a", "an", "this", "that", "our", "their", "its", "his", "her"]);

/** True when the words right before `start` are a determiner and one to three common nouns ("the sonar engineer"). */
export function closeAppositive(question: string, start: number): boolean {
  const before = words(question).filter((w) => w.end <= start);
  let k = before.length - 1;
  let nouns = 0;
  while (k >= 0 && nouns < 3 && !isFunctionWord(before[k]!.norm) && /^\p{Ll}/u.test(before[k]!.text)) {
    nouns++;
    k--;
  }
  return nouns > 0 && k >= 0 && APPOSITION_OPENERS.has(before[k]!.norm);
}

/** What the pipeline supplies to {@link linkFacts}. */
export interface LinkFactsSource {
  /** Every name (label and aliases) of an entity num. */
  readonly names: (num: number) => readonly string[];
  /**
   * The answers of the question with mention text `text` read as entity `id` that satisfy the
   * reading (empty: none does); null when it cannot be evaluated (a value question, the time budget).
   * `sameName`: the entity has the very label of the mention's chosen one (two senses of one name).
   */
  readonly otherSense: (text: string, id: string, sameName: boolean) => readonly EntityRef[] | null;
}

/** The link facts of one question (see the file header). */
export function linkFacts(
  question: string,
  analysis: Analysis,
  /** The clues the ranking used (the analysis's, less any dropped). */
  clues: readonly Clue[],
  link: LinkResult,
  source: LinkFactsSource,
  options: { readonly faintRatio?: number; readonly maxSenses?: number } = {},
): { notFound: MentionFacts[]; unlinked: MentionFacts[]; partial: MentionFacts[]; doubts: SenseDoubt[]; added: NotFoundDoc[] } {
  const faintRatio = options.faintRatio ?? VERDICT_DEFAULTS.faintRatio;
  const maxSenses = options.maxSenses ?? DEFAULTS.maxSenses;
  const notFound: MentionFacts[] = [];
  const added: NotFoundDoc[] = [];
  const partial: MentionFacts[] = [];
  const doubts: SenseDoubt[] = [];
  const seen = new Set<number>();
  for (const clue of clues) {
    if (seen.has(clue.mention)) continue;
    seen.add(clue.mention);
    const m = analysis.mentions[clue.mention];
    if (!m || m.pinned) continue;
    const base = { text: m.text, start: m.start, end: m.end, entity: { id: m.entity.id, label: m.entity.label }, confidence: m.confidence };
    const below = link.notFound.some((nf) => nf.linked && nf.start === m.start && nf.end === m.end);
    const word = writtenWord(question, m.start, m.end);
    const names = source.names(m.num);
    // a mention linked by its description ("the fast assembler for x86") names no code: its digits are the description's
    const code = !below && m.match !== "description" && codeMismatch(word.text, names);
    if (below || code) {
      const span = code ? word : { text: m.text, start: m.start, end: m.end };
      notFound.push({ ...base, ...span, notFound: true });
      // the linker reported those below its floor itself; the others are added to the answer's notFound
      if (!below) added.push({ ...span, linked: true, nearest: { ...base.entity, confidence: m.confidence } });
      continue;
    }
    if (m.match === "partial") partial.push({ ...base, notFound: true });
    const next = m.alternatives.find((a) => !(wholeName(m) && partOfLongerName(a)));
    if (!next || next.confidence < faintRatio * m.confidence || doubts.length >= maxSenses) continue;
    const other = { id: next.id, label: next.label, confidence: next.confidence };
    doubts.push({ mention: { ...base, next: other }, answers: source.otherSense(m.text, next.id, next.label === m.entity.label), modified: closeAppositive(question, m.start) });
  }
  // names written like one that nothing linked to (linking notFound, `linked: false`): the answer cannot rest on them
  const unlinked: MentionFacts[] = link.notFound
    .filter((nf) => !nf.linked)
    .map((nf) => ({ text: nf.text, start: nf.start, end: nf.end, entity: nf.nearest ? { id: nf.nearest.id, label: nf.nearest.label } : null, notFound: true }));
  return { notFound, unlinked, partial, doubts, added };
}

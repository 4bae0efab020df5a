/**
 * Question analysis: from the linked question to what the ranking needs — the clues (linked
 * entities that seed the walk), the expected answer types and the relation cues.
 *
 * Steps: (1) split the question into words (words.ts); (2) mentions whose entity is itself a
 * type of the catalog are not clues (a type names what is asked for, not a place to start);
 * (3) the answer type from the wh-phrase and head noun (answer-type.ts); (4) the content
 * words left over — not in a clue mention, not used for the type, not function words —
 * give the relation cues (relation-cues.ts); (5) a clue that pre-modifies the next one
 * ("the Ostrel engineer Ilse Varrick") gets a lower weight (see `modifierOf`).
 */
import type { LinkResult, LinkedMention } from "../linking/index.js";
import type { EntityRef } from "../model/index.js";
import { stemKey } from "../catalog/index.js";
import { detectAnswerType, type AnswerTypeOptions, type AnswerTypeSource } from "./answer-type.js";
import type { QuestionModel } from "./question-model.js";
import { relationCues, type RelationCue, type RelationCueOptions } from "./relation-cues.js";
import { findQuantities } from "./quantity.js";
import { relationalAnswerType, subjectRangeType, whereRangeType, type RelationRangeOptions } from "./relation-range.js";
import { isFunctionWord, words, type Word } from "./words.js";
import { ANSWER_TYPE_WORDS, DETERMINERS } from "./lexicon.js";
import { findTypeWords, type TypeWord } from "./type-words.js";

/** A linked entity that seeds one personalized PageRank. */
export interface Clue {
  /** Entity num (the relation index's node id). */
  readonly node: number;
  readonly id: string;
  readonly label: string;
  /** The clue's weight: the link confidence. */
  readonly weight: number;
  /** Index into `Analysis.mentions`. */
  readonly mention: number;
}

/** An expected answer type. */
export interface AnswerType extends EntityRef {
  readonly num: number;
}

/** What the analysis found in one question. */
export interface Analysis {
  readonly question: string;
  /** All linked mentions, as the linker returned them. */
  readonly mentions: readonly LinkedMention[];
  /** Expected answer types (empty: any type). Subtypes count. */
  readonly answerTypes: readonly AnswerType[];
  /** How the answer type was found. */
  readonly answerTypeSource: AnswerTypeSource;
  /** Relations cued by the question's words, best first. */
  readonly relationCues: readonly RelationCue[];
  /** The clues, in mention order. */
  readonly clues: readonly Clue[];
  /** Notes for the user (unlinked words, type words, missing type filter, …). */
  readonly notes: readonly string[];
  /** Type nouns outside the clues and the answer-type phrase ("a *document* that …"; cue-chains.ts). @default none */
  readonly typeWords?: readonly TypeWord[];
  /** UTF-16 spans of the words the answer type was read from (wh-word and head noun phrase). @default none */
  readonly answerTypeWords?: readonly { readonly start: number; readonly end: number }[];
  /** Which of `notes` say what the analysis could not find (a later stage that explains it drops that note by this record, not by its wording). @default none */
  readonly noteFacts?: NoteFacts;
}

/** The notes of an analysis that report something missing, each as the note string it made. */
export interface NoteFacts {
  /** No answer-type filter: no question word, or a head noun (or none) naming no type. */
  readonly answerTypeGap?: { readonly kind: "no-question-word" | "head-noun"; readonly note: string };
  /** Words that matched no catalog entity (not read as relation words). */
  readonly unmatched: readonly { readonly text: string; readonly note: string }[];
  /** No clue entity was linked. */
  readonly noClue?: string;
}

/** Options of {@link analyze}; all optional. */
export interface AnalyzeOptions {
  /** Weight factor of a clue that pre-modifies another one ("the *Ostrel* engineer Ilse Varrick"). @default 0.25 */
  readonly modifierWeight?: number;
  readonly answerType?: AnswerTypeOptions;
  readonly relationCues?: RelationCueOptions;
  /** Options of the relational head-noun typing (relation-range.ts). */
  readonly relationRange?: RelationRangeOptions;
}

/** Defaults of {@link AnalyzeOptions}. */
export const DEFAULTS = { modifierWeight: 0.25 } as const;


/**
 * The mention that mention `i` pre-modifies, if any: the next clue mention follows it with
 * nothing between them but type nouns and a possessive ("the Ostrel engineer Ilse Varrick",
 * "Ostrel's Ilse Varrick"). In an English noun phrase the pre-modifiers narrow down which
 * entity the head names (Quirk et al. 1985, "A Comprehensive Grammar of the English
 * Language", §17.97 ff., premodification), so the modifier is weaker evidence about the
 * answer than the head.
 */
function modifierOf(question: string, mentions: readonly LinkedMention[], i: number, isClue: readonly boolean[], model: QuestionModel): number | undefined {
  const m = mentions[i]!;
  let j = -1;
  for (let k = 0; k < mentions.length; k++) {
    if (k === i || !isClue[k] || mentions[k]!.start < m.end) continue;
    if (j < 0 || mentions[k]!.start < mentions[j]!.start) j = k;
  }
  if (j < 0) return undefined;
  const gap = question.slice(m.end, mentions[j]!.start);
  if (/[,;:()!?]/.test(gap)) return undefined;
  const between = words(gap).filter((w) => !/^s$/.test(w.norm));
  if (between.length > 2) return undefined;
  return between.every((w) => model.typesByKey.has(w.stem)) ? j : undefined;
}

/**
 * A mention that is a written quantity — a number with its unit word, as quantity.ts reads
 * it ("2000 KiB", "-30 degrees") — whose entity's label does not hold that number is the
 * quantity, not a name: the linker's fuzzy match on it is dropped (with a note), so the
 * conditions read the number. A name holding the number ("Apollo 11") stays.
 */
function withoutQuantities(question: string, link: LinkResult, notes: string[], units?: readonly string[]): LinkResult {
  const qs = findQuantities(question, units ? { units } : {}).filter((q) => q.unit !== undefined);
  if (qs.length === 0) return link;
  const keep = link.mentions.filter((m) => {
    const q = qs.find((x) => x.start <= m.start + 1 && m.end <= x.end && m.end - m.start >= (x.end - x.start) / 2);
    if (!q || m.entity.label.includes(q.text.replace(/^[+\u2212-]/, ""))) return true;
    notes.push(`"${m.text}" read as a quantity, not a name (it only resembles ${m.entity.label})`);
    return false;
  });
  return keep.length === link.mentions.length ? link : { ...link, mentions: keep };
}

/**
 * The mention in the head-noun slot of the wh-phrase ("Which *editor* is the second largest
 * package in the editors section?") when another clue mention is the same word (equal Porter
 * stem keys) linked to another entity: the two corefer (string match, the strict sieve of
 * Raghunathan et al. 2010, "A Multi-Pass Sieve for Coreference Resolution", EMNLP), the
 * wh-phrase's noun names the answer's class (Li & Roth 2002) and the other mention says which
 * entity that class is; the slot's own link (a package named "editor") is no clue.
 */
function classNounMention(ws: readonly Word[], mentions: readonly LinkedMention[], isClue: readonly boolean[]): { mention: number; same: number } | undefined {
  const wh = ws.findIndex((w) => ANSWER_TYPE_WORDS.WH_WHICH.has(w.norm));
  if (wh < 0 || ws.slice(0, wh).some((w) => !isFunctionWord(w.norm))) return undefined;
  const slot = ws[wh + 1];
  if (!slot) return undefined;
  const i = mentions.findIndex((m, k) => isClue[k] && m.start === slot.start);
  if (i < 0) return undefined;
  const key = stemKey(mentions[i]!.text);
  const same = mentions.findIndex((m, k) => k !== i && isClue[k] && m.num !== mentions[i]!.num && stemKey(m.text) === key);
  return same >= 0 ? { mention: i, same } : undefined;
}

/** Analyses one linked question against the catalog's vocabulary. */
export function analyze(question: string, linked: LinkResult, model: QuestionModel, options: AnalyzeOptions = {}): Analysis {
  const ws = words(question);
  const notes: string[] = [];
  const link = withoutQuantities(question, linked, notes, model.units);
  const clueMention: boolean[] = link.mentions.map((m) => !model.typeByNum.has(m.num));
  link.mentions.forEach((m, i) => {
    if (!clueMention[i]) notes.push(`"${m.text}" names a type (${m.entity.label}), not a clue`);
  });
  const inClue = ws.map((w) => link.mentions.some((m, i) => clueMention[i] && w.start < m.end && w.end > m.start));

  const at = detectAnswerType(ws, inClue, model, options.answerType);
  notes.push(...at.notes);
  const used = new Set(at.usedWords);
  // type nouns used as nouns — after a determiner, not a relational "the leader *of*" — name
  // a node of the path, not a relation ("built by a *organisation* that …")
  const typeWords = findTypeWords(ws, ws.map((_, i) => inClue[i]! || used.has(i)), model);
  const nounWord = new Set<number>();
  for (const t of typeWords) {
    const first = ws.findIndex((w) => w.start === t.start);
    let last = first;
    while (last + 1 < ws.length && ws[last + 1]!.end <= t.end) last++;
    if (first > 0 && DETERMINERS.has(ws[first - 1]!.norm) && ws[last + 1]?.norm !== "of") for (let k = first; k <= last; k++) nounWord.add(k);
  }
  const content: number[] = [];
  ws.forEach((w, i) => {
    if (!inClue[i] && !used.has(i) && !nounWord.has(i) && (!isFunctionWord(w.norm) || model.functionCueStems?.has(w.stem))) content.push(i);
  });
  const cues = relationCues(ws, content, model, options.relationCues);

  const modifierWeight = options.modifierWeight ?? DEFAULTS.modifierWeight;
  const clues: Clue[] = [];
  const classNoun = classNounMention(ws, link.mentions, clueMention);
  link.mentions.forEach((m, i) => {
    if (!clueMention[i]) return;
    if (i === classNoun?.mention) {
      notes.push(`"${m.text}" names the class of the answer, as "${link.mentions[classNoun.same]!.text}" (${link.mentions[classNoun.same]!.entity.label}) does: not a clue of its own`);
      return;
    }
    const head = modifierOf(question, link.mentions, i, clueMention, model);
    if (head !== undefined) notes.push(`"${m.text}" qualifies "${link.mentions[head]!.text}": weighed as a weaker clue`);
    clues.push({ node: m.num, id: m.entity.id, label: m.entity.label, weight: m.confidence * (head !== undefined ? modifierWeight : 1), mention: i });
  });
  const unmatched: { text: string; note: string }[] = [];
  for (const u of link.unlinked) {
    const near = u.suggestions.slice(0, 3).map((s) => s.label).join(", ");
    if (u.relationWord) notes.push(`"${u.text}" read as a relation word, not a name${near !== "" ? ` (it only resembles ${near})` : ""}`);
    else {
      const note = `"${u.text}" matched no catalog entity${near !== "" ? ` (did you mean ${near}?)` : ""}`;
      notes.push(note);
      unmatched.push({ text: u.text, note });
    }
  }
  const noClue = clues.length === 0 ? "no clue entity linked: nothing to start from" : undefined;
  if (noClue !== undefined) notes.push(noClue);

  // a head noun naming a relation, not a type: the answer is typed like that relation's far end
  let typeNums = at.types;
  let typeSource = at.source;
  const labelsOf = (types: readonly number[]) => types.map((t) => model.typeByNum.get(t)?.label ?? String(t)).join(", ");
  if (at.source === "none" && at.headPhrase) {
    const r = relationalAnswerType(ws, at.headPhrase, cues, clues.map((c) => c.node), model, options.relationRange);
    if (r) {
      typeNums = r.types;
      typeSource = "relation";
      const labels = labelsOf(r.types);
      const which = r.end === "object" ? "objects" : r.end === "subject" ? "subjects" : "ends";
      const k = notes.indexOf(at.notes[0] ?? "");
      const note = `"${r.cue.words.join(" ")}" names the relation ${r.cue.label}: answers expected of the types of its ${which} (${labels})`;
      if (k >= 0) notes[k] = note;
      else notes.push(note);
    }
  }
  // "where" + a last relation word whose far end is not a place ("where did X study")
  // "who" in a catalog with no person- or organisation-like type: likewise, the far end of the relation word
  // (the wh-word opening the question, not a relative "whose" further on)
  if ((at.source === "where" || (at.source === "who" && at.types.length === 0 && (at.usedWords[0] ?? 0) <= 1)) && model.relationEnds) {
    const defaults = at.source === "where" ? model.placeTypes : model.agentTypes;
    const places = new Set(defaults.flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
    // "who" + a relation verb: the answer is that verb's subject ("who maintains …"); else the last relation word's far end
    const whoAt = at.usedWords[0] ?? 0;
    const r =
      (at.source === "who" && ws[whoAt + 1] !== undefined ? subjectRangeType(cues, ws[whoAt + 1]!.start, model, options.relationRange) : undefined) ??
      whereRangeType(cues, clues.map((c) => c.node), places, model, options.relationRange);
    if (r) {
      typeNums = r.types;
      typeSource = "relation";
      const labels = labelsOf(r.types);
      const wh = at.source === "where" ? "where" : "who";
      const k = notes.indexOf(at.notes[0] ?? "");
      if (k >= 0) notes.splice(k, 1);
      notes.push(`"${wh}" with "${r.cue.words.join(" ")}" (${r.cue.label}): answers expected of the types at its far end (${labels})${defaults.length > 0 ? `, not ${wh === "where" ? "places" : "persons"}` : ""}`);
    }
  }
  const answerTypes: AnswerType[] = typeNums.map((t) => {
    const mt = model.typeByNum.get(t)!;
    return { num: t, id: mt.id, label: mt.label };
  });
  const answerTypeWords = [...at.usedWords, ...(at.headPhrase ?? [])].sort((a, b) => a - b).map((k) => ({ start: ws[k]!.start, end: ws[k]!.end }));
  // the answer-type gap, while its note stands (a relation or a far end may have replaced it above)
  const gapNote = at.gap !== undefined ? at.notes[0] : undefined;
  const noteFacts: NoteFacts = {
    ...(at.gap !== undefined && gapNote !== undefined && notes.includes(gapNote) ? { answerTypeGap: { kind: at.gap, note: gapNote } } : {}),
    unmatched,
    ...(noClue !== undefined ? { noClue } : {}),
  };
  return { question, mentions: link.mentions, answerTypes, answerTypeSource: typeSource, relationCues: cues, clues, notes, typeWords, answerTypeWords, noteFacts };
}

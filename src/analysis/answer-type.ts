/**
 * Expected answer type from the question's wh-phrase and head noun.
 *
 * Method: question classification by wh-word and head noun (Li & Roth 2002, "Learning
 * Question Classifiers", COLING), with the class set taken from the catalog's own types
 * instead of a fixed taxonomy. After "which"/"what" (optionally "what is the", "what kind
 * of"), or an imperative "name"/"list"/"identify"/"find"/"show"/"give" opening the question,
 * the following words up to the first clause word ("that", "did", "of", "the", …) form the
 * noun phrase; its first (then longest) n-gram, starting within the first words, whose Porter-stem key (Porter 1980) equals a type label or alias
 * key gives the type (so plurals and inflections match). "who"/"whom"/"whose" give the
 * catalog's agent types (persons and organisations) and "where" its place-like types (see
 * question-model.ts), narrowed when a copula and a noun phrase naming one of their subtypes
 * follow ("who is the captain of …"). Subtypes are followed
 * by the ranking's type filter (isA over the supertype closure).
 */
import type { QuestionModel } from "./question-model.js";
import { isFunctionWord, type Word } from "./words.js";
import { ANSWER_TYPE_WORDS } from "./lexicon.js";

/** Options of {@link detectAnswerType}; all optional. */
export interface AnswerTypeOptions {
  /** Words looked at after the wh-word for the head noun phrase. @default 6 */
  readonly window?: number;
  /** Words allowed before the type words in the noun phrase ("which *research* vessel"). @default 2 */
  readonly maxModifiers?: number;
}

/** Defaults of {@link AnswerTypeOptions}. */
export const DEFAULTS = { window: 6, maxModifiers: 2 } as const;

/** How the answer type was found. */
export type AnswerTypeSource = "head-noun" | "who" | "where" | "relation" | "none";

/** The detected answer type. */
export interface AnswerTypeResult {
  /** Type nums (empty: no type constraint). */
  readonly types: readonly number[];
  readonly source: AnswerTypeSource;
  /** Indexes (into the word list) of the words used as the head noun phrase or wh-word. */
  readonly usedWords: readonly number[];
  readonly notes: readonly string[];
  /** Indexes of the head noun phrase's words when it named no type (a relational noun may stand there: "the *capital* of"). */
  readonly headPhrase?: readonly number[];
  /** Why there is no answer-type filter, when `notes[0]` says so: no question word, or a head noun (or none) that names no type. */
  readonly gap?: "no-question-word" | "head-noun";
}

const { WH_WHICH, WH_PERSON, WH_PLACE, IMPERATIVE, SKIP, COPULA, CLAUSE } = ANSWER_TYPE_WORDS;

/**
 * Finds the expected answer type. `blocked[i]` is true for words inside a linked mention
 * (they never form the head noun).
 */
export function detectAnswerType(ws: readonly Word[], blocked: readonly boolean[], model: QuestionModel, options: AnswerTypeOptions = {}): AnswerTypeResult {
  const window = options.window ?? DEFAULTS.window;
  let wh = -1;
  for (let i = 0; i < ws.length; i++) {
    if (blocked[i]) continue;
    const n = ws[i]!.norm;
    if (WH_WHICH.has(n) || WH_PERSON.has(n) || WH_PLACE.has(n)) {
      wh = i;
      break;
    }
    if (IMPERATIVE.has(n) && (i === 0 || (i === 1 && ws[0]!.norm === "please"))) {
      wh = i;
      break;
    }
  }
  if (wh < 0) return { types: [], source: "none", usedWords: [], notes: ["no question word (which/what/who/where/name…) found: no answer-type filter"], gap: "no-question-word" };

  // the head noun phrase window
  let i = wh + 1;
  while (i < ws.length && !blocked[i] && SKIP.has(ws[i]!.norm)) i++;
  // a linked name pre-modifying the head noun ("which *Norwegian* ports", "which *French*-speaking
  // countries"; Quirk et al. 1985 §17.97 ff.): skipped when unblocked words follow it
  let k = i;
  while (k < ws.length && k - i < 4 && blocked[k]) k++;
  if (k > i && k < ws.length && !CLAUSE.has(ws[k]!.norm) && ws.slice(k, k + model.maxTypeWords + 1).some((_, j) => model.typesByKey.has(ws[k + j]!.stem))) i = k;
  const phrase: number[] = [];
  for (; i < ws.length && phrase.length < window; i++) {
    if (blocked[i] || CLAUSE.has(ws[i]!.norm)) break;
    phrase.push(i);
  }
  const match = longestTypeMatch(ws, phrase, model, options.maxModifiers ?? DEFAULTS.maxModifiers) ?? headAfterModifiers(ws, blocked, i, window, model) ?? copulaComplement(ws, blocked, i, model, options.maxModifiers ?? DEFAULTS.maxModifiers);
  const whWord = ws[wh]!.norm;

  if (WH_PERSON.has(whWord) || WH_PLACE.has(whWord)) {
    const person = WH_PERSON.has(whWord);
    const defaults = person ? model.agentTypes : model.placeTypes;
    const source: AnswerTypeSource = person ? "who" : "where";
    // "who is the captain of …": a copula then a noun naming one of the defaults' subtypes
    const copula = (wh + 1 < ws.length && COPULA.has(ws[wh + 1]!.norm)) || whWord.endsWith("s") && whWord !== "whose";
    if (copula && match && match.types.every((t) => defaults.includes(t))) {
      return { types: match.types, source: "head-noun", usedWords: [wh, ...match.words], notes: [] };
    }
    if (defaults.length === 0) {
      return { types: [], source, usedWords: [wh], notes: [`no ${person ? "person" : "place"}-like type in the catalog: no answer-type filter for "${ws[wh]!.text}"`] };
    }
    return { types: mostGeneral(defaults, model), source, usedWords: [wh], notes: [] };
  }
  if (match) return { types: match.types, source: "head-noun", usedWords: [wh, ...match.words], notes: [] };
  const np = phrase.map((k) => ws[k]!.text).join(" ");
  return {
    types: [],
    source: "none",
    usedWords: [wh],
    notes: [np === "" ? "no head noun after the question word: no answer-type filter" : `"${np}" names no type of the catalog: no answer-type filter`],
    gap: "head-noun",
    headPhrase: phrase,
  };
}

/** Keeps the types that have no ancestor in the set (the filter follows subtypes anyway). */
function mostGeneral(nums: readonly number[], model: QuestionModel): number[] {
  const set = new Set(nums);
  return nums.filter((n) => !(model.typeByNum.get(n)?.ancestors ?? []).some((a) => a !== n && set.has(a))).sort((a, b) => a - b);
}

/**
 * The head noun of a noun phrase whose pre-modifiers include linked names and compounds
 * ("which *Arabic*-speaking *East African* country"): the phrase runs from `from` to the first
 * clause word, linked words included; English noun phrases are head-final (Quirk et al. 1985
 * §17.2), so the type words that end latest in it (the longest at that end) are the head.
 */
function headAfterModifiers(ws: readonly Word[], blocked: readonly boolean[], from: number, window: number, model: QuestionModel): { types: number[]; words: number[] } | undefined {
  let best: { types: number[]; words: number[] } | undefined;
  for (let e = from, unblocked = 0; e < ws.length && unblocked < window && !CLAUSE.has(ws[e]!.norm); e++) {
    if (blocked[e]) continue;
    unblocked++;
    for (let len = Math.min(model.maxTypeWords, e - from + 1); len >= 1; len--) {
      const idx = Array.from({ length: len }, (_, j) => e - len + 1 + j);
      if (idx.some((k) => blocked[k]) || (len === 1 && isFunctionWord(ws[e]!.norm))) continue;
      const types = model.typesByKey.get(idx.map((k) => ws[k]!.stem).join(" "));
      if (types && types.length > 0) {
        best = { types: [...types].sort((a, b) => a - b), words: idx };
        break;
      }
    }
  }
  return best;
}

/**
 * "Which *editor* is the second largest *package* …": the wh-phrase names no type, so the
 * type is the head of the subject complement after the copula (Quirk et al. 1985 §10.8,
 * the subject complement identifies the subject): after "is"/"are" and an article, up to
 * `maxModifiers` + 1 pre-modifiers, the first type label or alias.
 */
function copulaComplement(ws: readonly Word[], blocked: readonly boolean[], from: number, model: QuestionModel, maxModifiers: number): { types: number[]; words: number[] } | undefined {
  let k = from;
  while (k < ws.length && blocked[k]) k++;
  if (k === from || !COPULA.has(ws[k]?.norm ?? "")) return undefined;
  k++;
  while (k < ws.length && (ws[k]!.norm === "the" || ws[k]!.norm === "a" || ws[k]!.norm === "an")) k++;
  const phrase: number[] = [];
  for (; k < ws.length && phrase.length < maxModifiers + 2 && !blocked[k] && !CLAUSE.has(ws[k]!.norm); k++) phrase.push(k);
  return longestTypeMatch(ws, phrase, model, maxModifiers + 1);
}

function longestTypeMatch(ws: readonly Word[], phrase: readonly number[], model: QuestionModel, maxModifiers: number): { types: number[]; words: number[] } | undefined {
  // the noun phrase opens the window: allow up to `maxModifiers` words before the type words
  for (let s = 0; s <= Math.min(maxModifiers, phrase.length - 1); s++) {
    for (let len = Math.min(model.maxTypeWords, phrase.length - s); len >= 1; len--) {
      const idx = phrase.slice(s, s + len);
      if (len === 1 && isFunctionWord(ws[idx[0]!]!.norm)) continue;
      const key = idx.map((k) => ws[k]!.stem).join(" ");
      const types = model.typesByKey.get(key);
      if (types && types.length > 0) return { types: [...types].sort((a, b) => a - b), words: idx };
    }
  }
  return undefined;
}

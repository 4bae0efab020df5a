/**
 * Word spans of a question: tokens with their UTF-16 offsets, normalised and stemmed with the
 * catalog's own normalisation (`normalize`, `stemToken` from the catalog stage), and a small
 * English function-word list (common practice: closed-class words carry no relation meaning).
 */
import { normalize, stemToken } from "../catalog/index.js";

/** One word of the question. */
export interface Word {
  /** The word as written. */
  readonly text: string;
  /** Normalised form (catalog normalisation). */
  readonly norm: string;
  /** Porter stem of the normalised form. */
  readonly stem: string;
  /** UTF-16 offset of the first character. */
  readonly start: number;
  /** UTF-16 offset one past the last character. */
  readonly end: number;
}

const WORD = /[\p{L}\p{N}]+(?:['’][\p{L}]+)*/gu;

/** Splits a question into words with offsets. A word that normalises to several tokens is split evenly. */
export function words(question: string): Word[] {
  const out: Word[] = [];
  for (const m of question.matchAll(WORD)) {
    const text = m[0];
    const start = m.index ?? 0;
    const norm = normalize(text);
    if (norm === "") continue;
    for (const part of norm.split(" ")) out.push({ text, norm: part, stem: stemToken(part), start, end: start + text.length });
  }
  return out;
}

/**
 * English closed-class words (determiners, pronouns, auxiliaries, prepositions, conjunctions,
 * question words) and a few question verbs ("name", "list"). Common practice for content-word
 * extraction; the list is general English, not tuned to any catalog.
 */
export const FUNCTION_WORDS: ReadonlySet<string> = new Set(
  (
    "a an the this that these those some any all both each every either neither no none other another such " +
    "i me my we us our you your he him his she her it its they them their one ones someone something anyone anything " +
    "who whom whose which what where when why how whatever whichever " +
    "is are was were be been being am do does did done doing have has had having will would shall should can could may might must " +
    "of in on at by for with from to into onto upon about above below under over between among through during before after " +
    "against within without via per than as like near off out up down " +
    "and or but nor so yet if then also too very just only not " +
    "there here please tell give show name list find identify me " +
    "same exactly together"
  ).split(" "),
);

/** True for a closed-class word (by its normalised form). */
export function isFunctionWord(norm: string): boolean {
  return FUNCTION_WORDS.has(norm);
}

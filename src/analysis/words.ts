/**
 * Word spans of a question: tokens with their UTF-16 offsets, normalised and stemmed with the
 * catalog's own normalisation (`normalize`, `stemToken` from the catalog stage); the English
 * function words they are tested against live in lexicon.ts (re-exported here).
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

/**
 * The last texts split ({@link DEFAULTS}.keep), oldest first: one question's reading splits
 * its text a dozen times (analysis, conditions, query graph, cue chains, link facts), and the
 * re-asks that check suggested clues split the same prefix again.
 */
const recent = new Map<string, readonly Word[]>();

/** Defaults of {@link words}. */
export const DEFAULTS = {
  /** Texts whose words are kept (a question and the texts split while reading it). */
  keep: 16,
} as const;

/**
 * Splits a question into words with offsets. A word that normalises to several tokens is split
 * evenly. The array is shared between calls with the same text (read-only).
 */
export function words(question: string): readonly Word[] {
  const kept = recent.get(question);
  if (kept !== undefined) return kept;
  const out = split(question);
  if (recent.size >= DEFAULTS.keep) recent.delete(recent.keys().next().value!);
  recent.set(question, out);
  return out;
}

function split(question: string): readonly Word[] {
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

export { FUNCTION_WORDS, isFunctionWord } from "./lexicon.js";

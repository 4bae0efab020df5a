/**
 * Type nouns of a question: the words that name one of the catalog's types outside the clue
 * mentions and the answer-type phrase ("the *corer* aboard", "a *document* that cites").
 *
 * Method: longest-match dictionary lookup (greedy left-to-right, longest n-gram first, as in
 * maximum-matching segmentation, common practice) of the words' Porter-stem keys (Porter
 * 1980, "An algorithm for suffix stripping", Program 14(3)) against the catalog's type labels
 * and aliases (the question model's `typesByKey`); a function word never makes a one-word type.
 * The chain attribution (cue-chains.ts) types the node between two hops with them.
 */
import type { QuestionModel } from "./question-model.js";
import { isFunctionWord, type Word } from "./words.js";

/** A type noun of the question outside the clues and the answer-type phrase. */
export interface TypeWord {
  /** UTF-16 offsets of the noun (phrase). */
  readonly start: number;
  readonly end: number;
  /** The types it names. */
  readonly types: readonly number[];
}

/**
 * The type nouns of a question: longest n-grams of unblocked words whose Porter-stem key is
 * a type label or alias of the catalog (function words never make a one-word type).
 * `blocked[i]`: word i is inside a clue mention or the answer-type phrase.
 */
export function findTypeWords(ws: readonly Word[], blocked: readonly boolean[], model: QuestionModel): TypeWord[] {
  const out: TypeWord[] = [];
  for (let i = 0; i < ws.length; ) {
    let found = 0;
    for (let len = Math.min(model.maxTypeWords, ws.length - i); len >= 1 && found === 0; len--) {
      const idx = Array.from({ length: len }, (_, k) => i + k);
      if (idx.some((k) => blocked[k])) continue;
      if (len === 1 && isFunctionWord(ws[i]!.norm)) continue;
      const types = model.typesByKey.get(idx.map((k) => ws[k]!.stem).join(" "));
      if (types && types.length > 0) {
        out.push({ start: ws[i]!.start, end: ws[i + len - 1]!.end, types: [...types].sort((a, b) => a - b) });
        found = len;
      }
    }
    i += Math.max(found, 1);
  }
  return out;
}

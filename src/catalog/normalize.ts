/**
 * Text normalisation shared by the catalog (aliases at load time) and linking (question
 * text at ask time): Unicode NFKC, case folding, diacritic folding, punctuation to spaces,
 * whitespace collapsed. `stemKey` adds Porter stemming per token (Porter 1980, via the
 * `stemmer` package) so that inflected words ("vessels", "carried") meet their base form.
 */
import { stemmer } from "stemmer";

const COMBINING = /\p{M}+/gu;
const NON_WORD = /[^\p{L}\p{N}]+/gu;

/** Folds one string to its comparison form: "Bérénice  O'Hara-Lund" → "berenice o hara lund". */
export function normalize(text: string): string {
  return text
    .normalize("NFKC")
    .toLowerCase()
    .normalize("NFD")
    .replace(COMBINING, "")
    .replace(/ß/g, "ss")
    .replace(/[’'`´]/g, "")
    .replace(NON_WORD, " ")
    .trim();
}

/** The normalised tokens of `text`. */
export function tokens(text: string): string[] {
  const n = normalize(text);
  return n === "" ? [] : n.split(" ");
}

/** Porter stem of one normalised token (numbers and short tokens pass unchanged). */
export function stemToken(token: string): string {
  if (token.length <= 2 || /^\d/.test(token)) return token;
  return stemmer(token);
}

/** The stemmed form of a whole string: its normalised tokens, each stemmed, space-joined. */
export function stemKey(text: string): string {
  return tokens(text).map(stemToken).join(" ");
}

/**
 * Text normalisation shared by the catalog (aliases at load time) and linking (question
 * text at ask time): Unicode NFKC, case folding, diacritic folding, punctuation to spaces,
 * whitespace collapsed. `stemKey` adds Porter stemming per token (Porter 1980, via the
 * `stemmer` package) so that inflected words ("vessels", "carried") meet their base form.
 */
import { stemmer } from "stemmer";

const COMBINING = /\p{M}+/gu;
const NON_WORD = /[^\p{L}\p{N}]+/gu;

const ASCII = /^[\x00-\x7f]*$/;
const ASCII_APOSTROPHES = /['`]/g;
const ASCII_NON_WORD = /[^a-z0-9]+/g;

/** Folds one string to its comparison form: "Bérénice  O'Hara-Lund" → "berenice ohara lund". */
export function normalize(text: string): string {
  // ASCII text is unchanged by NFKC and NFD and has no combining marks, ß or typographic
  // apostrophes, and its only letters and digits are [a-z0-9] once lower-cased: the same
  // result as the general path, without the Unicode passes
  if (ASCII.test(text)) return text.toLowerCase().replace(ASCII_APOSTROPHES, "").replace(ASCII_NON_WORD, " ").trim();
  return normalizeUnicode(text);
}

/** The general path of {@link normalize}, for any text (exported for the equivalence test). */
export function normalizeUnicode(text: string): string {
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

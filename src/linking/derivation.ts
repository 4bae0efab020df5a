/**
 * Derived forms: a question word that is no catalog name but an adjective or inhabitant noun
 * derived from one ("Velmegian" ~ Velmay, "Quennish" ~ Quenland, "Ostreli" ~ Ostrel,
 * "Kess" ~ Kessia; invented names), found by derivational morphology applied to the catalog's OWN label and alias
 * tokens — never by a list of names.
 *
 * [Reference] English denominal adjectives and inhabitant nouns take the suffixes -(i)an,
 * -ean, -ese, -ish, -i and -ic, with the base clipped before them (Velm-ay → Velm-egian,
 * Ostrel-ia → Ostrel-ian, Quen-land → Quenn-ish) or unchanged (Brask → Brask-ian); a few are
 * zero derivations (Kess) of a base that itself carries a place suffix (-land, -ia):
 * R. Quirk, S. Greenbaum, G. Leech and J. Svartvik, "A Comprehensive Grammar of the English
 * Language", Longman 1985, Appendix I (word-formation, suffixation: adjective suffixes), and
 * R. Huddleston and G. K. Pullum, "The Cambridge Grammar of the English Language", 2002,
 * ch. 19 (lexical word-formation) — section numbers from memory, not checked.
 *
 * Method (candidate generation, both sides reduced to a root, then compared):
 * - word roots: the word minus a plural -s (when longer than 4 letters), minus one suffix of
 *   `suffixes` (longest first; the empty suffix too), at least `minRoot` letters;
 * - label roots: a vocabulary token (normalised word of some label or alias) minus a final
 *   "land" (when at least `minRoot` letters remain), then minus its final vowels (a, e, i, o,
 *   u, y): Velmay → velm, Braskmoor → braskmoor, Quenland → quen, Kessia → kess, Tarnu → tarn;
 * - a word root and a label root match when one is a prefix of the other and the longer one
 *   has at most `maxLeftover` letters more (Velm-eg ~ Velm, Quen-n ~ Quen); with the empty
 *   suffix they must be equal. Similarity = `similarity` − `perLetter` × d, where d counts the
 *   letters the word and the base token do not share as a common prefix (the suffix replacing
 *   the base's ending): Nigorian ~ Nigoria d = 1, ~ Nigora d = 3; Velmegian ~ Velmay d = 7.
 * Irregular forms (an adjective whose root is not the name's) are not found; a
 * catalog that holds them as aliases links them exactly, and that exact link wins.
 */
import { isStopWord } from "./stopwords.js";

/** Options of {@link derivedTokens}. */
export const DEFAULTS = {
  /** Derivational suffixes tried on the question word, longest first ("" = zero derivation). */
  suffixes: ["ian", "ean", "ese", "ish", "an", "ic", "i", ""] as readonly string[],
  /** Shortest root on either side. */
  minRoot: 3,
  /** Most letters one root may have beyond the other. */
  maxLeftover: 2,
  /** Similarity of a derived form before the letters it changes are counted. */
  similarity: 0.9,
  /** Similarity lost per letter not shared by the word and its base (see the header). */
  perLetter: 0.02,
  /** Shortest question word tried. */
  minWord: 4,
} as const;

/** A vocabulary token a question word may be derived from. */
export interface DerivedToken {
  /** Index of the base token in the vocabulary. */
  readonly token: number;
  /** The suffix stripped from the question word ("" for a zero derivation). */
  readonly suffix: string;
  /** Similarity of the word to the base token, in (0, 1). */
  readonly similarity: number;
}

const VOWELS = /[aeiouy]+$/;

/** The root of a label token (see the header), or "" when too short. */
export function labelRoot(token: string, minRoot: number = DEFAULTS.minRoot): string {
  let t = token;
  if (t.endsWith("land") && t.length - 4 >= minRoot) t = t.slice(0, -4);
  const r = t.replace(VOWELS, "");
  return r.length >= minRoot ? r : t.length >= minRoot ? t : "";
}

/** Candidate word roots with the suffix each strips (see the header). */
export function wordRoots(word: string, o: typeof DEFAULTS = DEFAULTS): { root: string; suffix: string }[] {
  const forms = [word];
  if (word.length > 4 && word.endsWith("s") && !word.endsWith("ss")) forms.push(word.slice(0, -1));
  const out: { root: string; suffix: string }[] = [];
  const seen = new Set<string>();
  for (const f of forms) {
    for (const s of o.suffixes) {
      if (!f.endsWith(s)) continue;
      const root = f.slice(0, f.length - s.length);
      if (root.length < o.minRoot || seen.has(`${root} ${s}`)) continue;
      seen.add(`${root} ${s}`);
      out.push({ root, suffix: s });
    }
  }
  return out;
}

/** First index in the sorted `vocab` whose token is ≥ `key`. */
function lowerBound(vocab: readonly string[], key: string): number {
  let lo = 0;
  let hi = vocab.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (vocab[mid]! < key) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Vocabulary tokens `word` (a normalised question word) may be derived from, best first (ties by
 * token). The word itself is never returned; stop words and words shorter than `minWord` give none.
 */
export function derivedTokens(word: string, vocab: readonly string[], options: Partial<typeof DEFAULTS> = {}): DerivedToken[] {
  const o = { ...DEFAULTS, ...options };
  if (word.length < o.minWord || isStopWord(word) || !/^\p{L}+$/u.test(word)) return [];
  const roots = wordRoots(word, o);
  if (roots.length === 0) return [];
  const best = new Map<number, DerivedToken>();
  // every matching label token shares the first minRoot letters with the word
  const prefix = word.slice(0, o.minRoot);
  for (let i = lowerBound(vocab, prefix); i < vocab.length && vocab[i]!.startsWith(prefix); i++) {
    const v = vocab[i]!;
    if (v === word) continue;
    const lr = labelRoot(v, o.minRoot);
    if (lr === "") continue;
    for (const { root, suffix } of roots) {
      let leftover: number;
      if (suffix === "") {
        if (root !== lr || root === v) continue; // a zero derivation needs a clipped base (Kess ~ Kessia)
        leftover = 0;
      } else if (root.startsWith(lr)) leftover = root.length - lr.length;
      else if (lr.startsWith(root)) leftover = lr.length - root.length;
      else continue;
      if (leftover > o.maxLeftover) continue;
      let lcp = 0;
      while (lcp < word.length && lcp < v.length && word[lcp] === v[lcp]) lcp++;
      const similarity = o.similarity - o.perLetter * (word.length - lcp + v.length - lcp);
      const had = best.get(i);
      if (!had || similarity > had.similarity) best.set(i, { token: i, suffix, similarity });
    }
  }
  return [...best.values()].sort((a, b) => b.similarity - a.similarity || a.token - b.token);
}

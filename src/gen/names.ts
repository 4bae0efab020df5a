/**
 * Invented names built from syllables by mixed-radix numbering: index k always maps to the
 * same name, and distinct indices below the pool size map to distinct names. No word list of
 * real names is used; the syllables are chosen to read as names of no particular language.
 */

const ONSETS = ["b", "d", "f", "g", "k", "l", "m", "n", "p", "r", "s", "t", "v", "z", "br", "dr", "kr", "tr", "th", "h", "j"] as const;
const VOWELS = ["a", "e", "i", "o", "u", "ae", "ou"] as const;
const CODAS = ["", "n", "r", "l", "s", "th", "m", "x"] as const;
// No coda + onset pair spells another coda + onset pair ("s"+"t" vs ""+"st" is why "st" is not
// an onset), so a name splits into syllables one way only and distinct syllable sequences give
// distinct names.

/** Number of distinct syllables. */
export const SYLLABLES = ONSETS.length * VOWELS.length * CODAS.length;

/** The k-th syllable (k mod {@link SYLLABLES}). */
export function syllable(k: number): string {
  const i = k % SYLLABLES;
  const o = i % ONSETS.length;
  const v = Math.floor(i / ONSETS.length) % VOWELS.length;
  const c = Math.floor(i / (ONSETS.length * VOWELS.length));
  return ONSETS[o]! + VOWELS[v]! + CODAS[c]!;
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** A two- or three-syllable capitalised name; distinct for k < SYLLABLES^3. */
export function inventedName(k: number): string {
  const a = k % SYLLABLES;
  const b = Math.floor(k / SYLLABLES) % SYLLABLES;
  const c = Math.floor(k / (SYLLABLES * SYLLABLES));
  // multipliers coprime with SYLLABLES (1176 = 2^3·3·7^2): a bijection that spreads consecutive k
  return cap(syllable(a * 5 + 3) + syllable(b * 11 + 5) + (c > 0 ? syllable(c) : ""));
}

/**
 * Given names: two open syllables (onset + vowel, twice). Index i is spread over all
 * 21·7·21·7 = 21,609 such names by a multiplier coprime with that count, so the 160 names are
 * distinct (an onset never starts with a vowel, so each name splits one way only).
 */
const GIVEN: readonly string[] = Array.from({ length: 160 }, (_, i) => {
  const space = ONSETS.length * VOWELS.length * ONSETS.length * VOWELS.length;
  let k = (i * 997 + 11) % space;
  const o = ONSETS[k % ONSETS.length]!;
  k = Math.floor(k / ONSETS.length);
  const v = VOWELS[k % VOWELS.length]!;
  k = Math.floor(k / VOWELS.length);
  const o2 = ONSETS[k % ONSETS.length]!;
  k = Math.floor(k / ONSETS.length);
  const v2 = VOWELS[k % VOWELS.length]!;
  return cap(o + v + o2 + v2);
});

/** The number of given names. */
export const GIVEN_COUNT = GIVEN.length;

/** A person's given name and surname for index k (distinct pairs for distinct k). */
export function personName(k: number): { given: string; surname: string } {
  return { given: GIVEN[k % GIVEN.length]!, surname: inventedName(Math.floor(k / GIVEN.length)) };
}

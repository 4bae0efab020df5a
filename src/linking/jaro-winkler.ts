/**
 * Jaro–Winkler string similarity.
 *
 * [Reference] M. A. Jaro, "Advances in record-linkage methodology as applied to matching the
 * 1985 census of Tampa, Florida", JASA 84(406), 1989; W. E. Winkler, "String comparator
 * metrics and enhanced decision rules in the Fellegi–Sunter model of record linkage", 1990.
 * Matching window ⌊max(|a|,|b|)/2⌋−1, prefix bonus on up to 4 shared leading characters.
 * Compares UTF-16 code units (the inputs are normalised catalog forms).
 */

/** Options of {@link jaroWinkler}. */
export const DEFAULTS = {
  /** Winkler's prefix scale p (0.1 in the paper; must stay ≤ 0.25). */
  prefixScale: 0.1,
  /** Longest common prefix that earns the bonus. */
  maxPrefix: 4,
} as const;

/** Match-flag scratch of {@link jaro} (synchronous, so one pair is enough). */
let flagsA = new Uint8Array(64);
let flagsB = new Uint8Array(64);

/** Jaro similarity in [0, 1]. */
export function jaro(a: string, b: string): number {
  if (a === b) return a.length === 0 ? 1 : 1;
  const la = a.length;
  const lb = b.length;
  if (la === 0 || lb === 0) return 0;
  const window = Math.max(0, Math.floor(Math.max(la, lb) / 2) - 1);
  // the match flags in two scratch arrays kept between calls (cleared over the used length):
  // a question compares thousands of token pairs, and two fresh arrays per pair is garbage
  if (la > flagsA.length) flagsA = new Uint8Array(Math.max(la, 2 * flagsA.length));
  if (lb > flagsB.length) flagsB = new Uint8Array(Math.max(lb, 2 * flagsB.length));
  const ma = flagsA;
  const mb = flagsB;
  ma.fill(0, 0, la);
  mb.fill(0, 0, lb);
  let matches = 0;
  for (let i = 0; i < la; i++) {
    const lo = Math.max(0, i - window);
    const hi = Math.min(lb - 1, i + window);
    for (let j = lo; j <= hi; j++) {
      if (mb[j] || a.charCodeAt(i) !== b.charCodeAt(j)) continue;
      ma[i] = 1;
      mb[j] = 1;
      matches++;
      break;
    }
  }
  if (matches === 0) return 0;
  let t = 0;
  let k = 0;
  for (let i = 0; i < la; i++) {
    if (!ma[i]) continue;
    while (!mb[k]) k++;
    if (a.charCodeAt(i) !== b.charCodeAt(k)) t++;
    k++;
  }
  const m = matches;
  return (m / la + m / lb + (m - t / 2) / m) / 3;
}

/** Jaro–Winkler similarity in [0, 1]. */
export function jaroWinkler(a: string, b: string, options: { prefixScale?: number; maxPrefix?: number } = {}): number {
  const p = options.prefixScale ?? DEFAULTS.prefixScale;
  const maxPrefix = options.maxPrefix ?? DEFAULTS.maxPrefix;
  const j = jaro(a, b);
  let l = 0;
  const lim = Math.min(maxPrefix, a.length, b.length);
  while (l < lim && a.charCodeAt(l) === b.charCodeAt(l)) l++;
  return j + l * p * (1 - j);
}

/**
 * Terminal display width and truncation with an ellipsis.
 *
 * Method: the string is split into grapheme clusters (Unicode UAX #29, via `Intl.Segmenter`);
 * a cluster is 0 columns when it is a control or zero-width character, 2 columns when its
 * first code point is East Asian Wide or Fullwidth (Unicode UAX #11, the W and F classes
 * of EastAsianWidth.txt, main blocks) or has emoji presentation (UTS #51, the
 * `Emoji_Presentation` property, or a VS16-qualified emoji), and 1 column otherwise.
 * Combining marks join their base character's cluster and so add no width.
 *
 * [Reference] Unicode Standard Annex #11, East Asian Width; Unicode Standard Annex #29,
 * Unicode Text Segmentation; Unicode Technical Standard #51, Unicode Emoji.
 * Differs from a full implementation: ambiguous-width (A) characters count as 1 column, as
 * in most terminals outside East Asian locales; the wide ranges are the main blocks only.
 */

/** Options of {@link truncate}. */
export const DEFAULTS = {
  /** The mark appended to a cut string. */
  ellipsis: "…",
} as const;

// Main East Asian Wide (W) and Fullwidth (F) ranges of EastAsianWidth.txt (Unicode 15).
const WIDE: readonly (readonly [number, number])[] = [
  [0x1100, 0x115f], [0x231a, 0x231b], [0x2329, 0x232a], [0x23e9, 0x23ec], [0x23f0, 0x23f0],
  [0x23f3, 0x23f3], [0x25fd, 0x25fe], [0x2614, 0x2615], [0x2648, 0x2653], [0x267f, 0x267f],
  [0x2693, 0x2693], [0x26a1, 0x26a1], [0x26aa, 0x26ab], [0x26bd, 0x26be], [0x26c4, 0x26c5],
  [0x26ce, 0x26ce], [0x26d4, 0x26d4], [0x26ea, 0x26ea], [0x26f2, 0x26f3], [0x26f5, 0x26f5],
  [0x26fa, 0x26fa], [0x26fd, 0x26fd], [0x2705, 0x2705], [0x270a, 0x270b], [0x2728, 0x2728],
  [0x274c, 0x274c], [0x274e, 0x274e], [0x2753, 0x2755], [0x2757, 0x2757], [0x2795, 0x2797],
  [0x27b0, 0x27b0], [0x27bf, 0x27bf], [0x2b1b, 0x2b1c], [0x2b50, 0x2b50], [0x2b55, 0x2b55],
  [0x2e80, 0x303e], [0x3041, 0x33ff], [0x3400, 0x4dbf], [0x4e00, 0x9fff], [0xa000, 0xa4cf],
  [0xa960, 0xa97f], [0xac00, 0xd7a3], [0xf900, 0xfaff], [0xfe10, 0xfe19], [0xfe30, 0xfe6f],
  [0xff00, 0xff60], [0xffe0, 0xffe6], [0x16fe0, 0x16fe4], [0x17000, 0x18aff], [0x1b000, 0x1b2ff],
  [0x1f004, 0x1f004], [0x1f0cf, 0x1f0cf], [0x1f18e, 0x1f18e], [0x1f191, 0x1f19a], [0x1f200, 0x1f202],
  [0x1f210, 0x1f23b], [0x1f240, 0x1f248], [0x1f250, 0x1f251], [0x1f260, 0x1f265], [0x20000, 0x2fffd],
  [0x30000, 0x3fffd],
];

const EMOJI_PRESENTATION = /\p{Emoji_Presentation}/u;
const ZERO_WIDTH = /^[\p{Cc}\p{Cf}\p{Mn}\p{Me}\u200b-\u200f\u2028-\u202e\u2060-\u2064]+$/u;

function isWide(cp: number): boolean {
  let lo = 0;
  let hi = WIDE.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const [a, b] = WIDE[mid]!;
    if (cp < a) hi = mid - 1;
    else if (cp > b) lo = mid + 1;
    else return true;
  }
  return false;
}

const segmenter = new Intl.Segmenter("en", { granularity: "grapheme" });

/** The grapheme clusters of a string (user-perceived characters), in order. */
export function graphemes(s: string): string[] {
  const out: string[] = [];
  for (const g of segmenter.segment(s)) out.push(g.segment);
  return out;
}

/** Display width in terminal columns of one grapheme cluster. */
export function clusterWidth(g: string): number {
  if (g.length === 0 || ZERO_WIDTH.test(g)) return 0;
  const cp = g.codePointAt(0)!;
  if (isWide(cp)) return 2;
  if (EMOJI_PRESENTATION.test(g) || g.includes("\ufe0f")) return 2;
  return 1;
}

/** Display width in terminal columns of a string (no ANSI escapes expected). */
export function displayWidth(s: string): number {
  // fast path: printable ASCII
  if (/^[\x20-\x7e]*$/.test(s)) return s.length;
  let w = 0;
  for (const g of graphemes(s)) w += clusterWidth(g);
  return w;
}

/**
 * Cuts `s` to at most `width` columns, ending with an ellipsis when anything was cut.
 * Never splits a grapheme cluster (a base with its combining marks, a wide character).
 */
export function truncate(s: string, width: number, ellipsis: string = DEFAULTS.ellipsis): string {
  if (width <= 0) return "";
  if (displayWidth(s) <= width) return s;
  const ew = displayWidth(ellipsis);
  if (ew > width) return "";
  const room = width - ew;
  let used = 0;
  let out = "";
  for (const g of graphemes(s)) {
    const w = clusterWidth(g);
    if (used + w > room) break;
    out += g;
    used += w;
  }
  return out.replace(/\s+$/u, "") + ellipsis;
}

/** Pads `s` with spaces to exactly `width` columns (truncating with an ellipsis first). */
export function fit(s: string, width: number): string {
  const t = truncate(s, width);
  return t + " ".repeat(Math.max(0, width - displayWidth(t)));
}

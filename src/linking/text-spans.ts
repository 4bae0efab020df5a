/**
 * Question tokens with their UTF-16 spans in the original text.
 *
 * Applies the catalog's own normalisation (`normalize` from src/catalog: NFKC, case folding,
 * diacritic folding, apostrophes dropped, other punctuation to spaces) one grapheme-like
 * cluster at a time (a code point plus its combining marks), so every normalised character
 * remembers which original characters it came from. A ligature such as "ﬁ" (one UTF-16 unit,
 * two normalised letters) or a surrogate pair therefore maps back to whole original characters,
 * and `question.slice(start, end)` always yields the text the token was read from.
 * Per-cluster normalisation equals whole-string normalisation for everything but a few
 * cross-cluster compositions (e.g. conjoining Hangul jamo), which only affects those scripts.
 */
import { normalize, stemToken } from "../catalog/index.js";

/** One normalised token of the question. */
export interface QuestionToken {
  /** Normalised form (as `normalize` would give for this word). */
  readonly norm: string;
  /** Porter stem of `norm` (as `stemKey` would give). */
  readonly stem: string;
  /** UTF-16 offset of the first original character. */
  readonly start: number;
  /** UTF-16 offset one past the last original character. */
  readonly end: number;
  /** True when the original word starts with an upper-case letter or contains a digit. */
  readonly marked: boolean;
  /** Upper-case (or title-case) letters in the original word ("MICA's" 4, "Lives" 1, "lives" 0). */
  readonly upper: number;
}

const MARK = /\p{M}/u;
const UPPER = /\p{Lu}|\p{Lt}/u;

/** Porter stems of recent tokens (words repeat across questions; bounded, cleared when full). */
const STEMS = new Map<string, string>();

function stemOf(token: string): string {
  let s = STEMS.get(token);
  if (s === undefined) {
    if (STEMS.size >= 50_000) STEMS.clear();
    s = stemToken(token);
    STEMS.set(token, s);
  }
  return s;
}

/** Normalised form of one cluster: the catalog's `normalize`, without its trim. */
function normCluster(cluster: string): string {
  const c = cluster.charCodeAt(0);
  if (cluster.length === 1 && c < 128) {
    if ((c >= 97 && c <= 122) || (c >= 48 && c <= 57)) return cluster;
    if (c >= 65 && c <= 90) return String.fromCharCode(c + 32);
    if (c === 39 || c === 96) return ""; // apostrophe, backtick (dropped by normalize)
    return " ";
  }
  if (/^[’´]$/u.test(cluster)) return "";
  // normalize() trims; pad so leading/trailing separators survive as spaces
  const n = normalize(`a${cluster}a`);
  return n.slice(1, -1);
}

/**
 * Splits `question` into normalised tokens with original UTF-16 spans.
 * Never throws; any string (lone surrogates, control characters, 100 KB) is accepted.
 */
export function questionTokens(question: string): QuestionToken[] {
  const out: QuestionToken[] = [];
  let cur = "";
  let curStart = -1;
  let curEnd = -1;
  let marked = false;
  let upper = 0;
  const flush = () => {
    if (cur !== "") out.push({ norm: cur, stem: stemOf(cur), start: curStart, end: curEnd, marked, upper });
    cur = "";
    curStart = -1;
    marked = false;
    upper = 0;
  };
  let i = 0;
  const n = question.length;
  while (i < n) {
    const cp = question.codePointAt(i)!;
    let j = i + (cp > 0xffff ? 2 : 1);
    while (j < n) {
      const next = question.codePointAt(j)!;
      const ch = String.fromCodePoint(next);
      if (!MARK.test(ch)) break;
      j += next > 0xffff ? 2 : 1;
    }
    const cluster = question.slice(i, j);
    const piece = normCluster(cluster);
    const c0 = cluster.charCodeAt(0);
    const isCapital = cluster.length === 1 && c0 < 128 ? c0 >= 65 && c0 <= 90 : UPPER.test(cluster);
    let capital = isCapital;
    if (piece === "") {
      // dropped inside a word (apostrophe, stray mark): the word goes on, its end stays
    } else {
      for (let k = 0; k < piece.length; k++) {
        const ch = piece[k]!;
        if (ch === " ") {
          flush();
        } else {
          if (cur === "") {
            curStart = i;
            marked = isCapital || (cluster >= "0" && cluster <= "9");
          } else if (cluster >= "0" && cluster <= "9") {
            marked = true;
          }
          if (capital) {
            upper++; // once per original character
            capital = false;
          }
          cur += ch;
          curEnd = j;
        }
      }
    }
    i = j;
  }
  flush();
  return out;
}

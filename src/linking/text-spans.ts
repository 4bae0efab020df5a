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
 *
 * Sentence-initial words. English capitalises the first word of every sentence and the pronoun
 * "I" by orthography, not because they are names (common practice in capitalisation-based name
 * detection, cf. Mikheev, "Periods, capitalized words, etc.", Computational Linguistics 28,
 * 2002): a token is `initial` when it opens the text, follows "!" or "?", or follows a "." after
 * a word that is not a capitalised word of at most 3 letters or a single letter (so "Dr. Brenn"
 * and "I. Varrick" stay names: a short capitalised word before a period is read as an
 * abbreviation or an initial), or when it is the pronoun "I" (not followed by a period) alone or in a contraction
 * ("I'm", "I've"). Such a capital marks no name by itself.
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
  /** True when the word's capital is orthographic: it opens a sentence, or is the pronoun "I" (see the header). */
  readonly initial: boolean;
}

/** The pronoun "I" and its contractions, as written (apostrophes straight or curly). */
const PRONOUN_I = /^I(?:['’](?:m|ve|d|ll))?$/u;
/** A short capitalised word or a single letter before a period: an abbreviation or an initial ("Dr.", "I."), not a sentence end. */
const ABBREVIATION = /^(?:\p{Lu}\p{Ll}{0,2}|\p{L})$/u;

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
  /** Where the previous token ended (its text decides whether a period after it ends a sentence). */
  let prevStart = -1;
  let prevEnd = -1;
  const initialAt = (start: number, end: number): boolean => {
    if (PRONOUN_I.test(question.slice(start, end)) && question[end] !== ".") return true;
    if (prevEnd < 0) return true;
    const between = question.slice(prevEnd, start);
    if (/[!?]/u.test(between)) return true;
    return /\.\s/u.test(between) && !ABBREVIATION.test(question.slice(prevStart, prevEnd));
  };
  const flush = () => {
    if (cur !== "") {
      out.push({ norm: cur, stem: stemOf(cur), start: curStart, end: curEnd, marked, upper, initial: initialAt(curStart, curEnd) });
      prevStart = curStart;
      prevEnd = curEnd;
    }
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

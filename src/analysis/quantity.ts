/**
 * Quantities in question text: numbers, years, calendar dates and decades, each read as a
 * half-open interval [lo, hi) on the catalog's numeric scale.
 *
 * Scale: the catalog stores a literal's number the way `literalNumber` (catalog/writer.ts)
 * reads it — plain numbers as they are, a year Y as Y, an ISO 8601 calendar date
 * YYYY-MM-DD as Y plus the elapsed share of that year. A question's "1980" therefore covers
 * [1980, 1981), "1980-05" (ISO 8601 reduced precision, §5.2.1.2 of ISO 8601:2004) covers the
 * month, "1980-05-03" (ISO 8601 calendar date, complete representation, extended format,
 * §5.2.1.1) covers the day, "the 1970s" covers [1970, 1980) and "the early/mid/late 1970s"
 * the first, middle or last part of it (common usage: early = years 0–3, mid = 3–6, late =
 * 7–9). Plain numbers are points (lo = hi). Thousands separators ("12,500"), decimals
 * ("3.5"), and the multipliers "thousand", "million", "billion" are read; the word right
 * after the number is kept as its unit ("km²", "metres", "tonnes"). A four-digit number
 * followed by a unit the catalog declares, written out or abbreviated ("2000 KiB" for
 * kibibytes; abbreviation matching of Schwartz & Hearst 2003), is that many units, not a year.
 */
import { DECADE_PART, MULTIPLIER, NOT_UNIT, UNIT_POWERS } from "./lexicon.js";

/** What a quantity was written as. */
export type QuantityKind = "number" | "year" | "date" | "decade";

/** A quantity found in a question. */
export interface Quantity {
  readonly kind: QuantityKind;
  /** Lower end (inclusive). */
  readonly lo: number;
  /** Upper end: exclusive for years, dates and decades; equal to `lo` for a plain number. */
  readonly hi: number;
  /** The text as written (without the unit). */
  readonly text: string;
  /** UTF-16 offset of the first character; of the first digit when a sign precedes it (the sign is in `text` and the value). */
  readonly start: number;
  /** UTF-16 offset one past the last character (unit included when there is one). */
  readonly end: number;
  /** The unit word written right after the number, lower-cased, if any. */
  readonly unit?: string;
}

/** Options of {@link findQuantities}; all optional. */
export interface QuantityOptions {
  /** A bare whole number in this range is read as a year. @default [1000, 2999] */
  readonly yearRange?: readonly [number, number];
  /**
   * The catalog's declared units: a four-digit number followed by one of them (as written or
   * abbreviated, {@link unitMatches}) is a number with that unit, not a year ("2000 KiB"). @default none
   */
  readonly units?: readonly string[];
}

/** Defaults of {@link QuantityOptions}. */
export const DEFAULTS = { yearRange: [1000, 2999] as readonly [number, number] } as const;


/** A year as a number on the catalog's scale: Y plus the elapsed share of the year at month m, day d (UTC, proleptic Gregorian). */
export function yearFraction(y: number, m = 1, d = 1): number {
  const start = Date.UTC(y, 0, 1);
  const end = Date.UTC(y + 1, 0, 1);
  return y + (Date.UTC(y, m - 1, d) - start) / (end - start);
}

function daysIn(y: number, m: number): number {
  return new Date(Date.UTC(y, m, 0)).getUTCDate();
}

/**
 * Parses one written number: digits with optional thousands separators (comma, or a space
 * only between groups of three) and decimals. Returns null when it is not one.
 */
export function parseNumber(text: string): number | null {
  const t = text.trim().replace(/\u00a0|\u202f/g, " ");
  // a sign may be written as the minus sign U+2212 (Unicode's mathematical operator) as well as the hyphen-minus
  const u = t.replace(/^\u2212/, "-");
  if (/^[+-]?(\d{1,3}(,\d{3})+|\d{1,3}( \d{3})+|\d+)(\.\d+)?$/.test(u)) return Number(u.replace(/[, ]/g, ""));
  if (/^[+-]?\.\d+$/.test(u)) return Number(u);
  return null;
}

/** Parses an ISO 8601 calendar date or reduced-precision date (YYYY, YYYY-MM, YYYY-MM-DD) to its interval; null when invalid. */
export function parseIsoDate(text: string): { lo: number; hi: number; kind: "year" | "date" } | null {
  const m = /^(\d{4})(?:-(\d{2})(?:-(\d{2}))?)?$/.exec(text.trim());
  if (!m) return null;
  const y = Number(m[1]);
  if (m[2] === undefined) return { lo: y, hi: y + 1, kind: "year" };
  const mo = Number(m[2]);
  if (mo < 1 || mo > 12) return null;
  if (m[3] === undefined) return { lo: yearFraction(y, mo), hi: mo === 12 ? y + 1 : yearFraction(y, mo + 1), kind: "date" };
  const d = Number(m[3]);
  if (d < 1 || d > daysIn(y, mo)) return null;
  const next = new Date(Date.UTC(y, mo - 1, d + 1));
  const hi = next.getUTCFullYear() > y ? y + 1 : yearFraction(y, next.getUTCMonth() + 1, next.getUTCDate());
  return { lo: yearFraction(y, mo, d), hi, kind: "date" };
}

/** Letters and digits of a unit, lower-cased ("km²" → "km", "KiB" → "kib"). */
function unitChars(u: string): string {
  return u.toLowerCase().replace(/[^\p{L}\p{Nd}\s]/gu, "").trim();
}

/**
 * True when `short` abbreviates `long`: every character of the short form occurs in the long
 * form in order, and its first character starts a word of the long form ("KiB" ~ "kibibytes",
 * "km" ~ "square kilometres"). The matching of Schwartz & Hearst 2003 ("A simple algorithm for
 * identifying abbreviation definitions in biomedical text", Pacific Symposium on
 * Biocomputing), read right to left as there.
 */
export function abbreviates(short: string, long: string): boolean {
  const s = unitChars(short).replace(/\s+/g, "");
  const l = unitChars(long);
  if (s.length === 0 || s.length >= l.replace(/\s+/g, "").length) return false;
  let li = l.length - 1;
  for (let si = s.length - 1; si >= 0; si--) {
    const c = s[si]!;
    // the first character must also start a word of the long form
    while (li >= 0 && (l[li] !== c || (si === 0 && li > 0 && /\p{L}|\p{N}/u.test(l[li - 1]!)))) li--;
    if (li < 0) return false;
    li--;
  }
  return true;
}

/**
 * True when a unit written in a question is a declared unit of the catalog: the same letters
 * (ignoring case, symbols such as "²", and a plural -s), or either abbreviating the other
 * ({@link abbreviates}).
 */
export function unitMatches(written: string, declared: string): boolean {
  const w = unitChars(written);
  const d = unitChars(declared);
  if (w === "" || d === "") return false;
  if (w === d || w.replace(/s$/, "") === d.replace(/s$/, "")) return true;
  return abbreviates(written, declared) || abbreviates(declared, written);
}

const TOKEN =
  /(?:\b(early|mid|late)[- ])?\b(?:the )?(\d{3}0)['’]?s\b|\b(\d{4}-\d{2}(?:-\d{2})?)\b|(?<![\w.])([+\u2212-]?(?:\d{1,3}(?:,\d{3})+|\d+)(?:\.\d+)?)(?![\w,.]\d)(?:\s+(thousand|million|billion)\b)?/giu;
const UNIT_AFTER = /^\s*([\p{L}][\p{L}\p{N}²³/.]*|%)/u;

/**
 * The unit written at the start of `rest` (right after a number), lower-cased, and the length
 * it takes (a final full stop is the sentence's): one word, or a power word and the unit it
 * raises ("square kilometres"; lexicon.ts `UNIT_POWERS`). Undefined when the next word is no unit.
 */
function unitAfter(rest: string): { unit: string; length: number } | undefined {
  const one = UNIT_AFTER.exec(rest);
  if (!one || NOT_UNIT.has(one[1]!.toLowerCase())) return undefined;
  const word = (m: RegExpExecArray) => m[1]!.toLowerCase().replace(/\.$/, "");
  const len = (m: RegExpExecArray) => m[0].length - (m[1]!.endsWith(".") ? 1 : 0);
  const first = word(one);
  const two = UNIT_POWERS.has(first) && !one[1]!.endsWith(".") ? UNIT_AFTER.exec(rest.slice(one[0].length)) : null;
  if (two && !NOT_UNIT.has(two[1]!.toLowerCase())) return { unit: `${first} ${word(two)}`, length: one[0].length + len(two) };
  return { unit: first, length: len(one) };
}

/** Every quantity in `text`, in order. */
export function findQuantities(text: string, options: QuantityOptions = {}): Quantity[] {
  const [ylo, yhi] = options.yearRange ?? DEFAULTS.yearRange;
  const out: Quantity[] = [];
  for (const m of text.matchAll(TOKEN)) {
    const start = m.index ?? 0;
    let end = start + m[0].length;
    let q: Omit<Quantity, "start" | "end" | "unit"> | null = null;
    if (m[2] !== undefined) {
      const base = Number(m[2]);
      if (base % 10 !== 0) continue;
      const part = m[1] ? DECADE_PART[m[1].toLowerCase()]! : ([0, 10] as const);
      q = { kind: "decade", lo: base + part[0], hi: base + part[1], text: m[0] };
    } else if (m[3] !== undefined) {
      const d = parseIsoDate(m[3]);
      if (!d) continue;
      q = { kind: d.kind, lo: d.lo, hi: d.hi, text: m[0] };
    } else if (m[4] !== undefined) {
      let v = parseNumber(m[4]);
      if (v === null) continue;
      const mult = m[5] ? MULTIPLIER[m[5].toLowerCase()]! : 1;
      v *= mult;
      // a four-digit number before a unit of the catalog is that many units ("2000 KiB"), not a year
      const unitNext = unitAfter(text.slice(end))?.unit;
      const measured = unitNext !== undefined && (options.units ?? []).some((u) => unitMatches(unitNext, u));
      const isYear = mult === 1 && /^\d{4}$/.test(m[4]) && v >= ylo && v <= yhi && !measured;
      q = isYear ? { kind: "year", lo: v, hi: v + 1, text: m[0] } : { kind: "number", lo: v, hi: v, text: m[0] };
    }
    if (!q) continue;
    let unit: string | undefined;
    const after = unitAfter(text.slice(end));
    if (after && q.kind === "number") {
      unit = after.unit;
      end += after.length;
    }
    // a sign is part of the value and of `text`, not of the span: the span starts at the first
    // digit, so it begins on a word of the question (words are letter and digit runs, words.ts)
    const signed = q.kind === "number" && /^[+\u2212-]/.test(q.text) ? 1 : 0;
    out.push({ ...q, start: start + signed, end, ...(unit !== undefined ? { unit } : {}) });
  }
  return out;
}

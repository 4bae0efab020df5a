/**
 * Number and date parsing against worked examples.
 * Dates: ISO 8601:2004 "Data elements and interchange formats", §5.2.1.1 (complete calendar
 * date, extended format YYYY-MM-DD, e.g. 1985-04-12) and §5.2.1.2 (reduced precision: a
 * specific month YYYY-MM, a specific year YYYY). Day counts from the Gregorian calendar
 * (leap year rule: divisible by 4, except centuries not divisible by 400 — 2000 leap, 1900 not).
 */
import { describe, expect, it } from "vitest";
import { abbreviates, findQuantities, parseIsoDate, parseNumber, unitMatches, yearFraction } from "./quantity.js";

describe("parseNumber", () => {
  it("refuses text that is not a number", () => {
    expect(parseNumber("")).toBeNull();
    expect(parseNumber("12,34")).toBeNull(); // a comma must separate groups of three (common practice, en-GB/en-US)
    expect(parseNumber("1,2345")).toBeNull();
    expect(parseNumber("abc")).toBeNull();
  });
  it("reads thousands separators and decimals", () => {
    expect(parseNumber("500,000")).toBe(500000);
    expect(parseNumber("1,234,567.5")).toBe(1234567.5);
    expect(parseNumber("12 500")).toBe(12500); // SI brochure §5.4.4: digits grouped in threes by a space
    expect(parseNumber("3.25")).toBe(3.25);
    expect(parseNumber("-40")).toBe(-40);
    expect(parseNumber("\u221240")).toBe(-40); // U+2212 MINUS SIGN (Unicode 15, Mathematical Operators block)
  });
});

describe("findQuantities: signed numbers", () => {
  it("keeps the sign in the value and the text, and starts the span at the first digit (a word of the question)", () => {
    const q = "latitude below -30?";
    const [n] = findQuantities(q);
    expect(n).toMatchObject({ kind: "number", lo: -30, hi: -30, text: "-30" });
    expect(q.slice(n!.start, n!.end)).toBe("30");
    expect(findQuantities("code +47")[0]).toMatchObject({ lo: 47, text: "+47" });
    expect(findQuantities("below \u221215 degrees")[0]).toMatchObject({ lo: -15, unit: "degrees" });
  });
});

describe("parseIsoDate (ISO 8601:2004 §5.2.1)", () => {
  it("refuses invalid calendar dates", () => {
    expect(parseIsoDate("1985-13-01")).toBeNull(); // month 13
    expect(parseIsoDate("1985-00")).toBeNull();
    expect(parseIsoDate("1900-02-29")).toBeNull(); // 1900 is not a Gregorian leap year
    expect(parseIsoDate("1985-4-12")).toBeNull(); // the extended format has two-digit months
  });
  it("reads the standard's worked example 1985-04-12 as one day", () => {
    // 1985 has 365 days; 12 April is day 102, so 101 days have elapsed (hand-computed: 31+28+31+11)
    const d = parseIsoDate("1985-04-12")!;
    expect(d.kind).toBe("date");
    expect(d.lo).toBeCloseTo(1985 + 101 / 365, 9);
    expect(d.hi).toBeCloseTo(1985 + 102 / 365, 9);
  });
  it("reads reduced precision: a month (1985-04) and a year (1985)", () => {
    const m = parseIsoDate("1985-04")!; // April 1985: days 91..120 elapsed (hand-computed: 31+28+31 = 90)
    expect(m.lo).toBeCloseTo(1985 + 90 / 365, 9);
    expect(m.hi).toBeCloseTo(1985 + 120 / 365, 9);
    expect(parseIsoDate("1985")).toEqual({ lo: 1985, hi: 1986, kind: "year" });
  });
  it("handles leap days and the last day of a year", () => {
    const leap = parseIsoDate("2000-02-29")!; // 2000 is a leap year (366 days); 59 days elapsed
    expect(leap.lo).toBeCloseTo(2000 + 59 / 366, 9);
    const last = parseIsoDate("2021-12-31")!;
    expect(last.lo).toBeCloseTo(2021 + 364 / 365, 9);
    expect(last.hi).toBe(2022);
  });
  it("matches the catalog's own scale (yearFraction)", () => {
    expect(yearFraction(1985, 4, 12)).toBeCloseTo(parseIsoDate("1985-04-12")!.lo, 12);
    expect(yearFraction(1985)).toBe(1985);
  });
});

describe("findQuantities", () => {
  it("finds nothing in text without numbers", () => {
    expect(findQuantities("Which vessel is the largest?")).toEqual([]);
  });
  it("reads a year as the whole year, a plain number as a point", () => {
    const [y] = findQuantities("built before 1980?");
    expect(y).toMatchObject({ kind: "year", lo: 1980, hi: 1981, text: "1980" });
    const [n] = findQuantities("more than 500,000 km² of land");
    expect(n).toMatchObject({ kind: "number", lo: 500000, hi: 500000, unit: "km²" });
    expect("more than 500,000 km² of land".slice(n!.start, n!.end)).toBe("500,000 km²");
  });
  it("reads decades and their parts (common usage: early 0–3, mid 3–6, late 7–9)", () => {
    expect(findQuantities("in the 1970s")[0]).toMatchObject({ kind: "decade", lo: 1970, hi: 1980 });
    expect(findQuantities("in the mid-1990s")[0]).toMatchObject({ kind: "decade", lo: 1993, hi: 1997 });
    expect(findQuantities("during the late 1960s")[0]).toMatchObject({ kind: "decade", lo: 1967, hi: 1970 });
  });
  it("reads ISO dates inside a sentence and multipliers", () => {
    const [d] = findQuantities("started after 2008-06-30, please");
    expect(d!.kind).toBe("date");
    expect(d!.lo).toBeCloseTo(2008 + 181 / 366, 9); // 2008 leap: 31+29+31+30+31+29 = 181 days elapsed (hand-computed)
    expect(findQuantities("over 2.5 million people")[0]).toMatchObject({ kind: "number", lo: 2500000, unit: "people" });
  });
  it("reads both ends of a range", () => {
    const qs = findQuantities("between 40 and 70 metres");
    expect(qs.map((q) => q.lo)).toEqual([40, 70]);
    expect(qs[1]!.unit).toBe("metres");
  });
});

describe("units written as the catalog declares them, or abbreviated", () => {
  // short forms against their definitions as Schwartz & Hearst 2003 match them: in order, first letter starting a word
  it("matches an abbreviation to its long form, and nothing else", () => {
    expect(abbreviates("KiB", "kibibytes")).toBe(true); // IEC 80000-13: KiB is the symbol of the kibibyte
    expect(abbreviates("km", "square kilometres")).toBe(true);
    expect(abbreviates("kg", "kilometres")).toBe(false); // no g
    expect(abbreviates("mb", "kibibytes")).toBe(false); // m starts no word
    expect(unitMatches("km²", "km²")).toBe(true);
    expect(unitMatches("Metres", "metre")).toBe(true);
    expect(unitMatches("tonnes", "kibibytes")).toBe(false);
  });
  it("reads a four-digit number before a declared unit as a number, else as a year", () => {
    expect(findQuantities("larger than 2000 KiB", { units: ["kibibytes"] })[0]).toMatchObject({ kind: "number", lo: 2000, unit: "kib" });
    expect(findQuantities("larger than 2000 KiB")[0]).toMatchObject({ kind: "year", lo: 2000 });
    expect(findQuantities("launched in 1994 carry", { units: ["kibibytes"] })[0]).toMatchObject({ kind: "year" });
  });
});

describe("units raised to a power (SI Brochure, 9th edition 2019, §5.2: \"square\", \"cubic\")", () => {
  it("reads 'square kilometres' as one unit that matches the declared km²; a four-digit number before it is no year", () => {
    const [q] = findQuantities("less than 500 square kilometres?", { units: ["km²"] });
    expect(q).toMatchObject({ kind: "number", lo: 500, unit: "square kilometres" });
    expect(unitMatches("square kilometres", "km²")).toBe(true);
    expect(unitMatches("km2", "km²")).toBe(true);
    expect(unitMatches("square kilometres", "kibibytes")).toBe(false);
    expect(findQuantities("over 1500 square kilometres", { units: ["km²"] })[0]).toMatchObject({ kind: "number", lo: 1500, unit: "square kilometres" });
    // a power word with no unit after it stays a word of its own
    expect(findQuantities("500 square.")[0]).toMatchObject({ unit: "square" });
  });
});

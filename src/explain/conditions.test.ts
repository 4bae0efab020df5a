/**
 * Condition values as text: dates back to ISO 8601 calendar dates (ISO 8601:2004 §5.2.1.1),
 * whole years as written, other numbers with thousands separators (common practice, en-US).
 */
import { describe, expect, it } from "vitest";
import { parseIsoDate } from "../analysis/index.js";
import { formatValue } from "./conditions.js";

describe("formatValue", () => {
  it("writes a date on the catalog's year scale back as YYYY-MM-DD", () => {
    expect(formatValue(parseIsoDate("1985-04-12")!.lo, true)).toBe("1985-04-12");
    expect(formatValue(parseIsoDate("2000-02-29")!.lo, true)).toBe("2000-02-29"); // a Gregorian leap day
    expect(formatValue(1978, true)).toBe("1978");
  });
  it("groups large numbers by thousands and leaves small ones alone", () => {
    expect(formatValue(551695, false)).toBe("551,695");
    expect(formatValue(62, false)).toBe("62");
  });
  it("writes integers as en-US number formatting does (ECMA-402 Intl.NumberFormat, the reference), fractions through it", () => {
    const ref = (v: number) => v.toLocaleString("en-US", { maximumFractionDigits: 6 });
    for (const v of [10000, -10000, 99999, 100000, 1234567, -987654321, 2 ** 53 - 1, 12345.5, -43210.1234567, 1e6 + 0.25]) expect(formatValue(v, false)).toBe(ref(v));
  });
});

import { describe, expect, it } from "vitest";
import { bm25, idf } from "./bm25.js";

const stats = (n: number, avg: number, df: Record<string, number>) => ({ documents: n, avgLength: avg, documentFrequency: (t: string) => df[t] ?? 0 });

describe("bm25", () => {
  it("scores nothing for no shared terms", () => {
    expect(bm25(["ship"], new Map([["town", 2]]), 2, stats(10, 2, { ship: 1, town: 3 }))).toBe(0);
    expect(bm25([], new Map([["town", 2]]), 2, stats(10, 2, {}))).toBe(0);
  });

  it("follows Robertson & Zaragoza 2009 with k1 = 1.2, b = 0.75", () => {
    const s = stats(100, 10, { tidal: 5 });
    // idf = ln(1 + (100 − 5 + 0.5)/(5 + 0.5)) = ln(18.3636) = 2.9104 (hand-computed)
    expect(idf(s, "tidal")).toBeCloseTo(2.9104, 4);
    // tf 2, |d| 20: 2.9104 · 2 · 2.2 / (2 + 1.2 · (0.25 + 0.75 · 2)) = 12.8056 / 4.1 = 3.1233 (hand-computed)
    expect(bm25(["tidal"], new Map([["tidal", 2]]), 20, s)).toBeCloseTo(3.1233, 3);
    // a query term counts once even when repeated
    expect(bm25(["tidal", "tidal"], new Map([["tidal", 2]]), 20, s)).toBeCloseTo(3.1233, 3);
  });

  it("never gives a negative idf, even for a term in every document", () => {
    expect(idf(stats(10, 1, { the: 10 }), "the")).toBeGreaterThan(0);
  });
});

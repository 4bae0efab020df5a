import { describe, expect, it } from "vitest";
import { jaro, jaroWinkler } from "./jaro-winkler.js";

describe("jaroWinkler", () => {
  it("handles empty and equal strings", () => {
    expect(jaro("", "")).toBe(1);
    expect(jaro("abc", "")).toBe(0);
    expect(jaroWinkler("same", "same")).toBe(1);
    expect(jaro("abc", "xyz")).toBe(0);
  });

  it("matches the textbook examples", () => {
    // Winkler 1990 / the usual worked example: MARTHA vs MARHTA, jaro 0.944, JW 0.961 (from memory;
    // hand-check: m = 6, t = 1, jaro = (1 + 1 + 5/6) / 3 = 0.9444, JW = 0.9444 + 3·0.1·0.0556 = 0.9611)
    expect(jaro("martha", "marhta")).toBeCloseTo(0.9444, 4);
    expect(jaroWinkler("martha", "marhta")).toBeCloseTo(0.9611, 4);
    // DWAYNE vs DUANE: jaro 0.822, JW 0.840 (from memory; hand-check m = 4, t = 0:
    // (4/6 + 4/5 + 1)/3 = 0.8222, prefix 1 → 0.8222 + 0.1·0.1778 = 0.8400)
    expect(jaro("dwayne", "duane")).toBeCloseTo(0.8222, 4);
    expect(jaroWinkler("dwayne", "duane")).toBeCloseTo(0.84, 4);
    // DIXON vs DICKSONX: jaro 0.767, JW 0.813 (from memory; hand-check m = 4, t = 0, window 3:
    // (4/5 + 4/8 + 1)/3 = 0.7667, prefix 2 → 0.7667 + 0.2·0.2333 = 0.8133)
    expect(jaroWinkler("dixon", "dicksonx")).toBeCloseTo(0.8133, 4);
  });
});

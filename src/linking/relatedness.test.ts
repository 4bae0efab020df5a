import { describe, expect, it } from "vitest";
import { milneWitten } from "./relatedness.js";

describe("milneWitten", () => {
  it("is 1 for the same entity or a direct link, 0 without shared links", () => {
    expect(milneWitten(1, [2], 1, [2], 100)).toBe(1);
    expect(milneWitten(1, [2, 3], 2, [1], 100)).toBe(1);
    expect(milneWitten(1, [5, 6], 2, [7, 8], 100)).toBe(0);
    expect(milneWitten(1, [], 2, [7, 8], 100)).toBe(0);
  });

  it("follows Milne & Witten 2008 on a hand-computed case", () => {
    // |A| = 4, |B| = 2, |A∩B| = 2, N = 1000:
    // 1 − (ln 4 − ln 2) / (ln 1000 − ln 2) = 1 − 0.6931 / 6.2146 = 0.8885 (hand-computed)
    expect(milneWitten(1, [10, 11, 12, 13], 2, [10, 11], 1000)).toBeCloseTo(0.8885, 4);
    // |A| = 4, |B| = 4, one shared: 1 − (ln 4 − 0)/(ln 1000 − ln 4) = 1 − 1.3863/5.5215 = 0.7489
    expect(milneWitten(1, [10, 11, 12, 13], 2, [13, 20, 21, 22], 1000)).toBeCloseTo(0.7489, 4);
  });
});

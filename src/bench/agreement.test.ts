/**
 * The benchmark's summary statistics: nearest-rank quantiles (Hyndman & Fan 1996, definition
 * 1) and tie-aware top-k agreement. Expected values hand-computed.
 */
import { describe, expect, it } from "vitest";
import { agreement, quantiles } from "./phases.js";

describe("bench statistics", () => {
  it("takes nearest-rank median and p95", () => {
    const xs = Array.from({ length: 20 }, (_, i) => i + 1); // 1..20
    // median: ceil(0.5·20) = 10th value; p95: ceil(0.95·20) = 19th value
    expect(quantiles(xs)).toEqual({ median: 10, p95: 19, mean: 10.5 });
    expect(Number.isNaN(quantiles([]).median)).toBe(true);
  });

  it("counts top-k agreement, treating exact ties at the k-th score as agreeing", () => {
    const exact = new Map([[1, 0.5], [2, 0.3], [3, 0.2], [4, 0.2], [5, 0.1]]);
    const exactTop: [number, number][] = [[1, 0.5], [2, 0.3], [3, 0.2]];
    // fast ranks 4 instead of 3: node 4 ties node 3 at the 3rd exact score → full agreement
    expect(agreement([[1, 0.5], [2, 0.3], [4, 0.2]], (v) => exact.get(v) ?? 0, exactTop, 3)).toBe(1);
    // node 5 is below the 3rd exact score → 2 of 3
    expect(agreement([[1, 0.5], [5, 0.3], [2, 0.2]], (v) => exact.get(v) ?? 0, exactTop, 3)).toBeCloseTo(2 / 3, 12);
  });
});

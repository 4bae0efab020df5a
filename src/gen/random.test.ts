import { describe, expect, it } from "vitest";
import { Rng } from "./random.js";

describe("Rng (xoshiro128**)", () => {
  it("rejects a seed that is not a finite number", () => {
    expect(() => new Rng(Number.NaN)).toThrow(/seed/);
  });

  it("matches the reference C implementation from state {1, 2, 3, 4}", () => {
    // Source: xoshiro128** 1.1 reference C (Blackman & Vigna, prng.di.unimi.it), compiled with
    // gcc -O2 and run with s = {1, 2, 3, 4}; its first six outputs.
    const r = new Rng([1, 2, 3, 4]);
    expect(Array.from({ length: 6 }, () => r.nextU32())).toEqual([11520, 0, 5927040, 70819200, 2031721883, 1637235492]);
  });

  it("gives the same stream for the same seed and a different one for another seed", () => {
    const a = new Rng(42);
    const b = new Rng(42);
    const c = new Rng(43);
    const xs = Array.from({ length: 8 }, () => a.nextU32());
    expect(Array.from({ length: 8 }, () => b.nextU32())).toEqual(xs);
    expect(Array.from({ length: 8 }, () => c.nextU32())).not.toEqual(xs);
  });

  it("draws power-law ranks whose empirical CDF follows the bounded continuous power law", () => {
    // Target CDF of the sampled rank k (0-based) for exponent s on n ranks, derived by hand from
    // the inverse transform of Clauset, Shalizi & Newman 2009 (appendix D), truncated to [1, n+1):
    // P(k < m) = ((m+1)^(1-s) - 1) / ((n+1)^(1-s) - 1).
    const n = 1000;
    const s = 0.8;
    const draws = 200_000;
    const r = new Rng(7);
    const hist = new Int32Array(n);
    for (let i = 0; i < draws; i++) hist[r.zipf(n, s)]!++;
    const cdf = (m: number) => (Math.pow(m + 1, 1 - s) - 1) / (Math.pow(n + 1, 1 - s) - 1);
    let acc = 0;
    for (let m = 1; m <= n; m++) {
      acc += hist[m - 1]!;
      if ([1, 2, 10, 100, 500].includes(m)) expect(Math.abs(acc / draws - cdf(m)), `m = ${m}`).toBeLessThan(0.01);
    }
    expect(hist[0]! / draws).toBeCloseTo(cdf(1), 2); // the hub rank: about 5.2 % of draws
  });
});

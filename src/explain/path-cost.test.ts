import { describe, expect, it } from "vitest";
import { RelationIndex, transition } from "../ranking/index.js";
import { PathCostModel } from "./path-cost.js";

// nodes 1..4: 1 r0 2, 1 r0 3, 3 r1 4  → degrees 1:2, 2:1, 3:2, 4:1
const index = RelationIndex.fromEdges(5, 2, [
  [1, 0, 2],
  [1, 0, 3],
  [3, 1, 4],
]);

describe("PathCostModel", () => {
  it("rejects a restart outside (0, 1)", () => {
    expect(() => new PathCostModel(index, { restart: 0 })).toThrow(/restart must be in \(0, 1\)/);
    expect(() => new PathCostModel(index, { restart: 1.5 })).toThrow(RangeError);
  });

  it("gives −ln((1 − α)·P) with P = deg(v)^−β / Σ (hand-computed, β = 0.5, α = 0.15)", () => {
    const m = new PathCostModel(index, { restart: 0.15, hubExponent: 0.5 });
    // from 1: w(→2) = 1^−0.5 = 1, w(→3) = 2^−0.5 = 0.70711; W = 1.70711; P(1→2) = 0.58579
    expect(m.probability(1, 2, 0, false)).toBeCloseTo(0.58579, 4);
    expect(m.stepCost(1, 2, 0, false)).toBeCloseTo(-Math.log(0.85 * 0.58579), 4);
    // walking 2 → 1 against the stored direction: node 2 has one entry, P = 1
    expect(m.probability(2, 1, 0, true)).toBeCloseTo(1, 10);
    // an entry that does not exist costs Infinity
    expect(m.stepCost(2, 4, 0, false)).toBe(Infinity);
  });

  it("agrees with the ranking's walk (ranking/transition.ts) on every entry, with relation weights", () => {
    const rho = Float64Array.from([1, 3]);
    const fallback = new PathCostModel(index, { relationWeights: rho, hubExponent: 0.5 });
    const shared = new PathCostModel(index, { transition: transition(index, { relationWeights: rho, hubExponent: 0.5 }) });
    for (let u = 0; u < index.nodeCount; u++) {
      index.forEach(u, (v, rel, inv) => {
        expect(shared.probability(u, v, rel, inv)).toBeCloseTo(fallback.probability(u, v, rel, inv), 12);
      });
    }
    // hand-computed: from 3, w(→1, r0) = 2^−0.5 = 0.70711, w(→4, r1) = 3·1 = 3; P(3→4) = 3 / 3.70711
    expect(shared.probability(3, 4, 1, false)).toBeCloseTo(3 / 3.70711, 4);
  });
});

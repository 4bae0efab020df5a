import { describe, expect, it } from "vitest";
import { RelationIndex } from "../ranking/index.js";
import { matchPattern } from "./relation-pattern.js";

// town 1; vessels 2, 3 moored at 1 (r0), vessel 4 moored at 5; sonar 6 carried (r1) by 2, 3, 4
const index = RelationIndex.fromEdges(7, 2, [
  [2, 0, 1],
  [3, 0, 1],
  [4, 0, 5],
  [2, 1, 6],
  [3, 1, 6],
  [4, 1, 6],
]);

describe("matchPattern (SPARQL 1.1 property-path semantics for ^r0 and r0/^r1-style sequences, hand-evaluated)", () => {
  it("^mooredAt from the town gives the vessels moored there", () => {
    expect([...matchPattern(index, 1, [{ rel: 0, inverse: true }])!].sort()).toEqual([2, 3]);
  });
  it("^mooredAt / carries / ^carries reaches every vessel carrying the same sonar, but not the start", () => {
    const s = matchPattern(index, 1, [
      { rel: 0, inverse: true },
      { rel: 1, inverse: false },
      { rel: 1, inverse: true },
    ])!;
    expect([...s].sort()).toEqual([2, 3, 4]);
  });
  it("gives up (null) beyond the frontier limit, and an empty set when nothing matches", () => {
    expect(matchPattern(index, 6, [{ rel: 1, inverse: true }], { frontierLimit: 2 })).toBeNull();
    expect(matchPattern(index, 1, [{ rel: 1, inverse: false }])!.size).toBe(0);
  });
});

import { describe, expect, it } from "vitest";
import { RelationIndex } from "../ranking/index.js";
import { PathCostModel } from "./path-cost.js";
import { patternWalks, relaxations } from "./pattern-path.js";

// clue 1; 1 -r1-> 2 -r2-> 9 and 1 -r1-> 3 -r2-> 9 (two walks on the pattern r1 then r2);
// 1 -r0-> 9 directly (off the pattern); 2 -r0-> 4, 2 -r0-> 5 make 2 busier than 3;
// types: 2 is a 21, 3 a 20 (type ids are node ids too)
const index = RelationIndex.fromEdges(
  23,
  3,
  [
    [1, 1, 2],
    [1, 1, 3],
    [2, 2, 9],
    [3, 2, 9],
    [1, 0, 9],
    [2, 0, 4],
    [2, 0, 5],
  ],
  [
    [2, 21],
    [3, 20],
  ],
);
const cost = new PathCostModel(index, { restart: 0.3 });
const hop = (relation: number, inverse = false) => [{ relation, inverse }];

describe("patternWalks (cheapest walk along a relation-path pattern)", () => {
  it("takes the pattern's relations in order, the cheaper middle node, never the shorter walk off the pattern", () => {
    const w = patternWalks(index, cost, 1, { hops: [hop(1), hop(2)], types: [[], []], directed: true })!;
    const steps = w.path(9)!;
    // 2 has degree 4, 3 degree 2: the hub damping deg^−β of 1 → 2 and 2's larger row total make the walk via 3 likelier
    expect(steps.map((s) => [s.from, s.rel, s.to, s.inverse])).toEqual([
      [1, 1, 3, false],
      [3, 2, 9, false],
    ]);
    // each step priced by the path cost model (path-cost.ts)
    for (const s of steps) expect(s.cost).toBeCloseTo(cost.stepCost(s.from, s.to, s.rel, s.inverse), 12);
  });

  it("keeps only middle nodes of the hop's types", () => {
    const w = patternWalks(index, cost, 1, { hops: [hop(1), hop(2)], types: [[21], []], directed: true })!;
    expect(w.path(9)!.map((s) => s.to)).toEqual([2, 9]);
    const none = patternWalks(index, cost, 1, { hops: [hop(1), hop(2)], types: [[22], []], directed: true })!;
    expect(none.path(9)).toBeUndefined();
  });

  it("follows the hops' directions unless the pattern is undirected", () => {
    const against = { hops: [hop(1, true), hop(2)], types: [[], []], directed: true };
    expect(patternWalks(index, cost, 1, against)!.path(9)).toBeUndefined();
    const either = patternWalks(index, cost, 1, { ...against, directed: false })!.path(9)!;
    expect(either.map((s) => s.inverse)).toEqual([false, false]);
  });

  it("a hop with no relation takes any relation (one hop of any relation: the direct edge)", () => {
    const w = patternWalks(index, cost, 1, { hops: [[]], types: [[]], directed: false })!;
    expect(w.path(9)!.map((s) => [s.from, s.rel, s.to])).toEqual([[1, 0, 9]]);
  });

  it("shows no walk that passes its answer or clue twice", () => {
    // r1 either way, three hops from 1 to 2: 1 → 2 → 1 → 2 and 1 → 3 → 1 → 2 revisit nodes; there is no other walk
    const w = patternWalks(index, cost, 1, { hops: [hop(1), hop(1), hop(1)], types: [[], [], []], directed: false })!;
    expect(w.path(2)).toBeUndefined();
    expect(w.path(1)).toBeUndefined();
  });

  it("gives up (null) over its budget, and on an empty pattern", () => {
    expect(patternWalks(index, cost, 1, { hops: [hop(1), hop(2)], types: [[], []], directed: true }, { maxVisits: 1 })).toBeNull();
    expect(patternWalks(index, cost, 1, { hops: [], types: [], directed: true })).toBeNull();
  });

  it("relaxes like the ranking: without the types, then without the directions", () => {
    const p = { hops: [hop(1), hop(2)], types: [[21], []], directed: true };
    expect(relaxations(p).map((x) => [x.types.map((t) => t.length), x.directed])).toEqual([
      [[1, 0], true],
      [[0, 0], true],
      [[0, 0], false],
    ]);
  });
});

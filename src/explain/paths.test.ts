import { describe, expect, it } from "vitest";
import { RelationIndex } from "../ranking/index.js";
import { buildEvidenceGraph } from "./evidence-graph.js";
import { PathCostModel } from "./path-cost.js";
import { findPaths } from "./paths.js";

// 1 -r0-> 2 -r0-> 3 (answer); 4 -r1-> 3 directly; 5..9 hang off 1 so that 1 is a busier seed
const index = RelationIndex.fromEdges(10, 2, [
  [1, 0, 2],
  [2, 0, 3],
  [4, 1, 3],
  [1, 0, 5],
  [1, 0, 6],
  [1, 0, 7],
]);
const cost = new PathCostModel(index, { restart: 0.3 });

describe("findPaths", () => {
  it("starts at the clue, walks stored edges, and gives alternatives cheapest first", () => {
    const ps = findPaths(index, cost, [[{ node: 1, weight: 1 }]], [3]);
    const paths = ps.answers[0]!.byClue[0]!;
    expect(paths[0]!.start).toBe(1);
    expect(paths[0]!.steps.map((s) => [s.from, s.to, s.rel, s.inverse])).toEqual([
      [1, 2, 0, false],
      [2, 3, 0, false],
    ]);
    for (let i = 1; i < paths.length; i++) expect(paths[i]!.cost).toBeGreaterThanOrEqual(paths[i - 1]!.cost);
  });

  it("picks the seeded alternative when its share and path make the walk more likely (costs hand-derived: −ln share + step costs)", () => {
    // seed 4 reaches 3 in one hop; seed 1 needs two hops from a node of degree 4
    const ps = findPaths(index, cost, [[{ node: 1, weight: 0.6 }, { node: 4, weight: 0.4 }]], [3], { alternatives: 0 });
    const best = ps.answers[0]!.byClue[0]![0]!;
    expect(best.start).toBe(4);
    expect(best.steps).toHaveLength(1);
    expect(best.steps[0]!.inverse).toBe(false);
    const viaOne = cost.stepCost(1, 2, 0, false) + cost.stepCost(2, 3, 0, false) - Math.log(0.6);
    expect(best.cost).toBeCloseTo(-Math.log(0.4) + cost.stepCost(4, 3, 1, false), 10);
    expect(best.cost).toBeLessThan(viaOne);
  });

  it("falls back to the full index when the evidence subgraph is too small, and reports not reached beyond maxHops", () => {
    const ps = findPaths(index, cost, [[{ node: 5, weight: 1 }]], [3], { evidenceHops: 1, alternatives: 0 });
    const p = ps.answers[0]!.byClue[0]![0]!;
    expect(p.via).toBe("fallback");
    expect(p.steps.map((s) => s.to)).toEqual([1, 2, 3]);
    const none = findPaths(index, cost, [[{ node: 5, weight: 1 }]], [3], { evidenceHops: 1, maxHops: 2 });
    expect(none.answers[0]!.byClue[0]).toEqual([]);
  });

  it("keeps in the evidence subgraph exactly the nodes on short clue-answer walks (hand-derived)", () => {
    const g = buildEvidenceGraph(index, cost, [1], [3], { maxHops: 2 });
    expect(g.nodes().sort()).toEqual(["1", "2", "3"]);
    expect(g.getEdgeAttributes(g.edge("3", "2")!)).toMatchObject({ rel: 0, inverse: true });
  });
});

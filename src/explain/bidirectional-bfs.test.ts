import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { DirectedGraph } from "graphology";
import { unweighted } from "graphology-shortest-path";
import { RelationIndex } from "../ranking/index.js";
import { bidirectionalBfs } from "./bidirectional-bfs.js";
import { PathCostModel } from "./path-cost.js";

describe("bidirectionalBfs", () => {
  // a chain 1 - 2 - 3 - 4 - 5 - 6 (stored 1→2, 3→2, 3→4, 4→5, 6→5)
  const chain = RelationIndex.fromEdges(7, 1, [
    [1, 0, 2],
    [3, 0, 2],
    [3, 0, 4],
    [4, 0, 5],
    [6, 0, 5],
  ]);
  const cost = new PathCostModel(chain);

  it("finds the 5-hop chain with the right directions (hand-derived)", () => {
    const steps = bidirectionalBfs(chain, cost, 1, 6)!;
    expect(steps.map((s) => [s.from, s.to, s.inverse])).toEqual([
      [1, 2, false],
      [2, 3, true],
      [3, 4, false],
      [4, 5, false],
      [5, 6, true],
    ]);
  });

  it("returns null beyond maxHops and [] for source = target", () => {
    expect(bidirectionalBfs(chain, cost, 1, 6, { maxHops: 4 })).toBeNull();
    expect(bidirectionalBfs(chain, cost, 3, 3)).toEqual([]);
    expect(bidirectionalBfs(chain, cost, 1, 0)).toBeNull();
  });

  it("finds as few hops as graphology-shortest-path's unweighted search (property, random graphs)", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(9), fc.nat(9)), { maxLength: 25 }), fc.nat(9), fc.nat(9), (edges, s, t) => {
        const es = edges.filter(([a, b]) => a !== b).map(([a, b]) => [a, 0, b] as const);
        const idx = RelationIndex.fromEdges(10, 1, es);
        const g = new DirectedGraph();
        for (let i = 0; i < 10; i++) g.addNode(String(i));
        for (const [a, , b] of es) {
          g.mergeEdge(String(a), String(b));
          g.mergeEdge(String(b), String(a));
        }
        const ref = unweighted.bidirectional(g, String(s), String(t));
        const got = bidirectionalBfs(idx, new PathCostModel(idx), s, t, { maxHops: 10 });
        if (ref === null) expect(got).toBeNull();
        else expect(got!.length).toBe(ref.length - 1);
      }),
      { numRuns: 300, seed: 7 },
    );
  });
});

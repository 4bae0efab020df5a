import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { DirectedGraph } from "graphology";
import dijkstraRef from "graphology-shortest-path/dijkstra.js";
import { RelationIndex } from "../ranking/index.js";
import { arcsTo, dijkstra, type ArcGraph } from "./dijkstra.js";
import { buildEvidenceGraph, evidenceSubgraph } from "./evidence-graph.js";
import { PathCostModel } from "./path-cost.js";
import { yenKShortestPaths, yenOnArcs } from "./yen.js";

/** CSR arrays of a list of arcs [tail, head, cost] over n nodes (at most one arc per pair). */
function arcGraph(n: number, arcs: readonly (readonly [number, number, number])[]): ArcGraph {
  const sorted = [...arcs].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const offsets = new Int32Array(n + 1);
  for (const [t] of sorted) offsets[t + 1]!++;
  for (let i = 0; i < n; i++) offsets[i + 1]! += offsets[i]!;
  return {
    size: n,
    offsets,
    tails: Int32Array.from(sorted.map((a) => a[0])),
    heads: Int32Array.from(sorted.map((a) => a[1])),
    costs: Float64Array.from(sorted.map((a) => a[2])),
  };
}

const arbGraph = fc.record({
  n: fc.integer({ min: 2, max: 7 }),
  edges: fc.array(fc.tuple(fc.nat(6), fc.nat(6), fc.integer({ min: 0, max: 5 })), { maxLength: 22 }),
  k: fc.integer({ min: 1, max: 8 }),
});

function both(n: number, edges: readonly (readonly [number, number, number])[]): { arcs: ArcGraph; g: DirectedGraph } {
  const g = new DirectedGraph();
  const list: [number, number, number][] = [];
  for (let i = 0; i < n; i++) g.addNode(`n${i}`);
  for (const [a, b, w] of edges) {
    const s = a % n;
    const t = b % n;
    if (s !== t && !g.hasEdge(`n${s}`, `n${t}`)) {
      g.addEdge(`n${s}`, `n${t}`, { cost: w });
      list.push([s, t, w]);
    }
  }
  return { arcs: arcGraph(n, list), g };
}

describe("dijkstra on CSR arcs", () => {
  it("finds the worked example's cheapest path C-E-F-H of cost 5 (Wikipedia 'Yen's algorithm' example, from memory)", () => {
    // C=0 D=1 E=2 F=3 G=4 H=5
    const g = arcGraph(6, [[0, 1, 3], [0, 2, 2], [1, 3, 4], [2, 1, 1], [2, 3, 2], [2, 4, 3], [3, 4, 2], [3, 5, 1], [4, 5, 2]]);
    const tree = dijkstra(g, 0);
    expect(tree.dist[5]).toBe(5);
    expect(arcsTo(g, tree, 0, 5)!.map((e) => g.heads[e])).toEqual([2, 3, 5]);
  });

  it("gives the same distances as graphology-shortest-path's Dijkstra (property, random graphs)", () => {
    fc.assert(
      fc.property(arbGraph, ({ n, edges }) => {
        const { arcs, g } = both(n, edges);
        const tree = dijkstra(arcs, 0);
        for (let t = 1; t < n; t++) {
          const ref = dijkstraRef.bidirectional(g, "n0", `n${t}`, "cost") as string[] | null;
          if (ref === null) expect(tree.dist[t]).toBe(Infinity);
          else {
            let c = 0;
            for (let i = 0; i + 1 < ref.length; i++) c += g.getEdgeAttribute(g.edge(ref[i]!, ref[i + 1]!)!, "cost") as number;
            expect(tree.dist[t]).toBe(c);
          }
        }
      }),
      { numRuns: 300, seed: 11 },
    );
  });
});

describe("yenOnArcs", () => {
  it("returns the same path costs as yenKShortestPaths (itself checked against exhaustive enumeration in yen.test.ts)", () => {
    fc.assert(
      fc.property(arbGraph, ({ n, edges, k }) => {
        const { arcs, g } = both(n, edges);
        const got = yenOnArcs(arcs, 0, n - 1, k, String);
        const ref = yenKShortestPaths(g, "n0", `n${n - 1}`, { k });
        expect(got.map((p) => p.cost)).toEqual(ref.map((p) => p.cost));
        for (const p of got) {
          expect(new Set(p.nodes).size).toBe(p.nodes.length);
          p.arcs.forEach((e, i) => {
            expect(arcs.tails[e]).toBe(p.nodes[i]);
            expect(arcs.heads[e]).toBe(p.nodes[i + 1]);
          });
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });
});

describe("evidenceSubgraph: hub rows", () => {
  // node 1 is a hub (degree 5 > hubLimit 3) joined to 2..6; clue 3, answer 2 (3 - 1 - 2)
  const index = RelationIndex.fromEdges(8, 2, [
    [1, 0, 2],
    [1, 0, 3],
    [1, 0, 4],
    [1, 0, 5],
    [1, 0, 6],
    [2, 1, 7],
  ]);
  const cost = new PathCostModel(index, { restart: 0.3 });

  it("prices a kept hub's arcs from the reverse entries exactly as reading its row would (hand-derived: same formula)", () => {
    const sub = evidenceSubgraph(index, cost, [[{ node: 3, weight: 1 }]], [2], { maxHops: 4, hubLimit: 3 });
    const hub = sub.localOf(1);
    const to2 = sub.arc(hub, sub.localOf(2));
    expect(hub).toBeGreaterThanOrEqual(0);
    expect(to2).toBeGreaterThanOrEqual(0);
    expect(sub.costs[to2]).toBeCloseTo(cost.stepCost(1, 2, 0, false), 12);
    const from3 = sub.arc(sub.localOf(3), hub);
    expect(sub.costs[from3]).toBeCloseTo(cost.stepCost(3, 1, 0, true), 12);
    // the hub is not expanded, so 2's other neighbour 7 is not on a kept walk
    const g = buildEvidenceGraph(index, cost, [3], [2], { maxHops: 4, hubLimit: 3 });
    expect(g.nodes().sort()).toEqual(["1", "2", "3"]);
  });
});

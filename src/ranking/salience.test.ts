/**
 * Salience (global PageRank and its percentiles) against graphology-metrics' pagerank on a
 * seeded random undirected graph (same model: follow probability 0.85, unit weights, both
 * directions; no entity with edges is dangling), and hand-derived percentiles on a star.
 */
import Graph from "graphology";
import pagerank from "graphology-metrics/centrality/pagerank.js";
import { describe, expect, it } from "vitest";
import { RelationIndex, salienceOf } from "./index.js";

describe("salienceOf", () => {
  it("equals graphology-metrics' pagerank within 1e-7 on a random graph", () => {
    // seeded LCG (Numerical Recipes constants, common practice); a path 1–2–…–40 keeps every node linked
    let s = 7;
    const rnd = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
    const n = 41;
    const pairs = new Set<string>();
    const edges: [number, number, number][] = [];
    const add = (a: number, b: number) => {
      const k = a < b ? `${a}-${b}` : `${b}-${a}`;
      if (a === b || pairs.has(k)) return;
      pairs.add(k);
      edges.push([a, 0, b]);
    };
    for (let v = 1; v < n - 1; v++) add(v, v + 1);
    while (edges.length < 120) add(1 + Math.floor(rnd() * (n - 1)), 1 + Math.floor(rnd() * (n - 1)));
    const index = RelationIndex.fromEdges(n, 1, edges);
    const g = new Graph({ type: "undirected" });
    for (let v = 1; v < n; v++) g.addNode(String(v));
    for (const [a, , b] of edges) g.addEdge(String(a), String(b));
    const ref = pagerank(g, { alpha: 0.85, tolerance: 1e-14, maxIterations: 10_000, getEdgeWeight: null });
    const sal = salienceOf(index, { tolerance: 1e-13, maxIterations: 1000 });
    for (let v = 1; v < n; v++) expect(Math.abs(sal.pagerank[v]! - ref[String(v)]!)).toBeLessThan(1e-7);
    expect(sal.pagerank[0]).toBe(0);
    // percentiles follow the PageRank order
    const order = Array.from({ length: n - 1 }, (_, i) => i + 1).sort((a, b) => sal.pagerank[a]! - sal.pagerank[b]!);
    expect(sal.percentile[order.at(-1)!]).toBe(1);
    expect(sal.percentile[order[0]!]).toBe(0);
    // a time budget asked after each iteration: spent after the first, nothing is returned or kept; never spent, the same figures
    const fresh = RelationIndex.fromEdges(n, 1, edges);
    let asked = 0;
    expect(
      salienceOf(fresh, {}, () => {
        asked++;
        return true;
      }),
    ).toBeUndefined();
    expect(asked).toBe(1);
    const whole = salienceOf(fresh, {}, () => false)!;
    expect(Array.from(whole.pagerank)).toEqual(Array.from(salienceOf(RelationIndex.fromEdges(n, 1, edges)).pagerank));
    expect(salienceOf(fresh)).toBe(whole);
  });

  it("gives a star's centre percentile 1 and its tied leaves 0; an unlinked node 0 (hand-derived)", () => {
    const index = RelationIndex.fromEdges(6, 1, [[1, 0, 2], [1, 0, 3], [1, 0, 4]]);
    const sal = salienceOf(index);
    expect(Array.from(sal.percentile)).toEqual([0, 1, 0, 0, 0, 0]);
    // x_c = 0.15/4 + 0.85·3·x_leaf, x_leaf = 0.15/4 + 0.85·x_c/3 → x_c = 0.133125 / 0.2775 = 0.479730 (solved by hand)
    expect(sal.pagerank[1]).toBeCloseTo(0.133125 / 0.2775, 6);
    expect(salienceOf(index)).toBe(sal);
    expect(() => salienceOf(index, { damping: 1 })).toThrow(/damping must be in \(0, 1\)/);
  });
});

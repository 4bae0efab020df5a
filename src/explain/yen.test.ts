import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { DirectedGraph } from "graphology";
import { yenKShortestPaths } from "./yen.js";

/** Fixture shorthand: "C>D:3 C>E:2" → directed graph with a `cost` attribute. */
function graphOf(spec: string): DirectedGraph {
  const g = new DirectedGraph();
  for (const part of spec.trim().split(/\s+/)) {
    const m = /^(\w+)>(\w+):(\d+(?:\.\d+)?)$/.exec(part);
    if (!m) throw new Error(`bad fixture ${part}`);
    g.mergeNode(m[1]!);
    g.mergeNode(m[2]!);
    g.addEdge(m[1]!, m[2]!, { cost: Number(m[3]) });
  }
  return g;
}

/** All simple paths source → target by depth-first enumeration (the exhaustive reference). */
function allSimplePaths(g: DirectedGraph, s: string, t: string): { nodes: string[]; cost: number }[] {
  const out: { nodes: string[]; cost: number }[] = [];
  const walk = (u: string, path: string[], cost: number): void => {
    if (u === t) {
      out.push({ nodes: [...path], cost });
      return;
    }
    g.forEachOutEdge(u, (_e, attrs, _src, v) => {
      if (path.includes(v)) return;
      path.push(v);
      walk(v, path, cost + (attrs.cost as number));
      path.pop();
    });
  };
  walk(s, [s], 0);
  return out.sort((a, b) => a.cost - b.cost);
}

describe("yenKShortestPaths: bad arguments", () => {
  const g = graphOf("a>b:1");
  it("rejects a missing node", () => {
    expect(() => yenKShortestPaths(g, "a", "zz")).toThrow(/target node "zz"/);
    expect(() => yenKShortestPaths(g, "zz", "a")).toThrow(/source node/);
  });
  it("rejects k that is not a positive integer", () => {
    expect(() => yenKShortestPaths(g, "a", "b", { k: 0 })).toThrow(/k must be a positive integer/);
    expect(() => yenKShortestPaths(g, "a", "b", { k: 1.5 })).toThrow(RangeError);
  });
  it("rejects a negative or missing weight", () => {
    const h = graphOf("a>b:1 b>c:1");
    h.setEdgeAttribute(h.edge("b", "c")!, "cost", -2);
    expect(() => yenKShortestPaths(h, "a", "c")).toThrow(/non-negative/);
    expect(() => yenKShortestPaths(graphOf("a>b:1 b>c:1"), "a", "c", { weight: "length" })).toThrow(/non-negative/);
  });
  it("returns [] when the target is unreachable and [source] when source = target", () => {
    const h = graphOf("a>b:1 c>a:1");
    expect(yenKShortestPaths(h, "a", "c")).toEqual([]);
    expect(yenKShortestPaths(h, "a", "a")).toEqual([{ nodes: ["a"], cost: 0 }]);
  });
});

describe("yenKShortestPaths: the worked example", () => {
  // The six-node example of the Wikipedia article "Yen's algorithm" (from memory): nodes C..H,
  // K = 3 shortest paths from C to H. Expected: C-E-F-H (5), C-E-G-H (7), then a path of cost 8
  // (three paths cost 8: C-D-F-H, C-E-D-F-H, C-E-F-G-H — hand-enumerated, all 7 simple paths).
  const g = graphOf("C>D:3 C>E:2 D>F:4 E>D:1 E>F:2 E>G:3 F>G:2 F>H:1 G>H:2");
  it("finds the three cheapest loopless paths in order", () => {
    const paths = yenKShortestPaths(g, "C", "H", { k: 3 });
    expect(paths.map((p) => p.cost)).toEqual([5, 7, 8]);
    expect(paths[0]!.nodes).toEqual(["C", "E", "F", "H"]);
    expect(paths[1]!.nodes).toEqual(["C", "E", "G", "H"]);
    expect([["C", "D", "F", "H"], ["C", "E", "D", "F", "H"], ["C", "E", "F", "G", "H"]]).toContainEqual(paths[2]!.nodes);
  });
  it("lists all 7 simple paths when k is large (hand-enumerated)", () => {
    const paths = yenKShortestPaths(g, "C", "H", { k: 20 });
    expect(paths.map((p) => p.cost)).toEqual([5, 7, 8, 8, 8, 11, 11]);
    expect(new Set(paths.map((p) => p.nodes.join(""))).size).toBe(7);
  });
});

describe("yenKShortestPaths: against exhaustive enumeration (property)", () => {
  // Random directed graphs on up to 7 nodes with integer weights 0..5; the reference is the
  // depth-first enumeration of every simple path above.
  const arbGraph = fc.record({
    n: fc.integer({ min: 2, max: 7 }),
    edges: fc.array(fc.tuple(fc.nat(6), fc.nat(6), fc.integer({ min: 0, max: 5 })), { maxLength: 22 }),
    k: fc.integer({ min: 1, max: 8 }),
  });
  it("returns the k smallest simple-path costs, each path simple, valid and distinct", () => {
    fc.assert(
      fc.property(arbGraph, ({ n, edges, k }) => {
        const g = new DirectedGraph();
        for (let i = 0; i < n; i++) g.addNode(`n${i}`);
        for (const [a, b, w] of edges) {
          const s = `n${a % n}`;
          const t = `n${b % n}`;
          if (s !== t && !g.hasEdge(s, t)) g.addEdge(s, t, { cost: w });
        }
        const ref = allSimplePaths(g, "n0", `n${n - 1}`);
        const got = yenKShortestPaths(g, "n0", `n${n - 1}`, { k });
        expect(got.map((p) => p.cost)).toEqual(ref.slice(0, k).map((p) => p.cost));
        const keys = new Set<string>();
        for (const p of got) {
          expect(p.nodes[0]).toBe("n0");
          expect(p.nodes[p.nodes.length - 1]).toBe(`n${n - 1}`);
          expect(new Set(p.nodes).size).toBe(p.nodes.length);
          let c = 0;
          for (let i = 0; i + 1 < p.nodes.length; i++) {
            expect(g.hasEdge(p.nodes[i]!, p.nodes[i + 1]!)).toBe(true);
            c += g.getEdgeAttribute(g.edge(p.nodes[i]!, p.nodes[i + 1]!)!, "cost") as number;
          }
          expect(c).toBe(p.cost);
          keys.add(p.nodes.join(","));
        }
        expect(keys.size).toBe(got.length);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });
});

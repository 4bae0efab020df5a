/**
 * Personalized PageRank against outside references:
 * (1) the closed form π = α (I − (1 − α) P'ᵀ)⁻¹ s (Page et al. 1999; Haveliwala 2002),
 *     solved densely here by Gaussian elimination with partial pivoting, P' built in this
 *     test straight from the definition in transition.ts (w = ρ[r]·deg(v)^−β, both
 *     directions, dangling rows → s), on small seeded random graphs;
 * (2) graphology-metrics' pagerank on Zachary's karate club network (Zachary 1977);
 * (3) non-convergence and bad arguments.
 */
import Graph from "graphology";
import pagerank from "graphology-metrics/centrality/pagerank.js";
import { describe, expect, it } from "vitest";
import { TiepointError } from "../model/index.js";
import { FAST_DEFAULTS, RelationIndex, pprFast, pprPower, pprPush, transition } from "./index.js";

type Edge = readonly [number, number, number];

/** Seeded LCG (Numerical Recipes constants, common practice) for the fixtures. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}

function randomGraph(seed: number, n: number, m: number, relations: number, isolated: number[] = []) {
  const rnd = lcg(seed);
  const edges: Edge[] = [];
  const skip = new Set(isolated);
  while (edges.length < m) {
    const a = 1 + Math.floor(rnd() * (n - 1));
    const b = 1 + Math.floor(rnd() * (n - 1));
    if (skip.has(a) || skip.has(b)) continue;
    edges.push([a, Math.floor(rnd() * relations), b]);
  }
  return edges;
}

/** Dense closed form, independent of src/ranking: solve (I − (1 − α) P'ᵀ) π = α s. */
function closedForm(n: number, edges: readonly Edge[], s: number[], alpha: number, beta: number, rho: number[]): number[] {
  const deg = new Array(n).fill(0);
  for (const [a, , b] of edges) {
    deg[a]++;
    deg[b]++;
  }
  const P = Array.from({ length: n }, () => new Array(n).fill(0));
  const add = (u: number, v: number, r: number) => (P[u]![v] += rho[r]! * Math.pow(deg[v]!, -beta));
  for (const [a, r, b] of edges) {
    add(a, b, r);
    add(b, a, r);
  }
  for (let u = 0; u < n; u++) {
    const tot = P[u]!.reduce((x, y) => x + y, 0);
    if (tot > 0) for (let v = 0; v < n; v++) P[u]![v] /= tot;
    else for (let v = 0; v < n; v++) P[u]![v] = s[v]!;
  }
  // A = I − (1 − α) Pᵀ, b = α s
  const A = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - (1 - alpha) * P[j]![i]!));
  const b = s.map((x) => alpha * x);
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(A[r]![col]!) > Math.abs(A[piv]![col]!)) piv = r;
    [A[col], A[piv]] = [A[piv]!, A[col]!];
    [b[col], b[piv]] = [b[piv]!, b[col]!];
    for (let r = col + 1; r < n; r++) {
      const f = A[r]![col]! / A[col]![col]!;
      for (let c = col; c < n; c++) A[r]![c] -= f * A[col]![c]!;
      b[r] -= f * b[col]!;
    }
  }
  const x = new Array(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let t = b[r]!;
    for (let c = r + 1; c < n; c++) t -= A[r]![c]! * x[c]!;
    x[r] = t / A[r]![r]!;
  }
  return x;
}

function dense(n: number, nodes: Int32Array, scores: Float64Array): number[] {
  const out = new Array(n).fill(0);
  nodes.forEach((v, i) => (out[v] = scores[i]!));
  return out;
}

describe("bad arguments and non-convergence", () => {
  const index = RelationIndex.fromEdges(4, 1, [[1, 0, 2], [2, 0, 3]]);
  const seeds = [{ node: 1, weight: 1 }];
  it("refuses bad alpha, tolerance, seeds, weights and hub exponent with RangeError", () => {
    for (const f of [pprPower, pprPush, pprFast]) {
      expect(() => f(index, seeds, { alpha: 0 })).toThrow(/alpha/);
      expect(() => f(index, seeds, { alpha: 1 })).toThrow(RangeError);
      expect(() => f(index, seeds, { alpha: Number.NaN })).toThrow(RangeError);
      expect(() => f(index, seeds, { tolerance: 0 })).toThrow(/tolerance/);
      expect(() => f(index, [], {})).toThrow(/at least one seed/);
      expect(() => f(index, [{ node: 4, weight: 1 }])).toThrow(/seed node 4/);
      expect(() => f(index, [{ node: 1, weight: -1 }])).toThrow(/weight/);
      expect(() => f(index, seeds, { relationWeights: new Float64Array(0) })).toThrow(/relationWeights has 0/);
      expect(() => f(index, seeds, { relationWeights: Float64Array.of(-1) })).toThrow(/≥ 0/);
      expect(() => f(index, seeds, { hubExponent: -1 })).toThrow(/hubExponent/);
    }
    expect(() => pprPower(index, seeds, { maxIterations: 0 })).toThrow(/maxIterations/);
    expect(() => pprFast(index, seeds, { walks: -3 })).toThrow(/walks/);
  });
  it("reports non-convergence as a TiepointError naming the fix", () => {
    let err: unknown;
    try {
      pprPower(index, seeds, { maxIterations: 2, tolerance: 1e-15 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(TiepointError);
    expect((err as TiepointError).code).toBe("ranking/not-converged");
    expect((err as Error).message).toMatch(/raise maxIterations/);
  });
});

describe("closed form π = α (I − (1 − α) P'ᵀ)⁻¹ s on small random graphs", () => {
  const cases = [
    { seed: 1, n: 12, m: 20, alpha: 0.15, beta: 0, isolated: [] as number[] },
    { seed: 2, n: 15, m: 30, alpha: 0.3, beta: 0.5, isolated: [7] },
    { seed: 3, n: 20, m: 25, alpha: 0.5, beta: 1, isolated: [3, 9] },
    { seed: 4, n: 10, m: 40, alpha: 0.2, beta: 0.5, isolated: [] },
  ];
  for (const c of cases) {
    const edges = randomGraph(c.seed, c.n, c.m, 3, c.isolated);
    const index = RelationIndex.fromEdges(c.n, 3, edges);
    const rho = [1, 2.5, 0.5];
    const seeds = [{ node: 1, weight: 2 }, { node: c.isolated[0] ?? 2, weight: 1 }];
    const s = new Array(c.n).fill(0);
    s[1] += 2 / 3;
    s[c.isolated[0] ?? 2] += 1 / 3;
    const opts = { alpha: c.alpha, hubExponent: c.beta, relationWeights: Float64Array.from(rho) };
    const exact = closedForm(c.n, edges, s, c.alpha, c.beta, rho);

    it(`power iteration within 1e-9 (graph ${c.seed}: ${c.n} nodes, α ${c.alpha}, β ${c.beta}, dangling ${c.isolated.length + 1})`, () => {
      const x = pprPower(index, seeds, opts);
      for (let v = 0; v < c.n; v++) expect(Math.abs(x[v]! - exact[v]!)).toBeLessThan(1e-9);
      expect(x.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    });

    it(`forward push: 0 ≤ π − p, Σ(π − p) = residual sum, and ‖π − p‖₁ → 0 as ε → 0 (graph ${c.seed})`, () => {
      for (const eps of [1e-2, 1e-4, 1e-8]) {
        const r = pprPush(index, seeds, { ...opts, tolerance: eps });
        const p = dense(c.n, r.reserve.nodes, r.reserve.scores);
        let gap = 0;
        for (let v = 0; v < c.n; v++) {
          expect(exact[v]! - p[v]!).toBeGreaterThanOrEqual(-1e-12);
          gap += exact[v]! - p[v]!;
        }
        expect(Math.abs(gap - r.residualSum)).toBeLessThan(1e-10);
        expect(r.complete).toBe(true);
        if (eps === 1e-8) expect(r.residualSum).toBeLessThan(1e-6);
      }
    });

    it(`push + random walks is close in L1 and deterministic (graph ${c.seed})`, () => {
      const a = pprFast(index, seeds, { ...opts, tolerance: 1e-2, walks: 100_000 });
      const b = pprFast(index, seeds, { ...opts, tolerance: 1e-2, walks: 100_000 });
      expect(Array.from(a.scores)).toEqual(Array.from(b.scores));
      const x = dense(c.n, a.nodes, a.scores);
      const l1 = x.reduce((acc, v, i) => acc + Math.abs(v - exact[i]!), 0);
      // Monte-Carlo error ~ sqrt(residual/walks) per node; 0.02 is a loose bound (hand-estimated)
      expect(l1).toBeLessThan(0.02);
      expect(x.reduce((u, v) => u + v, 0)).toBeCloseTo(1, 4);
      expect(Array.from(a.nodes)).toEqual([...a.nodes].sort((u, v) => u - v));
    });
  }

  it("spends random walks on the residual when the push work budget is hit (bounded work)", () => {
    const n = 20;
    const edges = randomGraph(5, n, 60, 2);
    const index = RelationIndex.fromEdges(n, 2, edges);
    const s = new Array(n).fill(0);
    s[3] = 1;
    const exact = closedForm(n, edges, s, 0.3, 0.5, [1, 1]);
    const r = pprFast(index, [{ node: 3, weight: 1 }], { alpha: 0.3, maxWork: 10 });
    expect(r.stats.pushComplete).toBe(false);
    expect(r.stats.work).toBeLessThanOrEqual(10 + index.degree(3));
    expect(r.stats.walks).toBe(FAST_DEFAULTS.walksWhenCut);
    const x = dense(n, r.nodes, r.scores);
    // unbiased Monte-Carlo estimate of the residual's share; 0.15 in L1 is loose for 5,000 walks (hand-estimated)
    expect(x.reduce((acc, v, i) => acc + Math.abs(v - exact[i]!), 0)).toBeLessThan(0.15);
    const complete = pprFast(index, [{ node: 3, weight: 1 }], { alpha: 0.3 });
    expect(complete.stats.pushComplete).toBe(true);
    expect(complete.stats.walks).toBe(0);
  });

  it("forward push meets the per-node bound π(v) − p(v) ≤ ε·μ(v) of Andersen, Chung & Lang 2006 on a reversible walk", () => {
    for (const beta of [0, 0.5]) {
      const edges = randomGraph(11, 16, 40, 1);
      const n = 16;
      const deg = new Array(n).fill(0);
      for (const [a, , b] of edges) {
        deg[a]++;
        deg[b]++;
      }
      const isolated = deg.map((d, i) => (d === 0 ? i : -1)).filter((i) => i > 0);
      expect(isolated).toEqual([]); // the bound needs no dangling node (node 0 is never reached)
      const index = RelationIndex.fromEdges(n, 1, edges);
      // μ(v) = deg(v)^−β · Σ_{entries v→x} deg(x)^−β, computed here from the definition
      const mu = deg.map((d, v) => {
        let s = 0;
        for (const [a, , b] of edges) {
          if (a === v) s += Math.pow(deg[b]!, -beta);
          if (b === v) s += Math.pow(deg[a]!, -beta);
        }
        return d === 0 ? 1 : Math.pow(d, -beta) * s;
      });
      const s = new Array(n).fill(0);
      s[5] = 1;
      const exact = closedForm(n, edges, s, 0.15, beta, [1]);
      for (const eps of [1e-2, 1e-3, 1e-4]) {
        const r = pprPush(index, [{ node: 5, weight: 1 }], { alpha: 0.15, hubExponent: beta, tolerance: eps });
        const p = dense(n, r.reserve.nodes, r.reserve.scores);
        for (let v = 1; v < n; v++) expect(exact[v]! - p[v]!).toBeLessThanOrEqual(eps * mu[v]! + 1e-12);
      }
    }
  });
});

/**
 * Zachary's karate club: 34 members, 78 friendship ties. W. W. Zachary, "An information flow
 * model for conflict and fission in small groups", J. Anthropological Research 33 (1977),
 * 452–473; the edge list as distributed with networkx's karate_club_graph (1-based here).
 */
const KARATE: Record<number, number[]> = {
  1: [2, 3, 4, 5, 6, 7, 8, 9, 11, 12, 13, 14, 18, 20, 22, 32],
  2: [3, 4, 8, 14, 18, 20, 22, 31],
  3: [4, 8, 9, 10, 14, 28, 29, 33],
  4: [8, 13, 14],
  5: [7, 11],
  6: [7, 11, 17],
  7: [17],
  9: [31, 33, 34],
  10: [34],
  14: [34],
  15: [33, 34],
  16: [33, 34],
  19: [33, 34],
  20: [34],
  21: [33, 34],
  23: [33, 34],
  24: [26, 28, 30, 33, 34],
  25: [26, 28, 32],
  26: [32],
  27: [30, 34],
  28: [34],
  29: [32, 34],
  30: [33, 34],
  31: [33, 34],
  32: [33, 34],
  33: [34],
};

describe("graphology-metrics pagerank on Zachary's karate club (uniform restart)", () => {
  const edges: Edge[] = Object.entries(KARATE).flatMap(([a, bs]) => bs.map((b) => [Number(a), 0, b] as const));
  const index = RelationIndex.fromEdges(35, 1, edges);
  it("has the published shape: 78 edges, degrees 16 (member 1), 17 (member 34), 12 (member 33)", () => {
    // Zachary 1977 (as in networkx): |E| = 78; degrees from the same list
    expect(index.edgeCount).toBe(78);
    expect([index.degree(1), index.degree(34), index.degree(33)]).toEqual([16, 17, 12]);
  });
  it("equals graphology's pagerank within 1e-6", () => {
    // Same model: graphology's alpha 0.85 is the follow probability (our restart α = 0.15);
    // an undirected graph walks each edge both ways with unit weight (our walk at β = 0,
    // ρ = 1); graphology spreads dangling mass uniformly, ours to the restart vector,
    // which is uniform here, and the karate graph has no dangling node anyway.
    const g = new Graph({ type: "undirected" });
    for (let v = 1; v <= 34; v++) g.addNode(String(v));
    for (const [a, , b] of edges) g.addEdge(String(a), String(b));
    const ref = pagerank(g, { alpha: 0.85, tolerance: 1e-14, maxIterations: 10_000, getEdgeWeight: null });
    const seeds = Array.from({ length: 34 }, (_, i) => ({ node: i + 1, weight: 1 }));
    const x = pprPower(index, seeds, { alpha: 0.15, hubExponent: 0 });
    for (let v = 1; v <= 34; v++) expect(Math.abs(x[v]! - ref[String(v)]!)).toBeLessThan(1e-6);
    // networkx.pagerank(karate_club_graph()) gives member 34 ≈ 0.1009 and member 1 ≈ 0.0970 (from memory)
    expect(x[34]!).toBeCloseTo(0.1009, 3);
    expect(x[1]!).toBeCloseTo(0.097, 3);
  });
});

describe("the transition matrix seen from other stages", () => {
  it("gives row-stochastic probabilities with hub damping and relation weights", () => {
    // hand-computed: star 1–2, 1–3, 3–4; deg = [0, 2, 1, 2, 1]; β = 1, ρ = [1, 3]
    const index = RelationIndex.fromEdges(5, 2, [[1, 0, 2], [1, 1, 3], [3, 0, 4]]);
    const t = transition(index, { hubExponent: 1, relationWeights: Float64Array.of(1, 3) });
    const probs: number[] = [];
    t.forEachTransition(1, (_v, _r, _inv, p) => probs.push(p));
    // w(1→2) = 1·1⁻¹ = 1, w(1→3) = 3·2⁻¹ = 1.5 → 0.4, 0.6
    expect(probs[0]).toBeCloseTo(0.4, 12);
    expect(probs[1]).toBeCloseTo(0.6, 12);
    expect(t.rowTotal(0)).toBe(0);
  });
});

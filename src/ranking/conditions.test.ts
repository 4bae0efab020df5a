/**
 * applyConditions on a hand-built graph: region R (node 1) with countries A, B, C located in
 * it (nodes 2–4) and D (node 5) bordering A, two hops from R; type Country is node 6. Areas
 * are given per node. Every expected set and order below is hand-derived from those facts.
 */
import { describe, expect, it } from "vitest";
import type { Analysis, AttributeChoice, Condition } from "../analysis/index.js";
import { applyConditions, satisfies, type AttributeLookup } from "./conditions.js";
import type { Ranked } from "./rank.js";
import { RelationIndex } from "./relation-index.js";

const LOCATED = 1;
const BORDERS = 2;
const AREA: AttributeChoice = { num: 9, id: "area", label: "area", unit: "km²", score: 1, wordIndexes: [] };
const index = RelationIndex.fromEdges(7, 3, [[2, LOCATED, 1], [3, LOCATED, 1], [4, LOCATED, 1], [5, BORDERS, 2]], [[2, 6], [3, 6], [4, 6], [5, 6]]);
const areas = new Map<number, number[]>([[2, [300]], [3, [100]], [4, [200]], [5, [900]]]);
const lookup: AttributeLookup = { numbers: (e, p) => (p === AREA.num ? (areas.get(e) ?? []) : []) };

const clue = { node: 1, id: "g:R", label: "R", weight: 1, mention: 0 };
const analysis: Analysis = {
  question: "q",
  mentions: [],
  answerTypes: [{ num: 6, id: "t:Country", label: "country" }],
  answerTypeSource: "head-noun",
  relationCues: [],
  clues: [clue],
  notes: [],
};
// the walk's order: A, B, C one hop away, D through A (lower score)
const ranked: Ranked = {
  clues: [clue],
  candidates: [2, 3, 4, 5].map((node, i) => ({ node, score: node === 5 ? 0.05 : 0.5 - 0.1 * i, perClue: [1], covered: 1 })),
  typeFiltered: true,
  relationWeights: new Float64Array(3).fill(1),
  notes: [],
};
const base = { words: "w", start: 0, end: 1 };
const ids = (r: Ranked) => r.candidates.map((c) => c.node);

describe("applyConditions", () => {
  it("leaves a ranking without conditions as it is", () => {
    expect(ids(applyConditions(analysis, ranked, [], index, lookup).ranked)).toEqual([2, 3, 4, 5]);
  });

  it("orders the candidates one hop from the clue by the attribute; the two-hop one stays last", () => {
    const sup: Condition = { kind: "superlative", order: "max", position: 1, temporal: false, choices: [AREA], ...base };
    const out = applyConditions(analysis, ranked, [sup], index, lookup);
    expect(ids(out.ranked)).toEqual([2, 4, 3, 5]); // areas 300 > 200 > 100; D (900) is not one hop from R
    expect(out.tiedWith).toEqual([]);
    const s = out.ranked.candidates.map((c) => c.score);
    for (let i = 1; i < s.length; i++) expect(s[i]!).toBeLessThanOrEqual(s[i - 1]!);
    const second: Condition = { ...sup, position: 2 };
    expect(ids(applyConditions(analysis, ranked, [second], index, lookup).ranked)[0]).toBe(4);
  });

  it("filters by a comparison and counts the fitting candidates", () => {
    const cmp: Condition = { kind: "comparison", operator: ">", values: ["150"], min: 150, minStrict: true, negated: false, choices: [AREA], ...base };
    const count: Condition = { kind: "count", ...base };
    const out = applyConditions(analysis, ranked, [count, cmp], index, lookup);
    expect(ids(out.ranked)).toEqual([2, 4, 5]); // B (100) removed
    expect(out.count).toEqual({ value: 2, entities: [2, 4] }); // D passes but is not one hop from R
    expect(out.checks.get(3)?.[0]).toMatchObject({ satisfied: false, values: [100] });
  });

  it("excludes an entity and what is linked to it", () => {
    const ex: Condition = { kind: "exclusion", node: 2, id: "c:A", label: "A", mention: 1, mode: "not", relations: [], ...base };
    // "not A": A itself, R (located-in link) and D (border) are linked to A
    expect(ids(applyConditions(analysis, ranked, [ex], index, lookup).ranked)).toEqual([3, 4]);
    const other: Condition = { ...ex, mode: "other" };
    expect(ids(applyConditions(analysis, ranked, [other], index, lookup).ranked)).toEqual([3, 4, 5]); // A is a country: only A itself
    // no answer type ("what … apart from A"): A is taken as a peer of the answers, so only A goes
    // (D, which borders A, stays); "not A" still takes what is linked to A
    const untyped: Analysis = { ...analysis, answerTypes: [] };
    expect(ids(applyConditions(untyped, ranked, [other], index, lookup).ranked)).toEqual([3, 4, 5]);
    expect(ids(applyConditions(untyped, ranked, [ex], index, lookup).ranked)).toEqual([3, 4]);
  });

  it("satisfies honours strict and inclusive bounds and negation", () => {
    const c = { kind: "comparison", operator: "between", values: [], min: 1, max: 2, negated: false, choices: [], ...base } as const;
    expect([0.5, 1, 2, 2.5].map((v) => satisfies(c, v))).toEqual([false, true, true, false]);
    expect(satisfies({ ...c, maxStrict: true }, 2)).toBe(false);
    expect(satisfies({ ...c, negated: true }, 3)).toBe(true);
  });
});

describe("applyConditions over a large clue-less set (the k-th best bound, issue 23)", () => {
  // 2,000 entities of one type (node 0), values drawn with many ties and some without a value;
  // the expected order is a plain sort written here: value best first, ties by node number
  // (the ranking order of a clue-less set), those without a value after, in node order
  const N = 2000;
  const TYPE = 0;
  const big = RelationIndex.fromEdges(N + 1, 1, [], Array.from({ length: N }, (_, i) => [i + 1, TYPE] as [number, number]));
  const value = (v: number): number[] => (v % 7 === 3 ? [] : [((v * 7919) % 97) + (v % 5 === 0 ? 0.5 : 0), ((v * 31) % 97) - 50]);
  const bigLookup: AttributeLookup = { numbers: (e, p) => (p === AREA.num && e >= 1 ? value(e).sort((a, b) => a - b) : []) };
  const clueless: Analysis = { ...analysis, clues: [], answerTypes: [{ num: TYPE, id: "t:T", label: "thing" }] };
  const none: Ranked = { clues: [], candidates: [], typeFiltered: true, relationWeights: new Float64Array(1).fill(1), notes: [] };
  for (const order of ["max", "min"] as const) {
    for (const position of [1, 3]) {
      it(`${order}, place ${position}: the first 200 and the ties agree with a plain sort`, () => {
        const sup: Condition = { kind: "superlative", order, position, temporal: false, choices: [AREA], ...base };
        const out = applyConditions(clueless, none, [sup], big, bigLookup);
        const key = (v: number) => (order === "max" ? Math.max(...value(v)) : Math.min(...value(v)));
        const valued = Array.from({ length: N }, (_, i) => i + 1).filter((v) => value(v).length > 0);
        const sorted = [...valued].sort((a, b) => (order === "max" ? key(b) - key(a) : key(a) - key(b)) || a - b);
        const asked = sorted[position - 1]!;
        const expected = [asked, ...sorted.filter((v) => v !== asked)].slice(0, 200);
        expect(ids(out.ranked)).toEqual(expected);
        expect(out.tiedWith).toEqual(sorted.filter((v) => v !== asked && key(v) === key(asked)));
        expect(out.fit.length).toBe(N);
        // the candidates without a value come after every valued one
        expect(out.fit.slice(valued.length).every((v) => value(v).length === 0)).toBe(true);
      });
    }
  }
});

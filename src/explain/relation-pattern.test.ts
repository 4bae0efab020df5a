import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { RelationIndex, transition } from "../ranking/index.js";
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

describe("matchPattern with targets and with the flat rows (same semantics, checked against the plain evaluation)", () => {
  it("the targeted result is the full result restricted to the targets; the flat rows give the full result (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 4, max: 40 }),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 2 }), fc.nat()), { minLength: 1, maxLength: 120 }),
        fc.array(fc.tuple(fc.integer({ min: 0, max: 2 }), fc.boolean()), { minLength: 1, maxLength: 4 }),
        fc.nat(),
        fc.array(fc.nat(), { maxLength: 15 }),
        (n, raw, steps, s, ts) => {
          const g = RelationIndex.fromEdges(
            n,
            3,
            raw.map(([a, r, b]) => [a % n, r, b % n] as const),
          );
          const start = s % n;
          const pattern = steps.map(([rel, inverse]) => ({ rel, inverse }));
          const full = matchPattern(g, start, pattern);
          const flat = matchPattern(g, start, pattern, { rows: transition(g).rows });
          expect(flat === null ? null : [...flat].sort()).toEqual(full === null ? null : [...full].sort());
          const targets = ts.map((t) => t % n);
          const only = matchPattern(g, start, pattern, { targets });
          const onlyFlat = matchPattern(g, start, pattern, { targets, rows: transition(g).rows });
          const want = full === null ? null : [...new Set(targets.filter((t) => full.has(t)))].sort();
          expect(only === null ? null : [...only].sort()).toEqual(want);
          expect(onlyFlat === null ? null : [...onlyFlat].sort()).toEqual(want);
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });
});

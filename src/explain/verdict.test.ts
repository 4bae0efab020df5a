import { describe, expect, it } from "vitest";
import { decideVerdict, type VerdictCandidate } from "./verdict.js";

const c = (node: number, score: number, reached = [true, true], covered = 2): VerdictCandidate => ({ node, id: `e${node}`, label: `E${node}`, score, reached, covered });
const clues = ["A", "B"];

describe("decideVerdict (rules of the file header; scores hand-chosen)", () => {
  it("rejects thresholds outside [0, 1]", () => {
    expect(() => decideVerdict({ clues, candidates: [c(1, 1)], equivalent: null, maxHops: 6 }, { tieRatio: 2 })).toThrow(/tieRatio must be in \[0, 1\]/);
  });
  it("none without clues, without candidates, or when no clue reaches the best", () => {
    expect(decideVerdict({ clues: [], candidates: [], equivalent: null, maxHops: 6 }).status).toBe("none");
    expect(decideVerdict({ clues, candidates: [], equivalent: null, maxHops: 6 }).status).toBe("none");
    expect(decideVerdict({ clues, candidates: [c(1, 1, [false, false])], equivalent: null, maxHops: 6 }).status).toBe("none");
  });
  it("unique with margin (1 − 0.5)/1 = 0.5", () => {
    const v = decideVerdict({ clues, candidates: [c(1, 1), c(2, 0.5)], equivalent: new Set(), maxHops: 6 });
    expect(v.status).toBe("unique");
    expect(v.margin).toBeCloseTo(0.5, 10);
    expect(v.tiedWith).toEqual([]);
  });
  it("tied by score ratio 0.95 ≥ 0.9 with the same coverage", () => {
    const v = decideVerdict({ clues, candidates: [c(1, 1), c(2, 0.95), c(3, 0.2)], equivalent: null, maxHops: 6 });
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e2"]);
    expect(v.margin).toBeCloseTo(0.05, 10);
  });
  it("tied by structural equivalence even at ratio 0.3, not below the 0.25 floor", () => {
    const v = decideVerdict({ clues, candidates: [c(1, 1), c(2, 0.3), c(3, 0.2)], equivalent: new Set([2, 3]), maxHops: 6 });
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e2"]);
  });
  it("weak when a clue does not reach the best, or when the lead is below 0.15", () => {
    const a = decideVerdict({ clues, candidates: [c(1, 1, [true, false]), c(2, 0.2, [true, false])], equivalent: null, maxHops: 6 });
    expect(a.status).toBe("weak");
    expect(a.reason).toMatch(/"B" does not reach E1 within 6 hops/);
    const b = decideVerdict({ clues, candidates: [c(1, 1), c(2, 0.88, [true, false])], equivalent: null, maxHops: 6 });
    expect(b.status).toBe("weak");
    expect(b.margin).toBeCloseTo(0.12, 10);
  });
  it("weak when the best is off the relation-path pattern of a clue, even when it would be tied", () => {
    const top = { ...c(1, 1), chainFit: 0.05, chainMissed: [1] };
    const v = decideVerdict({ clues, candidates: [top, { ...c(2, 0.98), chainFit: 0.05 }], equivalent: null, maxHops: 6 });
    expect(v.status).toBe("weak");
    expect(v.reason).toBe('"B" does not reach E1 along the relations the question names for it');
    expect(v.tiedWith).toEqual(["e2"]);
    // on the pattern from every clue (nothing missed): the ordinary rules
    expect(decideVerdict({ clues, candidates: [{ ...c(1, 1), chainFit: 1, chainMissed: [] }, c(2, 0.5)], equivalent: new Set(), maxHops: 6 }).status).toBe("unique");
  });
  it("measures the margin against the next candidate with as much coverage", () => {
    // the runner-up covers one clue only: the lead is measured against E3 (0.4) → margin 0.6
    const v = decideVerdict({ clues, candidates: [c(1, 1), c(2, 0.99, [true, false], 1), c(3, 0.4)], equivalent: null, maxHops: 6 });
    expect(v.status).toBe("unique");
    expect(v.margin).toBeCloseTo(0.6, 10);
  });
  it("does not measure the margin against a rival whose paths miss the cued relations", () => {
    const top = { ...c(1, 1, [true]), cued: [true] };
    const off = { ...c(2, 0.95, [true]), cued: [false] };
    const v = decideVerdict({ clues: ["A"], candidates: [top, off, { ...c(3, 0.5, [true]), cued: [true] }], equivalent: new Set(), maxHops: 6 });
    expect(v.status).toBe("unique");
    expect(v.margin).toBeCloseTo(0.5, 10);
  });
  it("is weak when a rival reaches a clue in fewer hops over cued relations and no other clue in more", () => {
    const top = { ...c(1, 1), hops: [1, 3], cued: [true, true] };
    const r = { ...c(2, 0.4), hops: [1, 1], cued: [true, true] };
    const v = decideVerdict({ clues, candidates: [top, r], equivalent: new Set(), maxHops: 6 });
    expect(v.status).toBe("weak");
    expect(v.reason).toMatch(/E2 fits "B" more directly than E1 \(1 hop against 3\)/);
  });
});

import { describe, expect, it } from "vitest";
import { decideVerdict, type SenseDoubt, type VerdictCandidate, type VerdictContext } from "./verdict.js";

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

// The context rules (file header rules 1–5), on hand-made readings, link facts and conditions.
describe("decideVerdict with the question's reading and link facts", () => {
  const ref = (n: number) => ({ id: `e${n}`, label: `E${n}` });
  // two clues, each held by a one-hop pattern (only the chain lengths are read)
  const graph = { chains: [{ clue: 0, steps: [{}] }, { clue: 1, steps: [{}] }], plural: false } as unknown as NonNullable<VerdictContext["reading"]>["graph"];
  const reading = (matched: number[], fallback = false) => ({ graph, matched: new Set(matched), fallback, open: 0 });
  const mention = { text: "Nim", start: 0, end: 3, entity: { id: "s1", label: "Nim" }, confidence: 0.5 };
  const doubt = (next: number, answers: SenseDoubt["answers"], modified = false): SenseDoubt => ({ mention: { ...mention, next: { id: "s2", label: "Nim", confidence: next } }, answers, modified });
  const input = (context: VerdictContext, cands = [c(1, 1), c(2, 0.2)]) => ({ clues, candidates: cands, equivalent: new Set<number>(), maxHops: 6, context });

  it("several entities satisfying the reading are tied, whatever the scores say (0.2 of the best)", () => {
    const v = decideVerdict(input({ ref, reading: reading([1, 2]) }));
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e2"]);
  });
  it("one entity satisfying the reading is unique: a rival off the reading does not tie with it (0.95 of the best)", () => {
    const v = decideVerdict(input({ ref, reading: reading([1]) }, [c(1, 1), c(2, 0.95)]));
    expect(v.status).toBe("unique");
    // without a matching reading the score rules decide: tied at 0.95 ≥ 0.9
    expect(decideVerdict(input({ ref, reading: reading([], true) }, [c(1, 1), c(2, 0.95)])).status).toBe("tied");
  });
  it("a clue held only by a neighbour constraint: a rival off the reading neither ties nor narrows the margin, one on it still does", () => {
    // the ranking puts the matched candidate first even when a rival off the reading scores higher (2 against 1)
    const open = (matched: number[]) => ({ ...reading(matched), open: 1 });
    const v = decideVerdict(input({ ref, reading: open([1]) }, [c(1, 1), c(2, 2), c(3, 0.95)]));
    expect(v.status).toBe("unique");
    expect(v.margin).toBe(1);
    // a rival that satisfies the reading too ties by the score rules (0.95 ≥ 0.9)
    const t = decideVerdict(input({ ref, reading: open([1, 3]) }, [c(1, 1), c(2, 2), c(3, 0.95)]));
    expect(t.status).toBe("tied");
    expect(t.tiedWith).toEqual(["e3"]);
    // a best answer off the reading: every candidate is a rival (E2 at 2 ≥ 0.9 × 1 ties)
    expect(decideVerdict(input({ ref, reading: open([3]) }, [c(1, 1), c(2, 2), c(3, 0.95)])).tiedWith).toEqual(["e2", "e3"]);
  });
  it("a plural question whose clue is held only by a neighbour constraint: every candidate on the reading is in the tied group", () => {
    const open = (matched: number[], plural: boolean) => ({ ...reading(matched), graph: { ...graph, plural }, open: 1 });
    // E3 satisfies the reading at 0.3 of the best: the score rules alone leave E1 unique
    expect(decideVerdict(input({ ref, reading: open([1, 3], false) }, [c(1, 1), c(2, 2), c(3, 0.3)])).status).toBe("unique");
    const v = decideVerdict(input({ ref, reading: open([1, 3], true) }, [c(1, 1), c(2, 2), c(3, 0.3)]));
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e3"]); // E2 is off the reading
  });

  it("a candidate whose id and label are getters of its class keeps them when the reading marks it reached (tied ids and reason named)", () => {
    class Lazy {
      constructor(readonly node: number, readonly score: number, readonly reached: readonly boolean[], readonly covered = 2) {}
      get id(): string {
        return `e${this.node}`;
      }
      get label(): string {
        return `E${this.node}`;
      }
    }
    const v = decideVerdict(input({ ref, reading: reading([1, 2]) }, [new Lazy(1, 1, [true, false]), new Lazy(2, 0.5, [true, true])]));
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e2"]);
    expect(v.reason).toMatch(/E1, E2/);
  });

  it("an entity satisfying the reading counts as reached by every clue, even with no path found to it", () => {
    // the path search found no path to E1 (another sense of the clue's own mention is a seed), but the reading's pattern reaches it
    const v = decideVerdict(input({ ref, reading: reading([1]) }, [c(1, 1, [false, true]), c(2, 0.1)]));
    expect(v.status).toBe("unique");
    // when nothing satisfies the reading, no path still means not reached: weak
    expect(decideVerdict(input({ ref, reading: reading([], true) }, [c(1, 1, [false, true]), c(2, 0.1)])).status).toBe("weak");
  });
  it("the other sense's answer that is the mention's chosen entity itself is no answer", () => {
    // "the capital of Nim": read as the other Nim, the answer is the first Nim (s1) — the question named it
    const v = decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.45, [{ id: "s1", label: "Nim" }])] }));
    expect(v.status).toBe("unique");
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.45, [{ id: "s1", label: "Nim" }, { id: "e7", label: "E7" }])] })).tiedWith).toEqual(["e7"]);
  });
  it("a sense in doubt with answers of its own ties with them, each carrying the sense", () => {
    const v = decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.45, [{ id: "e9", label: "E9" }])] }));
    expect(v.status).toBe("tied");
    expect(v.tiedWith).toEqual(["e9"]);
    expect(v.senses).toEqual([{ id: "e9", label: "E9", mention: "Nim", sense: { id: "s2", label: "Nim", confidence: 0.45 } }]);
    expect(v.reason).toMatch(/'Nim' may be Nim \[s1\] \(50 %\) or Nim \[s2\] \(45 %\)/);
  });
  it("a sense in doubt that fits nothing the question asks leaves the verdict; one not evaluated makes it weak", () => {
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.45, [])] })).status).toBe("unique");
    const v = decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.45, null)] }));
    expect(v.status).toBe("weak");
    expect(v.mention?.text).toBe("Nim");
  });
  it("a faint sense (0.25 ≤ 0.2/0.5 = 0.4 < 0.5) ties only through its own answers, and not after a close appositive", () => {
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.2, [{ id: "e9", label: "E9" }])] })).status).toBe("tied");
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.2, null)] })).status).toBe("unique");
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.2, [{ id: "e9", label: "E9" }], true)] })).status).toBe("unique");
    // below the faint ratio (0.1/0.5 = 0.2 < 0.25): no doubt at all
    expect(decideVerdict(input({ ref, reading: reading([1]), doubts: [doubt(0.1, [{ id: "e9", label: "E9" }])] })).status).toBe("unique");
  });
  it("every clue not found gives none with the nearest name; one of two gives weak", () => {
    const nf = { ...mention, text: "KX-999", notFound: true as const };
    const all = decideVerdict(input({ ref, reading: reading([1]), notFound: [nf, { ...nf, text: "KX-998" }] }));
    expect(all.status).toBe("none");
    const one = decideVerdict(input({ ref, reading: reading([1]), notFound: [nf] }));
    expect(one.status).toBe("weak");
    expect(one.reason).toBe("no catalog entity matches 'KX-999'; nearest: Nim, 50 %; the answer rests on the other clues");
  });
  it("a name matched only in part counts as not found when nothing satisfies the reading, and not otherwise", () => {
    const part = { ...mention, text: "Ardent Nim", notFound: true as const };
    expect(decideVerdict(input({ ref, reading: reading([], true), partial: [part, part] })).status).toBe("none");
    expect(decideVerdict(input({ ref, reading: reading([1]), partial: [part, part] })).status).toBe("unique");
  });
});

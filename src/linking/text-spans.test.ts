import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { normalize } from "../catalog/index.js";
import { questionTokens } from "./text-spans.js";

describe("questionTokens", () => {
  it("gives normalised tokens with original UTF-16 spans", () => {
    const q = "Où est Zoë Ñandú's lab?";
    const t = questionTokens(q);
    expect(t.map((x) => x.norm)).toEqual(["ou", "est", "zoe", "nandus", "lab"]);
    expect(t.map((x) => q.slice(x.start, x.end))).toEqual(["Où", "est", "Zoë", "Ñandú's", "lab"]);
    expect(t[2]!.marked).toBe(true);
    expect(t[1]!.marked).toBe(false);
  });

  it("counts the capitals each word was written with", () => {
    // one per original character: "Ｍ" (full-width) and "Ñ" count, the possessive "'s" does not
    const t = questionTokens("Is MICA's Ｍica held by Ñandú?");
    expect(t.map((x) => [x.norm, x.upper])).toEqual([["is", 1], ["micas", 4], ["mica", 1], ["held", 0], ["by", 0], ["nandu", 1]]);
  });

  it("maps NFKC expansions and combining marks back to whole characters", () => {
    // "ﬁ" (U+FB01) becomes "fi" under NFKC (Unicode's compatibility decomposition)
    const q = "the ﬁord of Ａｂｃ and Zoe\u0308";
    const t = questionTokens(q);
    expect(t.map((x) => x.norm)).toEqual(["the", "fiord", "of", "abc", "and", "zoe"]);
    expect(q.slice(t[1]!.start, t[1]!.end)).toBe("ﬁord");
    expect(q.slice(t[3]!.start, t[3]!.end)).toBe("Ａｂｃ");
    expect(q.slice(t[5]!.start, t[5]!.end)).toBe("Zoe\u0308");
  });

  it("agrees with the catalog's normalize on ordinary text", () => {
    const q = "Which  VESSEL—carried the O'Hara-Lund sonar (2019)?";
    expect(questionTokens(q).map((x) => x.norm).join(" ")).toBe(normalize(q));
  });

  it("never throws and every span slices back to its characters (property)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 200 }), (s) => {
        for (const t of questionTokens(s)) {
          expect(t.start).toBeGreaterThanOrEqual(0);
          expect(t.end).toBeLessThanOrEqual(s.length);
          expect(t.start).toBeLessThan(t.end);
          expect(t.norm).not.toBe("");
          expect(t.norm).not.toMatch(/\s/);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("marks orthographic capitals: a sentence's first word and the pronoun I, not abbreviations or initials", () => {
    const initial = (q: string) => questionTokens(q).filter((t) => t.initial).map((t) => q.slice(t.start, t.end));
    expect(initial("Could you tell me the capital of Peru? Thanks!")).toEqual(["Could", "Thanks"]);
    expect(initial("Hi! I'm setting up a server: what does lighttpd need?")).toEqual(["Hi", "I'm"]);
    expect(initial("Where does Dr. Brenn live? Which lab is I. Varrick in?")).toEqual(["Where", "Which"]);
    expect(initial("It is a port. Which vessels use it?")).toEqual(["It", "Which"]);
  });
});

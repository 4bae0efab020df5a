import { describe, expect, it } from "vitest";
import { RelationIndex } from "../ranking/index.js";
import { appendClue, factPhrase, relationPhrase, suggestClues, type FactLookup } from "./suggest.js";

describe("phrasing", () => {
  it("adds `is` before participles and noun phrases, not before verbs (common practice of English grammar)", () => {
    expect(relationPhrase("moored at")).toBe("is moored at");
    expect(relationPhrase("member of")).toBe("is member of");
    expect(relationPhrase("leads")).toBe("leads");
    expect(relationPhrase("belongs to")).toBe("belongs to");
    expect(relationPhrase("commissioned")).toBe("commissioned");
    expect(relationPhrase("funded by")).toBe("is funded by");
    expect(relationPhrase("has part")).toBe("has part");
  });
  it("phrases a fact from the answer's side in both directions (common practice of English grammar)", () => {
    expect(factPhrase("home port", [], "Tolvane", false)).toBe("whose home port is Tolvane");
    expect(factPhrase("home port", [], "Lumen Ray", true)).toBe("that is the home port of Lumen Ray");
    expect(factPhrase("captain of", ["captained by"], "Corin Vael", true)).toBe("whose captain is Corin Vael");
    expect(factPhrase("captain of", [], "Lumen Ray", false)).toBe("that is captain of Lumen Ray");
    expect(factPhrase("leads", ["led by", "heads"], "Ada Quell", true)).toBe("that is led by Ada Quell");
    expect(factPhrase("leads", ["heads"], "Ada Quell", true)).toBe("that Ada Quell leads");
    expect(factPhrase("member of", ["employed by"], "Ada Quell", true)).toBe("whose member is Ada Quell");
    expect(factPhrase("funded by", [], "Project Tern", true)).toBe("that Project Tern is funded by");
    expect(factPhrase("carried aboard", ["carries"], "Halo", true)).toBe("that Halo is carried aboard");
    expect(factPhrase("took part in", [], "Spring Survey", false)).toBe("that took part in Spring Survey");
    expect(factPhrase("held in", [], "Tolvane", false)).toBe("that is held in Tolvane");
  });
  it("appends before the final question mark", () => {
    expect(appendClue("Which vessel carries the sonar?", "that is moored at Brackwell")).toBe("Which vessel carries the sonar that is moored at Brackwell?");
    expect(appendClue("which vessel carries the sonar", "that leads X")).toBe("which vessel carries the sonar that leads X?");
  });
});

describe("suggestClues", () => {
  // answer 1 and rivals 2, 3: 1 r0 5, 2 r0 5, 3 r0 6; 7 r1 1 (only the answer); 1 r0 4 (4 is a clue)
  const index = RelationIndex.fromEdges(8, 2, [
    [1, 0, 5],
    [2, 0, 5],
    [3, 0, 6],
    [7, 1, 1],
    [1, 0, 4],
  ]);
  const lookup: FactLookup = {
    ref: (n) => ({ id: `e${n}`, label: `Node ${n}` }),
    relation: (r) => ({ id: `r${r}`, label: r === 0 ? "moored at" : "leads" }),
    attributes: (n) => (n === 1 ? [{ predicate: "built", label: "built", value: "1994" }] : n === 2 ? [{ predicate: "built", label: "built", value: "1994" }] : []),
    labelCount: () => 1,
  };
  const s = suggestClues(index, lookup, "Which vessel is it?", 1, [2, 3], new Set([4]), {});

  it("orders facts by rivals ruled out, relation facts first (hand-derived)", () => {
    expect(s.map((x) => [x.text, x.rulesOut])).toEqual([
      ["that Node 7 leads", ["e2", "e3"]],
      ["that is moored at Node 5", ["e3"]],
      ["that has a built of 1994", ["e3"]],
    ]);
    expect(s[0]!.triple).toEqual({ subject: "e7", predicate: "r1", object: "e1", literal: false });
    expect(s[0]!.question).toBe("Which vessel is it that Node 7 leads?");
  });
  it("never uses a clue as the neighbour, and returns [] without rivals", () => {
    expect(s.some((x) => x.text.includes("Node 4"))).toBe(false);
    expect(suggestClues(index, lookup, "q", 1, [], new Set())).toEqual([]);
  });
});

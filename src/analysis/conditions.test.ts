/**
 * Condition detection on a small catalog (no linked mentions): which words give which
 * condition, operator, range and attribute. Ranges follow quantity.ts's reading of a year
 * as [Y, Y+1) (hand-derived from the operator's English meaning: "before 1980" = earlier
 * than 1980-01-01, "after 1980" = from 1981-01-01 on).
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { analyze, buildAttributeModel, buildQuestionModel, detectConditions, type Analysis, type AttributeModel, type ComparisonCondition, type QuestionModel } from "./index.js";

let cat: Catalog;
let model: QuestionModel;
let attributes: AttributeModel;

beforeAll(() => {
  const d = mkdtempSync(join(tmpdir(), "tp-cond-"));
  const file = join(d, "a.jsonl");
  const lines = [
    { kind: "type", id: "t:Ship", label: "ship" },
    { kind: "attribute", id: "built", label: "build year", aliases: ["built"], unit: "year" },
    { kind: "attribute", id: "len", label: "length", aliases: ["long"], unit: "metres" },
    { kind: "attribute", id: "crew", label: "crew size", aliases: ["crew"], unit: "sailors" },
    { id: "s1", label: "Alda", types: ["t:Ship"], attributes: { built: 1975, len: 60, crew: 12 } },
    { id: "s2", label: "Brona", types: ["t:Ship"], attributes: { built: 1991, len: 45, crew: 8 } },
  ];
  writeFileSync(file, lines.map((l) => JSON.stringify(l)).join("\n") + "\n");
  cat = Catalog.open(join(d, "c.db"), { create: true });
  loadFiles(cat, [file]);
  model = buildQuestionModel(cat);
  attributes = buildAttributeModel(cat);
});
afterAll(() => cat?.close());

function bare(question: string): Analysis {
  return { question, mentions: [], answerTypes: [], answerTypeSource: "none", relationCues: [], clues: [], notes: [] };
}

describe("detectConditions", () => {
  it("finds nothing in a question without condition words", () => {
    expect(detectConditions(bare("Which ship carries the sonar?"), model, attributes).conditions).toEqual([]);
  });

  it("reads before/after/since/until a year as ranges on the year scale", () => {
    const c = (q: string) => detectConditions(bare(q), model, attributes).conditions[0] as ComparisonCondition;
    expect(c("Which ships were built before 1980?")).toMatchObject({ kind: "comparison", operator: "<", max: 1980, maxStrict: true });
    expect(c("Which ships were built after 1980?")).toMatchObject({ operator: ">", min: 1981 });
    expect(c("Which ships were built since 1980?")).toMatchObject({ operator: ">=", min: 1980 });
    expect(c("Which ships were built until 1980?")).toMatchObject({ operator: "<=", max: 1981, maxStrict: true });
    expect(c("Which ships were built in the 1970s?")).toMatchObject({ operator: "in", min: 1970, max: 1980, maxStrict: true });
    expect(c("Which ships were built before 1980?").choices[0]!.id).toBe("built");
  });

  it("reads number comparisons, the attribute from its words or its unit", () => {
    const c = (q: string) => detectConditions(bare(q), model, attributes).conditions[0] as ComparisonCondition;
    expect(c("Which ships are longer than 50 metres?")).toMatchObject({ operator: ">", min: 50, minStrict: true });
    expect(c("Which ships are longer than 50 metres?").choices[0]!.id).toBe("len");
    expect(c("Which ships have at least 10 sailors?")).toMatchObject({ operator: ">=", min: 10 });
    expect(c("Which ships have at least 10 sailors?").choices[0]!.id).toBe("crew"); // by the unit
    expect(c("Which ships have a crew of 10 or more?")).toMatchObject({ operator: ">=", min: 10 });
    expect(c("Which ships have a crew between 5 and 9?")).toMatchObject({ operator: "between", min: 5, max: 9 });
    expect(c("Which ships were not built before 1980?")).toMatchObject({ operator: ">=", negated: true });
  });

  it("reads superlatives and ordinals, temporal ones preferring year attributes", () => {
    const s = (q: string) => detectConditions(bare(q), model, attributes).conditions[0]!;
    expect(s("Which is the longest ship?")).toMatchObject({ kind: "superlative", order: "max", position: 1 });
    expect(s("Which is the second longest ship?")).toMatchObject({ kind: "superlative", order: "max", position: 2 });
    const oldest = s("Which is the oldest ship?");
    expect(oldest).toMatchObject({ kind: "superlative", order: "min", temporal: true });
    expect(oldest.kind === "superlative" && oldest.choices[0]!.id).toBe("built");
    expect(detectConditions(bare("Which ship did Alda first visit?"), model, attributes).conditions).toEqual([]); // an adverb, not an ordering
    const most = s("Which ship has the most crew?");
    expect(most.kind === "superlative" && most.choices[0]!.id).toBe("crew");
  });

  it("reads counting and takes the answer type from the noun after it", () => {
    const r = detectConditions(bare("How many ships were built before 1980?"), model, attributes);
    expect(r.conditions.map((c) => c.kind)).toEqual(["count", "comparison"]);
    expect(r.analysis.answerTypes.map((t) => t.id)).toEqual(["t:Ship"]);
  });

  it("notes a condition whose words match no attribute", () => {
    const r = detectConditions(bare("Which ships are wider than 9 metres?"), model, attributes);
    const c = r.conditions[0] as ComparisonCondition;
    expect(c.choices).toEqual([]);
    expect(r.analysis.notes.some((n) => /no attribute of the catalog matches/.test(n))).toBe(true);
  });

  it("drops the analysis's notes of what it did not find by their records (analyze.ts noteFacts), not by wording", () => {
    // "How many ships were built before 1980?": no question word (the count names the type), "1980" matched no entity (the comparison reads it)
    const q = "How many ships were built before 1980?";
    const a = analyze(q, { mentions: [], unlinked: [{ text: "1980", start: q.indexOf("1980"), end: q.indexOf("1980") + 4, suggestions: [] }] } as never, model);
    expect(a.noteFacts?.answerTypeGap?.kind).toBe("no-question-word");
    expect(a.noteFacts?.unmatched.map((u) => u.text)).toEqual(["1980"]);
    expect(a.noteFacts?.noClue).toBeDefined();
    for (const n of [a.noteFacts!.answerTypeGap!.note, a.noteFacts!.unmatched[0]!.note, a.noteFacts!.noClue!]) expect(a.notes).toContain(n);
    const r = detectConditions(a, model, attributes);
    expect(r.analysis.answerTypes.map((t) => t.id)).toEqual(["t:Ship"]);
    // each note the conditions explain is gone: the type from "how many ships", the number, the clue-less start (every ship is a candidate)
    for (const n of [a.noteFacts!.answerTypeGap!.note, a.noteFacts!.unmatched[0]!.note, a.noteFacts!.noClue!]) expect(r.analysis.notes).not.toContain(n);
    // a note with the same wording but not recorded as a fact stays (no wording match)
    const lookalike = { ...a, notes: [...a.notes, "no clue entity linked: nothing to start from (copied)"] };
    expect(detectConditions(lookalike, model, attributes).analysis.notes).toContain("no clue entity linked: nothing to start from (copied)");
  });
});

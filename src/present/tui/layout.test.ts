import { describe, expect, it } from "vitest";
import { layoutFor } from "./layout.js";
import { scoreBar } from "./score-bar.js";
import { markQuestion, percent } from "./marked-question.js";
import { displayWidth } from "./text-width.js";

describe("layoutFor", () => {
  it("stacks answers over the detail at 80×24 and uses every row", () => {
    const l = layoutFor(80, 24, { mentions: 2, candidates: 0, answers: 10 });
    expect(l.sideBySide).toBe(false);
    // 6 fixed rows (title, question, marked question, verdict, status, hint) + the rest
    expect(6 + l.mentionRows + l.answerRows + l.detailRows).toBe(24);
    expect(l.answerRows).toBeGreaterThanOrEqual(3);
  });
  it("puts answers and detail side by side from 120 columns and gives them the extra rows", () => {
    const l = layoutFor(160, 48, { mentions: 2, candidates: 0, answers: 10 });
    expect(l.sideBySide).toBe(true);
    expect(l.answersWidth + 1 + l.detailWidth).toBe(160);
    expect(l.detailRows).toBe(48 - 6 - 2);
  });
  it("gives the reading one row, two with the words it ignores, taken from the detail area", () => {
    const base = layoutFor(80, 24, { mentions: 2, candidates: 0, answers: 10 });
    const one = layoutFor(80, 24, { mentions: 2, candidates: 0, answers: 10, readingRows: 1 });
    const two = layoutFor(80, 24, { mentions: 2, candidates: 0, answers: 10, readingRows: 2 });
    expect(6 + 1 + one.mentionRows + one.answerRows + one.detailRows).toBe(24);
    expect(6 + 2 + two.mentionRows + two.answerRows + two.detailRows).toBe(24);
    expect(base.answerRows + base.detailRows - (two.answerRows + two.detailRows)).toBe(2);
  });
  it("makes room for the candidates of the selected mention", () => {
    const a = layoutFor(80, 24, { mentions: 1, candidates: 3, answers: 5 });
    expect(a.mentionRows).toBe(4);
  });
});

describe("scoreBar", () => {
  it("draws eighths of a cell (Unicode Block Elements)", () => {
    expect(scoreBar(1, 1, 4)).toBe("████");
    expect(scoreBar(0.5, 1, 4)).toBe("██░░");
    expect(scoreBar(0.5625, 1, 2)).toBe("█▏"); // 0.5625·2·8 = 9 eighths: one full, one 1/8 (hand-computed)
    expect(scoreBar(0, 1, 3)).toBe("░░░");
    expect(scoreBar(2, 0, 3)).toBe("░░░"); // no maximum: empty track
  });
  it("always has exactly the width asked for", () => {
    for (let i = 0; i <= 40; i++) expect(displayWidth(scoreBar(i / 40, 1, 7))).toBe(7);
  });
});

describe("markQuestion", () => {
  it("splits the question at mention offsets (UTF-16, end exclusive)", () => {
    const q = "who wrote Tidal Engines?";
    const m = { text: "Tidal Engines", start: 10, end: 23, entity: { id: "b", label: "Tidal Engines" }, confidence: 0.9, alternatives: [] };
    expect(markQuestion(q, [m])).toEqual([{ text: "who wrote " }, { text: "Tidal Engines", mention: 0 }, { text: "?" }]);
  });
  it("skips overlapping and out-of-range spans", () => {
    const mk = (start: number, end: number) => ({ text: "", start, end, entity: { id: "x", label: "x" }, confidence: 1, alternatives: [] });
    expect(markQuestion("abcdef", [mk(0, 3), mk(2, 4), mk(5, 9)])).toEqual([{ text: "abc", mention: 0 }, { text: "def" }]);
  });
  it("prints confidences as whole percentages", () => {
    expect(percent(0.934)).toBe("93%");
    expect(percent(0.001)).toBe("<1%");
    expect(percent(0)).toBe("0%");
  });
});

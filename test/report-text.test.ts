/**
 * Text and Markdown check reports over a hand-written report (test/fixtures/report-fixtures.ts):
 * every figure of the summary, per-question outcome, verdict and margin, the "needs a look" list.
 */
import { describe, expect, it } from "vitest";
import { renderCheckText } from "../src/present/report-text.js";
import { renderCheckMd, mdText } from "../src/present/report-md.js";
import { reviewItem, reviewReport } from "../src/present/report-review.js";
import { DISCLAIMER } from "../src/model/index.js";
import { progressLine } from "../src/present/report-progress.js";
import { REPORT } from "./fixtures/report-fixtures.js";

describe("needs-a-look review", () => {
  it("flags misses, ties, weak and empty verdicts, and low-confidence links", () => {
    const kinds = reviewReport(REPORT).map((e) => [e.item.line, e.flags.map((f) => f.kind)]);
    // hand-derived from the fixture: line 1 links "Kessel Bay" at 0.41 < 0.5; line 3 tied;
    // line 4 misses e:zzz and is weak; line 6 linked nothing
    expect(kinds).toEqual([
      [1, ["low-confidence"]],
      [3, ["tied"]],
      [4, ["miss", "weak"]],
      [6, ["none"]],
    ]);
  });

  it("honours the low-confidence threshold", () => {
    expect(reviewItem(REPORT.results[0]!, { lowConfidence: 0.4 })).toEqual([]);
    expect(reviewItem(REPORT.results[2]!, { lowConfidence: 0.9 }).map((f) => f.kind)).toContain("low-confidence");
  });

  it("names the rank of an expected answer found below the top", () => {
    const item = { ...REPORT.results[0]!, rank: 3, hit: false };
    expect(reviewItem(item)[0]).toEqual({ kind: "miss", detail: "expected v:heron at rank 3" });
  });
});

describe("text report", () => {
  const text = renderCheckText(REPORT);

  it("prints each question with outcome, verdict, margin and top answers", () => {
    expect(text).toContain("line 1: Which vessel was built at Lorn Yard and is moored at Kessel Bay?\n  hit (rank 1) · unique · margin 0.51\n  1. Heron (v:heron)  0.410");
    expect(text).toContain("line 4: Who wrote");
    expect(text).toContain("miss (not found) · weak · margin 0.05");
    expect(text).toContain("  expected: e:zzz");
    expect(text).toContain("tied with o:lab2");
    expect(text).toContain("line 6: What is the colour of nothing?\n  no expected answer · none · margin 0.00\n  no answers");
  });

  it("summarises Hits@1, Hits@5, MRR, verdicts and time", () => {
    // figures of the fixture summary (hand-computed there: 2/3 each)
    expect(text).toContain("Hits@1 0.667   Hits@5 0.667   MRR 0.667");
    expect(text).toContain("verdicts    unique 1   tied 1   weak 1   none 1");
    // 0.8 s / 4 questions = 200 ms per question (hand-computed)
    expect(text).toContain("0.80 s for 4 questions, 200.0 ms per question");
    expect(text).toContain("Needs a look: 4\n  line 1: low-confidence:");
    expect(text.trimEnd().endsWith(DISCLAIMER)).toBe(true);
  });

  it("lists as many answers as asked", () => {
    expect(renderCheckText(REPORT, { answers: 1 })).not.toContain("2. Tern");
  });
});

describe("markdown report", () => {
  const md = renderCheckMd(REPORT);

  it("has a summary table and one table row per question with the same column count", () => {
    expect(md).toContain("| 4 | 3 | 0.667 | 0.667 | 0.667 | 1 | 1 | 1 | 1 |");
    const rows = md.split("\n").filter((l) => /^\| \d+ \| /.test(l));
    expect(rows.map((r) => r.split(" | ")[0])).toEqual(["| 4", "| 1", "| 3", "| 4", "| 6"]);
    // every row of the questions table has 7 cells: count unescaped pipes (GFM spec, tables extension)
    const cells = (l: string) => l.replace(/\\\|/g, "").split("|").length - 2;
    const qTable = md.slice(md.indexOf("## Questions")).split("\n").filter((l) => l.startsWith("|"));
    expect(new Set(qTable.map(cells))).toEqual(new Set([7]));
  });

  it("escapes markup, pipes and HTML in values", () => {
    expect(mdText("a|b <script> *x* [l](u) `c`")).toBe("a\\|b &lt;script&gt; \\*x\\* \\[l\\](u) \\`c\\`");
    expect(md).not.toContain("<script>");
    expect(md).not.toContain("<img");
  });
});

describe("progress line", () => {
  it("draws the share done, counts, time and a linear estimate", () => {
    // hand-computed: 412/1000 of 24 cells = 9.888 → 10 filled; eta = 3.2 s / 412 × 588 = 4.57 s
    expect(progressLine(412, 1000, 3200)).toBe("[##########--------------]  412/1000  41%  3.2 s  eta 4.6 s");
    expect(progressLine(1000, 1000, 5000, { width: 4 })).toBe("[####] 1000/1000 100%  5.0 s");
    expect(progressLine(0, 0, 0, { width: 2 })).toBe("[##] 0/0 100%  0.0 s");
  });
});

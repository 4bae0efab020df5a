/**
 * `--compare OLD.json`: differences between two check reports (hand-built variations of the
 * fixture report; every expected list is derived by hand from the changes made).
 */
import { describe, expect, it } from "vitest";
import { compareReports, parseCheckReport } from "../src/present/compare.js";
import { renderComparisonText } from "../src/present/report-text.js";
import type { CheckItem, CheckReport } from "../src/model/index.js";
import { TiepointError } from "../src/model/index.js";
import { ASK_TWO_CLUES, REPORT } from "./fixtures/report-fixtures.js";

function changed(): CheckReport {
  const [q1, q3, q4, q6] = REPORT.results as [CheckItem, CheckItem, CheckItem, CheckItem];
  // q1: Tern now ranks first and the verdict turns weak -> a new miss, an answer moved, a verdict changed
  const a1 = { ...ASK_TWO_CLUES, answers: [ASK_TWO_CLUES.answers[1]!, ASK_TWO_CLUES.answers[0]!], verdict: { status: "weak" as const, margin: 0.1, tiedWith: [] } };
  const n1: CheckItem = { ...q1, line: 2, answer: a1, rank: 2, hit: false };
  // q4: now found at rank 1 -> a fixed miss and a moved rank
  const n4: CheckItem = { ...q4, rank: 1, hit: true };
  // q6 removed, a new question added, q3 unchanged
  const added: CheckItem = { ...q6, line: 9, question: "A brand new question?" };
  return { results: [n1, q3, n4, added], summary: { ...REPORT.summary, hits1: 2 / 3, mrr: (0.5 + 1 + 1) / 3 } };
}

describe("compareReports", () => {
  it("finds nothing between a report and itself", () => {
    const c = compareReports(REPORT, REPORT);
    expect(c.matched).toBe(4);
    expect([c.moved, c.verdictChanges, c.newMisses, c.fixedMisses, c.added, c.removed].map((l) => l.length)).toEqual([0, 0, 0, 0, 0, 0]);
  });

  it("lists moved answers, changed verdicts, new and fixed misses, added and removed questions", () => {
    const c = compareReports(REPORT, changed());
    expect(c.matched).toBe(3);
    expect(c.newMisses).toEqual([{ question: REPORT.results[0]!.question, line: 2, oldLine: 1, rankBefore: 1, rankAfter: 2 }]);
    expect(c.fixedMisses.map((x) => [x.line, x.rankBefore, x.rankAfter])).toEqual([[4, null, 1]]);
    expect(c.moved.map((x) => [x.line, x.before?.id, x.after?.id])).toEqual([
      [2, "v:heron", "v:tern"],
      [4, "e:a\\b", "e:a\\b"],
    ]);
    expect(c.verdictChanges.map((x) => [x.line, x.before, x.after])).toEqual([[2, "unique", "weak"]]);
    expect(c.added).toEqual([{ line: 9, question: "A brand new question?" }]);
    expect(c.removed).toEqual([{ line: 6, question: REPORT.results[3]!.question }]);
  });

  it("matches questions by text despite spacing, and repeated questions occurrence by occurrence", () => {
    const q = REPORT.results[0]!;
    const old: CheckReport = { ...REPORT, results: [q, { ...q, line: 5 }] };
    const now: CheckReport = { ...REPORT, results: [{ ...q, question: `  ${q.question.replace(/ /g, "  ")} ` }, { ...q, line: 7, rank: null, hit: false }] };
    const c = compareReports(old, now);
    expect(c.matched).toBe(2);
    expect(c.newMisses.map((x) => [x.oldLine, x.line])).toEqual([[5, 7]]);
  });

  it("renders the changes as text with the summary deltas", () => {
    const t = renderComparisonText(compareReports(REPORT, changed()));
    // MRR before 2/3 = 0.667, after 2.5/3 = 0.833 (hand-computed)
    expect(t).toContain("MRR 0.667 → 0.833 (+0.167)");
    expect(t).toContain("new misses: 1\n    line 2: rank 1 → 2");
    expect(t).toContain("verdicts that changed: 1\n    line 2: unique → weak");
  });
});

describe("parseCheckReport", () => {
  it("reads back a report written as JSON", () => {
    expect(parseCheckReport(JSON.stringify(REPORT), "old.json")).toEqual(REPORT);
  });

  it("rejects what is not a check report, naming the file and the field", () => {
    const err = (text: string) => {
      try {
        parseCheckReport(text, "old.json");
      } catch (e) {
        expect(e).toBeInstanceOf(TiepointError);
        return (e as TiepointError).format();
      }
      throw new Error("no error");
    };
    expect(err("{oops")).toMatch(/^old\.json: not a JSON document/);
    expect(err("[]")).toMatch(/^old\.json: not a check report: the document should be an object/);
    expect(err('{"results": 3}')).toMatch(/results should be an array/);
    const bad = JSON.parse(JSON.stringify(REPORT));
    bad.results[2].answer.verdict.status = "great";
    expect(err(JSON.stringify(bad))).toMatch(/results\[2\]\.answer\.verdict\.status should be one of unique, tied, weak, none/);
    delete bad.summary.mrr;
    bad.results[2].answer.verdict.status = "weak";
    expect(err(JSON.stringify(bad))).toMatch(/summary\.mrr should be a number/);
  });
});

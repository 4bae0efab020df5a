/**
 * Question files, expected-answer ranks and the check summary. Metric values are
 * hand-computed from their definitions (Manning, Raghavan & Schütze 2008, §8.4: Hits@k and
 * mean reciprocal rank).
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { TiepointError, type AskResult, type CheckItem, type VerdictStatus } from "../model/index.js";
import { parseQuestionFile, parseQuestionText, rankOfExpected, summarise } from "./index.js";

const dir = mkdtempSync(join(tmpdir(), "tiepoint-pipeline-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("question files", () => {
  it("reads plain and TSV lines, skipping blanks and comments, keeping line numbers", () => {
    const text = "# demo\n\nWho made the sonar?\nWhich ship carries it?\tv:lumen | Caddrow\n   \n# end\nWhere?\t\n";
    expect(parseQuestionText(text, "q.tsv")).toEqual([
      { line: 3, question: "Who made the sonar?", expected: [] },
      { line: 4, question: "Which ship carries it?", expected: ["v:lumen", "Caddrow"] },
      { line: 7, question: "Where?", expected: [] },
    ]);
  });

  it("accepts CRLF line ends and a byte-order mark", () => {
    expect(parseQuestionText("\uFEFFA?\tx\r\nB?\r\n", "q.tsv").map((q) => [q.line, q.question, q.expected])).toEqual([
      [1, "A?", ["x"]],
      [2, "B?", []],
    ]);
  });

  it("names the file and line of a bad line", () => {
    const bad = () => parseQuestionText("ok?\n\tp:ada\n", "q.tsv");
    expect(bad).toThrow(TiepointError);
    try {
      bad();
    } catch (e) {
      expect((e as TiepointError).format()).toBe("q.tsv:2: empty question before the tab");
    }
    expect(() => parseQuestionText("a?\tb\tc\n", "q.tsv")).toThrow(/verdict "c": expected one of/);
    expect(() => parseQuestionText("a?\tb\ttied\td\n", "q.tsv")).toThrow(/more than three tab-separated fields/);
  });

  it("reports a missing file, a directory and a binary file in one line", () => {
    expect(() => parseQuestionFile(join(dir, "nope.tsv"))).toThrow(/no such file/);
    expect(() => parseQuestionFile(dir)).toThrow(/is a directory/);
    const bin = join(dir, "bin.tsv");
    writeFileSync(bin, Buffer.from([0x41, 0x00, 0x42]));
    expect(() => parseQuestionFile(bin)).toThrow(/not a text file/);
    const ok = join(dir, "ok.tsv");
    writeFileSync(ok, "Who?\tp:ada\n");
    expect(parseQuestionFile(ok)).toEqual([{ line: 1, question: "Who?", expected: ["p:ada"] }]);
  });
});

function result(ids: readonly string[], status: VerdictStatus = "unique"): AskResult {
  return {
    question: "q",
    mentions: [],
    answerTypes: [],
    answers: ids.map((id, i) => ({ id, label: `label of ${id}`, score: 1 / (i + 1), types: [], paths: [] })),
    verdict: { status, margin: 0.5, tiedWith: [] },
  };
}

describe("check metrics", () => {
  it("ranks the best-ranked expected answer by id or exact label", () => {
    expect(rankOfExpected(result(["a", "b", "c"]), ["c", "b"])).toBe(2);
    expect(rankOfExpected(result(["a", "b", "c"]), ["label of c"])).toBe(3);
    expect(rankOfExpected(result(["a"]), ["z"])).toBeNull();
    expect(rankOfExpected(result(["a"]), [])).toBeNull();
  });

  it("summarises Hits@1, Hits@5 and MRR over the questions with expected answers (hand-computed)", () => {
    const item = (rank: number | null, expected: string[], status: VerdictStatus): CheckItem => ({
      line: 1,
      question: "q",
      expected,
      rank,
      hit: rank === 1,
      answer: result(["a"], status),
    });
    const s = summarise([item(1, ["a"], "unique"), item(3, ["c"], "tied"), item(null, ["z"], "weak"), item(null, [], "none")], 2.5);
    expect(s.questions).toBe(4);
    expect(s.withExpected).toBe(3);
    expect(s.hits1).toBeCloseTo(1 / 3, 12);
    expect(s.hits5).toBeCloseTo(2 / 3, 12);
    // (1 + 1/3 + 0) / 3 = 4/9
    expect(s.mrr).toBeCloseTo(4 / 9, 12);
    expect(s.verdicts).toEqual({ unique: 1, tied: 1, weak: 1, none: 1 });
    expect(s.seconds).toBe(2.5);
  });

  it("gives zeros, not NaN, when no question has expected answers", () => {
    const s = summarise([], 0);
    expect([s.hits1, s.hits5, s.mrr]).toEqual([0, 0, 0]);
  });
});

/**
 * The TSV report, read back with csv-parse (an outside, general-purpose parser) as a
 * tab-delimited file without quoting (IANA text/tab-separated-values: no tabs inside fields).
 */
import { describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { renderCheckTsv, TSV_COLUMNS, tsvText } from "../src/present/report-tsv.js";
import { REPORT } from "./fixtures/report-fixtures.js";

const read = (s: string) => parse(s, { delimiter: "\t", quote: false, relax_column_count: false }) as string[][];

describe("TSV report", () => {
  it("has a header and one row per question, all of the same width", () => {
    const rows = read(renderCheckTsv(REPORT));
    expect(rows[0]).toEqual([...TSV_COLUMNS]);
    expect(rows).toHaveLength(1 + REPORT.results.length);
  });

  it("carries the figures of each question", () => {
    const rows = read(renderCheckTsv(REPORT));
    const rec = (i: number) => Object.fromEntries(TSV_COLUMNS.map((c, j) => [c, rows[i]![j]!]));
    // values copied from the fixture
    expect(rec(1)).toMatchObject({ line: "1", expected: "v:heron", outcome: "hit", rank: "1", verdict: "unique", margin: "0.5100", top_id: "v:heron", answers: "v:heron|v:tern|v:gull", weakest_link: "0.410", needs_look: "low-confidence" });
    expect(rec(2)).toMatchObject({ tied_with: "o:lab2", expected: "o:lab1|o:lab2" });
    expect(rec(3)).toMatchObject({ outcome: "miss", rank: "", needs_look: "miss|weak" });
    expect(rec(4)).toMatchObject({ outcome: "-", top_id: "", weakest_link: "" });
  });

  it("keeps tabs and line breaks out of cells and defuses formula starts", () => {
    expect(tsvText("a\tb\nc")).toBe("a b c");
    expect(tsvText("=SUM(A1)")).toBe("'=SUM(A1)");
    expect(tsvText("@x")).toBe("'@x");
    const weird = { ...REPORT, results: [{ ...REPORT.results[0]!, question: "=1+1\twith\ttabs\r\nand lines" }] };
    const rows = read(renderCheckTsv(weird));
    expect(rows[1]![1]).toBe("'=1+1 with tabs and lines");
    expect(rows[1]).toHaveLength(TSV_COLUMNS.length);
  });
});

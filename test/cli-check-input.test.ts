/**
 * `check` input as a new user writes it (issue 18): expected ids not in the catalog, several
 * bad lines, a CSV question file with a header, an empty file, comments. Real CLI from
 * dist/, real files, a real SQLite catalog of an invented orchard cooperative.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { orchardSeed } from "./helpers/catalog-files.js";
import { ensureBuilt, tp } from "./reliability-cli.js";

ensureBuilt();
const dir = mkdtempSync(join(tmpdir(), "tp-check-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const db = join(dir, "orchards.db");
const write = (name: string, text: string) => writeFileSync(join(dir, name), text);

beforeAll(() => {
  write("orchards.jsonl", orchardSeed());
  expect(tp(dir, "load", "orchards.jsonl", "--db", db).status).toBe(0);
});

describe("check: expected values not in the catalog", () => {
  it("warns with FILE:LINE and the value, and the JSON carries unknownExpected", () => {
    write("typo.tsv", "Who tends Fenwold Orchard?\tg:alai\nWho tends Briskmere Orchard?\tg:bren\n");
    const r = tp(dir, "check", "typo.tsv", "--db", db, "--json");
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/^typo\.tsv:1: warning: expected "g:alai" is neither an entity id nor an exact label in the catalog/m);
    expect(r.stderr).not.toMatch(/typo\.tsv:2/);
    const doc = JSON.parse(r.stdout);
    expect(doc.results[0].unknownExpected).toEqual(["g:alai"]);
    expect(doc.results[1].unknownExpected).toBeUndefined();
    // the text report says why the miss is a miss
    expect(tp(dir, "check", "typo.tsv", "--db", db).stdout).toMatch(/line 1: miss: .*\(not in the catalog: g:alai\)/);
  });
});

describe("check: bad lines", () => {
  it("reports every bad line, not only the first, and runs nothing", () => {
    write("bad.tsv", "a?\tb\tunique\td\n\tg:alia\nWho tends Fenwold Orchard?\n" + "x".repeat(2001) + "\n");
    const r = tp(dir, "check", "bad.tsv", "--db", db);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    const lines = r.stderr.trim().split("\n");
    expect(lines[0]).toMatch(/^tiepoint: bad\.tsv:1: more than three tab-separated fields/);
    expect(lines[1]).toMatch(/^tiepoint: bad\.tsv:2: empty question before the tab/);
    expect(lines[2]).toMatch(/^tiepoint: bad\.tsv:4: the question is 2001 characters long/);
    expect(lines[3]).toBe("tiepoint: bad.tsv: 3 bad lines; no question was run");
  });
  it("stops after 50 errors, as load does", () => {
    write("many.tsv", "\tx\n".repeat(80));
    const r = tp(dir, "check", "many.tsv", "--db", db);
    expect(r.status).toBe(1);
    const lines = r.stderr.trim().split("\n");
    expect(lines).toHaveLength(51);
    expect(lines[49]).toMatch(/many\.tsv:50: empty question/);
    expect(lines[50]).toBe("tiepoint: many.tsv: stopped after 50 errors; no question was run");
  });
});

describe("check: a CSV question file", () => {
  it("is read as CSV with a header (question, expected, verdict), quoted commas and # comments included", () => {
    write(
      "q.csv",
      'question,expected,verdict\n# the growers\n\nWho tends Fenwold Orchard?,g:alia,unique\n"Who tends Briskmere Orchard, then?",g:bren|Bren Osk,tied\nWho tends Briskmere Orchard?,,\n',
    );
    const r = tp(dir, "check", "q.csv", "--db", db, "--json");
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.results.map((x: { line: number; question: string }) => [x.line, x.question])).toEqual([
      [4, "Who tends Fenwold Orchard?"],
      [5, "Who tends Briskmere Orchard, then?"],
      [6, "Who tends Briskmere Orchard?"],
    ]);
    expect(doc.results[1].expected).toEqual(["g:bren", "Bren Osk"]);
    expect(doc.results[0].expectedVerdict).toBe("unique");
    expect(doc.results[2].expectedVerdict).toBeUndefined();
    expect(doc.summary.withExpected).toBe(2);
    // a verdict other than the file's is a reason to look
    expect(tp(dir, "check", "q.csv", "--db", db).stdout).toMatch(/line 5: verdict: verdict unique, but 2 answers were expected/);
  });
  it("refuses a header that does not name the columns, a bad verdict and an unclosed quote, each with its line", () => {
    write("noheader.csv", "Who tends Fenwold Orchard?,g:alia\n");
    const r = tp(dir, "check", "noheader.csv", "--db", db);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/noheader\.csv:1: CSV header: column 1 is "Who tends Fenwold Orchard\?"; a question file's columns are question, expected and verdict/);
    write("bad.csv", 'question,verdict\nWho?,maybe\nWhy?,tied,extra\n"unclosed\n');
    const b = tp(dir, "check", "bad.csv", "--db", db);
    expect(b.status).toBe(1);
    expect(b.stderr).toMatch(/bad\.csv:2: verdict "maybe": expected one of unique, tied, weak, none/);
    expect(b.stderr).toMatch(/bad\.csv:3: 3 cells, but the header names 2 columns/);
    expect(b.stderr).toMatch(/bad\.csv:4: CSV syntax error/);
  });
});

describe("check: a file with no question", () => {
  it("an empty file, or only comments and blanks, is exit 1 with one line", () => {
    write("empty.tsv", "");
    write("comments.tsv", "# nothing yet\n\n   \n");
    write("header.csv", "question,expected\n");
    for (const f of ["empty.tsv", "comments.tsv", "header.csv"]) {
      const r = tp(dir, "check", f, "--db", db);
      expect(r.status).toBe(1);
      expect(r.stdout).toBe("");
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toMatch(new RegExp(`^tiepoint: ${f.replace(".", "\\.")}: no questions`));
    }
  });
  it("--help documents comments, blank lines and the CSV layout", () => {
    const h = tp(dir, "check", "--help").stdout;
    expect(h).toMatch(/lines starting with # are\s+skipped/);
    expect(h).toMatch(/\*\.csv is read as CSV/);
  });
});

/**
 * `check` with an expected-verdict column (issue 17): `question<TAB>expected<TAB>verdict` (and
 * an empty expected field with verdict `none` for "no answer expected"), verdict accuracy and
 * the confusion matrix (expected × got) in the summary, and per-question mismatch flags, in
 * every report format (text, JSON, TSV, Markdown, HTML). Real CLI from dist/, a real SQLite
 * catalog of an invented orchard cooperative.
 *
 * What is asserted is the bookkeeping, not tiepoint's verdicts (the reader is being rewritten):
 * every count of the matrix is recomputed here from the per-question statuses of the JSON
 * document, and each mismatch flag must appear exactly for the questions whose verdict
 * differs from the expected one.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseQuestionText } from "../src/pipeline/index.js";
import { orchardSeed } from "./helpers/catalog-files.js";
import { ensureBuilt, tp } from "./reliability-cli.js";

ensureBuilt();
const dir = mkdtempSync(join(tmpdir(), "tp-checkv-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const db = join(dir, "orchards.db");
const write = (name: string, text: string) => writeFileSync(join(dir, name), text);
const STATUSES = ["unique", "tied", "weak", "none"] as const;

// one question per expectation; the expected verdicts are what the invented catalog makes true:
// Alia tends one orchard, two growers tend Briskmere, no one in the catalog is called Quillon
const QUESTIONS = [
  ["Which orchard does Alia Tormund tend?", "o:fenwold", "unique"],
  ["Who tends Briskmere Orchard?", "g:bren|g:cato", "tied"],
  ["Who tends Fenwold Orchard?", "g:alia", "unique"],
  ["Which orchard does Quillon Vasse tend?", "", "none"],
  ["Who tends Briskmere Orchard?", "g:bren|g:cato", "unique"],
] as const;

beforeAll(() => {
  write("orchards.jsonl", orchardSeed(['{"id":"g:cato","label":"Cato Lisle","types":["t:Grower"],"relations":{"r:tends":["o:brisk"]}}']));
  expect(tp(dir, "load", "orchards.jsonl", "--db", db).status).toBe(0);
  write("verdicts.tsv", "# question<TAB>expected<TAB>verdict\n" + QUESTIONS.map((q) => q.join("\t")).join("\n") + "\n");
});

interface Doc {
  results: { line: number; expected: string[]; expectedVerdict?: string; verdictMatch?: boolean; answer: { verdict: { status: string } } }[];
  summary: { verdictCheck?: { questions: number; accuracy: number; confusion: Record<string, Record<string, number>> } };
}

function jsonDoc(): Doc {
  const r = tp(dir, "check", "verdicts.tsv", "--db", db, "--json");
  expect(r.status).toBe(0);
  return JSON.parse(r.stdout) as Doc;
}

describe("check: the expected-verdict column", () => {
  it("parses question<TAB>expected<TAB>verdict, an empty expected field with none, and refuses an unknown verdict", () => {
    const items = parseQuestionText("A?\tx|y\ttied\nB?\t\tnone\nC?\tz\nD?\t\tUnique\n", "q.tsv");
    expect(items.map((i) => [i.expected, i.verdict])).toEqual([[["x", "y"], "tied"], [[], "none"], [["z"], undefined], [[], "unique"]]);
    expect(() => parseQuestionText("A?\tx\tsure\n", "q.tsv")).toThrow(/^verdict "sure": expected one of unique, tied, weak, none/);
    write("bad-verdict.tsv", "Who tends Fenwold Orchard?\tg:alia\tsure\n");
    const r = tp(dir, "check", "bad-verdict.tsv", "--db", db);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^tiepoint: bad-verdict\.tsv:1: verdict "sure": expected one of unique, tied, weak, none/m);
  });

  it("JSON: verdictMatch per question, verdict accuracy and the confusion matrix recomputed from the statuses", () => {
    const doc = jsonDoc();
    expect(doc.results.map((r) => r.expectedVerdict)).toEqual(QUESTIONS.map((q) => q[2]));
    const confusion = Object.fromEntries(STATUSES.map((e) => [e, Object.fromEntries(STATUSES.map((g) => [g, 0]))]));
    let right = 0;
    for (const r of doc.results) {
      expect(r.verdictMatch).toBe(r.expectedVerdict === r.answer.verdict.status);
      confusion[r.expectedVerdict!]![r.answer.verdict.status]!++;
      if (r.verdictMatch) right++;
    }
    expect(doc.summary.verdictCheck).toEqual({ questions: QUESTIONS.length, accuracy: right / QUESTIONS.length, confusion });
    // questions 2 and 5 are the same question with different expectations: one of them is a mismatch
    expect(doc.results[1]!.verdictMatch).not.toBe(doc.results[4]!.verdictMatch);
  });

  it("a file without verdicts has no verdictCheck (the JSON stays as it was)", () => {
    write("plain.tsv", "Who tends Fenwold Orchard?\tg:alia\n");
    const doc = JSON.parse(tp(dir, "check", "plain.tsv", "--db", db, "--json").stdout) as Doc;
    expect(doc.summary.verdictCheck).toBeUndefined();
    expect(doc.results[0]!.verdictMatch).toBeUndefined();
  });

  it("text: accuracy line, matrix rows, and one 'verdict mismatch' line per mismatching question", () => {
    const doc = jsonDoc();
    const text = tp(dir, "check", "verdicts.tsv", "--db", db).stdout;
    const vc = doc.summary.verdictCheck!;
    expect(text).toContain(`verdict accuracy ${vc.accuracy.toFixed(3)} (${QUESTIONS.length} questions with an expected verdict)`);
    for (const e of STATUSES) expect(text).toMatch(new RegExp(`^ {4}${e} +${STATUSES.map((g) => String(vc.confusion[e]![g])).join(" +")} +\\d+$`, "m"));
    const mismatches = doc.results.filter((r) => !r.verdictMatch);
    expect((text.match(/^ {2}verdict mismatch: /gm) ?? []).length).toBe(mismatches.length);
    // the wording names what was expected: two answers for the 'tied' question
    const tiedMiss = doc.results.find((r) => r.expectedVerdict === "tied" && !r.verdictMatch);
    if (tiedMiss) expect(text).toContain(`verdict ${tiedMiss.answer.verdict.status}, but 2 answers were expected`);
    const noneMiss = doc.results.find((r) => r.expectedVerdict === "none" && !r.verdictMatch);
    if (noneMiss) expect(text).toContain(`verdict ${noneMiss.answer.verdict.status}, but no answer was expected`);
  });

  it("TSV: expected_verdict and verdict_match columns agree with the JSON", () => {
    const doc = jsonDoc();
    const rows = tp(dir, "check", "verdicts.tsv", "--db", db, "--format", "tsv").stdout.trim().split("\n").map((l) => l.split("\t"));
    const head = rows[0]!;
    const ev = head.indexOf("expected_verdict");
    const vm = head.indexOf("verdict_match");
    const flags = head.indexOf("needs_look");
    expect(ev).toBeGreaterThan(0);
    rows.slice(1).forEach((r, i) => {
      const d = doc.results[i]!;
      expect(r[ev]).toBe(d.expectedVerdict);
      expect(r[vm]).toBe(d.verdictMatch ? "yes" : "no");
      expect(r[flags]!.split("|").includes("verdict")).toBe(!d.verdictMatch);
    });
  });

  it("Markdown: the accuracy sentence and the matrix table; mismatching rows show the expected verdict", () => {
    const doc = jsonDoc();
    const md = tp(dir, "check", "verdicts.tsv", "--db", db, "--format", "md").stdout;
    const vc = doc.summary.verdictCheck!;
    expect(md).toContain(`Verdict accuracy **${vc.accuracy.toFixed(3)}** over ${QUESTIONS.length} questions`);
    for (const e of STATUSES) expect(md).toContain(`| ${e} | ${STATUSES.map((g) => String(vc.confusion[e]![g])).join(" | ")} |`);
    const shown = (md.match(/\(expected (unique|tied|weak|none)\)/g) ?? []).length;
    expect(shown).toBe(doc.results.filter((r) => !r.verdictMatch).length);
  });

  it("HTML: the accuracy tile and the confusion table with every count", () => {
    const doc = jsonDoc();
    const html = tp(dir, "check", "verdicts.tsv", "--db", db, "--format", "html").stdout;
    const vc = doc.summary.verdictCheck!;
    expect(html).toContain(`<div class="tile-value">${vc.accuracy.toFixed(3)}</div><div class="tile-name">verdict accuracy</div>`);
    for (const e of STATUSES) expect(html).toContain(`<tr><th>${e}</th>${STATUSES.map((g) => `<td class="num">${vc.confusion[e]![g]}</td>`).join("")}`);
    expect((html.match(/<span class="flag">verdict: verdict /g) ?? []).length).toBeGreaterThanOrEqual(doc.results.filter((r) => !r.verdictMatch).length);
  });
});

/**
 * A new user's catalog in two formats (issue 18): an invented observatory network (42
 * entities, 62 edges; test/fixtures/observatory, written from one fact list as Turtle and
 * as CSV entity rows + CSV edge rows), loaded through the real CLI into two SQLite catalogs,
 * and ten questions whose expected answers the fixture's author wrote from that fact list
 * (q.tsv). The two formats must give the same answers, and the questions must be answered.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ensureBuilt, ROOT, tp } from "./reliability-cli.js";

ensureBuilt();
const FIX = join(ROOT, "test/fixtures/observatory");
const dir = mkdtempSync(join(tmpdir(), "tp-newuser-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Result {
  line: number;
  rank: number | null;
  answer: { answers: { label: string }[]; verdict: { status: string } };
}

describe("an observatory network in Turtle and in CSV", () => {
  it("loads both, and check gives the same answers from both", () => {
    const ttl = join(dir, "ttl.db");
    const csv = join(dir, "csv.db");
    const a = tp(FIX, "load", "network.ttl", "--db", ttl);
    expect(a.status, a.stderr).toBe(0);
    const b = tp(FIX, "load", "network.csv", "edges.csv", "--db", csv);
    expect(b.status, b.stderr).toBe(0);
    for (const s of [a.stderr, b.stderr]) expect(s).toMatch(/\+47 entities, \+62 edges, \+26 attributes/); // 42 + 5 types; 62 edges; 8×2 + 10 values
    const fromTtl = JSON.parse(tp(FIX, "check", "q.tsv", "--db", ttl, "--json").stdout);
    const fromCsv = JSON.parse(tp(FIX, "check", "q.tsv", "--db", csv, "--json").stdout);
    const view = (doc: { results: Result[] }) => doc.results.map((r) => [r.line, r.rank, r.answer.verdict.status, r.answer.answers.slice(0, 3).map((x) => x.label)]);
    expect(view(fromCsv)).toEqual(view(fromTtl));
    expect(fromTtl.summary.questions).toBe(10);
    expect(fromTtl.summary.hits1).toBeGreaterThanOrEqual(0.9);
  });
});

/**
 * Superlative, comparison and count questions over the Debian package slice
 * (test/fixtures/debian; Debian 12 "bookworm" main amd64), answered by tiepoint and checked
 * for identity against the SQL reference: the same stanzas parsed directly into plain tables
 * of an in-memory SQLite (src/eval/debian-reference.ts, not tiepoint's importer) and queried
 * with SQL (src/eval/debian-conditions.ts `benchQuestions`: sets chosen by their size from the data).
 * One set (250) is larger than the ranking's 200 candidates (RANK_DEFAULTS.limit): the
 * conditions take the reading's whole matched set. "Which dependency of X …" reads the
 * relation noun with X as the subject (X's own dependencies), also against SQL.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { agrees, benchQuestions, dependencyQuestions } from "../src/eval/debian-conditions.js";
import { debianReference } from "../src/eval/debian-reference.js";
import { Session } from "../src/pipeline/index.js";
import { buildDebianSliceCatalog, debianSliceText } from "./helpers/debian-catalog.js";

let dir: string;
let session: Session;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tp-debian-cond-"));
  session = Session.open({ db: buildDebianSliceCatalog(dir) });
});
afterAll(() => {
  session.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("Debian slice: conditions against the SQL reference", () => {
  it("answers superlative, comparison and count questions as SQL over the raw stanzas does", () => {
    const ref = debianReference(debianSliceText());
    const questions = [...benchQuestions(ref, [2, 5, 10, 25, 60, 250]), ...dependencyQuestions(ref, 4)];
    expect(questions).toHaveLength(22);
    expect(Math.max(...questions.map((q) => q.setSize))).toBeGreaterThan(200);
    const wrong = questions.flatMap((q) => {
      const r = session.ask(q.question, { timeLimitMs: 0 }).result;
      return agrees(q, r) ? [] : [`${q.question} → ${r.count?.value ?? r.answers[0]?.label} (SQL: ${JSON.stringify(q.gold)})`];
    });
    ref.close();
    expect(wrong).toEqual([]);
  });
});

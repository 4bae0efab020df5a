/**
 * Superlative, comparison and count questions over the Debian package slice
 * (test/fixtures/debian; Debian 12 "bookworm" main amd64), answered by tiepoint and checked
 * for identity against the SQL reference: the same stanzas parsed directly into plain tables
 * of an in-memory SQLite (src/eval/debian-reference.ts, not tiepoint's importer) and queried
 * with SQL (src/eval/debian-conditions.ts `benchQuestions`: sets chosen by their size from the data).
 * The sizes stay within the ranking's 200 candidates (RANK_DEFAULTS.limit), the sets a
 * ranking can hold whole.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { agrees, benchQuestions } from "../src/eval/debian-conditions.js";
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
    const questions = benchQuestions(ref, [2, 5, 10, 25, 60]);
    expect(questions).toHaveLength(15);
    const wrong = questions.flatMap((q) => {
      const r = session.ask(q.question, { timeLimitMs: 0 }).result;
      return agrees(q, r) ? [] : [`${q.question} → ${r.count?.value ?? r.answers[0]?.label} (SQL: ${JSON.stringify(q.gold)})`];
    });
    ref.close();
    expect(wrong).toEqual([]);
  });
});

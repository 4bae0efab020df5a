/**
 * Limits that protect the machine (issue 10; src/model/limits.ts, README "Failure modes"):
 * question length, mentions per question, answers per question (--top), question-file size
 * and length, and the path search bounds. Over-limit input gets one clear line: exit 1 for
 * input, 2 for a flag value. In-process on the demo catalog, and through the built CLI.
 * The figures compared are the documented ones (LIMITS, README) — no measured numbers.
 */
import { mkdtempSync, readFileSync, truncateSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BFS_DEFAULTS, EVIDENCE_DEFAULTS, PATH_DEFAULTS } from "../src/explain/index.js";
import { LIMITS, TiepointError } from "../src/model/index.js";
import { parseQuestionFile, parseQuestionText, Session } from "../src/pipeline/index.js";
import { askJson } from "../src/present/index.js";
import { validateAskJson } from "./reliability-contract.js";
import { ensureBuilt, ROOT, tp } from "./reliability-cli.js";

let session: Session;
let dir = "";

beforeAll(() => {
  ensureBuilt();
  session = Session.open();
  dir = mkdtempSync(join(tmpdir(), "tp-rel-lim-"));
});
afterAll(() => session?.close());

function refusal(f: () => unknown): TiepointError {
  try {
    f();
  } catch (e) {
    if (e instanceof TiepointError) return e;
    throw e;
  }
  throw new Error("not refused");
}

describe("documented limits", () => {
  it("LIMITS agree with the explain stage's path search bounds and the README", () => {
    expect(LIMITS.maxPathHops).toBe(PATH_DEFAULTS.maxHops);
    expect(LIMITS.pathNodeBudget).toBe(PATH_DEFAULTS.nodeBudget);
    expect(EVIDENCE_DEFAULTS.nodeBudget).toBeLessThanOrEqual(LIMITS.pathNodeBudget);
    expect(BFS_DEFAULTS.maxHops).toBeLessThanOrEqual(LIMITS.maxPathHops);
    const readme = readFileSync(join(ROOT, "README.md"), "utf8");
    const section = readme.slice(readme.indexOf("## Failure modes"));
    for (const n of [LIMITS.maxQuestionChars, LIMITS.maxMentions, LIMITS.maxTop, LIMITS.maxQuestions, LIMITS.maxPathHops, LIMITS.pathNodeBudget])
      expect(section).toContain(n.toLocaleString("en-US"));
    expect(section).toContain(`${LIMITS.maxQuestionFileBytes / (1024 * 1024)} MiB`);
  });
});

describe("over-limit input, in-process", () => {
  it("a question of exactly the limit is answered; one character more is refused in one line", () => {
    const at = "Which ship is moored at " + "x ".repeat(LIMITS.maxQuestionChars);
    const ok = at.slice(0, LIMITS.maxQuestionChars);
    const out = session.ask(ok);
    const order = out.ranked.candidates.map((c) => session.ref(c.node).id);
    expect(validateAskJson(JSON.parse(askJson(out.result)), ok, session.catalog, 10, order)).toEqual([]);
    const e = refusal(() => session.ask(ok + "y"));
    expect(e.code).toBe("pipeline/limit");
    expect(e.message).toBe(`the question is ${LIMITS.maxQuestionChars + 1} characters long; the limit is ${LIMITS.maxQuestionChars} (ask a shorter question)`);
  });

  it("top above the limit is refused", () => {
    expect(refusal(() => session.ask("harbour", { top: LIMITS.maxTop + 1 })).message).toMatch(/over the limit of 1000 answers/);
    expect(session.ask("harbour", { top: LIMITS.maxTop }).result.answers.length).toBeLessThanOrEqual(LIMITS.maxTop);
  });

  it(`at most ${LIMITS.maxMentions} mentions become clues; the rest are dropped with a note`, () => {
    const names = session.catalog.db.prepare("SELECT label FROM entity WHERE label IS NOT NULL AND length(label) > 6 ORDER BY num LIMIT 60").pluck().all() as string[];
    const q = names.join(", ");
    const out = session.ask(q);
    expect(out.result.mentions.length).toBeLessThanOrEqual(LIMITS.maxMentions);
    expect(out.analysis.clues.length).toBeLessThanOrEqual(LIMITS.maxMentions);
    expect(out.result.notes?.some((n) => n.includes(`only the ${LIMITS.maxMentions} most confident are used`))).toBe(true);
    const order = out.ranked.candidates.map((c) => session.ref(c.node).id);
    expect(validateAskJson(JSON.parse(askJson(out.result)), q, session.catalog, 10, order)).toEqual([]);
  });

  it("question files: a too-long question and too many questions are refused with FILE:LINE", () => {
    const long = refusal(() => parseQuestionText(`short one\n${"w".repeat(LIMITS.maxQuestionChars + 1)}\tx\n`, "q.tsv"));
    expect(long.format()).toMatch(/^q\.tsv:2: the question is 2001 characters long/);
    const many = refusal(() => parseQuestionText("q\n".repeat(LIMITS.maxQuestions + 1), "many.txt"));
    expect(many.format()).toBe(`many.txt:${LIMITS.maxQuestions + 1}: more than ${LIMITS.maxQuestions} questions in one file (split it into smaller files)`);
    const big = join(dir, "big.txt");
    writeFileSync(big, "");
    truncateSync(big, LIMITS.maxQuestionFileBytes + 1); // sparse: refused by its size before any read
    expect(refusal(() => parseQuestionFile(big)).format()).toBe(`${big}: the question file is ${LIMITS.maxQuestionFileBytes + 1} bytes; the limit is ${LIMITS.maxQuestionFileBytes} bytes (split it into smaller files)`);
  });
});

describe("over-limit input through the CLI", () => {
  it("ask: a too-long question exits 1 with one line; --top over the limit exits 2", () => {
    const r = tp(dir, "ask", "q".repeat(LIMITS.maxQuestionChars + 5));
    expect(r.status).toBe(1);
    expect(r.stderr).toBe(`tiepoint: the question is ${LIMITS.maxQuestionChars + 5} characters long; the limit is ${LIMITS.maxQuestionChars} (ask a shorter question)\n`);
    const t = tp(dir, "ask", "harbour", "--top", String(LIMITS.maxTop + 1));
    expect(t.status).toBe(2);
    expect(t.stderr).toBe(`tiepoint: --top ${LIMITS.maxTop + 1} is over the limit of ${LIMITS.maxTop} answers per question\n`);
    expect(t.stdout).toBe("");
  });

  it("check: an oversized question file exits 1 with one FILE: line and prints nothing on stdout", () => {
    const big = join(dir, "huge.tsv");
    writeFileSync(big, "");
    truncateSync(big, LIMITS.maxQuestionFileBytes + 1);
    const r = tp(dir, "check", "huge.tsv", "--json");
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe(`tiepoint: huge.tsv: the question file is ${LIMITS.maxQuestionFileBytes + 1} bytes; the limit is ${LIMITS.maxQuestionFileBytes} bytes (split it into smaller files)\n`);
  });
});

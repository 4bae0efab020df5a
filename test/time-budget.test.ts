/**
 * The time budget per question (README "Time budget"): a question given a budget it cannot
 * meet (1 ms) on a real catalog — the Debian package slice, test/fixtures/debian — comes back
 * with the answers found so far, the long stages cut and named in a note and in the JSON field
 * `budget`; the same question without a limit runs every stage. A fresh session's first
 * question does the same (the name index's trigram table and description index and the
 * numeric columns come from files written with the load, so it builds nothing). Timing is asserted only
 * against a generous margin (no timing precision: the machine may be busy). `check` counts
 * the questions that hit the budget, in its JSON summary and its text.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { buildDebianSliceCatalog } from "./helpers/debian-catalog.js";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const MAIN = join(ROOT, "dist/cli/main.js");
/** Generous: a 1 ms budget must not turn into seconds of work (the unlimited run takes longer on this catalog). */
const MARGIN_MS = 5000;
const QUESTION = "Which dependency of wget has the smallest installed size?";

let dir: string;
let db: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tp-budget-"));
  db = buildDebianSliceCatalog(dir);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (...args: string[]) => spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: "utf8", env: { ...process.env, TIEPOINT_DEBUG: "" } });

describe("time budget per question", () => {
  it("a 1 ms budget returns the answer so far, with the cut stages named; no limit runs them all", () => {
    const session = Session.open({ db });
    try {
      const full = session.ask(QUESTION, { timeLimitMs: 0, verifySuggestions: true, whyNot: ["libc6"] });
      expect(full.result.budget).toBeUndefined();
      expect(full.explanation!.ablation.length).toBeGreaterThan(0);
      expect(full.explanation!.whyNot.length).toBe(1);
      const t0 = performance.now();
      const cut = session.ask(QUESTION, { timeLimitMs: 1, verifySuggestions: true, whyNot: ["libc6"] });
      const ms = performance.now() - t0;
      expect(ms).toBeLessThan(1 + MARGIN_MS);
      const budget = cut.result.budget!;
      expect(budget).toMatchObject({ limitMs: 1, hit: true });
      expect(budget.cut).toEqual(expect.arrayContaining(["ablation", "why-not"]));
      // linking's optional passes, the ranking's cue-path check and the first answer's alternative paths look at it too
      expect(budget.cut).toEqual(expect.arrayContaining(["linking", "ranking", "paths"]));
      expect(cut.result.answers[0]!.paths.length).toBeLessThanOrEqual(full.result.answers[0]!.paths.length);
      expect(cut.explanation!.ablation).toEqual([]);
      // the path search of why-not is cut; the report keeps only the figures read without a search
      expect(full.explanation!.whyNot[0]!.perClue.length).toBeGreaterThan(0);
      expect(cut.explanation!.whyNot.every((w) => w.perClue.length === 0)).toBe(true);
      expect(cut.result.notes!.some((n) => n.startsWith("time limit of 1 ms reached:") && n.includes("ablation"))).toBe(true);
      // the ranking is never cut: the answers so far are the full run's, best first
      expect(cut.result.answers[0]!.id).toBe(full.result.answers[0]!.id);
      // only the best answer keeps its paths once the paths stage is cut
      if (budget.cut.includes("paths")) expect(cut.result.answers.slice(1).every((a) => a.paths.length === 0)).toBe(true);
      expect(cut.result.answers[0]!.paths.length).toBeGreaterThan(0);
    } finally {
      session.close();
    }
  });

  it("a session's first question, given 1 ms, returns within the margin too: what it needs once per catalog is opened from the load's files, not built", () => {
    const reference = Session.open({ db });
    let full;
    try {
      full = reference.ask(QUESTION, { timeLimitMs: 0 }).result;
    } finally {
      reference.close();
    }
    // a fresh session: its first question is the one that would build the one-time structures
    const session = Session.open({ db });
    try {
      const t0 = performance.now();
      const first = session.ask(QUESTION, { timeLimitMs: 1, verifySuggestions: true, whyNot: ["libc6"] });
      expect(performance.now() - t0).toBeLessThan(1 + MARGIN_MS);
      expect(first.result.budget).toMatchObject({ limitMs: 1, hit: true });
      expect(first.result.notes!.some((n) => n.startsWith("time limit of 1 ms reached:"))).toBe(true);
      expect(first.result.answers[0]!.id).toBe(full.answers[0]!.id);
      // the name index carries the trigram table and the description index (read, never built, so no budget is asked)
      let asked = 0;
      expect(
        session.linker.descriptions(() => {
          asked++;
          return true;
        }),
      ).toBeDefined();
      expect(asked).toBe(0);
    } finally {
      session.close();
    }
  });

  it("ask --time-limit 1 --json carries the budget; a bad value is a usage error", () => {
    const r = cli("ask", QUESTION, "--db", db, "--json", "--time-limit", "1");
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { budget?: { limitMs: number; hit: boolean; cut: string[] } };
    expect(doc.budget).toMatchObject({ limitMs: 1, hit: true });
    const bad = cli("ask", QUESTION, "--db", db, "--time-limit", "soon");
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split("\n")).toHaveLength(1);
    expect(bad.stderr).toContain("--time-limit");
  });

  it("check counts the questions that hit the budget (JSON summary and text)", () => {
    const file = join(dir, "q.txt");
    writeFileSync(file, `${QUESTION}\nWhich packages depend on wget?\n`);
    const r = cli("check", file, "--db", db, "--json", "--time-limit", "1");
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { results: { answer: { budget?: unknown } }[]; summary: { budgetHit: number; timeLimitMs: number } };
    expect(doc.summary.timeLimitMs).toBe(1);
    expect(doc.summary.budgetHit).toBe(doc.results.filter((x) => x.answer.budget !== undefined).length);
    expect(doc.summary.budgetHit).toBeGreaterThan(0);
    const text = cli("check", file, "--db", db, "--time-limit", "0");
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/time limit\s+0 of 2 questions hit the time budget/);
  });
});

/**
 * The worker engine of the terminal screen (built code in dist/, as the CLI runs it): the
 * catalog opens in a worker thread, so the screen's thread keeps running and receives
 * progress while the relation index is built; answers that cross the thread boundary equal
 * the in-process Session's contract document for the same question.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { Catalog, demoCatalogPath } from "../src/catalog/index.js";
import { Session } from "../src/pipeline/index.js";
import type { OpenProgress, TuiEngine } from "../src/present/tui/index.js";

const ROOT = resolve(__dirname, "..");
const DIST_TUI = join(ROOT, "dist/present/tui/index.js");
let dir: string;
let db: string;

beforeAll(() => {
  if (!existsSync(DIST_TUI)) throw new Error(`${DIST_TUI} is missing: build first (npm run build, or npm test which builds)`);
  // a fresh copy of the demo catalog: no index snapshot beside it, so opening must build one
  dir = mkdtempSync(join(tmpdir(), "tiepoint-tui-worker-"));
  db = join(dir, "copy.db");
  const src = Catalog.open(demoCatalogPath(), { readonly: true });
  src.db.exec(`VACUUM INTO '${db.replace(/'/g, "''")}'`);
  src.close();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("worker engine", () => {
  it("opens off the screen's thread with progress, and answers like the in-process Session", async () => {
    const { workerEngine } = (await import(pathToFileURL(DIST_TUI).href)) as { workerEngine: (s: { db?: string }, p?: (x: OpenProgress) => void) => Promise<TuiEngine> };
    const progress: OpenProgress[] = [];
    let ticks = 0;
    const timer = setInterval(() => ticks++, 1);
    let engine: TuiEngine;
    try {
      engine = await workerEngine({ db }, (p) => progress.push(p));
    } finally {
      clearInterval(timer);
    }
    // the main thread ran timers while the worker opened the catalog (common practice: a
    // blocked event loop runs no timers at all)
    expect(ticks).toBeGreaterThan(0);
    const phases = progress.map((p) => p.phase);
    expect(phases.some((p) => /relation index/.test(p))).toBe(true);
    expect(existsSync(`${db}.idx`)).toBe(true); // the index was built and saved beside the copy
    expect(engine.title).toMatch(/copy\.db · \d+ entities/);

    const question = readFileSync(join(ROOT, "data/demo-questions.tsv"), "utf8").split("\n")[0]!.split("\t")[0]!;
    const view = await engine.ask(question, [], 5);
    const session = Session.open({ db });
    try {
      const truth = session.ask(question, { top: 5 }).result;
      expect(view.result.answers.map((a) => a.id)).toEqual(truth.answers.map((a) => a.id));
      expect(view.result.verdict.status).toBe(truth.verdict.status);
      const card = await engine.card(truth.answers[0]!.id);
      expect(card?.label).toBe(truth.answers[0]!.label);
      expect(await engine.card("no-such-entity-id")).toBeNull();
    } finally {
      session.close();
      engine.close();
    }
  });

  it("reports a catalog that cannot be opened as an error, not a hang", async () => {
    const { workerEngine } = (await import(pathToFileURL(DIST_TUI).href)) as { workerEngine: (s: { db?: string }) => Promise<TuiEngine> };
    await expect(workerEngine({ db: join(dir, "missing.db") })).rejects.toThrow(/catalog not found/);
  });
});

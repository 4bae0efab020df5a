/**
 * `ask` and `check` while a `load` writes the same catalog (issue 10), all real processes.
 * The load adds North Quay and the boat Skua docked there (plus 30,000 filler entities, so it
 * runs for a while). Before it commits, "Which boat is docked at North Quay?" cannot link
 * North Quay and no answer is Skua; after, North Quay is linked and Skua is the first answer
 * (hand-derived from the two files). A mixture — North Quay linked but Skua not found, or the
 * reverse — would show that a process read parts of two catalog states. Every `check` run must
 * see one state for all its questions (the session holds one read transaction, SQLite WAL
 * snapshot isolation: https://www.sqlite.org/wal.html), and no process may fail (busy timeout).
 * Complements test/catalog-concurrency.test.ts (catalog reads and `show` during a load).
 */
import { spawn } from "node:child_process";
import { copyFileSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import { Session } from "../src/pipeline/index.js";
import { BOAT_SEED } from "./helpers/catalog-files.js";
import { BUILD_IN_FLUX, ensureBuilt, MAIN, tp } from "./reliability-cli.js";

let dir = "";
let db = "";
const QUESTION = "Which boat is docked at North Quay?";

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-rel-conc-"));
  db = join(dir, "c.db");
  writeFileSync(join(dir, "seed.jsonl"), BOAT_SEED);
  // the filler entities first, then their edges, then North Quay and Skua (the load's effect)
  const lines: string[] = [];
  for (let i = 0; i < 30_000; i++) lines.push(`{"id":"k:f${i}","label":"Filler item ${i}"}`);
  for (let i = 0; i < 30_000; i++) lines.push(`{"kind":"edge","subject":"k:f${i}","relation":"k:next","object":"k:f${(i * 7 + 1) % 30_000}"}`);
  lines.push('{"id":"q:north","label":"North Quay"}', '{"id":"b:skua","label":"Skua","types":["t:Boat"],"relations":{"r:dockedAt":["q:north"]}}', "");
  writeFileSync(join(dir, "more.jsonl"), lines.join("\n"));
  writeFileSync(join(dir, "qs.tsv"), Array.from({ length: 6 }, () => `${QUESTION}\tb:skua`).join("\n") + "\n");
  const r = tp(dir, "load", "seed.jsonl", "--db", db);
  expect(r.status, r.stderr).toBe(0);
});

type Run = { args: string[]; started: number; ended: number; code: number | null; stdout: string; stderr: string };

/** Spawns `tiepoint ARGS…`; a module-load failure of a build running at the same moment is retried (never tiepoint's own output). */
async function run(args: string[]): Promise<Run> {
  for (let attempt = 0; ; attempt++) {
    const r = await runOnce(args);
    if (attempt >= 5 || !BUILD_IN_FLUX.test(r.stderr)) return r;
    await new Promise((w) => setTimeout(w, 2000));
  }
}

function runOnce(args: string[]): Promise<Run> {
  return new Promise((done) => {
    const started = Date.now();
    const child = spawn(process.execPath, [MAIN, ...args], { cwd: dir, env: { ...process.env, TIEPOINT_DEBUG: "" } });
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (d) => (stdout += String(d)));
    child.stderr.on("data", (d) => (stderr += String(d)));
    child.on("exit", (code) => done({ args, started, ended: Date.now(), code, stdout, stderr }));
  });
}

/** "before" or "after" for one ask document, or a description of the mixture. */
function stateOf(doc: { mentions: { entity: { id: string } }[]; answers: { id: string; paths: { from: string }[] }[] }): string {
  const linked = doc.mentions.some((m) => m.entity.id === "q:north");
  const skua = doc.answers.findIndex((a) => a.id === "b:skua");
  if (!linked && skua < 0) return "before";
  if (linked && skua === 0 && doc.answers[0]!.paths.some((p) => p.from === "q:north")) return "after";
  return `mixture (North Quay linked: ${linked}, Skua at ${skua})`;
}

describe("ask and check while a load writes the same catalog", () => {
  it("answer from the state before or after the load, never a mixture, never a lock error", async () => {
    const load = run(["load", "more.jsonl", "--db", db]);
    let loading = true;
    void load.then(() => (loading = false));
    const runs: Run[] = [];
    const worker = async (args: string[]) => {
      while (loading) runs.push(await run(args));
    };
    await Promise.all([worker(["ask", QUESTION, "--db", db, "--json"]), worker(["check", "qs.tsv", "--db", db, "--json"]), load]);
    // and once more after the load
    runs.push(await run(["ask", QUESTION, "--db", db, "--json"]), await run(["check", "qs.tsv", "--db", db, "--json"]));
    const l = await load;
    expect(l.code, l.stderr).toBe(0);
    const states: string[] = [];
    for (const r of runs) {
      expect(r.code, `${r.args.join(" ")}: ${r.stderr}`).toBe(0);
      expect(r.stderr).not.toMatch(/locked|busy/i);
      const doc = JSON.parse(r.stdout);
      if (r.args[0] === "ask") states.push(stateOf(doc));
      else {
        const per = new Set(doc.results.map((x: { answer: Parameters<typeof stateOf>[0] }) => stateOf(x.answer)));
        expect([...per], "one check run saw several catalog states").toHaveLength(1);
        states.push(...per);
      }
    }
    for (const s of states) expect(["before", "after"]).toContain(s);
    expect(states.at(-1)).toBe("after");
    // the runs really overlapped the load: some started before it committed
    expect(runs.filter((r) => r.started < l.ended).length).toBeGreaterThan(1);
  });

  it("in-process: a session opened before a load keeps answering from the earlier state; a new one sees the load", () => {
    const db2 = join(dir, "iso.db");
    const seedCopy = join(dir, "iso-seed.db");
    expect(tp(dir, "load", "seed.jsonl", "--db", seedCopy).status).toBe(0);
    copyFileSync(seedCopy, db2);
    const old = Session.open({ db: db2 });
    try {
      expect(stateOf(old.ask(QUESTION).result)).toBe("before");
      const counts = old.catalog.counts();
      const writer = Catalog.open(db2);
      try {
        loadFiles(writer, [join(dir, "more.jsonl")]); // commits while `old` holds its read transaction
      } finally {
        writer.close();
      }
      expect(stateOf(old.ask(QUESTION).result)).toBe("before");
      // every catalog read of the old session (labels, types, paths) still sees the earlier state
      expect(old.catalog.counts()).toEqual(counts);
      expect(old.catalog.numOf("q:north")).toBeUndefined();
      const fresh = Session.open({ db: db2 });
      try {
        expect(stateOf(fresh.ask(QUESTION).result)).toBe("after");
      } finally {
        fresh.close();
      }
    } finally {
      old.close();
    }
  });
});

/**
 * Readers during a load (issue 10): while `tiepoint load` writes a catalog, other handles and
 * `tiepoint show` keep reading it and always see one committed state — all of it before the
 * load or all of it after, never a mixture — and never fail with a lock error. This is
 * SQLite's WAL snapshot isolation (https://www.sqlite.org/wal.html, "Concurrency") plus the
 * store's busy timeout. Needs a build (npm test builds first).
 */
import { spawn, spawnSync } from "node:child_process";
import { closeSync, mkdtempSync, openSync, writeSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import { ensureBuilt, MAIN } from "./reliability-cli.js";

let dir = "";
let db = "";
let big = "";

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-conc-"));
  db = join(dir, "c.db");
  const seed = join(dir, "seed.jsonl");
  const fd0 = openSync(seed, "w");
  for (let i = 0; i < 100; i++) writeSync(fd0, `{"id":"s:${i}","label":"Seed ${i}","relations":{"s:near":["s:${(i + 1) % 100}"]}}\n`);
  closeSync(fd0);
  const cat = Catalog.open(db, { create: true });
  loadFiles(cat, [seed]);
  cat.close();
  big = join(dir, "big.nt");
  const fd = openSync(big, "w");
  let chunk = "";
  for (let i = 0; i < 20_000; i++) {
    chunk += `<k:e${i}> <http://www.w3.org/2000/01/rdf-schema#label> "Entity number ${i}" .\n<k:e${i}> <k:r> <k:e${(i * 7 + 1) % 20_000}> .\n`;
  }
  writeSync(fd, chunk);
  closeSync(fd);
});

describe("reading while a load writes", () => {
  it("every read sees the state before or after the load, never a mixture, and no lock errors", async () => {
    const reader = Catalog.open(db, { readonly: true });
    const snapshot = reader.db.transaction(() => {
      const c = reader.counts();
      return `${c.entities}/${c.edges}/${c.aliases}`;
    });
    const beforeState = snapshot();
    expect(beforeState).toBe("100/100/100"); // hand-counted from the seed file
    const child = spawn(process.execPath, [MAIN, "load", big, "--db", db], { cwd: dir });
    let stderr = "";
    child.stderr.on("data", (d) => (stderr += String(d)));
    const seen = new Set<string>();
    let reads = 0;
    let shows = 0;
    let running = true;
    const exited = new Promise<number | null>((done) => child.on("exit", (code) => ((running = false), done(code))));
    while (running) {
      seen.add(snapshot());
      reads++;
      if (reads % 5 === 1) {
        let r = spawnSync(process.execPath, [MAIN, "show", "s:1", "--db", db], { encoding: "utf8" });
        // a half-written dist/ (another build at the same moment) fails at module load: retry that only
        for (let k = 0; k < 5 && /SyntaxError: The requested module|ERR_MODULE_NOT_FOUND/.test(r.stderr); k++) {
          await new Promise((ok) => setTimeout(ok, 1000));
          r = spawnSync(process.execPath, [MAIN, "show", "s:1", "--db", db], { encoding: "utf8" });
        }
        expect(r.status, r.stderr).toBe(0);
        expect(r.stdout).toContain("Seed 1  [s:1]");
        shows++;
      }
      await new Promise((r) => setTimeout(r, 15));
    }
    expect(await exited, stderr).toBe(0);
    seen.add(snapshot());
    reader.close();
    // after: 100 + 20,000 entities, 100 + 20,000 edges, 100 + 20,000 labels (hand-computed)
    const afterState = "20100/20100/20100";
    for (const state of seen) expect([beforeState, afterState]).toContain(state);
    expect(seen.has(afterState)).toBe(true);
    // the reads really overlapped the load (it runs for more than a second here)
    expect(reads).toBeGreaterThan(3);
    expect(shows).toBeGreaterThan(0);
  });
});

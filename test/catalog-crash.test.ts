/**
 * Crash safety of `tiepoint load` (issue 2 / issue 10): a load of a large generated file into
 * an existing catalog is killed with SIGKILL at several moments while it writes; afterwards
 * the catalog opens, passes `PRAGMA integrity_check` and holds exactly its earlier rows.
 * Relies on SQLite's write-ahead log: uncommitted frames are ignored on the next open
 * (https://www.sqlite.org/wal.html, "atomic commit"). Needs a build (npm test builds first).
 */
import { closeSync, copyFileSync, mkdtempSync, openSync, writeSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Database from "better-sqlite3";
import { beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import { dumpCatalog, integrity } from "./catalog-dump.js";
import { writeBigNTriples } from "./helpers/catalog-files.js";
import { killLoadWhen, type KilledLoad } from "./helpers/kill-load.js";
import { BUILD_IN_FLUX, ensureBuilt } from "./reliability-cli.js";

let dir = "";
let base = "";
let before = "";
let big = "";

/** Kills a load of the big file at the moment `when`; only a module-load failure of the build itself is retried. */
async function killWhen(db: string, when: { ms: number; walBytes?: number }, extra: string[] = []): Promise<KilledLoad> {
  for (let attempt = 0; ; attempt++) {
    const r = await killLoadWhen(dir, big, db, when, extra);
    if (attempt < 5 && r.signal === null && BUILD_IN_FLUX.test(r.stderr)) {
      await new Promise((ok) => setTimeout(ok, 2000));
      continue;
    }
    return r;
  }
}

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-crash-"));
  base = join(dir, "base.db");
  const seed = join(dir, "seed.nt");
  const fd0 = openSync(seed, "w");
  for (let i = 0; i < 200; i++) writeSync(fd0, `<k:s${i}> <http://www.w3.org/2000/01/rdf-schema#label> "Seed ${i}" .\n<k:s${i}> <k:near> <k:s${(i * 7) % 200}> .\n`);
  closeSync(fd0);
  const cat = Catalog.open(base, { create: true });
  loadFiles(cat, [seed]);
  cat.close();
  const h = new Database(base);
  h.pragma("wal_checkpoint(TRUNCATE)");
  h.close();
  before = dumpCatalog(base);
  // a large file: 30,000 entities with labels and 120,000 edges (150,000 lines, ~9 MB)
  big = join(dir, "big.nt");
  writeBigNTriples(big, 30_000);
});

describe("SIGKILL during load", () => {
  // moments: early (parsing, nothing on disk yet), and three points while the write-ahead
  // log is being written (its first frame, 1 MiB and 4 MiB of ~10 MiB); each run checks
  // that the load was really killed, not finished
  const MOMENTS: { name: string; ms: number; walBytes?: number }[] = [
    { name: "early (300 ms after start)", ms: 300 },
    { name: "at the first WAL frame", ms: 0, walBytes: 33 },
    { name: "at 1 MiB of WAL", ms: 0, walBytes: 1 << 20 },
    { name: "at 4 MiB of WAL", ms: 0, walBytes: 4 << 20 },
  ];
  for (const m of MOMENTS) {
    it(`killed ${m.name}: integrity ok, exactly the earlier content`, async () => {
      const db = join(dir, `k${m.ms}-${m.walBytes ?? 0}.db`);
      copyFileSync(base, db);
      const r = await killWhen(db, m);
      expect(r.signal, `load finished before the kill (${r.stderr})`).toBe("SIGKILL");
      if (m.walBytes !== undefined) expect(r.walAtKill).toBeGreaterThanOrEqual(m.walBytes);
      expect(integrity(db)).toBe("ok");
      expect(dumpCatalog(db)).toBe(before);
      const cat = Catalog.open(db);
      expect(cat.counts().entities).toBe(200);
      cat.close();
    });
  }

  it("killed while a --replace load writes (tables emptied, indexes dropped inside the transaction): earlier content intact", async () => {
    const db = join(dir, "replace.db");
    copyFileSync(base, db);
    const r = await killWhen(db, { ms: 0, walBytes: 2 << 20 }, ["--replace"]);
    expect(r.signal).toBe("SIGKILL");
    expect(integrity(db)).toBe("ok");
    expect(dumpCatalog(db)).toBe(before);
    const indexes = (path: string) => {
      const h = new Database(path, { readonly: true });
      const list = h.prepare("SELECT name, sql FROM sqlite_master WHERE type = 'index' ORDER BY name").raw(true).all();
      h.close();
      return list;
    };
    expect(indexes(db)).toEqual(indexes(base));
    expect(indexes(db).length).toBeGreaterThan(0);
  });
});

/**
 * Bad catalogs on real storage (issue 10), through the built CLI: a catalog on a full disk (a
 * 2 MiB tmpfs) and a catalog on read-only storage (the same tmpfs remounted read-only, so
 * neither SQLite's WAL index PATH-shm nor the index snapshot PATH.idx can be written beside
 * it). The not-SQLite, newer-schema, missing and read-only-file cases are in
 * test/catalog-cli.test.ts. Mounting needs root (CAP_SYS_ADMIN): without it the tests say so
 * and skip. Expected answers are hand-derived from the seed file below.
 */
import { copyFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog } from "../src/catalog/index.js";
import { dumpCatalog, integrity } from "./catalog-dump.js";
import { validateAskJson } from "./reliability-contract.js";
import { ensureBuilt, mountTmpfs, remount, tp, unmount } from "./reliability-cli.js";

let dir = "";
const mounts: string[] = [];

const SEED = [
  '{"kind":"relation","id":"r:dockedAt","label":"docked at","aliases":["moored at"]}',
  '{"kind":"type","id":"t:Boat","label":"boat"}',
  '{"id":"b:wren","label":"Wren","types":["t:Boat"],"relations":{"r:dockedAt":["q:east"]}}',
  '{"id":"b:tern","label":"Tern","types":["t:Boat"],"relations":{"r:dockedAt":["q:west"]}}',
  '{"id":"q:east","label":"East Quay"}',
  '{"id":"q:west","label":"West Quay"}',
  "",
].join("\n");
const QUESTION = "Which boat is docked at East Quay?";

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-rel-cat-"));
  writeFileSync(join(dir, "seed.jsonl"), SEED);
  writeFileSync(join(dir, "q.tsv"), `${QUESTION}\tb:wren\n`);
  // ~4 MB of N-Triples: far more than a 2 MiB disk holds once indexed
  let big = "";
  for (let i = 0; i < 40_000; i++) big += `<k:e${i}> <http://www.w3.org/2000/01/rdf-schema#label> "Entity number ${i}" .\n<k:e${i}> <k:r> <k:e${(i * 7 + 1) % 40_000}> .\n`;
  writeFileSync(join(dir, "big.nt"), big);
});
afterAll(() => {
  for (const m of mounts) unmount(m);
});

/** A fresh 2 MiB tmpfs holding the seed catalog, or why it could not be mounted. */
function seededDisk(name: string): { mnt: string; db: string } | string {
  const mnt = join(dir, name);
  const refused = mountTmpfs(mnt, "2m");
  if (refused) return refused;
  mounts.push(mnt);
  const db = join(mnt, "c.db");
  const r = tp(dir, "load", "seed.jsonl", "--db", db);
  expect(r.status, r.stderr).toBe(0);
  return { mnt, db };
}

describe("bad catalogs on real storage", () => {
  it("a full disk during a load: one line, exit 1, the catalog intact and still answering", (ctx) => {
    const disk = seededDisk("full");
    if (typeof disk === "string") {
      console.warn(`skipped: ${disk}`);
      return ctx.skip();
    }
    const before = dumpCatalog(disk.db);
    const r = tp(dir, "load", "big.nt", "--db", disk.db);
    expect(r.status).toBe(1);
    expect(r.stderr.split("\n").filter((l) => l !== "")).toHaveLength(1);
    expect(r.stderr).toMatch(/^tiepoint: .*c\.db: the disk is full.*nothing was loaded\n$/);
    expect(integrity(disk.db)).toBe("ok");
    expect(dumpCatalog(disk.db)).toBe(before);
    const ask = tp(dir, "ask", QUESTION, "--db", disk.db, "--json");
    expect(ask.status, ask.stderr).toBe(0);
    expect(JSON.parse(ask.stdout).answers[0].id).toBe("b:wren"); // hand-derived: Wren is the boat docked at East Quay
  });

  it("a catalog on read-only storage: ask and check answer from it, nothing is written, a load is refused", (ctx) => {
    const disk = seededDisk("ro");
    if (typeof disk === "string") {
      console.warn(`skipped: ${disk}`);
      return ctx.skip();
    }
    const copy = join(dir, "ro-before.db");
    copyFileSync(disk.db, copy);
    rmSync(`${disk.db}.idx`, { force: true }); // no snapshot: ask must build the index and cannot save it
    expect(remount(disk.mnt, "ro")).toBe(true);
    const files = readdirSync(disk.mnt).sort();
    const bytes = readFileSync(disk.db);
    const idx = `${disk.db}.idx`;
    const ask = tp(dir, "ask", QUESTION, "--db", disk.db, "--json");
    expect(ask.status, ask.stderr).toBe(0);
    const doc = JSON.parse(ask.stdout);
    const cat = Catalog.open(copy, { readonly: true });
    try {
      expect(validateAskJson(doc, QUESTION, cat, 10)).toEqual([]);
    } finally {
      cat.close();
    }
    expect(doc.answers[0].id).toBe("b:wren"); // hand-derived, as above
    const check = tp(dir, "check", "q.tsv", "--db", disk.db, "--json");
    expect(check.status, check.stderr).toBe(0);
    expect(JSON.parse(check.stdout).summary).toMatchObject({ questions: 1, withExpected: 1, hits1: 1 }); // one question, its expected answer first
    const load = tp(dir, "load", "seed.jsonl", "--db", disk.db);
    expect(load.status).toBe(1);
    expect(load.stderr.split("\n").filter((l) => l !== "")).toHaveLength(1);
    // nothing written: no new files (no PATH-shm, PATH-wal, PATH.idx), the same bytes
    expect(readdirSync(disk.mnt).sort()).toEqual(files);
    expect(existsSync(idx)).toBe(false);
    expect(readFileSync(disk.db).equals(bytes)).toBe(true);
  });
});

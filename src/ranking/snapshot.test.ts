/**
 * The relation index snapshot beside the catalog: round trip, and rejection of torn, stale,
 * foreign and corrupted files (each rebuilt, never trusted). Uses a real SQLite catalog
 * loaded through the JSONL importer. CRC-32 check value from the CRC catalogue
 * ("123456789" → 0xCBF43926, Williams, "A painless guide to CRC error detection", 1993).
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, truncateSync, writeFileSync, copyFileSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { openIndex, readSnapshot, snapshotPath, type IndexProgress, type RelationIndex } from "./index.js";
import { crc32, crc32Table } from "./snapshot.js";
import { walkTables, DEFAULTS as TRANSITION_DEFAULTS } from "./transition.js";
import { salienceOf } from "./salience.js";

const dir = mkdtempSync(join(tmpdir(), "tiepoint-snap-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function jsonl(name: string, rows: object[]): string {
  const f = join(dir, name);
  writeFileSync(f, rows.map((r) => JSON.stringify(r)).join("\n") + "\n");
  return f;
}

const base = [
  { kind: "type", id: "t:Lab", label: "lab" },
  { id: "o:lab1", label: "First Lab", types: ["t:Lab"] },
  { id: "p:ada", label: "Ada", relations: { "r:memberOf": ["o:lab1"] } },
  { id: "p:bo", label: "Bo", relations: { "r:memberOf": ["o:lab1"], "r:knows": ["p:ada"] } },
];

function adjacency(index: RelationIndex): string {
  const out: string[] = [];
  for (let u = 0; u < index.nodeCount; u++) index.forEach(u, (v, r, inv) => out.push(`${u}:${v}/${r}${inv ? "^" : ""}`));
  for (let u = 0; u < index.nodeCount; u++) out.push(`t${u}=${index.typesOf(u).join(",")}`);
  return out.join(" ");
}

function freshCatalog(name: string): Catalog {
  const cat = Catalog.open(join(dir, name), { create: true });
  loadFiles(cat, [jsonl(`${name}.jsonl`, base)]);
  return cat;
}

/** Opens the index once (writing the snapshot), then reads the snapshot back; it must be accepted. */
function savedIndex(cat: Catalog): RelationIndex {
  openIndex(cat);
  const read = readSnapshot(snapshotPath(cat.path), cat.version());
  expect(read.ok).toBe(true);
  if (!read.ok) throw new Error(`snapshot rejected: ${read.reason}`);
  return read.index;
}

function openWithEvents(cat: Catalog): { index: RelationIndex; events: IndexProgress[] } {
  const events: IndexProgress[] = [];
  const index = openIndex(cat, { onProgress: (e) => events.push(e) });
  return { index, events };
}

describe("crc32", () => {
  it("matches the standard check value, natively and by table", () => {
    const data = new TextEncoder().encode("123456789");
    expect(crc32Table(data)).toBe(0xcbf43926);
    expect(crc32(data)).toBe(0xcbf43926);
    expect(crc32(data.subarray(4), crc32(data.subarray(0, 4)))).toBe(0xcbf43926);
  });
});

describe("openIndex and the PATH.idx snapshot", () => {
  it("saves a snapshot on first open and loads the identical index from it next time", () => {
    const cat = freshCatalog("a.db");
    try {
      const first = openWithEvents(cat);
      expect(existsSync(snapshotPath(cat.path))).toBe(true);
      expect(first.events.some((e) => e.phase === "snapshot-save")).toBe(true);
      const second = openWithEvents(cat);
      expect(second.events.map((e) => e.phase)).toEqual(["snapshot-load"]);
      expect(adjacency(second.index)).toBe(adjacency(first.index));
      expect(second.index.edgeCount).toBe(3);
      // no temporary file is left behind
      expect(readdirSync(dir).filter((f) => f.includes(".tmp-"))).toEqual([]);
    } finally {
      cat.close();
    }
  });

  it("stores the walk tables: the loaded ones equal the ones computed from the index's arrays", () => {
    const cat = freshCatalog("w.db");
    try {
      const saved = savedIndex(cat);
      const stored = walkTables(saved, TRANSITION_DEFAULTS.hubExponent);
      // a fresh index from the catalog (no snapshot) computes them anew
      const fresh = walkTables(openIndex(cat, { noSnapshot: true }), TRANSITION_DEFAULTS.hubExponent);
      for (const k of ["hub", "rowTotal", "measure", "scaled", "hubAt"] as const) {
        expect(Array.from(stored[k])).toEqual(Array.from(fresh[k]));
        expect(stored[k].length).toBeGreaterThan(0);
      }
      // hub[v] = deg(v)^(−1/2) (transition.ts), e.g. the lab with two members: 2^(−1/2)
      expect(Math.max(...Array.from(stored.hub).filter((h) => h < 1))).toBeCloseTo(Math.SQRT1_2, 12);
    } finally {
      cat.close();
    }
  });

  it("stores the salience: the loaded PageRank and percentiles equal the ones computed from the index", () => {
    const cat = freshCatalog("s.db");
    try {
      const stored = salienceOf(savedIndex(cat));
      const fresh = salienceOf(openIndex(cat, { noSnapshot: true }));
      expect(Array.from(stored.pagerank)).toEqual(Array.from(fresh.pagerank));
      expect(Array.from(stored.percentile)).toEqual(Array.from(fresh.percentile));
      expect(stored.iterations).toBe(fresh.iterations);
      // PageRank sums to 1 over the linked entities; here each of the three has two adjacency
      // entries, so their ranks tie and share the lower percentile, 0 (salience.ts)
      expect(Array.from(stored.pagerank).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 9);
      expect(Array.from(stored.pagerank).filter((x) => x > 0)).toHaveLength(3);
      expect(Array.from(stored.percentile).every((x) => x === 0)).toBe(true);
    } finally {
      cat.close();
    }
  });

  it("stores the relation-end type table: equal to SQLite's own count of types per relation end", () => {
    const cat = freshCatalog("e.db");
    try {
      const saved = savedIndex(cat);
      const fresh = openIndex(cat, { noSnapshot: true }).endTable();
      const stored = saved.endTable();
      for (const k of ["totals", "keys", "types", "counts"] as const) expect(Array.from(stored[k])).toEqual(Array.from(fresh[k]));
      // the reference: GROUP BY over the catalog's edge and entity_type tables (subject end, then object end)
      const sql = cat.db
        .prepare(
          `SELECT rel * 2 AS k, t.type AS type, COUNT(*) AS n FROM edge e JOIN entity_type t ON t.entity = e.src GROUP BY rel, t.type
           UNION ALL SELECT rel * 2 + 1, t.type, COUNT(*) FROM edge e JOIN entity_type t ON t.entity = e.dst GROUP BY rel, t.type
           ORDER BY 1, 3 DESC, 2`,
        )
        .all() as { k: number; type: number; n: number }[];
      expect(sql.length).toBeGreaterThan(0);
      expect(Array.from(stored.keys).map((key, i) => [key, stored.types[i], stored.counts[i]])).toEqual(sql.map((r) => [r.k, r.type, r.n]));
      // the two memberOf edges end at the lab: its object end is typed lab twice
      const memberOf = cat.db.prepare("SELECT num FROM predicate WHERE id = 'r:memberOf'").get() as { num: number };
      expect(saved.relationEnds().types(memberOf.num, true)).toEqual([{ type: cat.numOf("t:Lab"), count: 2 }]);
      expect(saved.relationEnds().edges(memberOf.num)).toBe(2);
    } finally {
      cat.close();
    }
  });

  it("rejects a stale snapshot after a load and rebuilds it with the new edges", () => {
    const cat = freshCatalog("b.db");
    try {
      openIndex(cat);
      loadFiles(cat, [jsonl("more.jsonl", [{ id: "p:cy", label: "Cy", relations: { "r:knows": ["p:bo"] } }])]);
      const { index, events } = openWithEvents(cat);
      expect(events.find((e) => e.phase === "snapshot-rejected")?.message).toMatch(/stale/);
      expect(index.edgeCount).toBe(4);
      expect(readSnapshot(snapshotPath(cat.path), cat.version()).ok).toBe(true);
    } finally {
      cat.close();
    }
  });

  it("rejects a torn (truncated) snapshot", () => {
    const cat = freshCatalog("c.db");
    try {
      const good = adjacency(openIndex(cat));
      const file = snapshotPath(cat.path);
      truncateSync(file, readFileSync(file).length - 5);
      expect(readSnapshot(file, cat.version())).toMatchObject({ ok: false, reason: "torn" });
      const { index, events } = openWithEvents(cat);
      expect(events.some((e) => e.phase === "snapshot-rejected" && /torn/.test(e.message ?? ""))).toBe(true);
      expect(adjacency(index)).toBe(good);
      truncateSync(file, 20);
      expect(readSnapshot(file, cat.version())).toMatchObject({ ok: false, reason: "torn" });
    } finally {
      cat.close();
    }
  });

  it("rejects a corrupted payload by its checksum", () => {
    const cat = freshCatalog("d.db");
    try {
      openIndex(cat);
      const file = snapshotPath(cat.path);
      const bytes = readFileSync(file);
      bytes[bytes.length - 20]! ^= 0xff;
      writeFileSync(file, bytes);
      expect(readSnapshot(file, cat.version())).toMatchObject({ ok: false, reason: "checksum" });
      const { index } = openWithEvents(cat);
      expect(index.edgeCount).toBe(3);
    } finally {
      cat.close();
    }
  });

  it("rejects a foreign snapshot (another catalog's, or not a snapshot at all)", () => {
    const a = freshCatalog("e.db");
    const b = freshCatalog("f.db");
    try {
      openIndex(a);
      copyFileSync(snapshotPath(a.path), snapshotPath(b.path));
      expect(readSnapshot(snapshotPath(b.path), b.version())).toMatchObject({ ok: false, reason: "foreign" });
      writeFileSync(snapshotPath(b.path), Buffer.alloc(300, 7));
      expect(readSnapshot(snapshotPath(b.path), b.version())).toMatchObject({ ok: false, reason: "foreign" });
      const { events } = openWithEvents(b);
      expect(events.some((e) => e.phase === "snapshot-rejected")).toBe(true);
      expect(readSnapshot(snapshotPath(b.path), b.version()).ok).toBe(true);
    } finally {
      a.close();
      b.close();
    }
  });

  it("builds in memory for an in-memory catalog", () => {
    const cat = Catalog.open(":memory:", { create: true });
    try {
      loadFiles(cat, [jsonl("m.jsonl", base)]);
      expect(openIndex(cat).edgeCount).toBe(3);
      expect(existsSync(":memory:.idx")).toBe(false);
    } finally {
      cat.close();
    }
  });
});

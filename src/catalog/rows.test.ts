/**
 * Buffered bulk insertion (rows.ts) and the writer that uses it: buffering must not change
 * what is stored. Random writer operation sequences (fast-check) — labels in any order,
 * preferred labels, aliases, descriptions, types, edges with duplicates, attributes, reads
 * of the tables between flushes, into an empty and into a non-empty catalog — give exactly
 * the same rows with every buffer size down to one row (the unbuffered writer).
 */
import Database from "better-sqlite3";
import fc from "fast-check";
import { afterEach, describe, expect, it } from "vitest";
import { Catalog } from "./store.js";
import { CatalogWriter, DEFAULTS as WRITER_DEFAULTS } from "./writer.js";
import { DEFAULTS as ROW_DEFAULTS, HeldRows, PendingEntities, RowBatch, SortedEdges, TextColumn } from "./rows.js";

function edgeDb(): Database.Database {
  const db = new Database(":memory:");
  db.exec("CREATE TABLE edge (src INTEGER NOT NULL, rel INTEGER NOT NULL, dst INTEGER NOT NULL, PRIMARY KEY (src, rel, dst)) WITHOUT ROWID");
  return db;
}

describe("RowBatch", () => {
  it("writes full batches as they fill and the rest at flush; OR IGNORE counts only new rows", () => {
    const db = edgeDb();
    const b = new RowBatch(db, "INSERT OR IGNORE INTO edge(src, rel, dst)", 3, 4);
    for (let i = 0; i < 10; i++) b.add(i % 7, 1, 2);
    expect(db.prepare("SELECT count(*) FROM edge").pluck().get()).toBe(7); // two full batches of 4 written
    b.flush();
    expect(b.changes).toBe(7);
    expect(db.prepare("SELECT src FROM edge ORDER BY src").pluck().all()).toEqual([0, 1, 2, 3, 4, 5, 6]);
  });
});

describe("SortedEdges", () => {
  it("inserts in ascending source order, ties in arrival order, and flushes at capacity", () => {
    const db = edgeDb();
    const seen: number[][] = [];
    db.function("note", (s: number, r: number, d: number) => (seen.push([s, r, d]), 0));
    db.exec("CREATE TRIGGER t AFTER INSERT ON edge BEGIN SELECT note(NEW.src, NEW.rel, NEW.dst); END");
    const e = new SortedEdges(db, 5);
    for (const [s, d] of [[9, 1], [3, 2], [9, 0], [1, 5], [3, 1], [2, 2]]) e.add(s!, 7, d!);
    expect(seen).toEqual([[1, 7, 5], [3, 7, 2], [3, 7, 1], [9, 7, 1], [9, 7, 0]]); // the first five, sorted by src
    e.flush();
    expect(seen.at(-1)).toEqual([2, 7, 2]);
    expect(e.changes).toBe(6);
  });

  it("keeps arrival order when a source num is too large for the packed sort key", () => {
    const db = edgeDb();
    const e = new SortedEdges(db);
    e.add(2 ** 34, 1, 1);
    e.add(5, 1, 1);
    e.add(5, 1, 1);
    e.flush();
    expect(e.changes).toBe(2);
    expect(db.prepare("SELECT src FROM edge ORDER BY src").pluck().all()).toEqual([5, 2 ** 34]);
  });
});

describe("SortedEdges.hold", () => {
  function noted(db: Database.Database): number[][] {
    const seen: number[][] = [];
    db.function("note", (s: number, r: number, d: number) => (seen.push([s, r, d]), 0));
    db.exec("CREATE TRIGGER t AFTER INSERT ON edge BEGIN SELECT note(NEW.src, NEW.rel, NEW.dst); END");
    return seen;
  }
  const input = [[9, 2, 1], [3, 7, 2], [9, 1, 5], [3, 7, 1], [3, 7, 2], [1, 5, 5], [9, 1, 5]] as const;
  const sorted = [[1, 5, 5], [3, 7, 1], [3, 7, 2], [9, 1, 5], [9, 2, 1]];

  it("keeps every edge until the flush, then inserts each distinct one in (src, rel, dst) order", () => {
    const db = edgeDb();
    const seen = noted(db);
    const e = new SortedEdges(db, 2);
    e.hold();
    for (const [s, r, d] of input) e.add(s, r, d);
    expect(seen).toEqual([]); // capacity 2 does not apply while holding
    e.flush();
    expect(seen).toEqual(sorted);
    expect(e.changes).toBe(5);
    e.add(4, 4, 4); // after the flush: batches again
    e.flush();
    expect(seen.at(-1)).toEqual([4, 4, 4]);
  });

  it("sorts by comparison when the packed key would pass 2^53, and stops holding at a num above 2^31 - 1", () => {
    const db = edgeDb();
    const seen = noted(db);
    const e = new SortedEdges(db);
    e.hold();
    for (const [s, r, d] of input) e.add(s, r, d);
    e.add(2 ** 30, 2 ** 30, 2 ** 30); // (2^30 + 1)^3 > 2^53
    e.flush();
    expect(seen).toEqual([...sorted, [2 ** 30, 2 ** 30, 2 ** 30]]);
    const f = new SortedEdges(edgeDb());
    f.hold();
    f.add(5, 1, 1);
    f.add(2 ** 34, 1, 1); // held edges written, then batches
    f.add(5, 1, 1);
    f.flush();
    expect(f.changes).toBe(2);
  });
});

describe("TextColumn", () => {
  it("gives back every value, nulls, replaced values and lone surrogates included", () => {
    const c = new TextColumn();
    const values = ["Café Nord", null, "", "a\uD800b", "😀 harbour", "x".repeat(5000)];
    for (let k = 0; k < 300; k++) for (const v of values) c.push(v);
    c.set(1, "now set");
    c.set(3, null);
    expect([c.get(0), c.get(1), c.get(2), c.get(3), c.get(9), c.get(10), c.get(11)]).toEqual(["Café Nord", "now set", "", null, values[3], values[4], values[5]]);
    expect(c.length).toBe(1800);
  });
});

describe("HeldRows", () => {
  it("holds rows until the flush, then inserts them by entity, each entity's rows in arrival order", () => {
    const db = new Database(":memory:");
    db.exec("CREATE TABLE a (entity INTEGER NOT NULL, text TEXT NOT NULL, kind INTEGER, num REAL, PRIMARY KEY (entity, text)) WITHOUT ROWID");
    const seen: unknown[][] = [];
    db.function("note", (e: number, t: string, k: number | null) => (seen.push([e, t, k]), 0));
    db.exec("CREATE TRIGGER t AFTER INSERT ON a BEGIN SELECT note(NEW.entity, NEW.text, NEW.kind); END");
    const h = new HeldRows(db, "INSERT OR IGNORE INTO a(entity, text, kind, num)", ["num", "text", "num", "num"]);
    h.hold();
    for (const [e, t, k] of [[9, "x", 1], [3, "y", 0], [9, "w", null], [3, "y", 1], [1, "z", 0]] as const) h.add(e, t, k, k === null ? null : 2.5);
    expect(seen).toEqual([]);
    h.flush();
    expect(seen).toEqual([[1, "z", 0], [3, "y", 0], [9, "x", 1], [9, "w", null]]); // (3, "y", 1) ignored: the first row of the key stays
    expect(h.changes).toBe(4);
    expect(db.prepare("SELECT num FROM a WHERE entity = 9 ORDER BY text").pluck().all()).toEqual([null, 2.5]);
    h.add(0, "after", 0, null); // after the flush: straight to the batch
    h.flush();
    expect(seen.at(-1)).toEqual([0, "after", 0]);
  });
});

describe("PendingEntities", () => {
  it("holds rows with their label and description until flush, in num order", () => {
    const db = new Database(":memory:");
    db.exec("CREATE TABLE entity (num INTEGER PRIMARY KEY, id TEXT NOT NULL UNIQUE, label TEXT, description TEXT)");
    const p = new PendingEntities(db, 2);
    p.add(4, "a");
    p.add(5, "b");
    expect(p.full).toBe(true);
    expect(p.has(5) && !p.has(6) && !p.has(3)).toBe(true);
    p.setLabel(5, "Bee");
    p.setDescription(4, "first");
    expect([p.label(5), p.description(4), p.label(4)]).toEqual(["Bee", "first", null]);
    expect(() => p.add(9, "c")).toThrow(/out of order/);
    p.flush();
    expect(p.has(4)).toBe(false);
    expect(db.prepare("SELECT * FROM entity ORDER BY num").raw(true).all()).toEqual([
      [4, "a", null, "first"],
      [5, "b", "Bee", null],
    ]);
  });
});

/** One writer call, over small pools of ids and texts so that collisions happen. */
type Op =
  | { k: "label"; id: number; text: number; preferred: boolean }
  | { k: "alias"; id: number; text: number }
  | { k: "description"; id: number; text: number }
  | { k: "type"; id: number; type: number }
  | { k: "edge"; src: number; rel: number; dst: number }
  | { k: "attribute"; id: number; rel: number; text: number }
  | { k: "read" };

const TEXTS = ["Harbour", "harbour", "Old Mill", "Mill", "Café Nord", "north", "Ferry", "The ferries"];
const id = fc.nat(10);
const text = fc.nat(TEXTS.length - 1);
const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ k: fc.constant("label" as const), id, text, preferred: fc.boolean() }),
  fc.record({ k: fc.constant("alias" as const), id, text }),
  fc.record({ k: fc.constant("description" as const), id, text }),
  fc.record({ k: fc.constant("type" as const), id, type: fc.nat(4) }),
  fc.record({ k: fc.constant("edge" as const), src: id, rel: fc.nat(3), dst: id }),
  fc.record({ k: fc.constant("attribute" as const), id, rel: fc.nat(3), text }),
  fc.record({ k: fc.constant("read" as const) }),
);

function apply(w: CatalogWriter, cat: Catalog, ops: readonly Op[], reads: string[]): void {
  for (const o of ops) {
    if (o.k === "label") w.label(`e:${o.id}`, TEXTS[o.text]!, o.preferred);
    else if (o.k === "alias") w.alias(`e:${o.id}`, TEXTS[o.text]!);
    else if (o.k === "description") w.description(`e:${o.id}`, TEXTS[o.text]!);
    else if (o.k === "type") w.type(`e:${o.id}`, `t:${o.type}`);
    else if (o.k === "edge") w.edge(`e:${o.src}`, `r:${o.rel}`, `e:${o.dst}`);
    else if (o.k === "attribute") w.attribute(`e:${o.id}`, `a:${o.rel}`, TEXTS[o.text]!);
    else {
      w.flush();
      reads.push(JSON.stringify(cat.db.prepare("SELECT count(*), max(num), group_concat(label) FROM entity").raw(true).get()));
    }
  }
}

function rowsOf(cat: Catalog): string {
  const tables = ["entity", "predicate", "alias", "entity_type", "edge", "attribute"];
  return JSON.stringify(tables.map((t) => (cat.db.prepare(`SELECT * FROM ${t}`).raw(true).all() as unknown[][]).map((r) => JSON.stringify(r)).sort()));
}

/** Two transactions (the second into a non-empty catalog), with the given buffer sizes. */
function run(sizes: { rows: number; edges: number; pending: number; hold?: boolean }, first: readonly Op[], second: readonly Op[]): string {
  WRITER_DEFAULTS.holdRows = sizes.hold ?? true;
  ROW_DEFAULTS.rowsPerInsert = sizes.rows;
  ROW_DEFAULTS.edgeSortRows = sizes.edges;
  WRITER_DEFAULTS.pendingEntities = sizes.pending;
  const cat = Catalog.open(":memory:", { create: true });
  const reads: string[] = [];
  for (const ops of [first, second]) {
    const w = new CatalogWriter(cat);
    w.begin();
    if (w.startedEmpty) w.deferIndexes();
    apply(w, cat, ops, reads);
    w.commit();
  }
  const out = rowsOf(cat) + reads.join("|");
  cat.close();
  return out;
}

describe("CatalogWriter buffering", () => {
  const saved = { ...ROW_DEFAULTS, pending: WRITER_DEFAULTS.pendingEntities };
  afterEach(() => {
    WRITER_DEFAULTS.holdRows = true;
    ROW_DEFAULTS.rowsPerInsert = saved.rowsPerInsert;
    ROW_DEFAULTS.edgeSortRows = saved.edgeSortRows;
    WRITER_DEFAULTS.pendingEntities = saved.pending;
  });

  it("stores the same rows whatever the buffer sizes, one row (unbuffered) included (fast-check)", () => {
    fc.assert(
      fc.property(fc.array(op, { minLength: 5, maxLength: 120, size: "max" }), fc.array(op, { maxLength: 60, size: "max" }), (first, second) => {
        const unbuffered = run({ rows: 1, edges: 1, pending: 1, hold: false }, first, second);
        expect(run({ rows: 1, edges: 1, pending: 1 }, first, second)).toBe(unbuffered);
        expect(run({ rows: 3, edges: 5, pending: 4 }, first, second)).toBe(unbuffered);
        expect(run({ rows: saved.rowsPerInsert, edges: saved.edgeSortRows, pending: saved.pending }, first, second)).toBe(unbuffered);
      }),
      { numRuns: 150, seed: 5 },
    );
  });

  it("a rollback drops the buffered rows", () => {
    const cat = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(cat);
    w.begin();
    w.label("e:1", "One");
    w.edge("e:1", "r:x", "e:2");
    w.rollback();
    w.begin();
    w.label("e:3", "Three");
    w.commit();
    expect(cat.db.prepare("SELECT num, id, label FROM entity").raw(true).all()).toEqual([[1, "e:3", "Three"]]);
    expect(cat.db.prepare("SELECT count(*) FROM edge").pluck().get()).toBe(0);
    cat.close();
  });
});

import { describe, expect, it } from "vitest";
import Database from "better-sqlite3";
import { PulledEdges } from "./pulled-edges.js";

// Reference: SQLite itself, reading the same edges from a table with the catalog's `edge`
// schema (src/catalog/schema.ts: PRIMARY KEY (src, rel, dst) WITHOUT ROWID, index (dst, rel))
// through the catalog's own statements (src/catalog/store.ts).
describe("PulledEdges answers the catalog's edge reads as the edge table does", () => {
  it("neighbourNums, hasRelationEdge, has and the (dst, rel, src) order match SQLite on random edges", () => {
    const db = new Database(":memory:");
    db.exec("CREATE TABLE edge (src INTEGER NOT NULL, rel INTEGER NOT NULL, dst INTEGER NOT NULL, PRIMARY KEY (src, rel, dst)) WITHOUT ROWID; CREATE INDEX edge_by_dst ON edge(dst, rel);");
    const ins = db.prepare("INSERT OR IGNORE INTO edge VALUES (?, ?, ?)");
    const e = new PulledEdges();
    let seed = 7;
    const rnd = (k: number) => ((seed = (seed * 1103515245 + 12345) % 2 ** 31), seed % k);
    const seen = new Set<string>();
    for (let i = 0; i < 2000; i++) {
      const [s, p, o] = [rnd(60), rnd(5), rnd(60)];
      if (seen.has(`${s} ${p} ${o}`)) continue;
      seen.add(`${s} ${p} ${o}`);
      ins.run(s, p, o);
      e.add(s, p, o);
    }
    const outQ = db.prepare("SELECT dst AS n FROM edge WHERE src = ? LIMIT ?").pluck();
    const inQ = db.prepare("SELECT src AS n FROM edge WHERE dst = ? LIMIT ?").pluck();
    const relQ = db.prepare("SELECT (EXISTS(SELECT 1 FROM edge WHERE src = ? AND rel = ?) OR EXISTS(SELECT 1 FROM edge WHERE dst = ? AND rel = ?))").pluck();
    for (let n = 0; n < 62; n++) {
      for (const limit of [3, 1000]) expect(e.neighbourNums(n, limit)).toEqual([...(outQ.all(n, limit) as number[]), ...(inQ.all(n, limit) as number[])]);
      for (let r = 0; r < 6; r++) expect(e.hasRelation(n, r)).toBe(relQ.get(n, r, n, r) === 1);
    }
    expect([...e.ordered()]).toEqual(db.prepare("SELECT src, rel, dst FROM edge ORDER BY dst, rel, src").raw(true).all());
    expect(e.size).toBe(seen.size);
    expect(e.has(...([...seen][0]!.split(" ").map(Number) as [number, number, number]))).toBe(true);
    expect(e.has(999, 0, 0)).toBe(false);
    e.clear();
    expect(e.size).toBe(0);
    expect(e.neighbourNums(1, 10)).toEqual([]);
  });
});

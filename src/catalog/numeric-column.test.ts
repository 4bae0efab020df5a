/**
 * Numeric attribute columns (CSR): the column agrees with a plain grouping of the same pairs
 * (a property test over random pairs, fast-check), and a column read from a real catalog
 * agrees with the per-entity statement `Catalog.attributeNumbers` for every entity.
 */
import fc from "fast-check";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { existsSync, renameSync } from "node:fs";
import { Catalog, CatalogWriter, loadFiles, NumericColumn, NumericColumns, numericColumnsPath, readNumericColumn, writeNumericColumnsTemp } from "./index.js";

describe("numeric columns", () => {
  it("groups (entity, value) pairs by entity, each row smallest first", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 50 }), fc.double({ noNaN: true, min: -1e6, max: 1e6 }))), (pairs) => {
        const sorted = [...pairs].sort((a, b) => a[1] - b[1]);
        const col = NumericColumn.fromPairs(Int32Array.from(sorted, (p) => p[0]), Float64Array.from(sorted, (p) => p[1]));
        const want = new Map<number, number[]>();
        for (const [e, v] of sorted) want.set(e, [...(want.get(e) ?? []), v]);
        expect(col.size).toBe(want.size);
        for (let e = -1; e <= 51; e++) {
          expect(Array.from(col.of(e))).toEqual(want.get(e) ?? []);
          expect(col.list(e)).toEqual(want.get(e) ?? []);
        }
      }),
    );
  });

  it("reads the same numbers as the per-entity statement", () => {
    const d = mkdtempSync(join(tmpdir(), "tp-numcol-"));
    try {
      const rows = [{ kind: "attribute", id: "depth", label: "depth", unit: "metres" }];
      for (let i = 0; i < 300; i++) rows.push({ id: `s${i}`, label: `Site ${i}`, attributes: { depth: i % 7 === 0 ? [i, 1000 - i, "n/a"] : i % 5 === 0 ? "deep" : i * 1.5 } } as never);
      writeFileSync(join(d, "a.jsonl"), rows.map((r) => JSON.stringify(r)).join("\n") + "\n");
      const cat = Catalog.open(join(d, "c.db"), { create: true });
      loadFiles(cat, [join(d, "a.jsonl")]);
      const depth = cat.predicates().find((p) => p.id === "depth")!.num;
      const cols = new NumericColumns(cat);
      let carried = 0;
      for (let i = 0; i < 300; i++) {
        const e = cat.numOf(`s${i}`)!;
        const want = cat.attributeNumbers(e, depth);
        expect(cols.numbers(e, depth)).toEqual(want);
        if (want.length > 0) carried++;
      }
      expect(cols.column(depth).size).toBe(carried);
      // "deep" (no number) on the 60 multiples of 5 below 300 except the 9 multiples of 35 (arithmetic)
      expect(carried).toBe(300 - (60 - 9));
      cat.close();
    } finally {
      rmSync(d, { recursive: true, force: true });
    }
  });

  it("the columns file written with a load gives the columns the catalog gives; a stale one is replaced", () => {
    const d = mkdtempSync(join(tmpdir(), "tp-numfile-"));
    try {
      const rows: object[] = [{ kind: "attribute", id: "depth", label: "depth" }, { kind: "attribute", id: "year", label: "year" }];
      for (let i = 0; i < 200; i++) rows.push({ id: `s${i}`, label: `Site ${i}`, attributes: { depth: i % 3 === 0 ? [i, -i] : i / 4, ...(i % 2 === 0 ? { year: 1900 + (i % 50) } : {}) } });
      writeFileSync(join(d, "a.jsonl"), rows.map((r) => JSON.stringify(r)).join("\n") + "\n");
      const path = join(d, "c.db");
      const cat = Catalog.open(path, { create: true });
      loadFiles(cat, [join(d, "a.jsonl")]);
      const nums = ["depth", "year"].map((id) => cat.predicates().find((p) => p.id === id)!.num);
      // as a load writes it (pipeline/prepare.ts), stamped with the catalog's uid and generation
      renameSync(writeNumericColumnsTemp(cat, path, cat.version()), numericColumnsPath(path));
      const same = (a: NumericColumn, b: NumericColumn) => {
        expect(Array.from(a.entities)).toEqual(Array.from(b.entities));
        expect(Array.from(a.offsets)).toEqual(Array.from(b.offsets));
        expect(Array.from(a.values)).toEqual(Array.from(b.values));
      };
      const opened = NumericColumns.open(cat);
      for (const p of nums) same(opened.column(p), readNumericColumn(cat, p));
      expect(opened.column(nums[0]!).size).toBe(200);
      expect(opened.column(nums[1]!).size).toBe(100);
      // a predicate without numbers (a relation, here the label's predicate if any): an empty column
      expect(opened.column(99999).size).toBe(0);
      // a later load bumps the generation: the file no longer applies, the catalog is read and the file written again
      const w = new CatalogWriter(cat);
      w.begin();
      w.label("s0", "Site zero");
      w.commit();
      const again = NumericColumns.open(cat);
      for (const p of nums) same(again.column(p), readNumericColumn(cat, p));
      expect(existsSync(numericColumnsPath(path))).toBe(true);
      const third = NumericColumns.open(cat);
      for (const p of nums) same(third.column(p), readNumericColumn(cat, p));
      cat.close();
    } finally {
      rmSync(d, { recursive: true, force: true });
    }
  });
});

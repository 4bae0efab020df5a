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
import { Catalog, loadFiles, NumericColumn, NumericColumns } from "./index.js";

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
});

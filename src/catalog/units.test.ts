/**
 * Attribute units (JSONL `"unit"` on an attribute declaration): stored by the importer,
 * read back by `Catalog.predicateUnits`, cleared by a `--replace` load; and the literal
 * summary used by question conditions (`Catalog.attributeSummary`, `attributeNumbers`).
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "./index.js";

function catalogWith(lines: readonly object[]): { cat: Catalog; file: string } {
  const d = mkdtempSync(join(tmpdir(), "tp-units-"));
  const file = join(d, "a.jsonl");
  writeFileSync(file, lines.map((l) => JSON.stringify(l)).join("\n") + "\n");
  const cat = Catalog.open(join(d, "c.db"), { create: true });
  loadFiles(cat, [file]);
  return { cat, file };
}

describe("attribute units", () => {
  it("a catalog without declarations has no units", () => {
    const { cat } = catalogWith([{ id: "x", label: "X", attributes: { depth: 40 } }]);
    expect(cat.predicateUnits().size).toBe(0);
    cat.close();
  });

  it("stores the unit of an attribute declaration and reads values as numbers", () => {
    const { cat } = catalogWith([
      { kind: "attribute", id: "depth", label: "water depth", unit: "metres" },
      { kind: "attribute", id: "serial", label: "serial code" },
      { id: "s1", label: "Site one", attributes: { depth: "1,200", serial: "AB-1", opened: "1985-04-12" } },
    ]);
    expect([...cat.predicateUnits()]).toEqual([["depth", "metres"]]);
    const s1 = cat.numOf("s1")!;
    const depth = cat.predicates().find((p) => p.id === "depth")!.num;
    expect(cat.attributeNumbers(s1, depth)).toEqual([1200]); // thousands separator read (catalog literalNumber)
    const opened = cat.predicates().find((p) => p.id === "opened")!.num;
    const summary = new Map(cat.attributeSummary().map((s) => [s.num, s]));
    expect(summary.get(opened)).toMatchObject({ values: 1, numeric: 1, dateLike: 1 }); // an ISO 8601 date
    expect(summary.get(depth)).toMatchObject({ values: 1, numeric: 1, dateLike: 0 });
    cat.close();
  });

  it("a replacing load clears the units of the old catalog", () => {
    const { cat, file } = catalogWith([{ kind: "attribute", id: "depth", label: "depth", unit: "metres" }]);
    writeFileSync(file, JSON.stringify({ id: "y", label: "Y" }) + "\n");
    loadFiles(cat, [file], { replace: true });
    expect(cat.predicateUnits().size).toBe(0);
    cat.close();
  });
});

/**
 * loadFiles reliability: a full disk (simulated with SQLite's `PRAGMA max_page_count`, which
 * makes writes fail with SQLITE_FULL exactly as a full disk does — https://www.sqlite.org/pragma.html#pragma_max_page_count),
 * a read-only handle, and the generation counter; and the line reader (UTF-8 checked against
 * the WHATWG fatal TextDecoder of Node, chunk boundaries, BOM, over-long lines) under
 * fast-check generated inputs.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { Catalog, CatalogWriter, loadFiles, normalize, stemKey } from "./index.js";
import { TiepointError } from "../model/index.js";
import { readBlocks } from "./import/lines.js";

function tmp(): string {
  return mkdtempSync(join(tmpdir(), "tp-load-"));
}

function rows(cat: Catalog): string {
  const t = ["entity", "alias", "edge", "attribute", "predicate", "entity_type", "meta"];
  return JSON.stringify(t.map((x) => cat.db.prepare(`SELECT * FROM ${x}`).raw(true).all().map((r) => JSON.stringify(r)).sort()));
}

describe("loadFiles on a full disk", () => {
  it("SQLITE_FULL mid-load: one TiepointError, catalog unchanged, still writable afterwards", () => {
    const d = tmp();
    const seed = join(d, "seed.jsonl");
    writeFileSync(seed, '{"id":"a","label":"Anchor"}\n');
    const big = join(d, "big.nt");
    let text = "";
    for (let i = 0; i < 20_000; i++) text += `<x:${i}> <http://www.w3.org/2000/01/rdf-schema#label> "Buoy number ${i}" .\n<x:${i}> <x:next> <x:${i + 1}> .\n`;
    writeFileSync(big, text);
    const cat = Catalog.open(join(d, "c.db"), { create: true });
    loadFiles(cat, [seed]);
    const before = rows(cat);
    const pages = cat.db.pragma("page_count", { simple: true }) as number;
    cat.db.pragma(`max_page_count = ${pages + 20}`);
    let err: unknown;
    try {
      loadFiles(cat, [big]);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(TiepointError);
    expect((err as TiepointError).code).toBe("catalog/full");
    expect((err as TiepointError).format()).toMatch(/c\.db: the disk is full .*nothing was loaded$/);
    expect(rows(cat)).toBe(before);
    expect((cat.db.pragma("integrity_check") as { integrity_check: string }[])[0]!.integrity_check).toBe("ok");
    cat.db.pragma("max_page_count = 1073741823");
    expect(loadFiles(cat, [big]).added.entities).toBe(20_001);
    cat.close();
  });
});

describe("loadFiles guards", () => {
  it("refuses a read-only handle before reading anything", () => {
    const d = tmp();
    const f = join(d, "a.jsonl");
    writeFileSync(f, '{"id":"a"}\n');
    const w = Catalog.open(join(d, "c.db"), { create: true });
    loadFiles(w, [f]);
    w.close();
    const r = Catalog.open(join(d, "c.db"), { readonly: true });
    expect(() => loadFiles(r, [f])).toThrow(/read-only/);
    expect(r.counts().entities).toBe(1);
    r.close();
  });

  it("bumps the generation once per committed load, not on a failed one", () => {
    const d = tmp();
    const good = join(d, "g.jsonl");
    const bad = join(d, "b.jsonl");
    writeFileSync(good, '{"id":"a"}\n');
    writeFileSync(bad, "{oops\n");
    const cat = Catalog.open(join(d, "c.db"), { create: true });
    const g0 = cat.version().generation;
    loadFiles(cat, [good]);
    expect(() => loadFiles(cat, [good, bad])).toThrow(TiepointError);
    loadFiles(cat, [good]);
    expect(cat.version().generation).toBe(g0 + 2);
    cat.close();
  });
});

describe("CatalogWriter alias forms", () => {
  it("stores normalize(text) and stemKey(text), the forms linking computes at ask time (fast-check)", () => {
    const cat = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(cat);
    w.begin();
    let k = 0;
    fc.assert(
      fc.property(fc.string({ unit: "grapheme", minLength: 1, maxLength: 20 }), (text) => {
        const id = `e${k++}`;
        w.label(id, text);
        w.flush(); // rows are buffered until a flush (or the commit)
        const row = cat.db.prepare("SELECT norm, stem FROM alias WHERE entity = ? AND text = ?").get(cat.db.prepare("SELECT num FROM entity WHERE id = ?").pluck().get(id), text) as { norm: string; stem: string };
        expect(row).toEqual({ norm: normalize(text), stem: stemKey(text) });
      }),
      { numRuns: 300, seed: 3 },
    );
    w.rollback();
    cat.close();
  });
});

/** All lines of a file through readBlocks with a given chunk size. */
function readAll(path: string, chunkBytes: number, maxLineBytes = 1 << 20): { lines: string[]; bad: [number, string][] } {
  const lines: string[] = [];
  const bad: [number, string][] = [];
  readBlocks(
    path,
    (b) => {
      const parts = b.text.split("\n");
      expect(parts.length - 1).toBe(b.lineCount);
      expect(b.firstLine).toBe(lines.length + 1);
      lines.push(...parts.slice(0, -1));
    },
    (line, kind) => bad.push([line, kind]),
    { chunkBytes, maxLineBytes },
  );
  return { lines, bad };
}

describe("readBlocks", () => {
  it("agrees with a fatal TextDecoder line by line, whatever the chunk size and line limit (fast-check)", () => {
    const d = tmp();
    const f = join(d, "x.txt");
    const decoder = new TextDecoder("utf-8", { fatal: true });
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.string({ unit: "grapheme", maxLength: 12 }).map((s) => Buffer.from(s)), fc.uint8Array({ maxLength: 6 }).map((a) => Buffer.from(a))), { maxLength: 12 }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 4, max: 64 }),
        fc.boolean(),
        (pieces, chunk, maxLine, bom) => {
          const body = Buffer.concat(pieces.map((p, i) => (i % 3 === 2 ? Buffer.concat([p, Buffer.from("\n")]) : p)));
          const bytes = bom ? Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), body]) : body;
          writeFileSync(f, bytes);
          // reference: split the bytes on LF, decode each line with the fatal decoder
          const raw: Buffer[] = [];
          let start = bytes.subarray(0, 3).equals(Buffer.from([0xef, 0xbb, 0xbf])) ? 3 : 0;
          for (let i = start; i < bytes.length; i++) if (bytes[i] === 0x0a) (raw.push(bytes.subarray(start, i)), (start = i + 1));
          if (start < bytes.length) raw.push(bytes.subarray(start));
          const expected: string[] = [];
          const expectedBad: number[] = [];
          raw.forEach((b, i) => {
            if (b.length > maxLine) {
              expected.push("");
              expectedBad.push(i + 1);
              return;
            }
            try {
              expected.push(decoder.decode(b));
            } catch {
              expected.push("");
              expectedBad.push(i + 1);
            }
          });
          const got = readAll(f, chunk, maxLine);
          expect(got.lines).toEqual(expected);
          expect(got.bad.map((b) => b[0])).toEqual(expectedBad);
        },
      ),
      { numRuns: 300, seed: 42 },
    );
  });

  it("drops a byte order mark, keeps CR for the parser, reports over-long lines and goes on", () => {
    const d = tmp();
    const f = join(d, "x.txt");
    writeFileSync(f, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from("one\r\n" + "y".repeat(50) + "\nthree")]));
    const got = readAll(f, 7, 20);
    expect(got.lines).toEqual(["one\r", "", "three"]);
    expect(got.bad).toEqual([[2, "too-long"]]);
  });
});

describe("planner statistics after a load", () => {
  // ANALYZE fills sqlite_stat1 (https://www.sqlite.org/lang_analyze.html): one row per index
  // with the row count first; a failed load rolls its statistics back with its rows
  it("a committed load leaves statistics counting its rows; a failed one changes nothing", () => {
    const d = tmp();
    const a = join(d, "a.jsonl");
    writeFileSync(a, Array.from({ length: 50 }, (_, i) => JSON.stringify({ id: `e${i}`, label: `Item ${i}`, attributes: { weight: i } })).join("\n") + "\n");
    const cat = Catalog.open(join(d, "c.db"), { create: true });
    loadFiles(cat, [a]);
    const stat = () => cat.db.prepare("SELECT idx, stat FROM sqlite_stat1 WHERE tbl = 'attribute' ORDER BY idx").raw(true).all() as [string, string][];
    const first = stat();
    expect(first.map(([i]) => i)).toEqual(["attribute", "attribute_by_predicate"]);
    for (const [, s] of first) expect(s.split(" ")[0]).toBe("50");
    const bad = join(d, "bad.jsonl");
    writeFileSync(bad, Array.from({ length: 50 }, (_, i) => JSON.stringify({ id: `f${i}`, label: `Other ${i}`, attributes: { weight: i } })).join("\n") + "\n{not json\n");
    expect(() => loadFiles(cat, [bad])).toThrow(TiepointError);
    expect(stat()).toEqual(first);
    expect(cat.db.pragma("analysis_limit", { simple: true })).toBe(0); // the handle's setting restored (SQLite default 0)
    cat.close();
  });
});

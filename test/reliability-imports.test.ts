/**
 * Malformed imports made by mutating valid files (issue 10), with fast-check. Complements
 * src/catalog/import/fuzz.test.ts (which splices known-bad lines into valid files) with
 * mutations of the valid text itself, each malformed by construction:
 * - truncate: the file is cut inside a statement line (every statement ends in a character
 *   the format requires: `.` for N-Triples and Turtle, `}` for JSON Lines, the last field
 *   for CSV/TSV, cut before the row's last separator: a short row is an error, RFC 4180 §2.4);
 * - bad bytes: an invalid UTF-8 sequence inside a line (Unicode 15 §3.9, table 3-7);
 * - broken quote: one `"` (or `<`) removed from or added into a statement;
 * - dropped column: one field removed from a CSV/TSV data row.
 * Properties: the load fails with TiepointErrors, each naming the file and a line within it
 * as `FILE:LINE:`, the first at or before the mutated line, and the catalog is row-for-row
 * unchanged — in-process through loadFiles, and for a sample through the built CLI (exit
 * status 1, every stderr line but the summary `FILE:LINE: …`).
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import { TiepointError } from "../src/model/index.js";
import { dumpCatalog } from "./catalog-dump.js";
import { ensureBuilt, tp } from "./reliability-cli.js";

type Fmt = "nt" | "ttl" | "jsonl" | "csv" | "tsv";
const L = "<http://www.w3.org/2000/01/rdf-schema#label>";

/** Valid files; `header` lines come first and are never mutated. */
const VALID: Record<Fmt, { header: number; lines: string[] }> = {
  nt: { header: 0, lines: [`<m:a> ${L} "Alder \\"the old\\" one" .`, "<m:a> <m:near> <m:b> .", `<m:b> ${L} "Birch"@en .`, '<m:b> <m:depth> "12"^^<http://www.w3.org/2001/XMLSchema#integer> .', "<m:c> <m:near> _:x ."] },
  ttl: { header: 1, lines: ["@prefix m: <m:> .", 'm:a m:near m:b .', 'm:b m:name "Birch" .', "m:c m:near m:a , m:b .", 'm:d m:name "Dee \\"quoted\\"" .'] },
  jsonl: { header: 0, lines: ['{"id":"m:a","label":"Alder","aliases":["A."]}', '{"id":"m:b","label":"Birch","relations":{"m:near":["m:a"]}}', '{"kind":"edge","subject":"m:a","relation":"m:near","object":"m:b"}', '{"id":"m:c","label":"Cedar","attributes":{"height":31}}'] },
  csv: { header: 1, lines: ["id,label,height,note", "m:a,Alder,12,plain", 'm:b,"Birch, tall",3,"said ""hi"""', "m:c,Cedar,31,x"] },
  tsv: { header: 1, lines: ["id\tlabel\theight\tnote", "m:a\tAlder\t12\tplain", "m:b\tBirch\t3\ttall", "m:c\tCedar\t31\tx"] },
};

const BAD_UTF8 = [[0xff], [0xc3], [0xed, 0xa0, 0x80], [0xe2, 0x82], [0xf8, 0x88, 0x80, 0x80, 0x80], [0xc0, 0xaf]];

type Mutation = { kind: "truncate" | "bytes" | "quote" | "column"; line: number; at: number; pick: number };

/** The mutated file and the 1-based line that carries the mutation; undefined when the mutation does not apply. */
function mutate(fmt: Fmt, m: Mutation): { bytes: Buffer; line: number } | undefined {
  const { header, lines } = VALID[fmt];
  const i = header + (m.line % (lines.length - header));
  const text = lines[i]!;
  const out = lines.map((l) => Buffer.from(l + "\n"));
  if (m.kind === "truncate") {
    // cut inside the line, after at least one visible character, before its last one
    // (CSV/TSV: before the row's last separator, so the row is short — a cut right after it
    // would leave a valid empty last field)
    const end = fmt === "csv" || fmt === "tsv" ? text.lastIndexOf(fmt === "csv" ? "," : "\t") + 1 : text.length;
    const cut = 1 + (m.at % (end - 1));
    if (text.slice(0, cut).trim() === "") return undefined;
    return { bytes: Buffer.concat([...out.slice(0, i), Buffer.from(text.slice(0, cut))]), line: i + 1 };
  }
  if (m.kind === "bytes") {
    const at = m.at % (text.length + 1);
    out[i] = Buffer.concat([Buffer.from(text.slice(0, at)), Buffer.from(BAD_UTF8[m.pick % BAD_UTF8.length]!), Buffer.from(text.slice(at) + "\n")]);
    return { bytes: Buffer.concat(out), line: i + 1 };
  }
  if (m.kind === "quote") {
    if (fmt === "tsv") return undefined; // TSV has no quoting
    // unescaped ones only: dropping the quote of `\"` would leave a valid escape such as `\t`
    const quotes = [...text].flatMap((ch, k) => ((ch === '"' || ch === "<") && text[k - 1] !== "\\" ? [k] : []));
    if (quotes.length === 0) return undefined;
    const k = quotes[m.at % quotes.length]!;
    // drop one quote (an unterminated string or IRI); in CSV, a quote inside an unquoted field
    const broken = fmt === "csv" ? text.slice(0, 1) + '"' + text.slice(1) : text.slice(0, k) + text.slice(k + 1);
    out[i] = Buffer.from(broken + "\n");
    return { bytes: Buffer.concat(out), line: i + 1 };
  }
  if (fmt !== "csv" && fmt !== "tsv") return undefined;
  const sep = fmt === "csv" ? "," : "\t";
  if (fmt === "csv" && text.includes('"')) return undefined; // quoted fields hold commas
  const cells = text.split(sep);
  cells.splice(m.pick % cells.length, 1);
  out[i] = Buffer.from(cells.join(sep) + "\n");
  return { bytes: Buffer.concat(out), line: i + 1 };
}

const arbMutation = fc.record({ kind: fc.constantFrom("truncate", "bytes", "quote", "column"), line: fc.nat(), at: fc.nat(), pick: fc.nat() }) as fc.Arbitrary<Mutation>;

let dir = "";
let db = "";
let cat: Catalog;
let before = "";

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-rel-imp-"));
  db = join(dir, "c.db");
  cat = Catalog.open(db, { create: true });
  const seed = join(dir, "seed.jsonl");
  writeFileSync(seed, '{"id":"m:a","label":"Alder"}\n{"id":"m:z","label":"Zelkova"}\n');
  loadFiles(cat, [seed]);
  before = dumpCatalog(db);
});
afterAll(() => cat?.close());

describe("mutated valid files: FILE:LINE errors, the catalog unchanged", () => {
  for (const fmt of Object.keys(VALID) as Fmt[]) {
    it(`${fmt}: in-process, 150 mutations`, () => {
      // the valid file itself loads (so every failure below is the mutation's)
      const ok = join(dir, `ok.${fmt}`);
      writeFileSync(ok, VALID[fmt].lines.join("\n") + "\n");
      const probe = Catalog.open(":memory:", { create: true });
      expect(() => loadFiles(probe, [ok])).not.toThrow();
      probe.close();
      let k = 0;
      fc.assert(
        fc.property(arbMutation, (m) => {
          const made = mutate(fmt, m);
          fc.pre(made !== undefined);
          const file = join(dir, `m${k++}.${fmt}`);
          writeFileSync(file, made!.bytes);
          const lineCount = made!.bytes.toString("latin1").split("\n").length;
          let err: unknown;
          try {
            loadFiles(cat, [file]);
          } catch (e) {
            err = e;
          }
          expect(err, `${m.kind} at line ${made!.line} was loaded: ${JSON.stringify(made!.bytes.toString("latin1"))}`).toBeInstanceOf(TiepointError);
          const t = err as TiepointError;
          for (const e of [t, ...t.more.slice(0, -1)]) {
            expect(e.file).toBe(file);
            expect(e.line).toBeGreaterThanOrEqual(1);
            expect(e.line).toBeLessThanOrEqual(lineCount);
            expect(e.format()).toMatch(/^.+:\d+: \S/);
          }
          expect(t.line).toBeLessThanOrEqual(made!.line);
          expect(dumpCatalog(db)).toBe(before);
        }),
        { numRuns: 150, seed: 42, endOnFailure: true },
      );
    });
  }

  it("through the CLI, 3 mutations per format: exit 1, FILE:LINE: lines, the catalog unchanged", () => {
    cat.close();
    const rng = fc.sample(arbMutation, { numRuns: 200, seed: 9 });
    for (const fmt of Object.keys(VALID) as Fmt[]) {
      const made = rng.map((m) => mutate(fmt, m)).filter((x) => x !== undefined).slice(0, 3);
      expect(made.length).toBe(3);
      made.forEach((x, n) => {
        const name = `cli${n}.${fmt}`;
        writeFileSync(join(dir, name), x!.bytes);
        const r = tp(dir, "load", name, "--db", "c.db");
        expect(r.status, r.stderr).toBe(1);
        const lines = r.stderr.trimEnd().split("\n");
        expect(lines.at(-1)).toMatch(/nothing was loaded$/);
        for (const l of lines.slice(0, -1)) expect(l).toMatch(new RegExp(`^(tiepoint: )?${name.replace(".", "\\.")}:\\d+: \\S`));
        expect(dumpCatalog(db)).toBe(before);
      });
    }
    cat = Catalog.open(db);
  });
});

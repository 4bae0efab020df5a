/**
 * Fuzzing of every import path (issue 10) with fast-check: a valid file of each format gets a
 * generated malformed line (a broken statement, a stray quote, invalid UTF-8, random bytes)
 * spliced in at a generated position, plus optional random noise lines. The load must fail
 * with TiepointErrors that all name the file and a line within it (the last, summary entry
 * excepted), the first one at or before the spliced line, and leave the catalog row-for-row
 * unchanged. No expected numbers: the properties are the contract's error rules.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../index.js";
import { TiepointError } from "../../model/index.js";

type Fmt = "nt" | "ttl" | "jsonl" | "csv" | "tsv";

const VALID: Record<Fmt, string[]> = {
  nt: ['<f:a> <http://www.w3.org/2000/01/rdf-schema#label> "Alder" .', "<f:a> <f:near> <f:b> .", '<f:b> <f:depth> "12"^^<http://www.w3.org/2001/XMLSchema#integer> .', "# a comment", ""],
  ttl: ["@prefix f: <f:> .", 'f:a f:near f:b ; f:name "Alder" .', "f:b f:near f:c .", ""],
  jsonl: ['{"id":"f:a","label":"Alder"}', '{"id":"f:b","label":"Birch","relations":{"f:near":["f:a"]}}', '{"subject":"f:a","relation":"f:near","object":"f:b"}'],
  csv: ["id,label,depth", "f:a,Alder,12", 'f:b,"Birch, the tall",3'],
  tsv: ["id\tlabel\tdepth", "f:a\tAlder\t12", "f:b\tBirch\t3"],
};

/** Lines that are malformed in the given format wherever they are spliced in (after the header). */
const BROKEN: Record<Fmt, string[]> = {
  nt: ["<f:a> <f:near> .", '<f:a> <f:p> "open', "f:a <f:p> <f:b> .", "<f:a> <f:p> <f:b> <f:c> .", '"lit" <f:p> <f:b> .', "<f:a> <f:p> <f:b>", '<f:a> <http://www.w3.org/2000/01/rdf-schema#label> "" .'],
  ttl: ["f:a f:near .", "f:a f:p f:b f:c .", 'f:a f:p "open .', "undeclared:a f:p f:b .", "f:a f:p [ .", '<f:a> <http://www.w3.org/2000/01/rdf-schema#label> "" .'],
  jsonl: ["{", '{"id":}', "[1]", '"text"', '{"id":"x","label":""}', '{"id":"x","nope":1}', '{"subject":"f:a","relation":"f:near","object":"f:ghost"}', '{"kind":"edge","subject":"f:a"}'],
  csv: ['f:c,"open', "f:d,Oak,1,extra", ",Nameless,1", "f:e,,2", 'f:f,x"y"z,1'],
  tsv: ["f:d\tOak\t1\textra", "\tNameless\t1", "f:e\t\t2"],
};

const BAD_BYTES = [Buffer.from([0xff]), Buffer.from([0xc3]), Buffer.from([0xed, 0xa0, 0x80]), Buffer.from([0xe2, 0x82])];

let dir = "";
let cat: Catalog;
let before = "";

function dump(c: Catalog): string {
  const t = ["entity", "alias", "edge", "attribute", "predicate", "predicate_alias", "entity_type", "subclass", "meta"];
  return JSON.stringify(t.map((x) => c.db.prepare(`SELECT * FROM ${x}`).raw(true).all().map((r) => JSON.stringify(r)).sort()));
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tp-fuzz-"));
  cat = Catalog.open(join(dir, "c.db"), { create: true });
  const seed = join(dir, "seed.jsonl");
  writeFileSync(seed, '{"id":"f:a","label":"Alder"}\n{"id":"f:b","label":"Birch"}\n');
  loadFiles(cat, [seed]);
  before = dump(cat);
});
afterAll(() => cat.close());

const arbCase = (fmt: Fmt) =>
  fc.record({
    at: fc.nat(),
    kind: fc.constantFrom("line", "bytes"),
    pick: fc.nat(),
    noise: fc.array(fc.string({ unit: "binary", maxLength: 30 }), { maxLength: 3 }),
  }).map((c) => ({ ...c, fmt }));

describe("fuzzed malformed imports", () => {
  for (const fmt of Object.keys(VALID) as Fmt[]) {
    it(`${fmt}: always FILE:LINE errors and an unchanged catalog`, () => {
      let k = 0;
      fc.assert(
        fc.property(arbCase(fmt), (c) => {
          const lines = VALID[fmt].map((l) => Buffer.from(l));
          const header = fmt === "csv" || fmt === "tsv" || fmt === "ttl" ? 1 : 0;
          const pos = header + (c.at % (lines.length - header + 1));
          let bad: Buffer;
          if (c.kind === "line") bad = Buffer.from(BROKEN[fmt][c.pick % BROKEN[fmt].length]!);
          else {
            const ok = VALID[fmt][header]!;
            bad = Buffer.concat([Buffer.from(ok.slice(0, 3)), BAD_BYTES[c.pick % BAD_BYTES.length]!, Buffer.from(ok.slice(3))]);
          }
          const out = [...lines.slice(0, pos), bad, ...lines.slice(pos)];
          // noise goes after the bad line, so the first error is at or before it
          for (const n of c.noise) out.push(Buffer.from(n.replace(/\n/g, " ")));
          const file = join(dir, `f${k++}.${fmt}`);
          writeFileSync(file, Buffer.concat(out.flatMap((b) => [b, Buffer.from("\n")])));
          let err: unknown;
          try {
            loadFiles(cat, [file]);
          } catch (e) {
            err = e;
          }
          expect(err).toBeInstanceOf(TiepointError);
          const t = err as TiepointError;
          const all = [t, ...t.more.slice(0, -1)];
          for (const e of all) {
            expect(e.file).toBe(file);
            expect(e.line).toBeGreaterThanOrEqual(1);
            expect(e.line).toBeLessThanOrEqual(out.length);
            expect(e.format()).toMatch(/^.+:\d+: \S/);
          }
          expect(t.line).toBeLessThanOrEqual(pos + 1);
          expect(t.more.at(-1)!.message).toMatch(/nothing was loaded$/);
          expect(dump(cat)).toBe(before);
        }),
        { numRuns: 120, seed: 7 },
      );
    });
  }
});

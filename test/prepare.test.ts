/**
 * Question indexes prepared during a load (src/pipeline/prepare.ts) are the same files, byte
 * for byte, as the ones built by reading the finished catalog back (ranking `openIndex`,
 * linking `LexicalSnapshot.forCatalog`): the demo catalog, a generated catalog loaded in two
 * file orders (edges before the entities they name, as `load *.nt` does, and after), RDF edge
 * cases (duplicate rows, a preferred-language label replacing a provisional one, appended
 * descriptions, self-loops, predicate and unit IRIs removed at the end of the load), CSV, and
 * `--replace`. A failed load leaves no index file and no temporary file behind; a load into a
 * non-empty catalog leaves preparation to the read-back path. Real files, real SQLite.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { Catalog, demoSourceFiles, loadFiles } from "../src/catalog/index.js";
import { generateCatalog } from "../src/gen/index.js";
import { LexicalSnapshot } from "../src/linking/index.js";
import { LoadPreparation } from "../src/pipeline/index.js";
import { openIndex, snapshotPath } from "../src/ranking/index.js";

const dir = mkdtempSync(join(tmpdir(), "tiepoint-prepare-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Loads `files` into `db` with streamed preparation; returns the report and the two files' bytes. */
function streamedLoad(db: string, files: string[], replace = false, ahead?: boolean) {
  const cat = Catalog.open(db, { create: true });
  try {
    const sink = new LoadPreparation(undefined, ahead === undefined ? {} : { ahead });
    const report = loadFiles(cat, files, { sink, replace });
    const idx = existsSync(snapshotPath(db)) ? readFileSync(snapshotPath(db)) : undefined;
    const link = existsSync(LexicalSnapshot.pathFor(db)) ? readFileSync(LexicalSnapshot.pathFor(db)) : undefined;
    return { report, idx, link, sink };
  } finally {
    cat.close();
  }
}

/** Deletes the two files and builds them again by reading the catalog back. */
function readBack(db: string): { idx: Buffer; link: Buffer } {
  rmSync(snapshotPath(db), { force: true });
  rmSync(LexicalSnapshot.pathFor(db), { force: true });
  const cat = Catalog.open(db, { readonly: true });
  try {
    openIndex(cat);
    LexicalSnapshot.forCatalog(cat);
  } finally {
    cat.close();
  }
  return { idx: readFileSync(snapshotPath(db)), link: readFileSync(LexicalSnapshot.pathFor(db)) };
}

function expectSameAsReadBack(db: string, files: string[], replace = false, ahead?: boolean): LoadPreparation {
  const s = streamedLoad(db, files, replace, ahead);
  expect(s.report.prepared, s.sink.reason).toBe(true);
  const r = readBack(db);
  expect(s.idx!.equals(r.idx)).toBe(true);
  expect(s.link!.equals(r.link)).toBe(true);
  return s.sink;
}

function write(name: string, text: string): string {
  const f = join(dir, name);
  writeFileSync(f, text);
  return f;
}

describe("question indexes prepared during a load", () => {
  it("equal the read-back build on the demo catalog", () => {
    expectSameAsReadBack(join(dir, "demo.db"), demoSourceFiles());
  });

  it("equal the read-back build on a generated catalog, whatever the file order", () => {
    const gen = generateCatalog({ out: join(dir, "gen"), entities: 3000, edges: 15000, seed: 4, questions: 1 });
    expectSameAsReadBack(join(dir, "gen-sorted.db"), [...gen.files].sort()); // edges.nt first: entities exist before their labels
    expectSameAsReadBack(join(dir, "gen-given.db"), gen.files);
  });

  it("equal the read-back build when a second thread builds them (the compiled worker, dist/)", async () => {
    // the worker runs only from the compiled build (npm run build): load through dist's modules
    const dist = new URL("../dist/", import.meta.url);
    const { Catalog: DistCatalog, loadFiles: distLoad } = (await import(new URL("catalog/index.js", dist).href)) as typeof import("../src/catalog/index.js");
    const { LoadPreparation: DistPreparation, PREPARE_DEFAULTS } = (await import(new URL("pipeline/index.js", dist).href)) as typeof import("../src/pipeline/index.js");
    const gen = generateCatalog({ out: join(dir, "gen-thread"), entities: 3000, edges: 15000, seed: 6, questions: 1 });
    for (const [name, textBatch] of [["thread-big", PREPARE_DEFAULTS.textBatch], ["thread-small", 7]] as const) {
      const saved = PREPARE_DEFAULTS.textBatch;
      PREPARE_DEFAULTS.textBatch = textBatch; // 7: batches of any size, across row kinds
      const db = join(dir, `${name}.db`);
      const cat = DistCatalog.open(db, { create: true });
      const sink = new DistPreparation();
      try {
        const report = distLoad(cat, [...gen.files].sort(), { sink });
        expect(report.prepared, sink.reason).toBe(true);
      } finally {
        cat.close();
        PREPARE_DEFAULTS.textBatch = saved;
      }
      // 3,000 entities give more than one batch of names (labels, aliases, descriptions): the thread ran
      expect(sink.threaded).toBe(true);
      // the generator's relation IRIs carry labels only: their removal was foreseen, the files were built ahead
      expect(sink.builtAhead).toBe(true);
      const streamed = { idx: readFileSync(snapshotPath(db)), link: readFileSync(LexicalSnapshot.pathFor(db)) };
      const r = readBack(db);
      expect(streamed.idx.equals(r.idx)).toBe(true);
      expect(streamed.link.equals(r.link)).toBe(true);
    }
  });

  it("equal the read-back build on RDF edge cases", () => {
    const nt = write(
      "cases.nt",
      [
        "<urn:x:knows> <http://www.w3.org/2000/01/rdf-schema#label> \"knows\" .",
        "<urn:x:a> <http://www.w3.org/2000/01/rdf-schema#label> \"Gato grande\"@es .",
        "<urn:x:a> <urn:x:knows> <urn:x:b> .",
        "<urn:x:a> <urn:x:knows> <urn:x:b> .",
        "<urn:x:a> <urn:x:knows> <urn:x:a> .",
        "<urn:x:a> <http://www.w3.org/2000/01/rdf-schema#label> \"Big Cat\"@en .",
        "<urn:x:a> <http://www.w3.org/2000/01/rdf-schema#comment> \"A cat of the hills.\" .",
        "<urn:x:a> <http://www.w3.org/2000/01/rdf-schema#comment> \"It sleeps in the barn.\" .",
        "<urn:x:b> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <urn:x:Barn> .",
        "<urn:x:b> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <urn:x:Barn> .",
        "<urn:x:Barn> <http://www.w3.org/2000/01/rdf-schema#subClassOf> <urn:x:Building> .",
        "<urn:x:b> <http://www.w3.org/2004/02/skos/core#altLabel> \"the old barn\" .",
        "<urn:x:b> <http://www.w3.org/2000/01/rdf-schema#label> \"Barn\" .",
        "<urn:x:c> <urn:x:near> <urn:x:b> .",
        "<urn:x:near> <http://www.w3.org/2000/01/rdf-schema#label> \"near\" .",
        "<urn:x:near> <http://www.w3.org/2000/01/rdf-schema#domain> <urn:x:Place> .",
        "<urn:x:c> <urn:x:height> \"12\" .",
        "<urn:x:height> <http://qudt.org/schema/qudt/unit> <urn:x:unit:M> .",
        "<urn:x:unit:M> <http://www.w3.org/2000/01/rdf-schema#label> \"metre\" .",
        "<urn:x:unit:M> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <urn:x:Unit> .",
        "",
      ].join("\n"),
    );
    const db = join(dir, "cases.db");
    expectSameAsReadBack(db, [nt]);
    const cat = Catalog.open(db, { readonly: true });
    try {
      // the predicate IRIs were removed as entities at the end of the load (import/finish.ts)
      expect(cat.numOf("urn:x:knows")).toBeUndefined();
      expect(cat.numOf("urn:x:near")).toBeUndefined();
      // and the unit IRI named by qudt:unit, with the type only it had (writer.writeUnits)
      expect(cat.numOf("urn:x:unit:M")).toBeUndefined();
    } finally {
      cat.close();
    }
  });

  it("equal the read-back build when built ahead (the rows all in), whether the removals were foreseen or not", () => {
    const labelsOnly = write(
      "ahead.nt",
      [
        "<urn:x:knows> <http://www.w3.org/2000/01/rdf-schema#label> \"knows\" .",
        "<urn:x:knows> <http://www.w3.org/2004/02/skos/core#altLabel> \"is acquainted with\" .",
        "<urn:x:a> <http://www.w3.org/2000/01/rdf-schema#label> \"Ada\" .",
        "<urn:x:a> <urn:x:knows> <urn:x:b> .",
        "<urn:x:b> <http://www.w3.org/2000/01/rdf-schema#label> \"Bo\" .",
        "<urn:x:b> <http://www.w3.org/2000/01/rdf-schema#comment> \"Knows nobody.\" .",
        "<urn:x:c> <urn:x:knows> <urn:x:a> .",
        "",
      ].join("\n"),
    );
    // the predicate entity urn:x:knows has labels only: removed at the end, as foreseen
    expect(expectSameAsReadBack(join(dir, "ahead.db"), [labelsOnly], false, true).builtAhead).toBe(true);
    // a predicate with an rdfs:domain edge and a unit IRI: not foreseen, built at the end as before
    expect(expectSameAsReadBack(join(dir, "ahead-cases.db"), [join(dir, "cases.nt")], false, true).builtAhead).toBe(false);
    // CSV (no removals) and --replace
    const csv = write("ahead.csv", "id,label,knows\np:1,Ada,p:2\np:2,Bo,p:1\n");
    expect(expectSameAsReadBack(join(dir, "ahead-csv.db"), [csv], false, true).builtAhead).toBe(true);
    expect(expectSameAsReadBack(join(dir, "ahead-csv.db"), demoSourceFiles(), true, true).builtAhead).toBe(true);
  });

  it("equal the read-back build for CSV rows and after --replace", () => {
    const csv = write("people.csv", "id,label,type,description,worksWith\np:1,Ada Vell,t:Person,Builds boats.,p:2\np:2,Bo Rill,t:Person,Mends nets.,p:1\np:3,Cy Rill,t:Person,,p:1\n");
    const db = join(dir, "csv.db");
    expectSameAsReadBack(db, [csv]);
    expectSameAsReadBack(db, demoSourceFiles(), true);
  });

  it("leaves preparation to the read-back path when the catalog was not empty", () => {
    const db = join(dir, "twice.db");
    const first = streamedLoad(db, [write("one.csv", "id,label\nx:1,One\n")]);
    expect(first.report.prepared).toBe(true);
    const second = streamedLoad(db, [write("two.csv", "id,label\nx:2,Two\n")]);
    expect(second.report.prepared).toBe(false);
    expect(second.sink.reason).toMatch(/not empty/);
  });

  it("writes no index file and no temporary file when the load fails", () => {
    const sub = mkdtempSync(join(dir, "fail-"));
    const db = join(sub, "bad.db");
    const bad = write("bad.nt", "<urn:x:a> <urn:x:r> <urn:x:b> .\n<urn:x:a> broken line\n");
    const cat = Catalog.open(db, { create: true });
    try {
      expect(() => loadFiles(cat, [bad], { sink: new LoadPreparation() })).toThrow();
      // failing after the rows are all in (--strict: a warning of the end-of-load checks), the files built ahead are deleted
      const unlabelled = write("unlabelled.nt", "<urn:x:a> <urn:x:r> <urn:x:b> .\n");
      const sink = new LoadPreparation(undefined, { ahead: true });
      expect(() => loadFiles(cat, [unlabelled], { sink, strict: true })).toThrow(/strict/);
    } finally {
      cat.close();
    }
    expect(readdirSync(sub).filter((f) => /\.(idx|link)|tmp/.test(f))).toEqual([]);
  });
});

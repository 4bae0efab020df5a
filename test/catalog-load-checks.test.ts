/**
 * `tiepoint load` warnings and `--strict` through the real CLI (spawned `node dist/cli/main.js`,
 * real files in a temp folder, real SQLite): misspelt type and relation ids (issue 18), empty
 * files, a catalog in a missing folder, plurals in the summary. Expected lines are written by
 * hand from the input files (the line numbers counted in them).
 */
import { mkdtempSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import Database from "better-sqlite3";
import { dumpCatalog } from "./catalog-dump.js";
import { ensureBuilt, tp as run } from "./reliability-cli.js";

let dir = "";
const tp = (...args: string[]) => run(dir, ...args);
function write(name: string, content: string): string {
  writeFileSync(join(dir, name), content);
  return name;
}

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-load-checks-"));
});

const TYPO_JSONL = [
  '{"kind":"type","id":"t:Surveyor","label":"surveyor"}',
  '{"kind":"relation","id":"worksAt","label":"works at"}',
  '{"id":"p:ana","label":"Ana Vell","types":["t:Surveyor"],"relations":{"worksAt":"o:lab"}}',
  '{"id":"o:lab","label":"Harl Lab"}',
  '{"id":"p:bo","label":"Bo Trem","types":["t:Surveyr"],"relations":{"workAt":"o:lab"}}',
  "",
].join("\n");

const RDFS_LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const RDF_TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";

describe("load: misspelt ids are reported with FILE:LINE and a did-you-mean", () => {
  it("JSON Lines: an undeclared type and relation used once, at the line of first use", () => {
    const r = tp("load", write("typo.jsonl", TYPO_JSONL), "--db", "typo.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toContain('typo.jsonl:5: warning: relation "workAt" is not declared and has no label (used by 1 edge); did you mean "worksAt"?');
    expect(lines).toContain('typo.jsonl:5: warning: type "t:Surveyr" is not declared and has no label (used by 1 row); did you mean "t:Surveyor"?');
    expect(lines.at(-1)).toMatch(/; 2 warnings \(1 undeclared relation, 1 undeclared type\)$/);
  });

  it("N-Triples (read without line tracking) and Turtle find the line of first use too", () => {
    const nt = [
      `<urn:x:worksAt> ${RDFS_LABEL} "works at" .`,
      `<urn:x:Surveyor> ${RDFS_LABEL} "surveyor" .`,
      `<urn:x:ana> ${RDF_TYPE} <urn:x:Surveyor> .`,
      `<urn:x:ana> <urn:x:worksAt> <urn:x:lab> .`,
      "",
      `<urn:x:bo> ${RDF_TYPE} <urn:x:Surveyr> .`,
      `<urn:x:bo> <urn:x:workAt> <urn:x:lab> .`,
      "",
    ].join("\n");
    const r = tp("load", write("typo.nt", nt), "--db", "typo-nt.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain('typo.nt:6: warning: type "urn:x:Surveyr" is not declared and has no label (used by 1 row); did you mean "urn:x:Surveyor"?');
    expect(r.stderr).toContain('typo.nt:7: warning: relation "urn:x:workAt" is not declared and has no label (used by 1 edge); did you mean "urn:x:worksAt"?');
    const ttl = ["@prefix x: <urn:x:> .", "@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .", 'x:worksAt rdfs:label "works at" .', 'x:Surveyor rdfs:label "surveyor" .', "x:ana a x:Surveyor ; x:worksAt x:lab .", "x:bo a x:Surveyr ;", "  x:workAt x:lab .", ""].join("\n");
    const t = tp("load", write("typo.ttl", ttl), "--db", "typo-ttl.db", "--no-prepare");
    expect(t.status, t.stderr).toBe(0);
    expect(t.stderr).toContain('typo.ttl:6: warning: type "urn:x:Surveyr"');
    expect(t.stderr).toContain('typo.ttl:7: warning: relation "urn:x:workAt"');
  });

  it("a widely used relation without a label is reported as unlabelled, once", () => {
    const rows = ["subject,relation,object", ...["a", "b", "c"].map((x) => `e:${x},r:near,e:z`), ""].join("\n");
    write("ents.csv", "id,label\ne:a,Alder\ne:b,Birch\ne:c,Cedar\ne:z,Zelkova\n");
    const r = tp("load", "ents.csv", write("near.csv", rows), "--db", "near.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain('near.csv:2: warning: relation "r:near" has no label (used by 3 edges); questions can name it only as "near"');
    expect(r.stderr).toMatch(/1 warning \(1 unlabelled relation\)\n/);
  });

  it("--strict: the same warnings are errors, exit 1, nothing written", () => {
    const before = tp("load", write("seed.jsonl", '{"id":"s:1","label":"Seed"}\n'), "--db", "strict.db", "--no-prepare");
    expect(before.status, before.stderr).toBe(0);
    const dump = dumpCatalog(join(dir, "strict.db"));
    const r = tp("load", "typo.jsonl", "--db", "strict.db", "--strict", "--no-prepare");
    expect(r.status).toBe(1);
    expect(r.stderr.trimEnd().split("\n")).toEqual([
      'typo.jsonl:5: relation "workAt" is not declared and has no label (used by 1 edge); did you mean "worksAt"? (--strict: warnings are errors)',
      'typo.jsonl:5: type "t:Surveyr" is not declared and has no label (used by 1 row); did you mean "t:Surveyor"? (--strict: warnings are errors)',
      "2 errors; nothing was loaded",
    ]);
    expect(dumpCatalog(join(dir, "strict.db"))).toBe(dump);
    // a clean file passes --strict
    const ok = tp("load", write("clean.jsonl", TYPO_JSONL.split("\n").slice(0, 4).join("\n") + "\n"), "--db", "strict.db", "--strict", "--no-prepare");
    expect(ok.status, ok.stderr).toBe(0);
    expect(ok.stderr).not.toMatch(/warning/);
  });

  it("the warning list is capped, and says how many more", () => {
    // 25 relations, each used once, no labels: 25 warnings, 20 listed (DEFAULTS.maxWarnings)
    const rows = ["subject,relation,object", ...Array.from({ length: 25 }, (_, i) => `e:a,r:q${i},e:z`), ""].join("\n");
    const r = tp("load", "ents.csv", write("many.csv", rows), "--db", "many.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines.filter((l) => l.includes(": warning: "))).toHaveLength(20);
    expect(lines).toContain("… and 5 more warnings");
    expect(lines.at(-1)).toMatch(/; 25 warnings \(25 undeclared relations\)$/);
  });
});

describe("load: small things (issue 18)", () => {
  it("an empty .csv and an empty .ttl both load nothing, with a warning", () => {
    const r = tp("load", write("empty.csv", ""), write("empty.ttl", ""), write("one.jsonl", '{"id":"x:1","label":"Uno"}\n'), "--db", "empty.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain("empty.csv:1: warning: no statements in this file; nothing was loaded from it");
    expect(r.stderr).toContain("empty.ttl:1: warning: no statements in this file; nothing was loaded from it");
    // singular forms: 1 statement, +1 entity, +0 edges
    expect(r.stderr).toMatch(/loaded 3 files into empty\.db: 1 statement in [\d.]+ s \([\d,]+\/s\); \+1 entity, \+0 edges, \+0 attributes; 2 warnings \(2 empty files\)/);
  });

  it("a catalog in a folder that does not exist: one clear line, exit 1, nothing created", () => {
    const r = tp("load", "one.jsonl", "--db", "no/such/place.db");
    expect(r.status).toBe(1);
    expect(r.stderr).toBe("tiepoint: cannot create catalog no/such/place.db: folder no/such does not exist\n");
    expect(existsSync(join(dir, "no"))).toBe(false);
  });

  it("an unknown JSON Lines field names the record kind with the right article", () => {
    const r = tp("load", write("field.jsonl", '{"kind":"attribute","id":"a:x","lable":"x"}\n'), "--db", "field.db");
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^field\.jsonl:1: unknown field "lable" in an attribute record/);
  });
});

/** The units stored in a catalog file (meta `unit:PRED`), read with SQLite directly. */
function units(db: string): Record<string, string> {
  const h = new Database(join(dir, db), { readonly: true });
  try {
    const rows = h.prepare("SELECT key, value FROM meta WHERE key LIKE 'unit:%' ORDER BY key").all() as { key: string; value: string }[];
    return Object.fromEntries(rows.map((r) => [r.key.slice(5), r.value]));
  } finally {
    h.close();
  }
}

describe("load: attribute units in every format", () => {
  it("CSV: a unit column gives attribute rows their unit; cells a row cannot hold are warned about", () => {
    const csv = ["id,kind,label,unit,types", "depth,attribute,depth,metres,", "worksAt,relation,works at,km,t:X", "p:a,entity,Ana,,", "p:b,entity,Bo,7,", ""].join("\n");
    const r = tp("load", write("units.csv", csv), "--db", "units-csv.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(units("units-csv.db")).toEqual({ depth: "metres" });
    expect(r.stderr.split("\n").filter((l) => l.includes(": warning: "))).toEqual([
      'units.csv:3: warning: column "unit" is ignored on a relation row (a relation row takes id, kind, label, aliases, description)',
      'units.csv:3: warning: column "types" is ignored on a relation row (a relation row takes id, kind, label, aliases, description)',
      'units.csv:5: warning: column "unit" is ignored on an entity row (it gives the unit of attribute rows)',
    ]);
    // without a kind column, "unit" is an ordinary attribute column
    const plain = tp("load", write("plain.csv", "id,label,unit\nr:7,Seventh Rangers,brigade\n"), "--db", "plain.db", "--no-prepare");
    expect(plain.status, plain.stderr).toBe(0);
    expect(tp("show", "r:7", "--db", "plain.db").stdout).toContain("unit [unit]: brigade");
  });

  it("RDF: qudt:unit / qudt:hasUnit (named by the unit IRI's label, else its last segment), schema.org unitText and unitCode", () => {
    const ttl = [
      "@prefix x: <urn:x:> .",
      "@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .",
      "@prefix qudt: <http://qudt.org/schema/qudt/> .",
      "@prefix unit: <http://qudt.org/vocab/unit/> .",
      "@prefix schema: <http://schema.org/> .",
      'x:depth rdfs:label "depth" ; qudt:hasUnit unit:M .',
      'unit:M rdfs:label "metre" ; a qudt:Unit .',
      'x:area rdfs:label "area" ; schema:unitText "square kilometres" ; qudt:unit unit:KiloM2 .',
      "x:mass qudt:unit unit:KiloGM .",
      'x:code <https://schema.org/unitCode> "MTR" .',
      'x:trench rdfs:label "Harl Trench" ; x:depth 4200 ; x:area 12 .',
      "",
    ].join("\n");
    const r = tp("load", write("units.ttl", ttl), "--db", "units-ttl.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(units("units-ttl.db")).toEqual({ "urn:x:depth": "metre", "urn:x:area": "square kilometres", "urn:x:mass": "KiloGM", "urn:x:code": "MTR" });
    // the unit IRI (and its type qudt:Unit) took no part in the graph: not left as entities
    expect(r.stderr).toMatch(/\+1 entity, \+0 edges, \+2 attributes/);
    expect(tp("show", "metre", "--db", "units-ttl.db").status).toBe(1);
  });
});

describe("load: re-loading a corrected file (the re-load rule, --update)", () => {
  const FIRST = [
    '{"kind":"attribute","id":"depth","label":"depth","unit":"metres"}',
    '{"kind":"attribute","id":"tag","label":"tag"}',
    '{"kind":"relation","id":"near","label":"near"}',
    '{"id":"s:1","label":"Harl Trench","aliases":["the Harl"],"description":"A trench.","attributes":{"depth":4200,"tag":["a","b"]},"relations":{"near":["s:2"]}}',
    '{"id":"s:2","label":"Osk Shoal","attributes":{"depth":30}}',
    '{"id":"s:3","label":"Vey Reef","attributes":{"depth":12}}',
    "",
  ].join("\n");
  const CORRECTED = [
    '{"id":"s:1","label":"Harle Trench","description":"A deep trench.","attributes":{"depth":4300,"tag":"c"},"relations":{"near":["s:3"]}}',
    '{"id":"s:2","label":"Osk Shoal","attributes":{"depth":30}}',
    "",
  ].join("\n");

  it("without --update: the old label stays and values pile up, each reported once with FILE:LINE", () => {
    write("first.jsonl", FIRST);
    write("corrected.jsonl", CORRECTED);
    expect(tp("load", "first.jsonl", "--db", "keep.db", "--no-prepare").status).toBe(0);
    const again = tp("load", "first.jsonl", "--db", "keep.db", "--no-prepare");
    expect(again.stderr).not.toMatch(/warning/); // the same file again changes nothing and says nothing
    // --strict refuses the corrected file (the warnings below are errors)
    expect(tp("load", "corrected.jsonl", "--db", "keep.db", "--strict", "--no-prepare").status).toBe(1);
    const r = tp("load", "corrected.jsonl", "--db", "keep.db", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr.split("\n").filter((l) => l.includes(": warning: "))).toEqual([
      'corrected.jsonl:1: warning: entity "s:1" already has the label "Harl Trench"; "Harle Trench" was added as an alias (load with --update to replace the label)',
      // depth holds one value per entity: a second one is reported; tag already holds two on s:1, so a third is not
      'corrected.jsonl:1: warning: entity "s:1" already has depth "4200"; "4300" was added as a second value (load with --update to replace it)',
    ]);
    expect(r.stderr).toMatch(/2 warnings \(1 label kept, 1 second value\)/);
    const show = tp("show", "s:1", "--db", "keep.db").stdout;
    expect(show).toMatch(/^Harl Trench {2}\[s:1\]/);
    expect(show).toContain("depth [depth]: 4200\n    depth [depth]: 4300");
  });

  it("with --update: label, description, attribute values and the relation's edges are replaced, with a summary", () => {
    expect(tp("load", "first.jsonl", "--db", "upd.db", "--no-prepare").status).toBe(0);
    const r = tp("load", "corrected.jsonl", "--db", "upd.db", "--update", "--no-prepare");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).not.toMatch(/warning/);
    // hand-counted from the two files: s:1 changes label, description, depth 4200→4300,
    // tag a,b→c (2 values), near s:2→s:3 (1 edge); s:2 is restated unchanged
    expect(r.stderr).toContain("updated 1 entity: 1 label changed, 1 description replaced, 3 attribute values replaced, 1 edge removed\n");
    const show = tp("show", "s:1", "--db", "upd.db").stdout;
    expect(show).toMatch(/^Harle Trench {2}\[s:1\]/);
    expect(show).toContain("aliases:     the Harl\n"); // aliases not restated stay; the old label does not
    expect(show).toContain("description: A deep trench.\n");
    expect(show).toContain("depth [depth]: 4300\n    tag [tag]: c\n");
    expect(show).not.toContain("4200");
    expect(show).toContain("—near→ Vey Reef [s:3]");
    expect(show).not.toContain("Osk Shoal");
    // the edge into s:1's old target is gone from both ends
    expect(tp("show", "s:2", "--db", "upd.db").stdout).toContain("(no relations)");
    const same = tp("load", "corrected.jsonl", "--db", "upd.db", "--update", "--no-prepare");
    expect(same.stderr).toContain("updated 0 entities (the files matched the catalog)");
  });

  it("--update in RDF: the first preferred label replaces the old one; a restated file changes nothing", () => {
    const ttl = (label: string, len: number) => ["@prefix x: <urn:x:> .", "@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .", `x:wren rdfs:label "${label}" ; x:len ${len} .`, ""].join("\n");
    write("w1.ttl", ttl("Wren", 12));
    write("w2.ttl", ttl("Wren II", 14));
    expect(tp("load", "w1.ttl", "--db", "w.db", "--no-prepare").status).toBe(0);
    const r = tp("load", "w2.ttl", "--db", "w.db", "--update", "--no-prepare");
    expect(r.stderr).toContain("updated 1 entity: 1 label changed, 1 attribute value replaced\n");
    const show = tp("show", "urn:x:wren", "--db", "w.db").stdout;
    expect(show).toMatch(/^Wren II {2}\[urn:x:wren\]/);
    expect(show).not.toContain("aliases");
    expect(show).toContain("len [urn:x:len]: 14\n");
  });
});

describe("stats: per type, per relation, shared names, types with no members", () => {
  it("counts hand-checked against a small hierarchy", () => {
    const lines = [
      '{"kind":"type","id":"t:Site","label":"site"}',
      '{"kind":"type","id":"t:Reef","label":"reef","subClassOf":["t:Site"]}',
      '{"kind":"type","id":"t:Shoal","label":"shoal","subClassOf":["t:Site"]}',
      // a type is known as one by its members or its place in the hierarchy (a JSON Lines
      // "type" record is an entity record): t:Wreck has no members but a parent
      '{"kind":"type","id":"t:Wreck","label":"wreck","subClassOf":["t:Site"]}',
      '{"kind":"relation","id":"r:near","label":"near"}',
      '{"id":"s:1","label":"Vey","types":["t:Reef"],"relations":{"r:near":["s:2","s:3"]}}',
      '{"id":"s:2","label":"Vey","types":["t:Shoal"]}',
      '{"id":"s:3","label":"Osk","types":["t:Reef","t:Site"]}',
      '{"id":"s:4","label":"Tarn"}',
      "",
    ];
    const r0 = tp("load", write("stats.jsonl", lines.join("\n")), "--db", "stats.db", "--no-prepare");
    expect(r0.status, r0.stderr).toBe(0);
    const r = tp("stats", "--db", "stats.db", "--json");
    expect(r.status, r.stderr).toBe(0);
    const s = JSON.parse(r.stdout);
    // site: direct s:3; with subtypes (reef, shoal, wreck) s:1, s:2, s:3 = 3; reef: s:1, s:3; shoal: s:2; wreck: none
    expect(s.types).toEqual([
      { id: "t:Site", label: "site", members: 1, withSubtypes: 3 },
      { id: "t:Reef", label: "reef", members: 2, withSubtypes: 2 },
      { id: "t:Shoal", label: "shoal", members: 1, withSubtypes: 1 },
      { id: "t:Wreck", label: "wreck", members: 0, withSubtypes: 0 },
    ]);
    expect(s.emptyTypes).toEqual([{ id: "t:Wreck", label: "wreck" }]);
    expect(s.relations).toEqual([{ id: "r:near", label: "near", edges: 2 }]);
    expect(s.sharedNames).toEqual({ count: 1, top: [{ name: "Vey", entities: 2 }] });
    // the four types have no edges: not counted as entities without edges (only s:4 is)
    expect(s.isolated).toBe(1);
    expect(s.components).toBe(2);
    const text = tp("stats", "--db", "stats.db").stdout;
    expect(text).toContain("  types (members with subtypes, direct members):\n           3        1  site [t:Site]\n");
    expect(text).toContain("  relations (edges):\n           2  near [r:near]\n");
    expect(text).toContain("  shared names: 1 name carried by several entities (a question using one needs other clues to tell them apart):\n           2  Vey\n");
    expect(text).toContain("  types with no members (1):\n              wreck [t:Wreck]\n");
    expect(text).toContain("1 entities without edges; types without edges are not counted");
  });
});

describe("show: a type's place in the hierarchy; did you mean for an unknown name", () => {
  it("a type shows its parents, subtypes and member count", () => {
    // stats.db from the test above: site ⊃ reef, shoal, wreck; s:3 is a site directly
    const r = tp("show", "t:Site", "--db", "stats.db");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain("  a type with 3 members (1 direct, 2 through subtypes)\n  parents:     (none)\n  subtypes:    reef [t:Reef], shoal [t:Shoal], wreck [t:Wreck]\n");
    const reef = JSON.parse(tp("show", "reef", "--db", "stats.db", "--json").stdout);
    expect(reef.type).toEqual({ parents: [{ id: "t:Site", label: "site" }], children: [], members: 2, withSubtypes: 2 });
    // an entity that is no type has no type part
    expect(JSON.parse(tp("show", "s:4", "--db", "stats.db", "--json").stdout).type).toBeUndefined();
  });

  it("an unknown name gets the nearest names, never the same unknown name back", () => {
    const r = tp("show", "Tarnn", "--db", "stats.db");
    expect(r.status).toBe(1);
    expect(r.stderr).toBe('tiepoint: no entity with id or label "Tarnn"; did you mean Tarn [s:4]?\n');
    const id = tp("show", "s:44", "--db", "stats.db");
    expect(id.stderr).toMatch(/^tiepoint: no entity with id or label "s:44"; did you mean Tarn \[s:4\]/);
  });
});

describe("load: Turtle entities and CSV edges in one call", () => {
  it("an entity described by an RDF file of the same load is a declared edge endpoint", () => {
    write("yard.ttl", ['@prefix a: <urn:a:> .', '@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .', 'a:north rdfs:label "North Brake Yard" .', 'a:h1 rdfs:label "Hive Amberly" .', ""].join("\n"));
    write("yard-edges.csv", "subject,relation,object\nurn:a:h1,urn:a:keptAt,urn:a:north\nurn:a:h1,urn:a:keptAt,urn:a:south\n");
    const r = tp("load", "yard-edges.csv", "yard.ttl", "--db", "yard.db", "--no-prepare");
    // urn:a:south is described nowhere: still an unknown endpoint, at its line
    expect(r.status).toBe(1);
    expect(r.stderr.split("\n")[0]).toBe('yard-edges.csv:3: unknown entity "urn:a:south" (declare it as an entity in this load or an earlier one)');
    write("yard-edges.csv", "subject,relation,object\nurn:a:h1,urn:a:keptAt,urn:a:north\n");
    const ok = tp("load", "yard-edges.csv", "yard.ttl", "--db", "yard.db", "--no-prepare");
    expect(ok.status, ok.stderr).toBe(0);
    expect(tp("show", "urn:a:h1", "--db", "yard.db").stdout).toContain("—keptAt→ North Brake Yard [urn:a:north]");
  });
});

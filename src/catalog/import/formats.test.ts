/**
 * Turtle, CSV, TSV and JSON Lines imports, each checked row by row in the catalog, and the
 * same small graph written in all five formats giving the same catalog. Expected rows are
 * hand-derived from the inputs and the mapping in ../shared/contract.md / README.md.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../index.js";
import type { TiepointError } from "../../model/index.js";

let dir = "";
let cat: Catalog | undefined;

function files(spec: Record<string, string>): string[] {
  dir = mkdtempSync(join(tmpdir(), "tp-fmt-"));
  return Object.entries(spec).map(([name, text]) => {
    const f = join(dir, name);
    writeFileSync(f, text);
    return f;
  });
}

function loaded(spec: Record<string, string>): Catalog {
  const fs = files(spec);
  cat = Catalog.open(join(dir, "c.db"), { create: true });
  loadFiles(cat, fs);
  return cat;
}

function failure(spec: Record<string, string>): string[] {
  const fs = files(spec);
  cat = Catalog.open(join(dir, "c.db"), { create: true });
  try {
    loadFiles(cat, fs);
  } catch (e) {
    const t = e as TiepointError;
    return [t, ...t.more].map((x) => x.format().replace(dir + "/", ""));
  }
  throw new Error("expected the load to fail");
}

/** The catalog as comparable rows, by id (nums differ between loads). */
function snapshot(c: Catalog): unknown {
  const q = (sql: string) => c.db.prepare(sql).raw(true).all().map((r) => JSON.stringify(r)).sort();
  return {
    entities: q("SELECT id, label, description FROM entity"),
    aliases: q("SELECT e.id, a.text, a.kind FROM alias a JOIN entity e ON e.num = a.entity"),
    types: q("SELECT e.id, t.id FROM entity_type x JOIN entity e ON e.num = x.entity JOIN entity t ON t.num = x.type"),
    sub: q("SELECT a.id, b.id FROM subclass x JOIN entity a ON a.num = x.sub JOIN entity b ON b.num = x.sup"),
    edges: q("SELECT s.id, p.id, d.id FROM edge x JOIN entity s ON s.num = x.src JOIN predicate p ON p.num = x.rel JOIN entity d ON d.num = x.dst"),
    relLabels: q("SELECT p.id, p.label FROM predicate p WHERE p.num IN (SELECT rel FROM edge)"),
    attrs: q("SELECT e.id, p.id, a.value FROM attribute a JOIN entity e ON e.num = a.entity JOIN predicate p ON p.num = a.predicate"),
  };
}

afterEach(() => {
  cat?.close();
  cat = undefined;
});

// One invented scenario in every format: a ferry line of the made-up isle of Quorra.
const NT = `<q:ferry1> <http://www.w3.org/2000/01/rdf-schema#label> "Gull Runner" .
<q:ferry1> <http://www.w3.org/2004/02/skos/core#altLabel> "the Gull" .
<q:ferry1> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <q:Ferry> .
<q:Ferry> <http://www.w3.org/2000/01/rdf-schema#label> "ferry" .
<q:Ferry> <http://www.w3.org/2000/01/rdf-schema#subClassOf> <q:Vessel> .
<q:ferry1> <http://www.w3.org/2000/01/rdf-schema#comment> "Night boat to the north quay." .
<q:ferry1> <q:built> "1988" .
<q:ferry1> <q:servesPort> <q:northQuay> .
<q:northQuay> <http://www.w3.org/2000/01/rdf-schema#label> "North Quay" .
<q:Vessel> <http://www.w3.org/2000/01/rdf-schema#label> "vessel" .
<q:servesPort> <http://www.w3.org/2000/01/rdf-schema#label> "serves port" .
`;

const TTL = `@prefix q: <q:> .
@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .
@prefix skos: <http://www.w3.org/2004/02/skos/core#> .
q:servesPort rdfs:label "serves port" .
q:ferry1 a q:Ferry ;
  rdfs:label "Gull Runner" ; skos:altLabel "the Gull" ;
  rdfs:comment """Night boat to the north quay.""" ;
  q:built "1988" ;
  q:servesPort q:northQuay .
q:Ferry rdfs:label "ferry" ; rdfs:subClassOf q:Vessel .
q:Vessel rdfs:label "vessel" .
q:northQuay rdfs:label "North Quay" .
`;

const JSONL = `{"kind":"relation","id":"q:servesPort","label":"serves port"}
{"kind":"type","id":"q:Ferry","label":"ferry","subClassOf":["q:Vessel"]}
{"kind":"type","id":"q:Vessel","label":"vessel"}
{"id":"q:ferry1","label":"Gull Runner","aliases":["the Gull"],"types":["q:Ferry"],"description":"Night boat to the north quay.","attributes":{"q:built":"1988"},"relations":{"q:servesPort":["q:northQuay"]}}
{"id":"q:northQuay","label":"North Quay"}
`;

const CSV_ENTITIES = `id,kind,label,aliases,types,subClassOf,description,q:built
q:servesPort,relation,serves port,,,,,
q:Ferry,type,ferry,,,q:Vessel,,
q:Vessel,type,vessel,,,,,
q:ferry1,,Gull Runner,the Gull,q:Ferry,,"Night boat to the north quay.",1988
q:northQuay,,North Quay,,,,,
`;
const CSV_EDGES = `subject,relation,object
q:ferry1,q:servesPort,q:northQuay
`;

describe("the same graph in five formats", () => {
  it("N-Triples, Turtle, JSON Lines, CSV and TSV give the same catalog rows", () => {
    const nt = snapshot(loaded({ "a.nt": NT }));
    cat!.close();
    const ttl = snapshot(loaded({ "a.ttl": TTL }));
    cat!.close();
    const jsonl = snapshot(loaded({ "a.jsonl": JSONL }));
    cat!.close();
    const csv = snapshot(loaded({ "e.csv": CSV_ENTITIES, "r.csv": CSV_EDGES }));
    cat!.close();
    const tsv = snapshot(loaded({ "e.tsv": CSV_ENTITIES.replace(/,/g, "\t").replace(/"/g, ""), "r.tsv": CSV_EDGES.replace(/,/g, "\t") }));
    expect(nt).toEqual({
      entities: [
        '["q:Ferry","ferry",null]',
        '["q:Vessel","vessel",null]',
        '["q:ferry1","Gull Runner","Night boat to the north quay."]',
        '["q:northQuay","North Quay",null]',
      ],
      aliases: ['["q:Ferry","ferry",0]', '["q:Vessel","vessel",0]', '["q:ferry1","Gull Runner",0]', '["q:ferry1","the Gull",1]', '["q:northQuay","North Quay",0]'],
      types: ['["q:ferry1","q:Ferry"]'],
      sub: ['["q:Ferry","q:Vessel"]'],
      edges: ['["q:ferry1","q:servesPort","q:northQuay"]'],
      relLabels: ['["q:servesPort","serves port"]'],
      attrs: ['["q:ferry1","q:built","1988"]'],
    });
    expect(ttl).toEqual(nt);
    expect(jsonl).toEqual(nt);
    expect(csv).toEqual(nt);
    expect(tsv).toEqual(nt);
  });
});

describe("CSV (RFC 4180) details", () => {
  it("quoted fields with commas, doubled quotes and line breaks; rows numbered by their first line", () => {
    const c = loaded({
      "e.csv": 'id,label,note\r\np:1,"Reef, Outer","said ""hi""\r\ntwice"\r\n\r\np:2,Lamp,\r\n',
    });
    const e = c.entity(c.numOf("p:1")!);
    expect(e.label).toBe("Reef, Outer");
    // RFC 4180 section 2.6/2.7: a quoted field may hold CRLF and doubled quotes
    expect(e.attributes.map((a) => a.value)).toEqual(['said "hi"\r\ntwice']);
    expect(c.entity(c.numOf("p:2")!).attributes).toEqual([]);
  });

  it("an error on a row after a multi-line record names that row's line", () => {
    expect(failure({ "e.csv": 'id,label\np:1,"two\nlines"\n\np:2,\n' })).toEqual(["e.csv:5: empty label (give the entity a label, or drop the label column)", "1 error; nothing was loaded"]);
  });
});

describe("JSON Lines details", () => {
  it("edges may name entities declared later in the load, even in a later file", () => {
    const c = loaded({ "1.jsonl": '{"subject":"a","relation":"r","object":"b"}\n', "2.jsonl": '{"id":"a"}\n{"id":"b","label":"Bee"}\n' });
    expect(c.hasEdge("a", "r", "b")).toBe(true);
    expect(c.ref(c.numOf("a")!).label).toBe("a");
  });

  it("field errors name the field and what was expected", () => {
    expect(
      failure({
        "x.jsonl": [
          '{"id":"a","lable":"typo"}',
          '{"kind":"thing","id":"b"}',
          '{"id":"c","aliases":"ok","types":[3]}',
          "[1,2]",
          '{"id":"d","label":""}',
          '{"subject":"a","relation":"r"}',
          "",
        ].join("\n"),
      }),
    ).toEqual([
      'x.jsonl:1: unknown field "lable" in an entity record (expected id, label, aliases, types, description, attributes, relations, subClassOf)',
      'x.jsonl:2: unknown kind "thing" (expected entity, type, relation, attribute or edge)',
      'x.jsonl:3: field "types" must be a string or a list of strings (item 1 is a number)',
      "x.jsonl:4: expected a JSON object, got a list",
      'x.jsonl:5: empty label (give a non-empty "label" or leave the field out)',
      'x.jsonl:6: missing field "object"',
      "6 errors; nothing was loaded",
    ]);
  });
});

describe("Turtle details", () => {
  it("anonymous nodes get _:anonN ids; a blank label reused by a second file gets a suffix", () => {
    const c = loaded({
      "a.ttl": '@prefix q: <q:> .\nq:a q:near [ q:kind "buoy" ] .\n_:x q:near q:a .\n',
      "b.ttl": "@prefix q: <q:> .\n_:x q:near q:a .\n",
    });
    expect(c.hasEdge("q:a", "q:near", "_:anon1")).toBe(true);
    expect(c.hasEdge("_:x", "q:near", "q:a")).toBe(true);
    expect(c.hasEdge("_:x-2", "q:near", "q:a")).toBe(true);
  });

  it("the first syntax error ends the file and names its line (Turtle allows repeated ';', so use two objects)", () => {
    const errs = failure({ "a.ttl": "@prefix q: <q:> .\nq:a q:b q:c .\nq:a q:b q:c q:d .\nq:a q:b .\n" });
    expect(errs[0]).toMatch(/^a\.ttl:3: syntax error: /);
    expect(errs).toHaveLength(2);
  });
});

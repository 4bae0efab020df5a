/**
 * N-Triples import checked against the examples of the W3C Recommendation
 * "RDF 1.1 N-Triples — A line-based syntax for an RDF graph" (25 February 2014,
 * https://www.w3.org/TR/n-triples/), sections 2.1–2.4 (comments, IRIs, literals with
 * datatypes, language tags and escapes, blank nodes). The example lines are typed in from
 * memory of the recommendation; the \u / \U escape lines are our own, built from the
 * recommendation's grammar productions UCHAR and ECHAR.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../index.js";

const XSD = "http://www.w3.org/2001/XMLSchema#";

function load(text: string): Catalog {
  const dir = mkdtempSync(join(tmpdir(), "tp-nt-"));
  const file = join(dir, "spec.nt");
  writeFileSync(file, text);
  const cat = Catalog.open(join(dir, "c.db"), { create: true });
  loadFiles(cat, [file]);
  return cat;
}

function attrs(cat: Catalog, id: string): { p: string; value: string; datatype: string | null; lang: string | null; num: number | null }[] {
  return cat.attributes(cat.numOf(id)!).map((a) => ({ p: a.predicate, value: a.value, datatype: a.datatype, lang: a.lang, num: a.num }));
}

let open: Catalog | undefined;
afterEach(() => {
  open?.close();
  open = undefined;
});

describe("W3C RDF 1.1 N-Triples recommendation examples", () => {
  it("example 1: comments after a triple and on their own line; blank-node subjects with literal objects", () => {
    const cat = (open = load(
      [
        "<http://one.example/subject1> <http://one.example/predicate1> <http://one.example/object1> . # comments here",
        "# or on a line by themselves",
        '_:subject1 <http://an.example/predicate1> "object1" .',
        '_:subject2 <http://an.example/predicate2> "object2" .',
        "",
      ].join("\n"),
    ));
    expect(cat.hasEdge("http://one.example/subject1", "http://one.example/predicate1", "http://one.example/object1")).toBe(true);
    expect(attrs(cat, "_:subject1")).toEqual([{ p: "http://an.example/predicate1", value: "object1", datatype: null, lang: null, num: null }]);
    expect(attrs(cat, "_:subject2")).toEqual([{ p: "http://an.example/predicate2", value: "object2", datatype: null, lang: null, num: null }]);
    // 3 entities with ids as written; no entity was made from a comment
    expect(cat.counts().entities).toBe(4);
    expect(cat.counts().edges).toBe(1);
  });

  it("example 2: an IRI triple becomes one edge with the IRIs as ids", () => {
    const cat = (open = load("<http://example.org/#spiderman> <http://www.perceive.net/schemas/relationship/enemyOf> <http://example.org/#green-goblin> .\n"));
    expect(cat.hasEdge("http://example.org/#spiderman", "http://www.perceive.net/schemas/relationship/enemyOf", "http://example.org/#green-goblin")).toBe(true);
    expect(cat.predicates().map((p) => p.id)).toEqual(["http://www.perceive.net/schemas/relationship/enemyOf"]);
  });

  it("example 3: literals with datatypes, language tags (with region subtag) and ECHAR escapes", () => {
    const cat = (open = load(
      [
        '<http://example.org/show/218> <http://www.w3.org/2000/01/rdf-schema#label> "That Seventies Show"^^<http://www.w3.org/2001/XMLSchema#string> . # literal with XML Schema string datatype',
        '<http://example.org/show/218> <http://www.w3.org/2000/01/rdf-schema#label> "That Seventies Show" . # same as above',
        '<http://example.org/show/218> <http://example.org/show/localName> "That Seventies Show"@en . # literal with a language tag',
        '<http://example.org/show/218> <http://example.org/show/localName> "Cette Série des Années Septante"@fr-be .  # literal outside of ASCII range with a region subtag',
        '<http://example.org/#spiderman> <http://example.org/text> "This is a multi-line\\nliteral with many quotes (\\"\\"\\"\\"\\")\\nand two apostrophes (\'\')." .',
        '<http://en.wikipedia.org/wiki/Helium> <http://example.org/elements/atomicNumber> "2"^^<http://www.w3.org/2001/XMLSchema#integer> .',
        '<http://en.wikipedia.org/wiki/Helium> <http://example.org/elements/specificGravity> "1.663E-4"^^<http://www.w3.org/2001/XMLSchema#double> .     # xsd:double',
        "",
      ].join("\n"),
    ));
    const show = cat.entity(cat.numOf("http://example.org/show/218")!);
    // rdfs:label → label; the second, equal label (xsd:string is the plain literal's type) adds no alias
    expect(show.label).toBe("That Seventies Show");
    expect(show.aliases).toEqual([]);
    expect(attrs(cat, "http://example.org/show/218")).toEqual([
      { p: "http://example.org/show/localName", value: "Cette Série des Années Septante", datatype: null, lang: "fr-be", num: null },
      { p: "http://example.org/show/localName", value: "That Seventies Show", datatype: null, lang: "en", num: null },
    ]);
    expect(attrs(cat, "http://example.org/#spiderman")[0]!.value).toBe("This is a multi-line\nliteral with many quotes (\"\"\"\"\")\nand two apostrophes ('').");
    const he = attrs(cat, "http://en.wikipedia.org/wiki/Helium");
    expect(he).toEqual([
      { p: "http://example.org/elements/atomicNumber", value: "2", datatype: `${XSD}integer`, lang: null, num: 2 },
      // 1.663E-4 read as a number: 0.0001663 (hand-computed)
      { p: "http://example.org/elements/specificGravity", value: "1.663E-4", datatype: `${XSD}double`, lang: null, num: 0.0001663 },
    ]);
  });

  it("example 4: blank nodes keep their labels and join both ways", () => {
    const cat = (open = load(["_:alice <http://xmlns.com/foaf/0.1/knows> _:bob .", "_:bob <http://xmlns.com/foaf/0.1/knows> _:alice .", ""].join("\n")));
    expect(cat.hasEdge("_:alice", "http://xmlns.com/foaf/0.1/knows", "_:bob")).toBe(true);
    expect(cat.hasEdge("_:bob", "http://xmlns.com/foaf/0.1/knows", "_:alice")).toBe(true);
    expect(cat.counts().entities).toBe(2);
  });

  it("UCHAR escapes \\u and \\U in literals and IRIs, ECHAR \\t \\\\ \\r (grammar of section 6)", () => {
    const cat = (open = load(
      [
        // \u00E9 = é (U+00E9), \U0001F600 = 😀 (U+1F600, a surrogate pair in UTF-16): Unicode code charts
        '<http://example.org/caf\\u00E9> <http://www.w3.org/2000/01/rdf-schema#label> "caf\\u00E9 \\U0001F600" .',
        '<http://example.org/x> <http://example.org/p> "tab\\there back\\\\slash cr\\r" .',
        "",
      ].join("\n"),
    ));
    const n = cat.numOf("http://example.org/café");
    expect(n).toBeDefined();
    expect(cat.entity(n!).label).toBe("café \u{1F600}");
    expect(attrs(cat, "http://example.org/x")[0]!.value).toBe("tab\there back\\slash cr\r");
  });

  it("language-tagged labels: English or untagged first, the others aliases (contract RDF mapping)", () => {
    const cat = (open = load(
      [
        '<http://example.org/s> <http://www.w3.org/2000/01/rdf-schema#label> "Kanal"@de .',
        '<http://example.org/s> <http://www.w3.org/2000/01/rdf-schema#label> "Channel"@en-GB .',
        '<http://example.org/s> <http://www.w3.org/2004/02/skos/core#prefLabel> "Canal" .',
        '<http://example.org/s> <http://www.w3.org/2004/02/skos/core#altLabel> "Strait"@en .',
        "",
      ].join("\n"),
    ));
    const e = cat.entity(cat.numOf("http://example.org/s")!);
    expect(e.label).toBe("Channel");
    expect(e.aliases).toEqual(["Canal", "Kanal", "Strait"]);
  });

  it("a property described with rdf:type, rdfs:domain and rdfs:range is still not left behind as an entity", () => {
    const cat = (open = load(
      [
        "<http://example.org/moors> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <http://www.w3.org/1999/02/22-rdf-syntax-ns#Property> .",
        "<http://example.org/moors> <http://www.w3.org/2000/01/rdf-schema#domain> <http://example.org/Boat> .",
        "<http://example.org/moors> <http://www.w3.org/2000/01/rdf-schema#range> <http://example.org/Quay> .",
        '<http://example.org/moors> <http://www.w3.org/2000/01/rdf-schema#label> "moors at" .',
        '<http://example.org/Quay> <http://www.w3.org/2000/01/rdf-schema#label> "quay" .',
        "<http://example.org/a> <http://example.org/moors> <http://example.org/b> .",
        "",
      ].join("\n"),
    ));
    expect(cat.numOf("http://example.org/moors")).toBeUndefined();
    expect(cat.numOf("http://www.w3.org/1999/02/22-rdf-syntax-ns#Property")).toBeUndefined();
    expect(cat.predicates().find((p) => p.id === "http://example.org/moors")!.label).toBe("moors at");
    // the labelled range class stays (it is a named thing); the unlabelled domain class was only mentioned by the property
    expect(cat.numOf("http://example.org/Quay")).toBeDefined();
    expect(cat.numOf("http://example.org/Boat")).toBeUndefined();
    expect(cat.counts().edges).toBe(1);
  });

  it("types, subclasses, descriptions and predicate labels given before and after use", () => {
    const cat = (open = load(
      [
        '<http://example.org/rel> <http://www.w3.org/2000/01/rdf-schema#label> "moored at" .',
        "<http://example.org/a> <http://example.org/rel> <http://example.org/b> .",
        "<http://example.org/a> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> <http://example.org/Boat> .",
        "<http://example.org/Boat> <http://www.w3.org/2000/01/rdf-schema#subClassOf> <http://example.org/Vessel> .",
        '<http://example.org/a> <http://www.w3.org/2000/01/rdf-schema#comment> "a small boat" .',
        '<http://example.org/b> <http://schema.org/description> "a quay" .',
        '<http://example.org/rel> <http://www.w3.org/2004/02/skos/core#altLabel> "tied to" .',
        '<http://example.org/rel2> <http://www.w3.org/2000/01/rdf-schema#label> "late label" .',
        "<http://example.org/b> <http://example.org/rel2> <http://example.org/a> .",
        '<http://example.org/rel2> <http://www.w3.org/2000/01/rdf-schema#label> "second label" .',
        "",
      ].join("\n"),
    ));
    const preds = cat.predicates();
    expect(preds.map((p) => [p.id, p.label, p.aliases])).toEqual([
      ["http://example.org/rel", "moored at", ["tied to"]],
      ["http://example.org/rel2", "late label", ["second label"]],
    ]);
    // label-only predicate IRIs are not left behind as entities
    expect(cat.numOf("http://example.org/rel")).toBeUndefined();
    expect(cat.numOf("http://example.org/rel2")).toBeUndefined();
    const a = cat.entity(cat.numOf("http://example.org/a")!);
    expect(a.types.map((t) => t.id)).toEqual(["http://example.org/Boat"]);
    expect(a.description).toBe("a small boat");
    expect(cat.entity(cat.numOf("http://example.org/b")!).description).toBe("a quay");
    expect(cat.types().map((t) => [t.id, t.parents.map((p) => cat.ref(p).id)])).toEqual([
      ["http://example.org/Boat", ["http://example.org/Vessel"]],
      ["http://example.org/Vessel", []],
    ]);
  });
});

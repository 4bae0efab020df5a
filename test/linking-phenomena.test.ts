/**
 * Linking phenomena of issue 16 (derived forms, names not written as the catalog writes them,
 * entities named by what they are) and issue 17 (names not found), each as a sentence over a
 * tiny invented catalog → the expected mentions. Real CatalogWriter, real SQLite (in memory),
 * real Linker. Every name here is invented (no real places or people).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, CatalogWriter } from "../src/catalog/index.js";
import { Linker, linkQuestion, notFoundNote, type LinkedMention } from "../src/linking/index.js";
import { catalogShorthands } from "./linking-fixture.js";

let cat: Catalog;
let linker: Linker;

beforeAll(() => {
  cat = Catalog.open(":memory:", { create: true });
  const w = new CatalogWriter(cat);
  w.begin();
  const { type, rel, ent } = catalogShorthands(w);
  type("t:Country", "country", ["nation"]);
  type("t:Port", "port", ["harbour"]);
  type("t:Language", "language");
  type("t:Vessel", "vessel", ["ship"]);
  type("t:Code", "code");
  rel("r:in", "located in");
  rel("r:speaks", "official language");
  rel("r:borders", "borders");
  rel("r:homePort", "home port");
  ent("c:brask", "Brask", ["t:Country"], "An island nation of fjords in the cold sea.");
  ent("c:ostrelia", "Ostrelia", ["t:Country"], "A lowland nation of canals.");
  ent("c:quenland", "Quenland", ["t:Country"], "A forested nation east of Brask.");
  ent("c:tarnk", "Tarn Kingdom", ["t:Country"], "A mountain kingdom.");
  ent("c:velm", "Velmarra", ["t:Country"], "A desert republic.", ["Velmarran Republic"]);
  ent("l:ostrelian", "Ostrelian", ["t:Language"], "The language of Ostrelia.");
  ent("p:vask", "Vask", ["t:Port"], "A deep-water port in a fjord.");
  ent("p:holm", "Holm", ["t:Port"], "A canal port.");
  ent("p:kess", "Kess", ["t:Port"], "A river port in the forest.");
  ent("v:gull", "Gull", ["t:Vessel"], "A survey ship built in 1994 that maps the sea floor.");
  ent("v:tern", "Tern", ["t:Vessel"], "A cargo ship built in 2003 that carries timber.");
  for (const n of ["114", "115", "116", "117"]) ent(`k:${n}`, `KX-${n}`, ["t:Code"]);
  w.edge("p:vask", "r:in", "c:brask");
  w.edge("p:holm", "r:in", "c:ostrelia");
  w.edge("p:kess", "r:in", "c:quenland");
  w.edge("c:ostrelia", "r:speaks", "l:ostrelian");
  w.edge("c:quenland", "r:borders", "c:brask");
  w.edge("c:tarnk", "r:borders", "c:brask");
  w.edge("v:gull", "r:homePort", "p:vask");
  w.edge("v:tern", "r:homePort", "p:holm");
  w.commit();
  linker = Linker.fromCatalog(cat);
});
afterAll(() => cat.close());

const mentionsOf = (q: string) => linkQuestion(q, linker).mentions;
const one = (q: string): LinkedMention => {
  const ms = mentionsOf(q);
  expect(ms.length, JSON.stringify(ms)).toBe(1);
  return ms[0]!;
};

describe("derived forms (issue 16, phenomenon 3)", () => {
  it("links an adjective of a name to that name, as a derived link with its morphology", () => {
    const m = one("Which Braskian port?");
    expect(m).toMatchObject({ text: "Braskian", entity: { id: "c:brask" }, match: "derived", derivation: { suffix: "ian", base: "Brask" } });
    // -ish after a base clipped at -land (Quenland → Quennish)
    expect(one("Which Quennish port?")).toMatchObject({ text: "Quennish", entity: { id: "c:quenland" }, match: "derived" });
    // a derived link is less certain than the name itself
    expect(one("Which Braskian port?").confidence).toBeLessThan(one("Which port is in Brask?").confidence);
  });

  it("keeps an exact label and its derived reading apart by the noun the word modifies", () => {
    // "Ostrelian" is a language's label and the adjective of Ostrelia
    const port = one("Which Ostrelian port?");
    expect(port).toMatchObject({ entity: { id: "c:ostrelia" }, match: "derived" });
    expect(port.alternatives.map((a) => [a.id, a.match])).toEqual([["l:ostrelian", "label"]]);
    // used as a noun, the word is the language (no derived reading)
    expect(one("Which nation has Ostrelian as official language?")).toMatchObject({ entity: { id: "l:ostrelian" }, match: "label" });
  });

  it("marks the head of a hyphenated compound", () => {
    expect(one("Which vessels are Vask-based?")).toMatchObject({ text: "Vask", entity: { id: "p:vask" }, compound: "based" });
  });
});

describe("names not written as the catalog writes them (issue 16, phenomenon 4)", () => {
  it("reads a long form around a name as that name, not as the other name sharing its generic word", () => {
    const m = one("Which nation borders the Kingdom of Brask?");
    expect(m).toMatchObject({ text: "Kingdom of Brask", entity: { id: "c:brask" }, match: "partial" });
    expect(mentionsOf("Which nation borders the Kingdom of Brask?").map((x) => x.entity.id)).not.toContain("c:tarnk");
  });

  it("links a single-word misspelling", () => {
    expect(one("Which port is in Ostrelai?")).toMatchObject({ entity: { id: "c:ostrelia" }, match: "fuzzy" });
  });

  it("reads a question capitalised only at its first word as typed without capitals", () => {
    // names written in lower case (as package names are) are found, misspelt too ...
    expect(one("Which port is in ostrelai?")).toMatchObject({ entity: { id: "c:ostrelia" }, match: "fuzzy" });
    // ... but a word matching one word of a name only loosely is no name, and no "not found"
    const r = linkQuestion("Which port has the deeper tarns?", linker);
    expect(r.mentions).toEqual([]);
    expect(r.notFound).toEqual([]);
  });
});

describe("an entity named by what it is (issue 16, phenomenon 10)", () => {
  it("links a definite phrase that is no name to the entity whose description fits it best", () => {
    const m = one("Which port is the home port of the survey ship built in 1994?");
    // the post-modifier "in 1994" is held by the description too, so the phrase takes it in
    expect(m).toMatchObject({ text: "survey ship built in 1994", entity: { id: "v:gull" }, match: "description" });
    // the other ship's description shares only "ship" and "built": a weaker alternative
    expect(m.alternatives.map((a) => [a.id, a.match])).toEqual([["v:tern", "description"]]);
    expect(m.confidence).toBeGreaterThan(m.alternatives[0]!.confidence);
  });

  it("never reads an indefinite phrase, or one of type and relation words only, as a description", () => {
    expect(mentionsOf("Does Vask have a survey ship built in 1994?").map((x) => x.entity.id)).toEqual(["p:vask"]);
    expect(mentionsOf("Which is the home port of the vessel?")).toEqual([]);
  });
});

describe("names not found (issue 17)", () => {
  it("reports a code the catalog does not hold, with the nearest code", () => {
    const r = linkQuestion("What is KX-999?", linker);
    expect(r.notFound.length).toBe(1);
    const nf = r.notFound[0]!;
    expect(nf.text).toBe("KX-999");
    expect(nf.nearest?.label).toMatch(/^KX-11[4-7]$/);
    expect(notFoundNote(nf)).toMatch(/^no catalog entity matches 'KX-999'; nearest: KX-11[4-7]/);
  });

  it("reports nothing for names that link well", () => {
    expect(linkQuestion("Which port is in Brask?", linker).notFound).toEqual([]);
    expect(linkQuestion("What is KX-114?", linker).notFound).toEqual([]);
  });
});

/**
 * Names typed without capitals and misspelt by one letter (issue 17: "a misspelling near two
 * names"), and capitals that mark no name (a sentence's first word, the pronoun I), over a tiny
 * invented catalog of lower-case tool names. Real CatalogWriter, real SQLite (in memory), real
 * Linker. Outside check of the edit counts: Levenshtein distance by hand (one substitution each).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, CatalogWriter } from "../src/catalog/index.js";
import { Linker, linkQuestion } from "../src/linking/index.js";
import { catalogShorthands } from "./linking-fixture.js";

let cat: Catalog;
let linker: Linker;

beforeAll(() => {
  cat = Catalog.open(":memory:", { create: true });
  const w = new CatalogWriter(cat);
  w.begin();
  const { type, rel, ent } = catalogShorthands(w);
  type("t:Tool", "tool");
  type("t:Port", "port");
  rel("r:dependsOn", "depends on");
  rel("r:homePort", "home port");
  rel("r:maintainedBy", "maintained by");
  ent("x:mave", "mave", ["t:Tool"], "A build driver.");
  ent("x:rave", "rave", ["t:Tool"], "A report generator.");
  ent("x:libq", "libq", ["t:Tool"], "A queue library.");
  ent("x:libz", "libz", ["t:Tool"], "A packing library.");
  ent("p:holm", "Holm", ["t:Port"], "A canal port.");
  ent("v:gull", "Gull", [], "A survey ship.");
  ent("v:dredger", "Kessel Dredger", [], "A dredging ship.");
  ent("v:tugA", "Holm Tug", [], "A harbour tug.");
  ent("v:tugB", "Vask Tug", [], "Another harbour tug.");
  w.edge("x:mave", "r:dependsOn", "x:libq");
  w.edge("x:rave", "r:dependsOn", "x:libz");
  w.edge("v:gull", "r:homePort", "p:holm");
  ent("g:ora", "Ora Vell", [], "A maintainer.");
  w.edge("x:mave", "r:maintainedBy", "g:ora");
  w.edge("x:rave", "r:maintainedBy", "g:ora");
  w.commit();
  linker = Linker.fromCatalog(cat);
});
afterAll(() => cat.close());

describe("a lower-case name one edit from two names", () => {
  it("links the misspelt word to both names, one as the alternative, when the question names a relation they have", () => {
    // "wave" → "mave", "rave": one substitution of the first letter each (Jaro–Winkler 0.83, below the usual 0.88)
    const r = linkQuestion("what does wave depend on?", linker);
    expect(r.mentions).toHaveLength(1);
    const m = r.mentions[0]!;
    expect(m.text).toBe("wave");
    expect(m.match).toBe("fuzzy");
    const both = [m.entity.id, ...m.alternatives.map((a) => a.id)];
    expect(both).toEqual(expect.arrayContaining(["x:mave", "x:rave"]));
    // the two spellings are equally near: neither is clearly ahead
    expect(m.alternatives[0]!.confidence).toBeGreaterThanOrEqual(0.5 * m.confidence);
  });

  it("also when a word of the relation's label names it ('maintains' of 'maintained by')", () => {
    const m = linkQuestion("who maintains wave?", linker).mentions;
    expect(m.map((x) => x.text)).toEqual(["wave"]);
    expect([m[0]!.entity.id, ...m[0]!.alternatives.map((a) => a.id)]).toEqual(expect.arrayContaining(["x:mave", "x:rave"]));
  });

  it("leaves an English word alone when the question names no relation of the names it resembles", () => {
    // "save" is one edit from "mave" and "rave" too, but nothing in the question supports a tool
    const r = linkQuestion("which tools save time?", linker);
    expect(r.mentions.map((m) => m.entity.id)).not.toContain("x:mave");
    expect(r.mentions.map((m) => m.entity.id)).not.toContain("x:rave");
  });
});

describe("a definite description by one word of one name, typed without capitals", () => {
  it("links 'the dredger' to the one entity whose name holds the word", () => {
    const r = linkQuestion("what is the home port of the dredger?", linker);
    expect(r.mentions.map((m) => [m.text, m.entity.id])).toEqual([["dredger", "v:dredger"]]);
  });
  it("does not when the word is in two names, or the phrase is not definite", () => {
    expect(linkQuestion("what is the home port of the tug?", linker).mentions).toEqual([]);
    expect(linkQuestion("what is the home port of a dredger?", linker).mentions).toEqual([]);
  });
});

describe("orthographic capitals", () => {
  it("does not report a sentence's first word as a name the catalog lacks", () => {
    const r = linkQuestion("What is the home port of Gull? Thanks!", linker);
    expect(r.mentions.map((m) => m.entity.id)).toEqual(["v:gull"]);
    expect(r.notFound).toEqual([]);
  });

  it("reads the pronoun I and its contractions as no name", () => {
    const r = linkQuestion("Hi! I'm curious: what does mave depend on?", linker);
    expect(r.mentions.map((m) => m.entity.id)).toEqual(["x:mave"]);
    expect(r.notFound).toEqual([]);
  });

  it("still reports a capitalised word inside a sentence that matches nothing", () => {
    const r = linkQuestion("What is the home port of Zorblax?", linker);
    expect(r.notFound.map((n) => n.text)).toEqual(["Zorblax"]);
  });
});

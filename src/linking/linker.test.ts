import fc from "fast-check";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, CatalogWriter } from "../catalog/index.js";
import { TiepointError } from "../model/index.js";
import { catalogShorthands, linkingFixture, writeLinkingFixture } from "../../test/linking-fixture.js";
import { DescriptionIndex } from "./description-match.js";
import { FuzzyTokenIndex, trigramTable } from "./fuzzy-index.js";
import { LexicalSnapshot, Linker, linkQuestion, parsePin } from "./index.js";

let cat: Catalog;
let linker: Linker;
beforeAll(() => {
  cat = linkingFixture();
  linker = Linker.fromCatalog(cat);
});
afterAll(() => cat.close());

const link = (q: string, pins?: { text: string; entity: string }[]) => linkQuestion(q, linker, pins ? { pins } : {});
const only = (q: string) => {
  const r = link(q);
  expect(r.mentions.length, JSON.stringify(r)).toBe(1);
  return r.mentions[0]!;
};

describe("parsePin", () => {
  it("rejects values without TEXT=ENTITY", () => {
    for (const bad of ["", "Ada", "=p:ada", "Ada=", "  =  "]) expect(() => parsePin(bad)).toThrow(/expected TEXT=ENTITY/);
    try {
      parsePin("Ada");
    } catch (e) {
      expect(e).toBeInstanceOf(TiepointError);
      expect((e as TiepointError).code).toBe("cli/usage");
    }
  });

  it("splits at the first = and trims", () => {
    expect(parsePin(" Aurora = town:aurora ")).toEqual({ text: "Aurora", entity: "town:aurora" });
    expect(parsePin("Q=http://x.org/a?b=c")).toEqual({ text: "Q", entity: "http://x.org/a?b=c" });
  });
});

describe("linkQuestion on the fixture catalog", () => {
  it("links an exact name and leaves type and relation words alone", () => {
    const m = only("Which lab is Ada Quell a member of?");
    expect(m).toMatchObject({ text: "Ada Quell", start: 13, end: 22, entity: { id: "p:ada", label: "Ada Quell" } });
    expect(m.confidence).toBeGreaterThan(0.9);
    expect(m.alternatives).toEqual([]);
  });

  it("never makes a mention of type words, relation phrases or stop words alone", () => {
    // "researcher", "lab", "vessel", "people" are type labels/aliases; "works in", "captain of" relation phrases
    for (const q of ["Which researcher works in the lab?", "Who is the captain of which vessel?", "What is it?", "Which People?"]) {
      expect(link(q).mentions, q).toEqual([]);
    }
  });

  it("decides a shared name by relation words and by context words", () => {
    // "captain of" is a relation of the fixture; only the ship has such an edge
    const ship = only("Who is the captain of the Aurora?");
    expect(ship.entity.id).toBe("s:aurora");
    expect(ship.alternatives.map((a) => a.id)).toEqual(["town:aurora"]);
    // "ski lodge" appears in the town's description (BM25 context)
    const town = only("Which hotel near the ski slopes of Aurora has a cable car?");
    expect(town.entity.id).toBe("town:aurora");
    expect(town.confidence).toBeGreaterThan(town.alternatives[0]!.confidence);
    // confidences of one mention never sum above 1 (the rest is "none of these")
    expect(town.confidence + town.alternatives.reduce((s, a) => s + a.confidence, 0)).toBeLessThanOrEqual(1.0001);
  });

  it("links misspelt, partial and reordered names with less confidence than exact ones", () => {
    const exact = only("Where does Ada Quell work?");
    const typo = only("Where does Ada Qwell work?");
    expect(typo.entity.id).toBe("p:ada");
    expect(typo.text).toBe("Ada Qwell");
    expect(typo.confidence).toBeLessThan(exact.confidence);
    const partial = only("What lab is Quell in?");
    expect(partial).toMatchObject({ text: "Quell", entity: { id: "p:ada" } });
    const reordered = only("who is quell ada");
    expect(reordered).toMatchObject({ text: "quell ada", entity: { id: "p:ada" } });
  });

  it("folds case and diacritics, and keeps offsets into the original text", () => {
    const q = "where does zoe nandu work";
    const m = only(q);
    expect(m.entity.id).toBe("p:zoe");
    expect(q.slice(m.start, m.end)).toBe("zoe nandu");
    const q2 = "🚢 Zoë Ñandú?";
    const m2 = only(q2);
    expect(m2.text).toBe("Zoë Ñandú");
    expect(q2.slice(m2.start, m2.end)).toBe("Zoë Ñandú");
  });

  it("reports words that link to nothing, with nearest names", () => {
    const r = link("Where is Zzyzx?");
    expect(r.mentions).toEqual([]);
    expect(r.unlinked).toEqual([{ text: "Zzyzx", start: 9, end: 14, suggestions: [] }]);
    // a capitalised name phrase whose best name matches only partly and whose other word no
    // name holds ("Harbour" is only in descriptions) names something the catalog does not hold:
    // not found, the partly matching name as the nearest
    const r3 = link("Where is Tidewater Harbour?");
    expect(r3.mentions).toEqual([]);
    expect(r3.unlinked.map((u) => [u.text, u.suggestions[0]?.id])).toEqual([["Tidewater Harbour", "o:lab1"]]);
    expect(r3.notFound).toMatchObject([{ text: "Tidewater Harbour", linked: false, nearest: { id: "o:lab1" } }]);
    // nothing name-like links: the content words still get the nearest catalog names
    const r2 = link("where is the copper smith from the hills");
    expect(r2.mentions).toEqual([]);
    expect(r2.unlinked.length).toBeGreaterThan(0);
    // a definite phrase that is no name but fits an entity's description links to it (issue 16,
    // phenomenon 10): Ada Morrow is "A glass blower from the valley." (the post-modifier too)
    const r4 = link("where is the glass blower from the valley");
    expect(r4.mentions.map((m) => [m.text, m.entity.id, m.match])).toEqual([["glass blower from the valley", "p:morrow", "description"]]);
  });

  it("lets a pin override a link, and rejects bad pins with a clear message", () => {
    const r = link("Who is the captain of the Aurora?", [{ text: "aurora", entity: "town:aurora" }]);
    expect(r.mentions).toEqual([
      { text: "Aurora", start: 26, end: 32, entity: { id: "town:aurora", label: "Aurora" }, num: cat.numOf("town:aurora"), confidence: 1, alternatives: [], pinned: true },
    ]);
    // a pin by exact label
    expect(link("Where does Ada work?", [{ text: "Ada", entity: "Ada Morrow" }]).mentions[0]!.entity.id).toBe("p:morrow");
    expect(() => link("Who is Ada?", [{ text: "Ada", entity: "p:nobody" }])).toThrow(/no entity has the id or exact label "p:nobody"/);
    expect(() => link("Who is Ada?", [{ text: "Brill", entity: "town:brill" }])).toThrow(/"Brill" does not occur in the question/);
    expect(() => link("Who sailed the Aurora?", [{ text: "Aurora", entity: "Aurora" }])).toThrow(/names 2 entities \(s:aurora, town:aurora\); pin one by its id/);
    expect(() => link("Ada Quell", [{ text: "Ada Quell", entity: "p:ada" }, { text: "Quell", entity: "p:ada" }])).toThrow(/overlaps another pin/);
  });

  it("is deterministic", () => {
    const q = "Did Ada and Zoë Ñandú work at Tidewater Lab in Brill?";
    expect(link(q)).toEqual(link(q));
  });
});

describe("a name that is a relation word only by its stem", () => {
  it("is linked as a modifier before a type noun, and left to the relation elsewhere", () => {
    // invented: a priority level named "required" beside a relation aliased "requires" (Porter stems both "requir")
    const c = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(c);
    w.begin();
    const { type, rel, ent } = catalogShorthands(w);
    type("t:Kit", "kit");
    type("t:Level", "level");
    rel("r:needs", "depends on", ["requires"]);
    rel("r:level", "has level");
    ent("l:required", "required", ["t:Level"]);
    ent("k:a", "Alder", ["t:Kit"]);
    ent("k:b", "Birch", ["t:Kit"]);
    w.edge("k:a", "r:needs", "k:b");
    w.edge("k:a", "r:level", "l:required");
    w.commit();
    const l = Linker.fromCatalog(c);
    const names = (q: string) => linkQuestion(q, l).mentions.map((m) => m.entity.id);
    expect(names("Which required kits depend on Birch?")).toEqual(["l:required", "k:b"]);
    // no type noun after it: the relation reading stands; "requires" is the relation's own phrase
    expect(names("Which kits are required by Alder?")).toEqual(["k:a"]);
    expect(names("Which kit requires Birch?")).toEqual(["k:b"]);
    c.close();
  });
});

describe("a name written with an initialism for some of its words", () => {
  it("links 'ZR crown' to 'Zeldan Republic crown' (initials of consecutive words, Schwartz & Hearst 2003), not a lower-case word", () => {
    // invented currency names
    const c = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(c);
    w.begin();
    const { type, ent } = catalogShorthands(w);
    type("t:Currency", "currency");
    ent("m:zrc", "Zeldan Republic crown", ["t:Currency"]);
    ent("m:oc", "Ostrel crown", ["t:Currency"]);
    w.commit();
    const l = Linker.fromCatalog(c);
    const r = linkQuestion("Which towns pay with the ZR crown?", l);
    expect(r.mentions.map((m) => [m.text, m.entity.id, m.match])).toEqual([["ZR crown", "m:zrc", "fuzzy"]]);
    // initials that spell no name's words, or a word not in capitals, make no such link
    expect(linkQuestion("Which towns pay with the ZQ crown?", l).mentions.map((m) => m.entity.id)).not.toContain("m:zrc");
    expect(linkQuestion("Which towns pay with the zr crown?", l).mentions.map((m) => m.text)).not.toContain("zr crown");
    c.close();
  });
});

describe("a name written as separate words that the catalog writes as one", () => {
  it("links 'Zel Dania' to Zeldania and 'corvo 3' to corvo3 (compound spelling variants, Christen 2012 §4.2), never gluing a type or relation word", () => {
    // invented names
    const c = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(c);
    w.begin();
    const { type, rel, ent } = catalogShorthands(w);
    type("t:Realm", "realm");
    type("t:Tool", "tool");
    rel("r:uses", "uses");
    ent("k:zel", "Zeldania", ["t:Realm"]);
    ent("x:corvo3", "corvo3", ["t:Tool"]);
    ent("x:realmuses", "realmuses", ["t:Tool"]);
    w.commit();
    const l = Linker.fromCatalog(c);
    const ids = (q: string) => linkQuestion(q, l).mentions.map((m) => [m.text, m.entity.id, m.match]);
    expect(ids("Which realm borders Zel Dania?")).toEqual([["Zel Dania", "k:zel", "fuzzy"]]);
    expect(ids("Which realm uses corvo 3?")).toEqual([["corvo 3", "x:corvo3", "fuzzy"]]);
    // "realm uses": a type word and a relation word are never glued into a name
    expect(ids("Which realm uses corvo 3?").map((x) => x[1])).not.toContain("x:realmuses");
    c.close();
  });

  it("leaves a lower-case verb form alone whose stem is a lower-case name ('filed' ~ file, Quirk et al. 1985 §3.5: -ed, -ing)", () => {
    const c = Catalog.open(":memory:", { create: true });
    const w = new CatalogWriter(c);
    w.begin();
    const { type, ent } = catalogShorthands(w);
    type("t:Tool", "tool");
    ent("x:file", "file", ["t:Tool"]);
    ent("x:corvo3", "corvo3", ["t:Tool"]);
    w.commit();
    const l = Linker.fromCatalog(c);
    const r = linkQuestion("Which tool is Corvo 3 filed under?", l);
    expect(r.mentions.map((m) => m.entity.id)).toEqual(["x:corvo3"]);
    // the name as written still links
    expect(linkQuestion("Which tool uses file?", l).mentions.map((m) => m.entity.id)).toEqual(["x:file"]);
    c.close();
  });
});

describe("linkQuestion on arbitrary text (properties)", () => {
  const check = (s: string) => {
    const r = link(s);
    for (const m of r.mentions) {
      expect(s.slice(m.start, m.end)).toBe(m.text);
      expect(m.confidence).toBeGreaterThan(0);
      expect(m.confidence).toBeLessThanOrEqual(1);
    }
    for (const u of r.unlinked) expect(s.slice(u.start, u.end)).toBe(u.text);
    // mentions are in text order and never overlap
    for (let k = 1; k < r.mentions.length; k++) expect(r.mentions[k]!.start).toBeGreaterThanOrEqual(r.mentions[k - 1]!.end);
  };

  it("never throws on any UTF-16 string and offsets slice back", () => {
    fc.assert(fc.property(fc.string({ unit: "binary", maxLength: 120 }), check), { numRuns: 300 });
  });

  it("handles names mixed with emoji, right-to-left text and control characters", () => {
    const parts = fc.constantFrom("Ada Quell", "Aurora", "Zoë Ñandú", "Brill", "🚢", "👩🏽‍🔬", "שלום", "مرحبا", "\u202e", "\u0000", "\u0007", "\t", "\r\n", "'", "-", "ﬁ", "Ｑｕｅｌｌ", "captain of", "the");
    fc.assert(fc.property(fc.array(parts, { maxLength: 12 }).map((a) => a.join(" ")), check), { numRuns: 300 });
  });

  it("handles 100 KB of lower-case words that link to nothing", () => {
    const words = ["zorvath", "quintel", "marbeck", "olund", "trevask", "hyllo", "praxen", "dunmire"];
    const big = Array.from({ length: 14_000 }, (_, k) => words[(k * 7 + (k >> 3)) % words.length]).join(" ").slice(0, 100_000);
    check(big);
  });

  it("handles a 100 KB question", () => {
    const big = "Ada Quell 🚢 שלום Aurora \u0000 ".repeat(4000).slice(0, 100_000);
    check(big);
    expect(link(big).mentions.length).toBeGreaterThan(1000);
  });
});

describe("the lexical snapshot beside a catalog file", () => {
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), "tiepoint-link-"));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("is saved once, reused while current and rebuilt after a load", () => {
    const path = join(dir, "c.db");
    const c = Catalog.open(path, { create: true });
    writeLinkingFixture(c);
    const first = LexicalSnapshot.forCatalog(c);
    expect(existsSync(`${path}.link`)).toBe(true);
    const { uid, generation } = c.version();
    const loaded = LexicalSnapshot.load(`${path}.link`, uid, generation)!;
    expect(loaded.vocab).toEqual(first.vocab);
    expect([...loaded.postings]).toEqual([...first.postings]);
    expect([...loaded.degree]).toEqual([...first.degree]);
    expect(loaded.documentFrequency("tidal")).toBe(first.documentFrequency("tidal"));
    // p:ada has one edge (memberOf); "quell" is in two of its aliases but posts it once
    expect(loaded.degreeOf(c.numOf("p:ada")!)).toBe(1);
    expect([...loaded.entitiesWithToken(loaded.tokenId("quell"))]).toEqual([c.numOf("p:ada")]);
    // the trigram table and the description index, read from the file on first use, equal the built ones
    const plain = (t: object | undefined) => JSON.parse(JSON.stringify(t, (_, v: unknown) => (ArrayBuffer.isView(v) ? Array.from(v as Int32Array) : v))) as unknown;
    expect(plain(loaded.grams())).toEqual(plain(trigramTable(first.vocab)));
    expect(plain(loaded.descriptions())).toEqual(plain(first.descriptions()));
    expect(loaded.descriptions()!.documents).toBeGreaterThan(0);
    // the fuzzy lookups through the saved table are those of a table built from the vocabulary
    for (const q of ["quel", "tidle", "lodgge", "harbuor"]) expect(new FuzzyTokenIndex(loaded.vocab, loaded.grams()).nearest(q)).toEqual(new FuzzyTokenIndex(first.vocab).nearest(q));
    // a later load bumps the generation: the old snapshot no longer applies
    const w = new CatalogWriter(c);
    w.begin();
    w.label("p:new", "Nadia Quell");
    w.commit();
    expect(LexicalSnapshot.load(`${path}.link`, uid, c.version().generation)).toBeUndefined();
    const again = Linker.fromCatalog(c);
    expect(linkQuestion("Who is Nadia Quell?", again).mentions[0]!.entity.id).toBe("p:new");
    c.close();
  });

  it("ignores a damaged snapshot file", () => {
    const path = join(dir, "d.db");
    const c = Catalog.open(path, { create: true });
    writeLinkingFixture(c);
    LexicalSnapshot.forCatalog(c);
    const { uid, generation } = c.version();
    // overwrite with junk of the wrong format
    rmSync(`${path}.link`);
    writeFileSync(`${path}.link`, "not a snapshot");
    expect(LexicalSnapshot.load(`${path}.link`, uid, generation)).toBeUndefined();
    expect(linkQuestion("Ada Quell", Linker.fromCatalog(c)).mentions[0]!.entity.id).toBe("p:ada");
    c.close();
  });
});

describe("the description index: made with the name index, or built within the time budget", () => {
  it("the name index's table matches as an index built from the catalog; a build from the catalog stops when the budget is spent", () => {
    const fresh = Linker.fromCatalog(cat);
    // the name index carries the table: no budget is asked
    let asked = 0;
    const whole = fresh.descriptions(() => {
      asked++;
      return true;
    })!;
    expect(whole).toBeDefined();
    expect(asked).toBe(0);
    // kept: a later call gets the same index
    expect(fresh.descriptions(() => true)).toBe(whole);
    // the same hits as an index built from the catalog's rows ("ski lodge" is in the fixture town's description)
    const query = ["ski", "lodg"];
    expect(whole.match(query)).toEqual(DescriptionIndex.fromCatalog(cat)!.match(query));
    expect(whole.match(query).length).toBeGreaterThan(0);
    // built from the catalog (a name index without the table): a spent budget ends the build, nothing is returned
    let checks = 0;
    expect(
      DescriptionIndex.fromCatalog(cat, () => {
        checks++;
        return true;
      }),
    ).toBeUndefined();
    expect(checks).toBe(1);
  });
});

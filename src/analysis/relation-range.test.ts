/**
 * Relational head nouns (relation-range.ts): the answer type read from the types found at
 * the far end of the relation the head noun names. A small catalog written through
 * CatalogWriter into in-memory SQLite, the real relation index (its end-type table) and the
 * real question model; link results built by hand so the analysis is tested alone. Expected
 * types are hand-derived from the rule in the file header (invented data).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Catalog } from "../catalog/index.js";
import { handLinks, writtenCatalog } from "../../test/helpers/hand-links.js";
import { RelationIndex } from "../ranking/index.js";
import { analyze, buildQuestionModel, type QuestionModel } from "./index.js";

let cat: Catalog;
let model: QuestionModel;

beforeAll(() => {
  cat = writtenCatalog((w) => {
    for (const [id, label] of [["t:Realm", "realm"], ["t:Town", "town"], ["t:Port", "port town"], ["t:Coin", "coin"], ["t:Noble", "noble"], ["t:Place", "place"]] as const) w.label(id, label);
    w.subclass("t:Port", "t:Town");
    w.subclass("t:Town", "t:Place");
    w.predicateLabel("r:seat", "seat");
    w.predicateLabel("r:ruler", "ruler");
    w.predicateLabel("r:coin", "coin");
    w.predicateLabel("r:neighbour", "neighbour");
    w.predicateLabel("r:guard", "guarded by");
    const realms = ["Avenmark", "Brisca", "Coldhollow", "Dunmere"];
    realms.forEach((r, i) => {
      w.label(`x:${r}`, r);
      w.type(`x:${r}`, "t:Realm");
      const town = `x:${r}-seat`;
      w.label(town, `${r} Keep`);
      w.type(town, i === 0 ? "t:Port" : "t:Town");
      w.edge(`x:${r}`, "r:seat", town);
      w.label(`x:${r}-lord`, `Lord of ${r}`);
      w.type(`x:${r}-lord`, "t:Noble");
      w.edge(`x:${r}-lord`, "r:ruler", `x:${r}`);
      w.label(`x:${r}-coin`, `${r} mark`);
      w.type(`x:${r}-coin`, "t:Coin");
      w.edge(`x:${r}`, "r:coin", `x:${r}-coin`);
      w.edge(`x:${r}-coin`, "r:guard", `x:${r}-lord`);
      if (i > 0) w.edge(`x:${r}`, "r:neighbour", `x:${realms[i - 1]!}`);
    });
  });
  const index = RelationIndex.fromCatalog(cat);
  model = buildQuestionModel(cat, { relationEdgeCounts: index.relationEdgeCounts(), relationEnds: () => index.relationEnds(), typesOf: (n) => index.typesOf(n) });
});
afterAll(() => cat.close());

const linkOf = (question: string, labels: readonly string[]) => handLinks(cat, question, labels);

const ids = (a: ReturnType<typeof analyze>) => a.answerTypes.map((t) => t.id).sort();

describe("relationalAnswerType, through analyze", () => {
  it("types the answer like the relation's objects when the clue stands at its subject end", () => {
    const q = "What is the seat of Brisca?";
    const a = analyze(q, linkOf(q, ["Brisca"]), model);
    expect(a.answerTypeSource).toBe("relation");
    // one port town and three towns at the object end of "seat": both direct types
    expect(ids(a)).toEqual(["t:Port", "t:Town"]);
    expect(a.notes.join(" ")).toMatch(/names the relation seat: answers expected of the types of its objects/);
    expect(a.notes.join(" ")).not.toMatch(/names no type/);
  });

  it("takes the subject end when the clue stands at the object end (noble —ruler→ realm)", () => {
    const q = "What is the ruler of Dunmere?";
    const a = analyze(q, linkOf(q, ["Dunmere"]), model);
    expect(ids(a)).toEqual(["t:Noble"]);
    expect(a.notes.join(" ")).toMatch(/types of its subjects/);
  });

  it("keeps the types of both ends when the clue's type is at both (a relation between realms)", () => {
    const q = "What is the neighbour of Coldhollow?";
    const a = analyze(q, linkOf(q, ["Coldhollow"]), model);
    expect(ids(a)).toEqual(["t:Realm"]);
    expect(a.notes.join(" ")).toMatch(/types of its ends/);
  });

  it("leaves a type-naming head noun alone, and sets nothing for a head noun that names neither", () => {
    const typed = "Which town is the seat of Avenmark?";
    expect(analyze(typed, linkOf(typed, ["Avenmark"]), model).answerTypeSource).toBe("head-noun");
    const neither = "What is the weather of Avenmark?";
    const a = analyze(neither, linkOf(neither, ["Avenmark"]), model);
    expect(a.answerTypes).toEqual([]);
    expect(a.notes.join(" ")).toMatch(/names no type/);
  });

  it("sets nothing without the relation-end table (a model built without an index)", () => {
    const bare = buildQuestionModel(cat);
    const q = "What is the seat of Brisca?";
    const a = analyze(q, linkOf(q, ["Brisca"]), bare);
    expect(a.answerTypes).toEqual([]);
    expect(a.answerTypeSource).toBe("none");
  });

  it("'where' with a last relation word whose far end is no place: that end's types, not places", () => {
    // a realm is no place in this catalog; a town is (its supertype is labelled "place": lexicon.ts WH_REFERENTS)
    const q = "Where is Lord of Brisca the ruler?";
    const a = analyze(q, linkOf(q, ["Lord of Brisca"]), model);
    expect(a.answerTypeSource).toBe("relation");
    expect(ids(a)).toEqual(["t:Realm"]);
    expect(a.notes.join(" ")).toMatch(/"where" with "ruler" \(ruler\): answers expected of the types at its far end \(realm\), not places/);
    // far end holding a place-like type (the seat: towns): the place default stays
    const seat = "Where is the seat of Brisca?";
    const b = analyze(seat, linkOf(seat, ["Brisca"]), model);
    expect(b.answerTypeSource).toBe("where");
  });

  it("'who' in a catalog with no person-like type: the far end of the relation word", () => {
    // no type here is (under) "person", "people", "organisation" …: the ruler's end gives the type
    const q = "Who is the ruler of Brisca?";
    const a = analyze(q, linkOf(q, ["Brisca"]), model);
    expect(a.answerTypeSource).toBe("relation");
    expect(ids(a)).toEqual(["t:Noble"]);
  });

  it("'in which R are the T …': the subject T after the copula stands at the near end of R", () => {
    // realms are at the subject end of "seat": the answer is at its object end (one port town, three towns)
    const q = "In which seat are the realms that Lord of Brisca rules?";
    const a = analyze(q, linkOf(q, ["Lord of Brisca"]), model);
    expect(ids(a)).toEqual(["t:Port", "t:Town"]);
    // without a preposition of place the copula identifies ("which seat is the realm …"): not read so,
    // the clue (a noble, at neither end of "seat") leaves both ends
    const b = "Which seat are the realms that Lord of Brisca rules?";
    expect(ids(analyze(b, linkOf(b, ["Lord of Brisca"]), model))).toEqual(["t:Port", "t:Realm", "t:Town"]);
  });

  it("'who' + a relation verb right after it: the verb's subject, however far the clue (active 'guards' for the passive label 'guarded by': the stored object)", () => {
    // the clue Brisca Keep is a town, two hops away; the last relation word ("seat") would give realms
    const q = "Who guards the coin of the realm whose seat is Brisca Keep?";
    const a = analyze(q, linkOf(q, ["Brisca Keep"]), model);
    expect(a.answerTypeSource).toBe("relation");
    expect(ids(a)).toEqual(["t:Noble"]);
    expect(a.notes.join(" ")).toMatch(/"who" with "guards" \(guarded by\)/);
  });
});


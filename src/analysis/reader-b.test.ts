/**
 * The reader on phrasings of the second question sets (issue 16, world-b / debian-b): a
 * negated predicate noun after the name it negates ("where X isn't an R"), a derived form that
 * is an attribute value ("people known as Braskian"), a unit written out ("square
 * kilometres"), "apart from X" in a question with no answer-type noun, and a plural question
 * whose set is held by a neighbour constraint. The catalog is written as JSON Lines, loaded
 * through the real loader and read through the real Session; every expected answer is
 * derived by hand from the lines below (an invented world: no real places).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../pipeline/index.js";
import type { AskResult } from "../model/index.js";
import { loadJsonlCatalog } from "../../test/helpers/catalog-files.js";

const LINES = [
  { kind: "type", id: "t:Realm", label: "realm", aliases: ["nation"] },
  { kind: "type", id: "t:Tongue", label: "tongue" },
  { kind: "type", id: "t:Zone", label: "zone" },
  { kind: "relation", id: "r:tongue", label: "official language" },
  { kind: "relation", id: "r:zone", label: "zone" },
  { kind: "relation", id: "r:borders", label: "borders" },
  { kind: "attribute", id: "a:area", label: "area", unit: "km²" },
  { kind: "attribute", id: "a:demonym", label: "demonym" },
  { id: "z:north", label: "Nordmark", types: ["t:Zone"] },
  { id: "l:vesk", label: "Veskan", types: ["t:Tongue"] },
  { id: "l:ost", label: "Ostrish", types: ["t:Tongue"] },
  { id: "k:brask", label: "Brask", types: ["t:Realm"], relations: { "r:tongue": ["l:vesk"], "r:zone": ["z:north"] }, attributes: { "a:area": 420, "a:demonym": "Braskian" } },
  { id: "k:quen", label: "Quenland", types: ["t:Realm"], relations: { "r:tongue": ["l:vesk", "l:ost"], "r:zone": ["z:north"], "r:borders": ["k:brask"] }, attributes: { "a:area": 9000, "a:demonym": "Quenish" } },
  { id: "k:marsk", label: "Marsk", types: ["t:Realm"], relations: { "r:tongue": ["l:ost"], "r:zone": ["z:north"], "r:borders": ["k:quen"] }, attributes: { "a:area": 300, "a:demonym": "Marskan" } },
  { id: "k:tarn", label: "Tarn", types: ["t:Realm"], relations: { "r:tongue": ["l:ost"], "r:borders": ["k:marsk"] }, attributes: { "a:area": 100, "a:demonym": "Tarnish" } },
].map((l) => JSON.stringify(l));

let dir: string;
let session: Session;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tiepoint-reader-b-"));
  session = Session.open({ db: loadJsonlCatalog(dir, "realms-b", LINES) });
});
afterAll(() => {
  session?.close();
  rmSync(dir, { recursive: true, force: true });
});

const ask = (q: string): AskResult => session.ask(q).result;
const group = (r: AskResult) => [r.answers[0]!.id, ...r.verdict.tiedWith].sort();

describe("the reader on the phrasings of the second sets (issue 16)", () => {
  it("7. 'where X isn't an R': the realms whose official language is Veskan go (Brask, Quenland)", () => {
    const r = ask("Which realms in Nordmark are there where Veskan isn't an official language?");
    expect(r.reading!.constraints).toContain("Veskan isn't an official language");
    expect(group(r)).toEqual(["k:marsk"]);
    // every Nordmark realm but Marsk has Veskan: with "is not" after Ostrish, only Brask is left
    expect(group(ask("Which realm in Nordmark is there where Ostrish is not an official language?"))).toEqual(["k:brask"]);
  });

  it("8. a derived form that is a stored value of a text attribute is that value, not a clue", () => {
    const r = ask("Which realm's people are known as Braskian?");
    expect(r.answers[0]!.id).toBe("k:brask");
    expect(r.verdict.status).toBe("unique");
    // before a type noun the same form is a modifier naming the realm ("Braskian realms" → a neighbour of Brask)
    expect(ask("Which realm borders the Braskian realm?").answers[0]!.id).toBe("k:quen");
  });

  it("8. 'square kilometres' is the area's unit km²", () => {
    const r = ask("Which realms in Nordmark cover less than 500 square kilometres?");
    expect(group(r)).toEqual(["k:brask", "k:marsk"]);
    expect(r.verdict.status).toBe("tied");
  });

  it("11. a plural question whose set a neighbour constraint holds is one tied group", () => {
    // Ostrish is official in Quenland, Marsk (both in Nordmark) and Tarn (in no zone)
    const r = ask("Which Nordmark realms have Ostrish as an official language?");
    expect(r.reading!.plural).toBe(true);
    expect(r.verdict.status).toBe("tied");
    expect(group(r)).toEqual(["k:marsk", "k:quen"]);
  });

  it("7. 'apart from X' with no answer-type noun excludes X only", () => {
    // Quenland's official languages: Veskan and Ostrish; Ostrish is also linked to Marsk and Tarn, Veskan to Brask
    const r = ask("What is an official language of Quenland apart from Veskan?");
    expect(r.answers[0]!.id).toBe("l:ost");
    expect(r.verdict.status).toBe("unique");
  });
});

/**
 * The reader (query-graph.ts), one phenomenon of issue 16 at a time: a sentence over a tiny
 * invented catalog (realms, ports, vessels and their commanders) → the expected query graph,
 * and the answer the graph selects. The catalog is written as JSON Lines, loaded through the
 * real loader into SQLite and read through the real Session (linker, analysis, conditions,
 * reader, ranking), so each graph is the one `ask` shows. Every expected graph and answer is
 * derived by hand from the catalog lines below (few enough to read off); no other source.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../pipeline/index.js";
import type { AskResult } from "../model/index.js";
import { loadJsonlCatalog } from "../../test/helpers/catalog-files.js";

const LINES = [
  { kind: "type", id: "t:Realm", label: "realm", aliases: ["kingdom"] },
  { kind: "type", id: "t:Port", label: "port", aliases: ["harbour"] },
  { kind: "type", id: "t:Vessel", label: "vessel", aliases: ["ship"] },
  { kind: "type", id: "t:Person", label: "person" },
  { kind: "type", id: "t:Fleet", label: "fleet" },
  { kind: "relation", id: "r:commands", label: "commands" },
  { kind: "relation", id: "r:fleet", label: "in fleet" },
  { kind: "relation", id: "r:homePort", label: "home port", aliases: ["based at"] },
  { kind: "relation", id: "r:in", label: "located in" },
  { kind: "relation", id: "r:borders", label: "borders", aliases: ["neighbour"] },
  { kind: "attribute", id: "a:length", label: "length", unit: "m" },
  { kind: "attribute", id: "a:launched", label: "launch year" },
  { kind: "attribute", id: "a:condition", label: "condition" },
  { kind: "attribute", id: "a:lat", label: "latitude", unit: "degrees" },
  { id: "k:brask", label: "Brask", types: ["t:Realm"], description: "An island realm of fjords in the cold sea." },
  { id: "k:ostrelia", label: "Ostrelia", types: ["t:Realm"], description: "A lowland realm of canals.", relations: { "r:borders": ["k:brask"] } },
  { id: "k:quenland", label: "Quenland", types: ["t:Realm"], description: "A forested realm east of Brask.", relations: { "r:borders": ["k:brask"] } },
  { id: "k:marsk", label: "Marsk", types: ["t:Realm"], description: "A marsh realm west of Ostrelia.", relations: { "r:borders": ["k:ostrelia"] } },
  { id: "p:vask", label: "Vask", types: ["t:Port"], description: "A deep-water port in a fjord.", relations: { "r:in": ["k:brask"] }, attributes: { "a:lat": 61.5 } },
  { id: "p:holm", label: "Holm", types: ["t:Port"], description: "A canal port with a lock.", relations: { "r:in": ["k:ostrelia"] }, attributes: { "a:lat": 52 } },
  { id: "p:kess", label: "Kess", types: ["t:Port"], description: "A river port in the forest.", relations: { "r:in": ["k:quenland"] }, attributes: { "a:lat": -3.25 } },
  { id: "s:skell", label: "Skell", types: ["t:Vessel"], description: "A survey ship that maps the sea floor.", relations: { "r:fleet": ["f:surveys"], "r:homePort": ["p:vask"] }, attributes: { "a:length": 41, "a:launched": 1994, "a:condition": "poor" } },
  { id: "s:morrow", label: "Morrow", types: ["t:Vessel"], description: "A cargo ship that carries timber.", relations: { "r:homePort": ["p:vask"] }, attributes: { "a:length": 63, "a:launched": 2003, "a:condition": "good" } },
  { id: "s:lune", label: "Lune", types: ["t:Vessel"], description: "A small ferry across the canal.", relations: { "r:homePort": ["p:holm"] }, attributes: { "a:length": 28, "a:launched": 1988, "a:condition": "poor" } },
  { id: "s:gull", label: "Gull", types: ["t:Vessel"], description: "An ice breaker for the northern sea lanes.", relations: { "r:fleet": ["f:surveys"], "r:homePort": ["p:kess"] }, attributes: { "a:length": 50, "a:launched": 2010, "a:condition": "good" } },
  { id: "f:surveys", label: "surveys", types: ["t:Fleet"] },
  { id: "x:survey", label: "Survey", types: ["t:Person"] },
  { id: "x:ada", label: "Ada Quell", types: ["t:Person"], relations: { "r:commands": ["s:skell"] } },
  { id: "x:bo", label: "Bo Tarrant", types: ["t:Person"], relations: { "r:commands": ["s:morrow"] } },
  { id: "x:cyl", label: "Cyl Venn", types: ["t:Person"], relations: { "r:commands": ["s:lune", "s:gull"] } },
].map((l) => JSON.stringify(l));

let dir: string;
let session: Session;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tiepoint-reader-"));
  session = Session.open({ db: loadJsonlCatalog(dir, "realms", LINES) });
});
afterAll(() => {
  session?.close();
  rmSync(dir, { recursive: true, force: true });
});

const ask = (q: string): AskResult => session.ask(q).result;

/** The graph's edges as [from node, relation ids, direction, to node] (node names: "?answer", "?v1" … or entity ids). */
function edges(r: AskResult): [string, string, string, string][] {
  const g = r.reading!;
  return g.edges.map((e) => [g.nodes[e.from]!.name, e.relations.map((x) => x.id).join("|"), e.direction, g.nodes[e.to]!.name]);
}

/** The first answer and the tied group, sorted. */
const group = (r: AskResult) => [r.answers[0]!.id, ...r.verdict.tiedWith].sort();

describe("the reader: a sentence → its query graph (issue 16)", () => {
  it("1. a relation noun heads the question: the far end of the head relation, read from the clue outward", () => {
    const r = ask("What is the home port of the vessel that Ada Quell commands?");
    expect(r.reading!.text).toBe("?answer (port) ← home port — ?v1 (vessel) ← commands — Ada Quell");
    expect(edges(r)).toEqual([
      ["x:ada", "r:commands", "forward", "?v1"],
      ["?v1", "r:homePort", "forward", "?answer"],
    ]);
    // Ada Quell commands Skell, whose home port is Vask
    expect(r.answers[0]!.id).toBe("p:vask");
    expect(r.verdict.status).toBe("unique");
  });

  it("2. three hops: the hop the words do not name comes from the catalog's relation ends; a described middle node is linked by its description", () => {
    const r = ask("In which realm is the home port of the vessel that Ada Quell commands?");
    // "realm" is at no end of "home port" (vessel → port): "located in" (port → realm) joins them
    expect(r.reading!.text).toBe("?answer (realm) ← located in — ?v2 (port) ← home port — ?v1 (vessel) ← commands — Ada Quell");
    expect(edges(r).map((e) => e[1])).toEqual(["r:commands", "r:homePort", "r:in"]);
    expect(r.answers[0]!.id).toBe("k:brask");
    // the vessel named by what it is: Lune is "A small ferry across the canal."; its home port Holm is in Ostrelia
    const d = ask("In which realm is the home port of the small ferry across the canal?");
    expect(d.mentions.map((m) => [m.text, m.entity.id, m.match])).toEqual([["small ferry across the canal", "s:lune", "description"]]);
    expect(d.reading!.text).toBe("?answer (realm) ← located in — ?v1 (port) ← home port — Lune");
    expect(d.answers[0]!.id).toBe("k:ostrelia");
    expect(d.verdict.status).toBe("unique");
  });

  it("3. a modifier is a constraint: a derived adjective links to its base name and joins the answer or a middle node", () => {
    const r = ask("Which Braskian port is the home port of Morrow?");
    // "Braskian" is derived from the label Brask (-ian); "home port" takes "of Morrow" as its argument
    expect(r.mentions.find((m) => m.text === "Braskian")).toMatchObject({ entity: { id: "k:brask" }, derivation: { suffix: "ian", base: "Brask" } });
    expect(r.reading!.text).toBe("?answer (port) ~ Brask; ?answer (port) ← home port — Morrow");
    expect(r.answers[0]!.id).toBe("p:vask");
    // the modifier of a relation noun: Skell and Morrow have home port Vask, in Brask
    const s = ask("Which vessels have a Braskian home port?");
    expect(s.reading!.text).toBe("?answer (vessel) — home port → ?v1 (port) — located in → Brask; all that fit");
    expect(group(s)).toEqual(["s:morrow", "s:skell"]);
  });

  it("3. a verbal compound takes the name before its hyphen; the head noun stands after linked pre-modifiers", () => {
    // "Vask-based": Vask is the argument of "based" (home port); "Braskian" and "Vask" pre-modify "ship"
    const r = ask("Which Vask-based Braskian ship does Bo Tarrant command?");
    expect(r.reading!.nodes[0]!.types).toEqual(["t:Vessel"]);
    expect(edges(r)).toContainEqual(["p:vask", "r:homePort", "backward", "?answer"]);
    // Bo Tarrant commands Morrow, based at Vask
    expect(r.answers[0]!.id).toBe("s:morrow");
  });

  it("2. a described middle node: 'whose only neighbour is X' counts the node's relations", () => {
    // Brask's neighbours: Ostrelia and Quenland; Ostrelia also borders Marsk, Quenland borders Brask alone; Kess is Quenland's port
    const r = ask("Which port is located in the realm whose only neighbour is Brask?");
    expect(r.reading!.edges.find((e) => e.only !== undefined)).toMatchObject({ only: 1, relations: [{ id: "r:borders" }] });
    expect(r.answers[0]!.id).toBe("p:kess");
    expect(r.verdict.status).toBe("unique");
  });

  it("4. names not written as the catalog writes them: a misspelling, an official long form", () => {
    const r = ask("What is the home port of the Morow?");
    expect(r.mentions[0]).toMatchObject({ text: "Morow", entity: { id: "s:morrow" } });
    expect(r.reading!.text).toBe("?answer (port) ← home port — Morrow");
    expect(r.answers[0]!.id).toBe("p:vask");
    // "Kingdom" is a type alias, not a name: the long form links to Quenland alone
    const k = ask("Which port is located in the Kingdom of Quenland?");
    expect(k.mentions.map((m) => m.entity.id)).toEqual(["k:quenland"]);
    expect(edges(k)).toEqual([["k:quenland", "r:in", "backward", "?answer"]]);
    expect(k.answers[0]!.id).toBe("p:kess");
  });

  it("5. comparing named entities: the answer is one of them", () => {
    // lengths: Skell 41, Morrow 63
    const r = ask("Which is longer, the Skell or the Morrow?");
    expect(r.reading!.constraints).toEqual(["compare: Skell vs Morrow by length (larger wins)"]);
    expect(r.answers.map((a) => a.id)).toEqual(["s:morrow", "s:skell"]);
    expect(r.verdict.status).toBe("unique");
  });

  it("5. comparing described entities: each alternative is what its clue's chain reaches", () => {
    // Ada Quell commands Skell (41 m), Bo Tarrant commands Morrow (63 m)
    const r = ask("Which is longer, the vessel that Ada Quell commands or the one that Bo Tarrant commands?");
    expect(r.reading!.constraints).toEqual(["compare: (… Ada Quell) vs (… Bo Tarrant) by length (larger wins)"]);
    expect(r.answers.map((a) => a.id)).toEqual(["s:morrow", "s:skell"]);
    expect(r.verdict.status).toBe("unique");
  });

  it("6. a superlative over the set a chain defines", () => {
    // home port Vask: Skell (41 m) and Morrow (63 m); Gull (50 m) is based elsewhere
    const r = ask("Which is the longest vessel whose home port is Vask?");
    expect(r.reading!.text).toBe("?answer (vessel) — home port → Vask; largest by length");
    expect(r.answers[0]!.id).toBe("s:morrow");
    expect(r.verdict.status).toBe("unique");
  });

  it("6. a superlative on a middle node: it orders the nouns it modifies, and the chain goes on from the one it selects", () => {
    // Cyl Venn commands Lune (28 m, home port Holm) and Gull (50 m, home port Kess)
    const r = ask("What is the home port of the longest vessel that Cyl Venn commands?");
    expect(r.reading!.text).toBe("?answer (port) ← home port — ?v1 (vessel; largest by length) ← commands — Cyl Venn");
    expect(r.reading!.constraints).toEqual([]);
    expect(r.reading!.matched).toBe(1);
    expect(r.answers[0]!.id).toBe("p:kess");
    expect(r.verdict.status).toBe("unique");
  });

  it("6. an adjective of size no label names measures the catalog's magnitudes, never a signed coordinate", () => {
    // length (m, no negative value) is a magnitude; latitude (degrees) has a negative value (Kess -3.25): a coordinate, not a size
    const r = ask("Which is the largest vessel?");
    expect(r.reading!.constraints).toEqual(["largest by length"]);
    expect(r.notes!.some((n) => /"largest" names no attribute: it measures the first of the catalog's magnitudes the candidates carry \(length\)/.test(n))).toBe(true);
    // lengths: Morrow 63, Gull 50, Skell 41, Lune 28
    expect(r.answers[0]!.id).toBe("s:morrow");
    const p = ask("Which is the largest port?");
    expect(p.conditions?.[0]).toMatchObject({ kind: "superlative", applied: false });
  });

  it("2. three hops through a shared object: 'the vessel that shares Vask with the Skell' is a vessel based at Vask other than the Skell", () => {
    // Skell and Morrow have home port Vask; Bo Tarrant commands Morrow
    const r = ask("Who commands the vessel that shares Vask with the Skell?");
    expect(r.reading!.text).toBe("?answer (person) — commands → ?v1 (vessel; not Skell) — home port → Vask");
    expect(r.reading!.ignored).toEqual([]);
    expect(r.answers[0]!.id).toBe("x:bo");
    expect(r.verdict.status).toBe("unique");
  });

  it("7. negation over a relation excludes, and its relation word makes no hop of the other clue", () => {
    const r = ask("Which vessels whose home port is Vask are not commanded by Ada Quell?");
    expect(edges(r)).toEqual([["p:vask", "r:homePort", "backward", "?answer"]]);
    expect(r.reading!.constraints).toContain("not commanded by Ada Quell");
    // Skell and Morrow are based at Vask; Ada Quell commands Skell
    expect(r.answers[0]!.id).toBe("s:morrow");
    expect(r.answers.map((a) => a.id)).not.toContain("s:skell");
  });

  it("7. negation scope: a negated directed relation removes what is so linked, not the named entity; a relation noun heading the name's phrase is in the scope", () => {
    // Ostrelia and Quenland border Brask; nobody borders Quenland (Quenland borders only Brask):
    // Quenland does not border itself, so both stay
    const r = ask("Which realms that border Brask do not border Quenland?");
    expect(r.reading!.constraints).toContain("not border Quenland");
    expect(group(r)).toEqual(["k:ostrelia", "k:quenland"]);
    // "the Holm home port": "home port" heads the phrase Holm stands in, so it is negated with
    // it and makes no hop; Cyl Venn commands Lune (home port Holm) and Gull (home port Kess)
    const h = ask("Which vessel commanded by Cyl Venn does not have the Holm home port?");
    expect(edges(h)).toEqual([["x:cyl", "r:commands", "forward", "?answer"]]);
    expect(h.reading!.constraints).toEqual(["not have the Holm home port"]);
    expect(h.answers[0]!.id).toBe("s:gull");
    expect(h.verdict.status).toBe("unique");
  });

  it("7. a negated relation with no object is an absence: no edge of it, in the sentence's direction", () => {
    // Ostrelia, Quenland and Marsk each border a realm (stored subject → object); Brask borders none (it is only bordered)
    const r = ask("Which realms do not border any other realm?");
    expect(r.reading!.constraints).toContain("not border any other realm");
    expect(r.reading!.ignored).toEqual([]);
    expect(r.answers.map((a) => a.id)).toEqual(["k:brask"]);
  });

  it("8. literal conditions: a text value and a year", () => {
    const r = ask("Which vessels are in poor condition?");
    expect(r.reading!.constraints).toEqual(["condition = poor", "all that fit"]);
    expect(group(r)).toEqual(["s:lune", "s:skell"]);
    const y = ask("Which vessels were launched after 2000?");
    expect(y.reading!.constraints).toEqual(["launch year > 2000", "all that fit"]);
    expect(group(y)).toEqual(["s:gull", "s:morrow"]);
    // `matched` counts the entities after the conditions: Skell (1994) and Morrow (2003) have home port Vask, only Morrow after 2000
    const m = ask("Which vessels whose home port is Vask were launched after 2000?");
    expect(m.reading!.matched).toBe(1);
    expect(m.answers[0]!.id).toBe("s:morrow");
  });

  it("8. a four-digit number before the catalog's unit is a quantity of that unit, not a year", () => {
    // length is declared in "m": "2000 m" is a length (all four vessels are shorter); read as a year it would be launch year < 2000 (Skell, Lune)
    const r = ask("Which vessels are shorter than 2000 m?");
    expect(r.reading!.constraints).toEqual(["length < 2000", "all that fit"]);
    expect(group(r)).toEqual(["s:gull", "s:lune", "s:morrow", "s:skell"]);
  });

  it("8. a compass point compares the coordinate the question names, a signed number included", () => {
    // latitudes: Vask 61.5, Holm 52, Kess -3.25 (ISO 6709: south = smaller latitude)
    const r = ask("Which ports lie south of latitude 55?");
    expect(r.reading!.constraints).toEqual(["latitude < 55", "all that fit"]);
    expect(group(r)).toEqual(["p:holm", "p:kess"]);
    const n = ask("Which ports lie north of latitude 55?");
    expect(n.reading!.constraints).toEqual(["latitude > 55", "all that fit"]);
    expect(group(n)).toEqual(["p:vask"]);
    const m = ask("Which ports lie south of latitude -1?");
    expect(m.reading!.constraints).toEqual(["latitude < -1", "all that fit"]);
    expect(group(m)).toEqual(["p:kess"]);
  });

  it("8. a text value of a node one hop from the answer: the answers are linked by the cued relation to the entities that carry it", () => {
    // condition poor: Skell (commanded by Ada Quell) and Lune (commanded by Cyl Venn); no person has a condition
    const r = ask("Which persons command a vessel whose condition is poor?");
    expect(r.reading!.constraints).toEqual(["condition = poor", "all that fit"]);
    expect(group(r)).toEqual(["x:ada", "x:cyl"]);
    expect(r.verdict.status).toBe("tied");
  });

  it("9. direction from word order and voice: what X commands against who commands X", () => {
    const out = ask("What does Ada Quell command?");
    expect(edges(out)).toEqual([["x:ada", "r:commands", "forward", "?answer"]]);
    expect(out.answers[0]!.id).toBe("s:skell");
    const into = ask("Who commands the Skell?");
    expect(edges(into)).toEqual([["s:skell", "r:commands", "backward", "?answer"]]);
    expect(into.answers[0]!.id).toBe("x:ada");
  });

  it("10. an entity named by what it is: the definite description, post-modifier included", () => {
    const r = ask("What is the home port of the ferry across the canal?");
    expect(r.mentions).toMatchObject([{ text: "ferry across the canal", entity: { id: "s:lune" }, match: "description" }]);
    expect(r.reading!.text).toBe("?answer (port) ← home port — Lune");
    expect(r.answers[0]!.id).toBe("p:holm");
  });

  it("10. 'Which X is the <description>?' asks which entity the description names: the answer is that entity, not its neighbours", () => {
    // Lune is "A small ferry across the canal."
    const r = ask("Which vessel is the small ferry across the canal?");
    expect(r.reading!.text).toBe("?answer (vessel); identity: ?answer = Lune");
    expect(r.reading!.edges).toEqual([]);
    expect(r.answers[0]!.id).toBe("s:lune");
    expect(r.verdict.status).toBe("unique");
    // a relation word between the copula and the name is no identity: the home port of Morrow is Vask
    const h = ask("Which port is the home port of Morrow?");
    expect(h.reading!.text).not.toMatch(/identity/);
    expect(h.answers[0]!.id).toBe("p:vask");
  });

  it("3. the wh-phrase's noun names the answer's class when another mention is the same word: it is no clue of its own", () => {
    // "survey" links to the person Survey, "surveys" to the fleet; the fleet surveys holds Skell (41 m) and Gull (50 m)
    const r = ask("Which survey is the longest vessel in the surveys fleet?");
    expect(r.reading!.text).toBe("?answer (vessel) — in fleet → surveys; largest by length");
    expect(r.notes!.some((n) => /"survey" names the class of the answer, as "surveys" \(surveys\) does/.test(n))).toBe(true);
    expect(r.answers[0]!.id).toBe("s:gull");
    expect(r.verdict.status).toBe("unique");
  });

  it("11. a plural question asks for the set: one tied group", () => {
    const r = ask("Which vessels have Vask as their home port?");
    expect(r.reading!.plural).toBe(true);
    expect(r.verdict.status).toBe("tied");
    expect(group(r)).toEqual(["s:morrow", "s:skell"]);
  });

  it("12. the words the reading does not use are reported", () => {
    const r = ask("Which vessel does Ada Quell command on sunny days?");
    expect(r.reading!.ignored).toEqual(["sunny", "days"]);
    expect(r.answers[0]!.id).toBe("s:skell");
  });

  it("falls back to PageRank with a note when no entity satisfies the reading", () => {
    // Vask is a port: no "commands" edge touches it
    const r = ask("Which vessel does Vask command?");
    expect(r.reading!.text).toBe("?answer (vessel) ← commands — Vask");
    expect(r.reading!.matched).toBe(0);
    expect(r.reading!.fallback).toBe(true);
    expect(r.notes!.some((n) => /PageRank alone/.test(n))).toBe(true);
  });
});

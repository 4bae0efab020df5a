/**
 * Conditions on a middle node of the reading (issue 16, structural gaps 1, 2 and 4): every
 * condition attaches to the query-graph node whose noun phrase it modifies
 * (src/analysis/attach-conditions.ts: a pre-modifying adjective to the noun after it, a
 * post-modifier to the noun before it, a main-clause predicate to the answer), the ranking
 * evaluates it on that node's set (src/ranking/node-select.ts), on the set where coordinated
 * clues' chains meet (src/ranking/chain-reach.ts `meet`), and the reading lists it at its node
 * (text and JSON `reading.nodes[].conditions`); and a verb no relation label names between two
 * typed nodes is a hop of the catalog's relations between their types (query-graph.ts
 * `unnamedHops`).
 *
 * Catalog: six invented realms with their capitals, borders (stored both ways), an area and a
 * coastal flag, written as N-Triples and loaded through the real loader; each question read
 * and ranked by the real Session. Gold: SPARQL over the same N-Triples in oxigraph (npm
 * `oxigraph`, src/eval/question-set.ts `goldStore`), an engine independent of tiepoint.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { AskResult } from "../src/model/index.js";
import { openNtSession, type NtSession } from "./helpers/nt-session.js";

const E = "http://realms.example/";
const LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";
/** realm → [area km², coastal, capital] */
const REALMS: Record<string, [number, boolean, string]> = {
  Arlen: [500, false, "Aton"],
  Brisk: [300, true, "Bel"],
  Corvel: [800, false, "Cade"],
  Dunmar: [200, false, "Dorr"],
  Elsk: [900, true, "Esk"],
  Fohr: [100, false, "Fenn"],
};
const BORDERS: Record<string, string[]> = {
  Arlen: ["Brisk", "Corvel", "Dunmar", "Elsk"],
  Brisk: ["Arlen", "Corvel", "Fohr"],
  Corvel: ["Arlen", "Brisk", "Dunmar"],
  Dunmar: ["Arlen", "Corvel"],
  Elsk: ["Arlen"],
  Fohr: ["Brisk"],
};

function triples(): string {
  const out = [
    `<${E}Realm> ${LABEL} "realm" .`,
    `<${E}Town> ${LABEL} "town" .`,
    `<${E}borders> ${LABEL} "borders" .`,
    `<${E}capital> ${LABEL} "capital" .`,
    `<${E}area> ${LABEL} "area" .`,
    `<${E}coastal> ${LABEL} "coastal" .`,
  ];
  for (const [r, [area, coastal, cap]] of Object.entries(REALMS)) {
    out.push(
      `<${E}realm/${r}> ${TYPE} <${E}Realm> .`,
      `<${E}realm/${r}> ${LABEL} "${r}" .`,
      `<${E}realm/${r}> <${E}area> "${area}"^^<http://www.w3.org/2001/XMLSchema#decimal> .`,
      `<${E}realm/${r}> <${E}coastal> "${coastal}"^^<http://www.w3.org/2001/XMLSchema#boolean> .`,
      `<${E}realm/${r}> <${E}capital> <${E}town/${cap}> .`,
      `<${E}town/${cap}> ${TYPE} <${E}Town> .`,
      `<${E}town/${cap}> ${LABEL} "${cap}" .`,
    );
    for (const n of BORDERS[r]!) out.push(`<${E}realm/${r}> <${E}borders> <${E}realm/${n}> .`);
  }
  return out.join("\n") + "\n";
}

let cat: NtSession;
let gold: (sparql: string) => string[];

beforeAll(() => {
  cat = openNtSession("realms", triples(), `{"kind":"attribute","id":"${E}area","label":"area","unit":"km²"}\n`, E);
  gold = cat.gold;
});
afterAll(() => cat?.close());

const ask = (q: string): AskResult => cat.session.ask(q).result;
/** The first answer and the tied group, sorted. */
const group = (r: AskResult) => [r.answers[0]!.id, ...r.verdict.tiedWith].sort();

describe("conditions on a middle node: attached where their noun phrase is, evaluated on that node's set", () => {
  it("a literal adjective before the noun of a middle node filters that node ('the capital of the coastal realm that borders C')", () => {
    const r = ask("What is the capital of the coastal realm that borders Corvel?");
    expect(r.reading!.text).toBe("?answer (town) ← capital — ?v1 (realm; coastal = true) — borders → Corvel");
    expect(r.reading!.constraints).toEqual([]);
    expect(r.reading!.nodes.find((n) => n.name === "?v1")!.conditions).toEqual(["coastal = true"]);
    expect(group(r)).toEqual(gold(`SELECT ?c WHERE { ?r :borders :realm\\/Corvel ; :coastal true ; :capital ?c }`));
    expect(r.verdict.status).toBe("unique");
  });

  it("a comparison in a relative clause coordinated after the clue ('that borders C and has an area above N') is the middle node's", () => {
    const r = ask("What is the capital of the realm that borders Corvel and has an area above 400?");
    expect(r.reading!.text).toBe("?answer (town) ← capital — ?v1 (realm; area > 400) — borders → Corvel");
    expect(group(r)).toEqual(gold(`SELECT ?c WHERE { ?r :borders :realm\\/Corvel ; :area ?a ; :capital ?c FILTER(?a > 400) }`));
    expect(r.verdict.status).toBe("unique");
  });

  it("a negated literal after the clue ('and is not coastal') is the middle node's; several fit: tied", () => {
    const r = ask("What is the capital of the realm that borders Arlen and is not coastal?");
    expect(r.reading!.text).toBe("?answer (town) ← capital — ?v1 (realm; coastal != true) — borders → Arlen");
    expect(group(r)).toEqual(gold(`SELECT ?c WHERE { ?r :borders :realm\\/Arlen ; :coastal false ; :capital ?c }`));
    expect(r.verdict.status).toBe("tied");
  });

  it("a main-clause predicate after a participle clause ('realms … bordering X have an area above N') is the answer's, not the nearer noun's", () => {
    const r = ask("Which realms that border a realm bordering Fohr have an area above 400?");
    expect(r.reading!.constraints).toContain("area > 400");
    expect(r.reading!.nodes.every((n) => n.conditions === undefined)).toBe(true);
    // 'bordering' is the second place of the borders cue: no word is ignored
    expect(r.reading!.ignored).toEqual([]);
    expect(group(r)).toEqual(gold(`SELECT DISTINCT ?r WHERE { ?r :borders ?m . ?m :borders :realm\\/Fohr . ?r :area ?a FILTER(?a > 400) }`));
  });

  it("a verb no relation label names, between two typed nodes, is a hop of the relations the catalog has between their types ('the realm that encircles the one whose capital is F')", () => {
    // realm to realm, the catalog has one relation: borders (query-graph.ts unnamedHops)
    const r = ask("What is the capital of the realm that quietly encircles the one whose capital is Fenn?");
    expect(r.reading!.text).toBe("?answer (town) ← capital — ?v2 (realm) — borders — ?v1 (realm) — capital → Fenn");
    expect(r.reading!.ignored).toEqual(["quietly"]);
    expect(group(r)).toEqual(gold(`SELECT DISTINCT ?c WHERE { ?f :capital :town\\/Fenn . { ?r :borders ?f } UNION { ?f :borders ?r } ?r :capital ?c }`));
    expect(r.verdict.status).toBe("unique");
  });

  it("a superlative on the node where coordinated clues meet orders their intersection, not each clue's set", () => {
    // per clue, the largest neighbour of Arlen (Elsk) and of Corvel (Arlen) differ; of the realms bordering both, Brisk is the largest
    const r = ask("What is the capital of the largest realm that borders both Arlen and Corvel?");
    expect(r.reading!.text).toBe("?answer (town) ← capital — ?v1 (realm; largest by area) — borders → Arlen & Corvel");
    const both = `{ ?r :borders :realm\\/Arlen , :realm\\/Corvel ; :area ?a }`;
    expect(group(r)).toEqual(gold(`SELECT ?c WHERE { ${both} ?r :capital ?c FILTER NOT EXISTS { ?s :borders :realm\\/Arlen , :realm\\/Corvel ; :area ?b FILTER(?b > ?a) } }`));
    expect(r.reading!.matched).toBe(1);
    expect(r.verdict.status).toBe("unique");
  });
});

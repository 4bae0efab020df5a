/**
 * The reading of a question (analysis query-graph.ts) through the real pipeline: a small
 * invented catalog (a harbour survey: vessels, their commanders and home ports, a trench with
 * a depth) loaded from JSONL through the real loader into SQLite, asked through Session.
 * Every expected graph, set and value is derived by hand from the catalog lines below (the
 * facts are few enough to read off): no other source.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { rankOfExpected } from "../src/pipeline/index.js";
import { loadJsonlCatalog } from "./helpers/catalog-files.js";

const LINES = [
  { kind: "type", id: "t:Port", label: "port" },
  { kind: "type", id: "t:Vessel", label: "vessel", aliases: ["ship"] },
  { kind: "type", id: "t:Person", label: "person" },
  { kind: "type", id: "t:Trench", label: "trench" },
  { kind: "relation", id: "r:commands", label: "commands" },
  { kind: "relation", id: "r:homePort", label: "home port" },
  { kind: "attribute", id: "a:depth", label: "depth", unit: "m" },
  { kind: "attribute", id: "a:length", label: "length", unit: "m" },
  { kind: "attribute", id: "a:callSign", label: "call sign" },
  { kind: "attribute", id: "a:retired", label: "decommissioned" },
  { id: "p:ada", label: "Ada Quell", types: ["t:Person"], relations: { "r:commands": ["v:skell"] } },
  { id: "p:bo", label: "Bo Tarrant", types: ["t:Person"], relations: { "r:commands": ["v:morrow"] } },
  { id: "v:skell", label: "Skell", types: ["t:Vessel"], relations: { "r:homePort": ["port:brask"] }, attributes: { "a:length": 41, "a:callSign": "QX-41", "a:retired": "false" } },
  { id: "v:morrow", label: "Morrow", types: ["t:Vessel"], relations: { "r:homePort": ["port:brask"] }, attributes: { "a:length": 63, "a:callSign": "QX-63", "a:retired": "true" } },
  { id: "v:lune", label: "Lune", types: ["t:Vessel"], relations: { "r:homePort": ["port:ottery"] }, attributes: { "a:length": 28, "a:callSign": "RL-28", "a:retired": "true" } },
  { id: "port:brask", label: "Brask", types: ["t:Port"] },
  { id: "port:ottery", label: "Ottery", types: ["t:Port"] },
  { id: "tr:harrow", label: "Harrow Trench", types: ["t:Trench"], attributes: { "a:depth": 7410 } },
].map((l) => JSON.stringify(l));

let dir: string;
let session: Session;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tiepoint-reading-"));
  session = Session.open({ db: loadJsonlCatalog(dir, "harbour", LINES) });
});
afterAll(() => {
  session?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("the reading of a question", () => {
  it("reads a relation noun head as the last hop, from the clue outward (phenomenon 1)", () => {
    const r = session.ask("What is the home port of the vessel that Ada Quell commands?").result;
    // Ada Quell commands Skell; Skell's home port is Brask (catalog lines above)
    expect(r.reading!.text).toBe("?answer (port) ← home port — ?v1 (vessel) ← commands — Ada Quell");
    const rels = r.reading!.edges.map((e) => [r.reading!.nodes[e.from]!.name, e.relations.map((x) => x.id).join(), e.direction, r.reading!.nodes[e.to]!.name]);
    expect(rels).toEqual([
      ["p:ada", "r:commands", "forward", "?v1"],
      ["?v1", "r:homePort", "forward", "?answer"],
    ]);
    expect(r.answers[0]!.id).toBe("port:brask");
    expect(r.reading!.matched).toBe(1);
    expect(r.verdict.status).toBe("unique");
  });

  it("asks for the set with a plural head noun: every vessel based at Brask, tied (phenomenon 11)", () => {
    const r = session.ask("Which vessels have Brask as their home port?").result;
    // Skell and Morrow have home port Brask; Lune has Ottery
    expect(r.reading!.plural).toBe(true);
    expect(r.answers.slice(0, 2).map((a) => a.id).sort()).toEqual(["v:morrow", "v:skell"]);
    expect(r.verdict.status).toBe("tied");
    expect([r.answers[0]!.id, ...r.verdict.tiedWith].sort()).toEqual(["v:morrow", "v:skell"]);
  });

  it("answers a value question with the value, its unit and the source triple (issue 18)", () => {
    const r = session.ask("What is the depth of the Harrow Trench?").result;
    expect(r.values).toEqual([
      { entity: { id: "tr:harrow", label: "Harrow Trench" }, attribute: { id: "a:depth", label: "depth", unit: "m" }, value: "7410", number: 7410, triple: { subject: "tr:harrow", predicate: "a:depth", object: "7410", literal: true } },
    ]);
    expect(r.answers[0]!.id).toBe("tr:harrow");
    expect(r.verdict.status).toBe("unique");
    // check counts the value as written as a hit
    expect(rankOfExpected(r, ["7410"])).toBe(1);
    const how = session.ask("How long is the Skell?").result;
    expect(how.values!.map((v) => [v.attribute.id, v.value])).toEqual([["a:length", "41"]]);
  });

  it("compares named entities and answers one of them (phenomenon 5)", () => {
    // lengths: Skell 41, Morrow 63
    const r = session.ask("Which is longer, the Skell or the Morrow?").result;
    expect(r.answers.map((a) => a.id)).toEqual(["v:morrow", "v:skell"]);
    expect(r.verdict.status).toBe("unique");
    const s = session.ask("Which is shorter, Skell or Morrow?").result;
    expect(s.answers[0]!.id).toBe("v:skell");
  });

  it("falls back to PageRank with a note when no entity satisfies the reading", () => {
    // Brask is a port: no "commands" edge touches it, so the pattern reaches nothing
    const r = session.ask("Which vessel does Brask command?").result;
    expect(r.reading!.fallback).toBe(true);
    expect(r.reading!.matched).toBe(0);
    expect(r.notes!.some((n) => /PageRank alone/.test(n))).toBe(true);
  });

  it("reads a text value and a boolean attribute as literal conditions (phenomenon 8)", () => {
    // call signs: Skell QX-41, Morrow QX-63, Lune RL-28; decommissioned: Morrow and Lune
    const r = session.ask("Which vessel has the call sign QX-41?").result;
    expect(r.answers[0]!.id).toBe("v:skell");
    expect(r.conditions![0]).toMatchObject({ kind: "literal", attribute: { id: "a:callSign" }, operator: "=", values: ["QX-41"] });
    expect(r.verdict.status).toBe("unique");
    const set = session.ask("Which vessels are decommissioned?").result;
    expect(set.answers.slice(0, 2).map((a) => a.id).sort()).toEqual(["v:lune", "v:morrow"]);
    expect(set.verdict.status).toBe("tied");
    const not = session.ask("Which vessels based in Brask are not decommissioned?").result;
    expect(not.answers[0]!.id).toBe("v:skell");
    // the value question reads text attributes too
    expect(session.ask("What is the call sign of the Lune?").result.values!.map((v) => v.value)).toEqual(["RL-28"]);
  });

  it("bridges a hop the words do not name, from the catalog's relation ends (phenomenon 2)", () => {
    // a person is at neither end of "home port" (vessel → port); "commands" joins persons to vessels
    const r = session.ask("What is the home port of Ada Quell?").result;
    expect(r.reading!.text).toBe("?answer (port) ← home port — ?v1 (vessel) ← commands — Ada Quell");
    expect(r.answers[0]!.id).toBe("port:brask");
  });

  it("lists the words it did not use (phenomenon 12)", () => {
    const r = session.ask("Which vessel does Ada Quell command on sunny days?").result;
    expect(r.reading!.ignored).toEqual(["sunny", "days"]);
    expect(r.answers[0]!.id).toBe("v:skell");
  });
});

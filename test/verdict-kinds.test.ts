/**
 * The verdict decider (explain/verdict.ts) on each kind of issue 17's verdict set, through the
 * real pipeline: a small invented harbour catalog (two people who share a name, a port and a
 * vessel who share one, two ports one letter apart, instrument codes) loaded from JSONL
 * through the real loader into SQLite, asked through Session. Every expected verdict and set
 * is read off the catalog lines below by hand (they are few enough): no other source.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { loadJsonlCatalog } from "./helpers/catalog-files.js";

const LINES = [
  { kind: "type", id: "t:Person", label: "person" },
  { kind: "type", id: "t:Vessel", label: "vessel" },
  { kind: "type", id: "t:Port", label: "port" },
  { kind: "type", id: "t:Instrument", label: "instrument" },
  { kind: "relation", id: "r:commands", label: "commands", aliases: ["captains"] },
  { kind: "relation", id: "r:inspected", label: "inspected" },
  { kind: "relation", id: "r:homePort", label: "home port" },
  { kind: "relation", id: "r:carries", label: "carries" },
  // two people called Ada Quell, each commanding one vessel
  { id: "p:ada1", label: "Ada Quell", types: ["t:Person"], description: "a harbour pilot", relations: { "r:commands": ["v:skell"] } },
  { id: "p:ada2", label: "Ada Quell", types: ["t:Person"], description: "a survey diver", relations: { "r:commands": ["v:lune"] } },
  // Bo commands Varn and Osper, and also inspected Varn (a relation no question below names)
  { id: "p:bo", label: "Bo Tarrant", types: ["t:Person"], relations: { "r:commands": ["v:varn", "v:osper"], "r:inspected": ["v:varn"] } },
  { id: "p:cal", label: "Cal Heddon", types: ["t:Person"], relations: { "r:commands": ["v:morrow"] } },
  { id: "v:skell", label: "Skell", types: ["t:Vessel"], relations: { "r:homePort": ["port:brask"], "r:carries": ["i:kx114"] } },
  { id: "v:lune", label: "Lune", types: ["t:Vessel"], relations: { "r:homePort": ["port:brask"] } },
  { id: "v:varn", label: "Varn", types: ["t:Vessel"], relations: { "r:homePort": ["port:ottery"], "r:carries": ["i:kx120"] } },
  { id: "v:osper", label: "Osper", types: ["t:Vessel"], relations: { "r:homePort": ["port:ottery"] } },
  // a vessel and a port both called Morrow: only the vessel has a commander
  { id: "v:morrow", label: "Morrow", types: ["t:Vessel"], relations: { "r:homePort": ["port:morrow"] } },
  { id: "port:brask", label: "Brask", types: ["t:Port"] },
  { id: "port:ottery", label: "Ottery", types: ["t:Port"] },
  { id: "port:morrow", label: "Morrow", types: ["t:Port"] },
  // Bresk is one letter from Brask: "Brosk" is one edit from both
  { id: "port:bresk", label: "Bresk", types: ["t:Port"] },
  { id: "v:halm", label: "Halm", types: ["t:Vessel"], relations: { "r:homePort": ["port:bresk"] } },
  { id: "i:kx114", label: "KX-114", types: ["t:Instrument"] },
  { id: "i:kx120", label: "KX-120", types: ["t:Instrument"] },
].map((l) => JSON.stringify(l));

let dir: string;
let session: Session;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tiepoint-verdict-kinds-"));
  session = Session.open({ db: loadJsonlCatalog(dir, "harbour", LINES) });
});
afterAll(() => {
  session?.close();
  rmSync(dir, { recursive: true, force: true });
});

const ask = (q: string) => session.ask(q).result;
const fitting = (r: ReturnType<typeof ask>) => [r.answers[0]?.id, ...r.verdict.tiedWith].sort();

describe("the verdict of each kind (issue 17)", () => {
  it("clearly unique: one commander of the Skell", () => {
    const r = ask("Who commands the Skell?");
    expect(r.answers[0]!.id).toBe("p:ada1");
    expect(r.verdict.status).toBe("unique");
    expect(r.verdict.reason).toBeTruthy();
  });

  it("2–4 right answers: both vessels based at Brask are tied", () => {
    const r = ask("Which vessels have Brask as their home port?");
    expect(r.verdict.status).toBe("tied");
    expect(fitting(r)).toEqual(["v:lune", "v:skell"]);
  });

  it("several senses, nothing to choose: each Ada Quell's vessel, the other one carrying its sense", () => {
    const r = ask("Which vessel does Ada Quell command?");
    expect(r.verdict.status).toBe("tied");
    expect(fitting(r)).toEqual(["v:lune", "v:skell"]);
    const other = r.answers[0]!.id === "v:skell" ? { answer: "v:lune", sense: "p:ada2" } : { answer: "v:skell", sense: "p:ada1" };
    expect(r.verdict.senses).toEqual([expect.objectContaining({ id: other.answer, mention: "Ada Quell", sense: expect.objectContaining({ id: other.sense }) })]);
    expect(r.verdict.mention?.text).toBe("Ada Quell");
  });

  it("several senses, the question chooses: the port called Morrow has no commander", () => {
    const r = ask("Who commands the Morrow?");
    expect(r.answers[0]!.id).toBe("p:cal");
    expect(r.verdict.status).toBe("unique");
  });

  it("a name not in the catalog: none when it is the only clue, weak when the answer rests on another", () => {
    expect(ask("Who commands the Zephyrine?").verdict.status).toBe("none");
    const r = ask("Who commands the Lune and the Zephyrine?");
    expect(r.verdict.status).toBe("weak");
    expect(r.verdict.reason).toMatch(/no catalog entity matches 'Zephyrine'/);
    expect(r.verdict.mention).toEqual(expect.objectContaining({ text: "Zephyrine", notFound: true }));
  });

  it("a code not in the catalog: KX-1140 is not KX-114 (its digits differ), so none with the nearest named", () => {
    const r = ask("Which vessel carries KX-1140?");
    expect(r.verdict.status).toBe("none");
    expect(r.verdict.reason).toMatch(/^no catalog entity matches 'KX-1140'; nearest: KX-114, \d+ %$/);
    expect(r.verdict.mention).toEqual(expect.objectContaining({ text: "KX-1140", notFound: true, entity: { id: "i:kx114", label: "KX-114" } }));
    expect(r.notFound).toEqual([expect.objectContaining({ text: "KX-1140", linked: true, nearest: expect.objectContaining({ id: "i:kx114" }) })]);
    // the code as written is found: unique
    expect(ask("Which vessel carries KX-114?").verdict.status).toBe("unique");
  });

  it("a misspelling near two names: Brosk is Bresk or Brask, tied with the vessels of both", () => {
    const r = ask("Which vessels have Brosk as their home port?");
    expect(r.verdict.status).toBe("tied");
    expect(fitting(r)).toEqual(["v:halm", "v:lune", "v:skell"]);
    expect(new Set(r.verdict.senses!.map((s) => s.sense.id)).size).toBe(1);
  });

  it("off-question evidence: Bo also inspected Varn, which does not break the tie of the two vessels he commands", () => {
    for (const q of ["Which vessels does Bo Tarrant command?", "Which vessel does Bo Tarrant command?"]) {
      const r = ask(q);
      expect(r.verdict.status, q).toBe("tied");
      expect(fitting(r)).toEqual(["v:osper", "v:varn"]);
    }
  });

  it("a count: the number is the answer (unique), weak when it depends on a sense in doubt", () => {
    const r = ask("How many vessels have Brask as their home port?");
    expect(r.count?.value).toBe(2);
    expect(r.verdict.status).toBe("unique");
    const d = ask("How many vessels does Ada Quell command?");
    expect(d.verdict.status).toBe("weak");
    expect(d.verdict.mention?.text).toBe("Ada Quell");
  });
});

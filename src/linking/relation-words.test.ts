/**
 * The relation-word rule of mention detection (mention-detection.ts header) and relation
 * evidence only from words outside a mention (linker.ts header), on a small invented catalog
 * loaded from JSONL through the real importer (`loadFiles`). Its projects carry four-letter
 * code aliases ("HOST", "LIVE") the way generated catalogs do (src/gen/synthetic.ts).
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { Linker, linkQuestion } from "./index.js";

const LINES: readonly object[] = [
  { kind: "type", id: "t:Person", label: "person", aliases: ["people"] },
  { kind: "type", id: "t:Project", label: "project" },
  { kind: "type", id: "t:Lab", label: "laboratory", aliases: ["lab"] },
  { kind: "type", id: "t:Town", label: "town" },
  { kind: "type", id: "t:Event", label: "event", aliases: ["workshop"] },
  { kind: "type", id: "t:Report", label: "report" },
  { kind: "type", id: "t:Site", label: "field site" },
  { kind: "relation", id: "r:hostedBy", label: "hosted by" },
  { kind: "relation", id: "r:fundedBy", label: "funded by" },
  { kind: "relation", id: "r:livesIn", label: "lives in", aliases: ["resides in"] },
  { kind: "relation", id: "r:heldIn", label: "held in" },
  { kind: "relation", id: "r:worksOn", label: "works on" },
  { kind: "relation", id: "r:studies", label: "studies", aliases: ["surveys"] },
  { kind: "relation", id: "r:authorOf", label: "author of", aliases: ["wrote"] },
  { id: "lab:monje", label: "Monje Laboratory", aliases: ["Monje Lab"], types: ["t:Lab"], description: "A marine laboratory." },
  { id: "lab:orra", label: "Orra Laboratory", types: ["t:Lab"], description: "A laboratory for sediments." },
  { id: "proj:hostun", label: "Project Hostun", aliases: ["HOST"], types: ["t:Project"], relations: { "r:hostedBy": ["lab:monje"] } },
  { id: "proj:livel", label: "Project Livel", aliases: ["LIVE"], types: ["t:Project"], relations: { "r:hostedBy": ["lab:orra"] } },
  { id: "proj:fundel", label: "Project Fundel", types: ["t:Project"], relations: { "r:fundedBy": ["lab:orra"] } },
  { id: "town:droujux", label: "Droujux", types: ["t:Town"], description: "A harbour town." },
  { id: "town:held", label: "Held", types: ["t:Town"], description: "A hill town." },
  { id: "p:ada", label: "Ada Quell", types: ["t:Person"], relations: { "r:livesIn": ["town:droujux"], "r:worksOn": ["proj:hostun"] } },
  { id: "ev:meet", label: "Droujux Workshop", types: ["t:Event"], relations: { "r:heldIn": ["town:held"] } },
  { id: "site:reef", label: "Vellan Reef", types: ["t:Site"] },
  { id: "proj:vellan", label: "Vellan Survey", types: ["t:Project"], relations: { "r:studies": ["site:reef"] } },
  { id: "rep:vellan", label: "Vellan Survey", types: ["t:Report"] },
  { id: "p:ines", label: "Ines Tarrow", types: ["t:Person"], relations: { "r:authorOf": ["rep:vellan"] } },
];

let dir: string;
let cat: Catalog;
let linker: Linker;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tp-relwords-"));
  const file = join(dir, "catalog.jsonl");
  writeFileSync(file, LINES.map((l) => JSON.stringify(l)).join("\n") + "\n");
  cat = Catalog.open(join(dir, "c.db"), { create: true });
  loadFiles(cat, [file]);
  linker = Linker.fromCatalog(cat);
});
afterAll(() => {
  cat.close();
  rmSync(dir, { recursive: true, force: true });
});

const link = (q: string) => linkQuestion(q, linker);
const linked = (q: string) => link(q).mentions.map((m) => [m.text, m.entity.id]);

describe("a relation word beside a partly similar name", () => {
  it("is not linked to a code alias it matches only by stem or without its capitals", () => {
    // "hosted" → stem "host" = the code HOST of Project Hostun; "lives" → stem "live" = LIVE
    expect(linked("Which project is hosted by Monje Laboratory?")).toEqual([["Monje Laboratory", "lab:monje"]]);
    expect(linked("Who lives in Droujux?")).toEqual([["Droujux", "town:droujux"]]);
    // the near name is kept as a suggestion of an unlinked relation word
    const r = link("Who lives in Droujux?");
    expect(r.unlinked).toEqual([{ text: "lives", start: 4, end: 9, suggestions: [{ id: "proj:livel", label: "Project Livel" }], relationWord: true }]);
  });

  it("is not linked in a question typed without capitals, by stem or by a fuzzy part of a longer label", () => {
    expect(linked("which project is hosted by monje laboratory")).toEqual([["monje laboratory", "lab:monje"]]);
    // "funded" is one edit from "fundel", one token of "Project Fundel" (a fuzzy partial match)
    expect(linked("which project is funded by orra laboratory")).toEqual([["orra laboratory", "lab:orra"]]);
    expect(link("which project is funded by orra laboratory").unlinked.map((u) => [u.text, u.relationWord, u.suggestions[0]?.id])).toEqual([["funded", true, "proj:fundel"]]);
  });

  it("still links when it names the entity as written: a capitalised label, a code in capitals", () => {
    // the lower-case relation word "held" is not the town Held; the capitalised one is
    expect(linked("Which workshop was held in Held?")).toEqual([["Held", "town:held"]]);
    expect(linked("Who works on HOST?")).toEqual([["HOST", "proj:hostun"]]);
  });
});

describe("genuine names keep linking", () => {
  it("links a misspelling of a full label, single-word or multi-word", () => {
    const town = linked("Who lives in Droujx?");
    expect(town).toEqual([["Droujx", "town:droujux"]]);
    expect(linked("who lives in droujx")).toEqual([["droujx", "town:droujux"]]);
    expect(linked("Which project is hosted by Monje Laboratry?")).toEqual([["Monje Laboratry", "lab:monje"]]);
  });

  it("does not count a relation named by the mention's own words as evidence for a candidate", () => {
    // "Survey" is a form of the relation alias "surveys" only inside the name; "wrote" names
    // author of, and only the report has such an edge, so the report wins
    const m = link("Who wrote the Vellan Survey?").mentions;
    expect(m.map((x) => [x.text, x.entity.id])).toEqual([["Vellan Survey", "rep:vellan"]]);
    expect(m[0]!.alternatives.map((a) => a.id)).toEqual(["proj:vellan"]);
  });
});

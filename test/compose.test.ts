/**
 * compose on a small invented fleet catalog (loaded through the real JSONL importer, asked
 * back through the real Session) and on the demo catalog: the minimal distinguishing clue
 * sets, computed by hand from the fixture's facts below; the exclusion rules; the proof's
 * candidate counts against what `ask` finds for the same clues; the CLI's outputs.
 *
 *   Kestrel (alias RV Kestrel)  moored at Brackwell, built by Ferrand Yards, commissioned 1994, owned by Kestrel Trust
 *   Marrow                      moored at Brackwell, built by Hollis Vane, captain Ada Quell
 *   Quillon                     moored at Osterly,   built by Hollis Vane, commissioned 1994
 *   Tern                        moored at Osterly,   built by Ferrand Yards, commissioned 1994
 *
 * Facts of Kestrel (hand-derived extensions among the 4 vessels): moored at Brackwell {K, M},
 * built by Ferrand Yards {K, T}, commissioned 1994 {K, T, Q}; owned by Kestrel Trust {K} is
 * excluded (the clue entity's label contains "Kestrel"). Minimal distinguishing sets:
 * {Brackwell, Ferrand Yards} and {Brackwell, 1994}; {Ferrand Yards, 1994} leaves {K, T}.
 * Marrow: {Ada Quell} alone, and {Brackwell, Hollis Vane}. Quillon: {Osterly, Hollis Vane}
 * and {Hollis Vane, 1994}.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import { Composer, cheapestSets, candidateFacts, extensionOf, clauseOf, questionOf, type Fact } from "../src/compose/index.js";
import { Session } from "../src/pipeline/index.js";

const LINES = [
  { kind: "type", id: "t:Thing", label: "thing" },
  { kind: "type", id: "t:Vessel", label: "vessel", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Town", label: "town", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Yard", label: "shipyard", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Person", label: "person", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Trust", label: "trust", subClassOf: ["t:Thing"] },
  { kind: "relation", id: "r:mooredAt", label: "moored at" },
  { kind: "relation", id: "r:builtBy", label: "built by" },
  { kind: "relation", id: "r:captainOf", label: "captain of", aliases: ["captained by"] },
  { kind: "relation", id: "r:ownedBy", label: "owned by" },
  { kind: "attribute", id: "commissioned", label: "commissioned", unit: "year" },
  { id: "x:brackwell", label: "Brackwell", types: ["t:Town"], description: "A harbour town." },
  { id: "x:osterly", label: "Osterly", types: ["t:Town"], description: "A fishing port." },
  { id: "x:ferrand", label: "Ferrand Yards", types: ["t:Yard"], description: "A shipyard." },
  { id: "x:hollis", label: "Hollis Vane", types: ["t:Yard"], description: "A shipyard." },
  { id: "x:ada", label: "Ada Quell", types: ["t:Person"], description: "A master mariner.", relations: { "r:captainOf": ["x:marrow"] } },
  { id: "x:trust", label: "Kestrel Trust", types: ["t:Trust"], description: "A charity." },
  { id: "x:kestrel", label: "Kestrel", aliases: ["RV Kestrel"], types: ["t:Vessel"], description: "A survey vessel.", attributes: { commissioned: 1994 }, relations: { "r:mooredAt": ["x:brackwell"], "r:builtBy": ["x:ferrand"], "r:ownedBy": ["x:trust"] } },
  { id: "x:marrow", label: "Marrow", types: ["t:Vessel"], description: "A coastal vessel.", relations: { "r:mooredAt": ["x:brackwell"], "r:builtBy": ["x:hollis"] } },
  { id: "x:quillon", label: "Quillon", types: ["t:Vessel"], description: "A trawler.", attributes: { commissioned: 1994 }, relations: { "r:mooredAt": ["x:osterly"], "r:builtBy": ["x:hollis"] } },
  { id: "x:tern", label: "Tern", types: ["t:Vessel"], description: "A tender.", attributes: { commissioned: 1994 }, relations: { "r:mooredAt": ["x:osterly"], "r:builtBy": ["x:ferrand"] } },
];

const CLI = resolve(__dirname, "../dist/cli/main.js");
const dir = mkdtempSync(join(tmpdir(), "tiepoint-compose-"));
const db = join(dir, "fleet.db");
let session: Session;
let composer: Composer;

beforeAll(() => {
  const src = join(dir, "fleet.jsonl");
  writeFileSync(src, LINES.map((l) => JSON.stringify(l)).join("\n") + "\n");
  const cat = Catalog.open(db, { create: true });
  loadFiles(cat, [src]);
  cat.close();
  session = Session.open({ db });
  composer = new Composer(session);
});
afterAll(() => {
  session?.close();
  rmSync(dir, { recursive: true, force: true });
});

const num = (id: string) => session.catalog.numOf(id)!;
/** A fact's readable key: the named entity's id, or the attribute value. */
const nameOf = (f: Fact) => (f.kind === "attribute" ? f.value! : session.ref(f.entity!).id);

function minimalSets(id: string, opts: { chains?: boolean } = {}): string[][] {
  const t = num(id);
  const vessel = new Set([num("t:Vessel")]);
  const facts = candidateFacts(composer, t, composer.names(t), { chains: opts.chains ?? false });
  const space = {
    costs: facts.map((f) => f.cost),
    start: composer.typeCount(num("t:Vessel")),
    ext: (i: number) => extensionOf(composer, facts[i]!).filter((x) => session.index.isA(x, vessel)),
  };
  return cheapestSets(space)
    .map((s) => s.facts.map((i) => nameOf(facts[i]!)).sort())
    .sort((a, b) => (a.join() < b.join() ? -1 : 1));
}

describe("compose on the fleet catalog", () => {
  it("finds exactly the hand-computed minimal distinguishing sets", () => {
    expect(composer.typeCount(num("t:Vessel"))).toBe(4);
    expect(minimalSets("x:kestrel")).toEqual([
      ["1994", "x:brackwell"],
      ["x:brackwell", "x:ferrand"],
    ]);
    expect(minimalSets("x:marrow")).toEqual([["x:ada"], ["x:brackwell", "x:hollis"]]);
    expect(minimalSets("x:quillon")).toEqual([
      ["1994", "x:hollis"],
      ["x:hollis", "x:osterly"],
    ]);
  });

  it("never names the target, an entity whose label contains its label, or an avoided entity or relation", async () => {
    const k = num("x:kestrel");
    const facts = candidateFacts(composer, k, composer.names(k));
    expect(composer.names(k).sort()).toEqual(["Kestrel", "RV Kestrel"]);
    expect(facts.some((f) => f.entity === num("x:trust"))).toBe(false);
    const c = await composer.compose(k, { count: 5 });
    expect(c.proposals.length).toBeGreaterThan(0);
    for (const p of c.proposals) expect(p.question.toLowerCase()).not.toContain("kestrel");
    const noBrackwell = await composer.compose(k, { avoid: ["Brackwell"] });
    expect(noBrackwell.proposals.every((p) => !p.question.includes("Brackwell"))).toBe(true);
    const noMooring = await composer.compose(k, { avoid: ["moored at"] });
    expect(noMooring.proposals.every((p) => !p.question.includes("moored"))).toBe(true);
    // without mooring nothing separates Kestrel from Tern (hand-derived): no proposal, a note says so
    expect(noMooring.proposals).toEqual([]);
    expect(noMooring.notes.join(" ")).toMatch(/no combination of at most 4 clues singles out Kestrel/);
    await expect(composer.compose(k, { avoid: ["Nowhere Such"] })).rejects.toThrow(/--avoid "Nowhere Such": no entity or relation/);
  });

  it("verifies a proposal only when asking it back gives the target first and unique; the proof shrinks to one", async () => {
    const c = await composer.compose(num("x:marrow"), { count: 2 });
    expect(c.proposals.length).toBeGreaterThan(0);
    for (const p of c.proposals) {
      const again = session.ask(p.question, { top: 3 }).result;
      expect(p.verified).toBe(again.verdict.status === "unique" && again.answers[0]?.id === "x:marrow");
      expect(p.candidates[0]).toBe(4);
      expect(p.candidates.at(-1)).toBe(1);
      for (let i = 1; i < p.candidates.length; i++) expect(p.candidates[i]!).toBeLessThan(p.candidates[i - 1]!);
    }
    expect(c.proposals[0]!.question).toBe("Which vessel whose captain is Ada Quell?");
  });

  it("proof counts equal the entities ask's reading matches for the same clues", async () => {
    const t = num("x:quillon");
    const facts = candidateFacts(composer, t, composer.names(t), { chains: false });
    const osterly = facts.find((f) => f.entity === num("x:osterly"))!;
    const hollis = facts.find((f) => f.entity === num("x:hollis"))!;
    // the same clauses compose uses; counts: Osterly {Quillon, Tern}, + Hollis Vane {Quillon} (hand-derived)
    const q1 = questionOf("vessel", [clauseOf(osterly, composer)]);
    const q2 = questionOf("vessel", [clauseOf(osterly, composer), clauseOf(hollis, composer)]);
    expect(q2).toBe("Which vessel is moored at Osterly and is built by Hollis Vane?");
    expect(session.ask(q1).result.reading?.matched).toBe(2);
    expect(session.ask(q2).result.reading?.matched).toBe(1);
    const c = await composer.compose(t, { count: 1 });
    expect(c.proposals[0]!.candidates[0]).toBe(4);
    expect(c.proposals[0]!.candidates.at(-1)).toBe(1);
  });
});

describe("compose on the demo catalog", () => {
  let demo: Session;
  let dc: Composer;
  beforeAll(() => {
    demo = Session.open();
    dc = new Composer(demo);
  });
  afterAll(() => demo?.close());

  it("proof counts of relation clues equal what ask's reading matches, clue by clue", async () => {
    let compared = 0;
    for (const id of ["ves:caddrow", "p:jessa-moll", "town:tolvane", "ins:deepeye"]) {
      const c = await dc.compose(demo.catalog.numOf(id)!, { count: 2 });
      for (const p of c.proposals.filter((x) => x.verified)) {
        const clues = p.clues.filter((k) => k.kind !== "type");
        if (clues.some((k) => k.kind !== "relation")) continue;
        // the question made of the first i clues, in the proposal's (spoken) order
        for (let i = 1; i <= clues.length; i++) {
          const q = questionOf(
            c.type!.label,
            clues.slice(0, i).map((k) => ({ text: k.text, subjectFirst: k.text.startsWith("that ") && !k.text.startsWith(`that ${k.entity!.label}`) })),
          );
          const matched = demo.ask(q).result.reading?.matched;
          if (typeof matched === "number" && matched > 0) {
            expect(matched, q).toBe(clues[i - 1]!.candidates);
            compared++;
          }
        }
      }
    }
    expect(compared).toBeGreaterThan(2);
  });
});

describe("compose on the command line", () => {
  it("prints the contract JSON; an ambiguous name lists the candidates and exits 1", () => {
    const out = JSON.parse(execFileSync("node", [CLI, "compose", "Marrow", "--db", db, "--json", "--count", "1"], { encoding: "utf8" }));
    expect(out.target).toEqual({ id: "x:marrow", label: "Marrow" });
    expect(out.proposals[0]).toMatchObject({ question: "Which vessel whose captain is Ada Quell?", verified: true, candidates: [4, 1], verdict: { status: "unique" } });
    expect(out.proposals[0].clues[1].steps).toEqual([{ from: "x:ada", relation: "r:captainOf", to: "x:marrow", inverse: false }]);
    const amb = spawnSync("node", [CLI, "compose", "MICA"], { encoding: "utf8" });
    expect(amb.status).toBe(1);
    expect(amb.stderr).toMatch(/"MICA" names 2 entities; give one of these ids:\n {2}ins:mica/);
    expect(amb.stdout).toBe("");
    const unknown = spawnSync("node", [CLI, "compose", "Zzyzx Qwert", "--db", db], { encoding: "utf8" });
    expect(unknown.status).toBe(1);
    expect(unknown.stderr.trim().split("\n")).toHaveLength(1);
  });

  it("turns a file of intended answers into a TSV that check reads, and names the bad line", () => {
    const answers = join(dir, "answers.txt");
    writeFileSync(answers, "# intended answers\nx:marrow\nQuillon\n");
    const tsv = execFileSync("node", [CLI, "compose", "--batch", answers, "--db", db, "--count", "1"], { encoding: "utf8" });
    const rows = tsv.split("\n").filter((l) => l !== "" && !l.startsWith("#"));
    expect(rows.map((r) => r.split("\t").slice(1))).toEqual([
      ["x:marrow", "unique"],
      ["x:quillon", "unique"],
    ]);
    expect(rows[0]).toBe("Which vessel whose captain is Ada Quell?\tx:marrow\tunique");
    const file = join(dir, "composed.tsv");
    writeFileSync(file, tsv);
    const check = JSON.parse(execFileSync("node", [CLI, "check", file, "--db", db, "--json"], { encoding: "utf8" }));
    expect(check.summary.hits1).toBe(1);
    writeFileSync(answers, "x:marrow\nNo Such Vessel\n");
    const bad = spawnSync("node", [CLI, "compose", "--batch", answers, "--db", db], { encoding: "utf8" });
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/answers\.txt:2: no entity with id or label "No Such Vessel"/);
    expect(bad.stdout).toBe("");
  });
});

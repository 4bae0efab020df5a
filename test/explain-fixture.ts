/**
 * A small invented harbour catalog for the explain tests, loaded through the real JSONL
 * importer into a temporary SQLite file. Three vessels, two towns, one sonar, two shipyards:
 *
 *   Kestrel  moored at Brackwell, carries Deep Echo, built by Ferrand Yards, commissioned 1994
 *   Marrow   moored at Brackwell, carries Deep Echo, built by Hollis & Vane, commissioned 2001
 *   Quillon  moored at Osterly,   carries Deep Echo, built by Hollis & Vane
 *
 * so "moored at Brackwell + carries Deep Echo" fits Kestrel and Marrow equally (a tie) and
 * "built by Ferrand Yards" singles out Kestrel.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../src/catalog/index.js";
import type { Analysis, Clue } from "../src/analysis/index.js";
import { RelationIndex } from "../src/ranking/index.js";

const LINES = [
  { kind: "type", id: "t:Thing", label: "thing" },
  { kind: "type", id: "t:Vessel", label: "vessel", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Town", label: "town", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Sonar", label: "sonar", subClassOf: ["t:Thing"] },
  { kind: "type", id: "t:Yard", label: "shipyard", subClassOf: ["t:Thing"] },
  { kind: "relation", id: "r:mooredAt", label: "moored at", aliases: ["berthed at"] },
  { kind: "relation", id: "r:carries", label: "carries", aliases: ["carried"] },
  { kind: "relation", id: "r:builtBy", label: "built by", aliases: ["built"] },
  { kind: "attribute", id: "commissioned", label: "commissioned", unit: "year" },
  { id: "x:brackwell", label: "Brackwell", types: ["t:Town"], description: "A harbour town." },
  { id: "x:osterly", label: "Osterly", types: ["t:Town"], description: "A fishing port." },
  { id: "x:deepecho", label: "Deep Echo", types: ["t:Sonar"], description: "A hull-mounted sonar." },
  { id: "x:ferrand", label: "Ferrand Yards", types: ["t:Yard"], description: "A shipyard." },
  { id: "x:hollis", label: "Hollis & Vane", types: ["t:Yard"], description: "A shipyard." },
  { id: "x:kestrel", label: "Kestrel", types: ["t:Vessel"], description: "A survey vessel.", attributes: { commissioned: 1994 }, relations: { "r:mooredAt": ["x:brackwell"], "r:carries": ["x:deepecho"], "r:builtBy": ["x:ferrand"] } },
  { id: "x:marrow", label: "Marrow", types: ["t:Vessel"], description: "A coastal vessel.", attributes: { commissioned: 2001 }, relations: { "r:mooredAt": ["x:brackwell"], "r:carries": ["x:deepecho"], "r:builtBy": ["x:hollis"] } },
  { id: "x:quillon", label: "Quillon", types: ["t:Vessel"], description: "A trawler.", relations: { "r:mooredAt": ["x:osterly"], "r:carries": ["x:deepecho"], "r:builtBy": ["x:hollis"] } },
];

/** Loads the fixture into a fresh temporary catalog file and builds its relation index. */
export function harbourCatalog(): { cat: Catalog; index: RelationIndex; path: string } {
  const dir = mkdtempSync(join(tmpdir(), "tiepoint-explain-"));
  const src = join(dir, "harbour.jsonl");
  writeFileSync(src, LINES.map((l) => JSON.stringify(l)).join("\n") + "\n");
  const path = join(dir, "harbour.db");
  const cat = Catalog.open(path, { create: true });
  loadFiles(cat, [src]);
  return { cat, index: RelationIndex.fromCatalog(cat), path };
}

/** An analysis with the given clue entities (ids), answer type and relation cues, as analysis would produce it. */
export function analysisOf(cat: Catalog, question: string, clueIds: readonly string[], typeId: string | null, cueIds: readonly string[] = []): Analysis {
  const clues: Clue[] = clueIds.map((id, i) => ({ node: cat.numOf(id)!, id, label: cat.ref(cat.numOf(id)!).label, weight: 1, mention: i }));
  const preds = cat.predicates();
  const analysis: Analysis = {
    question,
    mentions: [],
    answerTypes: typeId ? [{ id: typeId, label: cat.ref(cat.numOf(typeId)!).label, num: cat.numOf(typeId)! }] : [],
    answerTypeSource: typeId ? "head-noun" : "none",
    relationCues: cueIds.map((id) => {
      const p = preds.find((x) => x.id === id)!;
      return { relation: p.num, id, label: p.label, weight: 5, score: 1, words: [p.label] };
    }),
    clues,
    notes: [],
  };
  return analysis;
}

/**
 * The natural-question evaluation sets of issue 16 (test/fixtures/eval/*.tsv) are themselves
 * checked here — not tiepoint's scores on them (those are printed by `npm run eval:questions`).
 *
 * Sources: the world set's catalog is built from the `world-countries` npm package 5.1.0
 * (mledoze/countries, ODbL); the debian set's from the committed slice of the Debian 12
 * "bookworm" binary package index (test/fixtures/debian/README.md) by src/eval/debian-packages.ts;
 * gold answers are computed by an independent SPARQL 1.1 engine,
 * the `oxigraph` npm package 0.5.11, over the same N-Triples text that tiepoint's importer loads.
 *
 * Checked: every query parses and runs; a question whose note starts "none expected" has no
 * gold answer and every other one has at least one; a question starting "How many" has a count
 * gold and no other does; the set sizes and per-phenomenon counts; the committed split equals
 * the seeded shuffle of src/eval/question-set.ts and covers every question once; and the
 * catalog tiepoint loads holds exactly the relation edges the gold engine sees.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog } from "../src/catalog/index.js";
import { SETS, builtCatalog, questionsOf, readSplit, type BuiltCatalog } from "../src/eval/eval-sets.js";
import { PHENOMENA, goldOf, goldStore, splitIds, type EvalQuestion } from "../src/eval/question-set.js";

/** Smallest sizes asked of the sets (issue 16 "Must show": ≥ 250 questions over two datasets of different domains, ≥ 15 per phenomenon). */
const MIN_QUESTIONS = 250;
const MIN_PER_PHENOMENON = 15;

describe.each(SETS.map((s) => [s.name, s] as const))("evaluation set %s", (_name, spec) => {
  let dir: string;
  let built: BuiltCatalog;
  let questions: EvalQuestion[];

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), `tiepoint-eval-${spec.name}-`));
    built = builtCatalog(spec, dir);
    questions = questionsOf(spec);
  });

  afterAll(() => {
    rmSync(dir, { recursive: true, force: true });
  });

  it("every query runs in oxigraph and returns the kind of gold its question asks for", () => {
    const store = goldStore(built.triples);
    const problems: string[] = [];
    for (const q of questions) {
      const gold = goldOf(store, q, spec.prefixes);
      const wantsNone = q.note.startsWith("none expected");
      const wantsCount = /^how many\b/i.test(q.question);
      if (wantsCount !== (gold.kind === "count")) problems.push(`${q.id}: gold kind ${gold.kind}`);
      if (gold.kind === "entities" && wantsNone !== (gold.ids.length === 0)) problems.push(`${q.id}: ${gold.ids.length} gold answers`);
      if (gold.kind === "count" && gold.value <= 0) problems.push(`${q.id}: count ${gold.value}`);
    }
    expect(problems).toEqual([]);
  });

  it("the committed split is the seeded shuffle, and every question is in exactly one half", () => {
    const split = readSplit();
    const mine = split.sets[spec.name];
    expect(mine).toBeDefined();
    expect(splitIds(questions, split.seed)).toEqual({ dev: [...mine!.dev], holdout: [...mine!.holdout] });
    const halves = [...mine!.dev, ...mine!.holdout].sort();
    expect(halves).toEqual(questions.map((q) => q.id).sort());
  });

  it("tiepoint's catalog holds exactly the relation edges oxigraph sees in the same triples", () => {
    const store = goldStore(built.triples);
    const rows = [...(store.query(`SELECT (COUNT(*) AS ?n) WHERE { ?s ?p ?o FILTER(isIRI(?o) && ?p != <http://www.w3.org/1999/02/22-rdf-syntax-ns#type>) }`) as Iterable<Map<string, { value: string }>>)];
    const cat = Catalog.open(built.db, { readonly: true });
    try {
      expect(cat.counts().edges).toBe(Number(rows[0]!.get("n")!.value));
    } finally {
      cat.close();
    }
  });
});

describe("evaluation sets together", () => {
  it("at least 250 questions over both datasets, at least 15 per phenomenon of issue 16", () => {
    const all = SETS.flatMap((s) => questionsOf(s));
    expect(new Set(all.map((q) => q.set))).toEqual(new Set(["world", "debian", "world-b", "debian-b"]));
    expect(all.length).toBeGreaterThanOrEqual(MIN_QUESTIONS);
    const short = PHENOMENA.filter((p) => all.filter((q) => q.phenomena.includes(p.key)).length < MIN_PER_PHENOMENON).map((p) => p.key);
    expect(short).toEqual([]);
  });
});

describe("second sets (world-b, debian-b), written before tiepoint was run on them", () => {
  it("at least 70 questions each, every phenomenon of issue 16 at least 8 times across the two", () => {
    const b = SETS.filter((s) => s.name.endsWith("-b")).map((s) => questionsOf(s));
    expect(b.length).toBe(2);
    for (const qs of b) expect(qs.length).toBeGreaterThanOrEqual(70);
    const all = b.flat();
    const short = PHENOMENA.filter((p) => all.filter((q) => q.phenomena.includes(p.key)).length < 8).map((p) => p.key);
    expect(short).toEqual([]);
  });
});

/**
 * Cue chains (cue-chains.ts): attribution of relation words to clues, hop order, per-place
 * voice and the type nouns between hops, on a small in-memory catalog written through
 * CatalogWriter; link results are built by hand from the question text so the analysis is
 * tested alone. Expected chains are hand-derived from the rules in the file header.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Catalog } from "../catalog/index.js";
import { handLinks, writtenCatalog } from "../../test/helpers/hand-links.js";
import { analyze, buildQuestionModel, cueChains, findTypeWords, words, type QuestionModel } from "./index.js";

let cat: Catalog;
let model: QuestionModel;

beforeAll(() => {
  cat = writtenCatalog((w) => {
    for (const [id, label, alias] of [["t:Paper", "paper", "document"], ["t:Person", "person", "people"], ["t:Report", "field report", ""], ["t:Org", "organisation", ""]] as const) {
      w.label(id, label);
      if (alias) w.alias(id, alias);
    }
    w.predicateLabel("r:cites", "cites");
    w.predicateLabel("r:wrote", "wrote");
    w.predicateLabel("r:leads", "leads");
    w.predicateLabel("r:about", "about");
    w.predicateLabel("r:organisedBy", "organised by");
    for (const [id, label, t] of [["d:0", "Notes on Ice", "t:Paper"], ["p:a", "Ada Roe", "t:Person"], ["x:q", "Quay", "t:Paper"], ["d:1", "Tide Log", "t:Report"], ["o:1", "Rime Society", "t:Org"]] as const) {
      w.label(id, label);
      w.type(id, t);
    }
  });
  model = buildQuestionModel(cat);
});
afterAll(() => cat.close());

const linkOf = (question: string, labels: readonly string[]) => handLinks(cat, question, labels);

const relId = (n: number) => model.relations.find((r) => r.num === n)!.id;

describe("cueChains", () => {
  it("gives each place of a repeated relation word its own voice", () => {
    const q = "Which paper cites a paper that is cited by Notes on Ice?";
    const a = analyze(q, linkOf(q, ["Notes on Ice"]), model);
    const cue = a.relationCues.find((c) => c.id === "r:cites")!;
    // "cites" (active, like the label) then "cited by" (passive): no flip, then a flip
    expect(cue.occurrences!.map((o) => o.flip)).toEqual([false, true]);
    const [chain] = cueChains(a);
    // nearest first: "cited by" (the clue is its passive agent, so the stored subject: along), then "cites" (against)
    expect(chain!.steps.map((s) => s.options.map((o) => [relId(o.relation), o.inverse]))).toEqual([[["r:cites", false]], [["r:cites", true]]]);
    expect(chain!.steps[0]!.types).toEqual([cat.numOf("t:Paper")]);
  });

  it("does not attach a relation word across a coordination", () => {
    const q = "Which person wrote Notes on Ice and leads Quay?";
    const a = analyze(q, linkOf(q, ["Notes on Ice", "Quay"]), model);
    const chains = cueChains(a);
    expect(chains.map((ch) => ch.steps.map((s) => relId(s.options[0]!.relation)))).toEqual([["r:wrote"], ["r:leads"]]);
    expect(chains.every((ch) => ch.conjuncts === undefined)).toBe(true);
  });

  it("gives a relation word its object clue when only function words stand between", () => {
    // "cites" is 1 character from "Quay" on its left, but "Notes on Ice" is its object
    const q = "Which paper about Quay cites Notes on Ice?";
    const chains = cueChains(analyze(q, linkOf(q, ["Quay", "Notes on Ice"]), model));
    expect(chains.map((ch) => ch.steps.map((s) => relId(s.options[0]!.relation)))).toEqual([["r:about"], ["r:cites"]]);
  });

  it("gives coordinated clues one shared pattern, directed from the group (rule 5)", () => {
    const q = "Which person wrote a paper that cites both Notes on Ice and the Quay?";
    const a = analyze(q, linkOf(q, ["Notes on Ice", "Quay"]), model);
    const chains = cueChains(a);
    // "cites" is nearest to the first conjunct only; the second takes it through the group
    const shape = (ch: (typeof chains)[number]) => ch.steps.map((s) => [relId(s.options[0]!.relation), s.options[0]!.inverse]);
    expect(shape(chains[0]!)).toEqual([["r:cites", true], ["r:wrote", true]]);
    expect(shape(chains[1]!)).toEqual(shape(chains[0]!));
    expect(chains.map((ch) => ch.conjuncts)).toEqual([[0, 1], [0, 1]]);
    // the type noun between the two relation words ("a paper") types the middle node for both
    expect(chains[1]!.steps[0]!.types).toEqual([cat.numOf("t:Paper")]);
  });

  it("keeps clues apart when a relation word stands between them, even with a conjunction", () => {
    const q = "Which paper cites Notes on Ice or cites Quay?";
    const chains = cueChains(analyze(q, linkOf(q, ["Notes on Ice", "Quay"]), model));
    expect(chains.map((ch) => ch.conjuncts)).toEqual([undefined, undefined]);
  });
});

describe("analyze: relation words among function words and type nouns", () => {
  it("matches a relation labelled by a function word, and not a type noun used as a noun", () => {
    const q = "Which paper is about an organisation that Ada Roe leads?";
    const a = analyze(q, linkOf(q, ["Ada Roe"]), model);
    const ids = a.relationCues.map((c) => c.id);
    expect(ids).toContain("r:about"); // the label "about" is a function word only
    expect(ids).toContain("r:leads");
    expect(ids).not.toContain("r:organisedBy"); // "an organisation" names the node in between
    const [chain] = cueChains(a);
    expect(chain!.steps.map((s) => relId(s.options[0]!.relation))).toEqual(["r:leads", "r:about"]);
    expect(chain!.steps[0]!.types).toEqual([cat.numOf("t:Org")]);
  });
});

describe("findTypeWords", () => {
  it("finds the longest type n-gram and skips blocked words", () => {
    const ws = words("a field report and a document by Ada");
    const found = findTypeWords(ws, ws.map((w) => w.text === "Ada"), model);
    expect(found.map((t) => [t.start, t.end])).toEqual([
      [2, 14], // "field report" (two words, one type)
      [21, 29], // "document"
    ]);
  });
});

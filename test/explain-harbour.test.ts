/**
 * explain() on the invented harbour catalog (test/explain-fixture.ts), through the real
 * importer, relation index and rank(): paths valid against the catalog, the verdict, the
 * coverage table, ablation, why-not and suggested clues. Expected outcomes are hand-derived
 * from the fixture's facts (listed in the fixture header).
 */
import { afterAll, describe, expect, it } from "vitest";
import { explain } from "../src/explain/index.js";
import { rank } from "../src/ranking/index.js";
import type { Analysis } from "../src/analysis/index.js";
import { analysisOf, harbourCatalog } from "./explain-fixture.js";

const { cat, index } = harbourCatalog();
afterAll(() => cat.close());

const rerank = (a: Analysis, drop: readonly number[]) => rank(a, index, { dropClues: drop });
function run(question: string, clues: string[], cues: string[] = [], whyNot: string[] = []) {
  const analysis = analysisOf(cat, question, clues, "t:Vessel", cues);
  const ranked = rank(analysis, index);
  return { analysis, ranked, ex: explain(analysis, ranked, index, cat, { rerank, whyNot: whyNot.map((id) => cat.numOf(id)!) }) };
}

describe("explain on the harbour fixture", () => {
  it("every path joins up, starts at its clue, ends at its answer and uses stored edges in the stated direction", () => {
    const { ex } = run("Which vessel is moored at Brackwell and carries Deep Echo?", ["x:brackwell", "x:deepecho"], ["r:mooredAt", "r:carries"]);
    expect(ex.answers.length).toBeGreaterThan(0);
    for (const a of ex.answers) {
      for (const p of a.paths) {
        expect(p.steps.length).toBeGreaterThan(0);
        expect(p.steps[0]!.from).toBe(p.from);
        expect(p.steps[p.steps.length - 1]!.to).toBe(a.id);
        p.steps.forEach((s, i) => {
          if (i > 0) expect(s.from).toBe(p.steps[i - 1]!.to);
          expect(s.inverse ? cat.hasEdge(s.to, s.relation, s.from) : cat.hasEdge(s.from, s.relation, s.to)).toBe(true);
        });
      }
    }
  });

  it("reports a tie between the two vessels moored at Brackwell that carry Deep Echo (hand-derived)", () => {
    const { ex } = run("Which vessel is moored at Brackwell and carries Deep Echo?", ["x:brackwell", "x:deepecho"], ["r:mooredAt", "r:carries"]);
    const top = ex.answers[0]!.id;
    expect(["x:kestrel", "x:marrow"]).toContain(top);
    expect(ex.verdict.status).toBe("tied");
    expect(ex.verdict.tiedWith).toEqual([top === "x:kestrel" ? "x:marrow" : "x:kestrel"]);
    // the best paths are one hop each: vessel —moored at→ Brackwell walked backwards
    const best = ex.answers[0]!.paths.find((p) => p.from === "x:brackwell")!;
    expect(best.steps).toEqual([{ from: "x:brackwell", relation: "r:mooredAt", to: top, inverse: true }]);
    // coverage: both clues reach the top answer in one hop
    expect(ex.coverage.rows[0]!.cells.map((c) => c.hops)).toEqual([1, 1]);
    // a suggestion that rules out the rival, with its triple
    expect(ex.suggestions.length).toBeGreaterThan(0);
    const s = ex.suggestions[0]!;
    expect(s.rulesOut.length).toBe(1);
    expect(s.kind).toBe("relation");
    expect(s.triple.literal ? true : cat.hasEdge(s.triple.subject, s.triple.predicate, s.triple.object)).toBe(true);
    expect(s.question).toMatch(/\?$/);
  });

  it("adding the distinguishing clue makes Kestrel unique (built by Ferrand Yards, hand-derived)", () => {
    const { ex } = run("Which vessel is moored at Brackwell, carries Deep Echo and was built by Ferrand Yards?", ["x:brackwell", "x:deepecho", "x:ferrand"], ["r:mooredAt", "r:carries", "r:builtBy"]);
    expect(ex.answers[0]!.id).toBe("x:kestrel");
    expect(ex.verdict.status).toBe("unique");
    expect(ex.verdict.tiedWith).toEqual([]);
    // ablation: without Ferrand Yards the answer is no longer unique; Deep Echo (carried by all three) is redundant
    const byClue = Object.fromEntries(ex.ablation.map((a) => [a.clue.id, a]));
    expect(["narrowing", "necessary"]).toContain(byClue["x:ferrand"]!.role);
    expect(byClue["x:deepecho"]!.role).toBe("redundant");
  });

  it("why-not: Quillon is not moored at Brackwell, so that clue reaches it only through a longer path", () => {
    const { ex } = run("Which vessel is moored at Brackwell and built by Ferrand Yards?", ["x:brackwell", "x:ferrand"], ["r:mooredAt", "r:builtBy"], ["x:quillon", "x:osterly"]);
    const q = ex.whyNot[0]!;
    expect(q.entity.id).toBe("x:quillon");
    expect(q.rank).not.toBe(1);
    const brack = q.perClue.find((c) => c.clue.id === "x:brackwell")!;
    expect(brack.weak).toBe(true);
    // Osterly is a town: the question asks for a vessel
    const o = ex.whyNot[1]!;
    expect(o.excludedByType).toBe(true);
    expect(o.reasons.join(" ")).toMatch(/type filter excluded it/);
  });

  it("a single clue that reaches nothing of the expected type gives none", () => {
    const analysis = analysisOf(cat, "Which vessel?", [], "t:Vessel");
    const ranked = rank(analysis, index);
    const ex = explain(analysis, ranked, index, cat, {});
    expect(ex.verdict.status).toBe("none");
    expect(ex.answers).toEqual([]);
  });

  it("rejects a bad top", () => {
    const analysis = analysisOf(cat, "Which vessel?", ["x:osterly"], "t:Vessel");
    expect(() => explain(analysis, rank(analysis, index), index, cat, { top: 0 })).toThrow(/top must be a positive integer/);
  });
});

/**
 * The text renderers of explanations (src/present/explain-text.ts) on a real explanation of
 * the invented harbour catalog: chains read `A —relation→ B ←relation— C` with labels.
 */
import { afterAll, describe, expect, it } from "vitest";
import { explain } from "../src/explain/index.js";
import { rank } from "../src/ranking/index.js";
import { pathChain, renderCoverageText, renderExplanationText } from "../src/present/index.js";
import { analysisOf, harbourCatalog } from "./explain-fixture.js";

const { cat, index } = harbourCatalog();
afterAll(() => cat.close());

describe("explanation text", () => {
  const analysis = analysisOf(cat, "Which vessel is moored at Brackwell and carries Deep Echo?", ["x:brackwell", "x:deepecho"], "t:Vessel", ["r:mooredAt", "r:carries"]);
  const ranked = rank(analysis, index);
  const ex = explain(analysis, ranked, index, cat, { rerank: (a, d) => rank(a, index, { dropClues: d }), whyNot: [cat.numOf("x:quillon")!] });
  const top = ex.answers[0]!;

  it("renders a path against the stored direction with ← and the relation label", () => {
    const p = top.paths.find((x) => x.from === "x:brackwell")!;
    expect(pathChain(p, ex.labels)).toBe(`Brackwell ←moored at— ${top.label}`);
    expect(pathChain(p, ex.labels, true)).toBe(`Brackwell <-[moored at]- ${top.label}`);
  });

  it("renders a forward step with → (hand-built path over stored edges)", () => {
    const chain = pathChain(
      { from: "x:kestrel", steps: [{ from: "x:kestrel", relation: "r:builtBy", to: "x:ferrand", inverse: false }] },
      { "x:kestrel": "Kestrel", "r:builtBy": "built by", "x:ferrand": "Ferrand Yards" },
    );
    expect(chain).toBe("Kestrel —built by→ Ferrand Yards");
  });

  it("renders the coverage table with one column per clue", () => {
    const t = renderCoverageText(ex.coverage);
    const lines = t.trimEnd().split("\n");
    expect(lines[0]).toMatch(/^answer\s+Brackwell\s+Deep Echo$/);
    expect(lines[2]).toContain("1 hop: ←moored at");
  });

  it("prints every section: paths, coverage, ablation, suggestions, why-not", () => {
    const text = renderExplanationText(ex);
    for (const h of ["why (paths from the clues):", "clue coverage:", "clue ablation:", "to single out the best answer, add a clue:", "why not Quillon [x:quillon]?"]) {
      expect(text).toContain(h);
    }
  });
});

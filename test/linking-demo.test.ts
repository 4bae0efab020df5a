/**
 * Mention links on the demo questions against a hand-written gold file
 * (test/fixtures/demo-mentions.tsv). A predicted mention is correct when its entity equals a
 * gold mention's entity and the spans overlap (the "weak annotation match" of M. Cornolti,
 * P. Ferragina and M. Ciaramita, "A framework for benchmarking entity-annotation systems",
 * WWW 2013); precision, recall and F1 are micro-averaged over all questions.
 */
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, demoCatalogPath } from "../src/catalog/index.js";
import { Linker, linkQuestion } from "../src/linking/index.js";

interface Gold {
  line: number;
  text: string;
  entity: string;
}

const questions = readFileSync(new URL("../data/demo-questions.tsv", import.meta.url), "utf8")
  .split("\n")
  .map((l) => l.split("\t")[0]!);
const goldText = readFileSync(new URL("./fixtures/demo-mentions.tsv", import.meta.url), "utf8");
/** The question lines the gold file covers (questions added later are not judged until labelled). */
const covered = Number(/^# lines: 1-(\d+)$/m.exec(goldText)![1]);
const gold: Gold[] = goldText
  .split("\n")
  .filter((l) => l !== "" && !l.startsWith("#"))
  .map((l) => {
    const [line, text, entity] = l.split("\t");
    return { line: Number(line), text: text!, entity: entity! };
  });

let cat: Catalog;
let linker: Linker;
beforeAll(() => {
  cat = Catalog.open(demoCatalogPath(), { readonly: true });
  linker = Linker.fromCatalog(cat);
});
afterAll(() => cat.close());

describe("linking on the demo questions", () => {
  it("the gold file names real questions and spans", () => {
    for (const g of gold) expect(questions[g.line - 1], `line ${g.line}`).toContain(g.text);
  });

  it("links every gold mention (micro P/R/F1 with overlapping spans)", () => {
    let tp = 0;
    let predicted = 0;
    let exactSpans = 0;
    const missed: string[] = [];
    const wrong: string[] = [];
    expect(covered).toBeGreaterThanOrEqual(57);
    for (let i = 0; i < Math.min(covered, questions.length); i++) {
      const q = questions[i]!;
      if (q === "") continue;
      const mine = gold.filter((g) => g.line === i + 1).map((g) => ({ ...g, start: q.indexOf(g.text), end: q.indexOf(g.text) + g.text.length }));
      const r = linkQuestion(q, linker);
      predicted += r.mentions.length;
      for (const m of r.mentions) {
        expect(q.slice(m.start, m.end)).toBe(m.text);
        const g = mine.find((x) => x.entity === m.entity.id && x.start < m.end && m.start < x.end);
        if (g) {
          tp++;
          if (g.start === m.start && g.end === m.end) exactSpans++;
        } else wrong.push(`${i + 1}: [${m.text}] → ${m.entity.id}`);
      }
      for (const g of mine) if (!r.mentions.some((m) => m.entity.id === g.entity && g.start < m.end && m.start < g.end)) missed.push(`${i + 1}: ${g.text} (${g.entity})`);
    }
    const precision = tp / predicted;
    const recall = tp / gold.length;
    const f1 = (2 * precision * recall) / (precision + recall);
    process.stderr.write(
      `demo mention links (questions 1-${covered}): gold ${gold.length}, predicted ${predicted}, correct ${tp} (exact spans ${exactSpans}); ` +
        `P ${precision.toFixed(3)} R ${recall.toFixed(3)} F1 ${f1.toFixed(3)}\n` +
        (wrong.length ? `  extra/wrong: ${wrong.join("; ")}\n` : "") +
        (missed.length ? `  missed: ${missed.join("; ")}\n` : ""),
    );
    expect(missed).toEqual([]);
    expect(wrong).toEqual([]);
  });
});

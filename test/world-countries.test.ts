/**
 * Open-dataset property test of the whole pipeline (linking → analysis → ranking → verdict).
 *
 * Source: the `world-countries` npm package 5.1.0 (mledoze/countries, ODbL), fields
 * `cca3`, `name.common`, `name.official`, `borders` (land borders as cca3 codes), `region`
 * and `subregion`. The catalog is generated as JSONL in the project's documented layout and
 * loaded through the real `loadFiles` into a real SQLite file; the relation index, linker
 * and question model are the real ones (Session.open).
 *
 * Property: for 200 country pairs (A, B) with at least one common land neighbour, the
 * question "Which country borders both A and B?" (common names) must put exactly the set
 * N(A) ∩ N(B), computed directly from the dataset, at the top — and, when the set has
 * several members, return them as a tie (verdict `tied`, the others in `tiedWith`).
 * Subregion membership edges (and "located in" cues absent from the question) make other
 * countries two hops away through a region, so the relation cue and the clue combination
 * have to do the work.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { loadJsonlCatalog } from "./helpers/catalog-files.js";
import { catalogLines, choose, commonNeighbourPairs, countries } from "./helpers/world-countries-catalog.js";

const byCode = new Map(countries.map((c) => [c.cca3, c]));

describe("world-countries: which country borders both A and B", () => {
  let dir: string;
  let session: Session;

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), "tiepoint-wc-"));
    session = Session.open({ db: loadJsonlCatalog(dir, "countries", catalogLines()) });
  });

  afterAll(() => {
    session?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it("the dataset has enough pairs with a common neighbour (world-countries 5.1.0: 1014, counted here)", () => {
    expect(byCode.size).toBe(countries.length);
    expect(commonNeighbourPairs().length).toBeGreaterThanOrEqual(200);
  });

  it("puts exactly the common neighbours at the top, as a tie when several (200 pairs)", () => {
    const failures: string[] = [];
    const pairs = choose(commonNeighbourPairs(), 200);
    for (const { a, b, common } of pairs) {
      const q = `Which country borders both ${a.name.common} and ${b.name.common}?`;
      const r = session.ask(q, { top: 10 }).result;
      const top = r.answers.slice(0, common.length).map((x) => x.id).sort();
      const problems: string[] = [];
      if (JSON.stringify(top) !== JSON.stringify(common)) problems.push(`top ${top.join(",")} != expected ${common.join(",")}`);
      if (common.length > 1) {
        const group = [r.answers[0]?.id, ...r.verdict.tiedWith].sort();
        if (r.verdict.status !== "tied" || JSON.stringify(group) !== JSON.stringify(common)) problems.push(`verdict ${r.verdict.status} tied with [${r.verdict.tiedWith.join(",")}]`);
      } else if (r.verdict.status === "tied") problems.push(`single answer reported as tied with [${r.verdict.tiedWith.join(",")}]`);
      if (problems.length > 0) failures.push(`${q} -> ${problems.join("; ")}; linked ${r.mentions.map((m) => `${m.text}=${m.entity.id}`).join(" ")}`);
    }
    expect(failures).toEqual([]);
  });
});

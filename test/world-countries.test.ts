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
 *
 * Second property, two hops with coordinated clues: for 100 pairs (A, B) whose only common
 * land neighbour X has a capital in the dataset, "What is the capital of the country that
 * borders both A and B?" must put exactly X's capitals (`capital`) at the top — not the
 * capital of A or B, which is one hop from a clue but not on the pattern borders → capital
 * from both. Required: at least 95 of the 100 (measured 98 on 2 December 2026; the two
 * misses, Mongolia & Russia and India & Nepal → China, put a clue's own capital first: China's
 * 16 land borders dilute the hub-damped walk into its capital more than the off-pattern
 * factor `chainMiss` = 0.05 takes from the clue's capital — a known limit, not tuned away).
 *
 * Third property, three clues: for 60 triples (A, B, C) where some country borders two of
 * them but none borders all three (computed from the dataset), "Which country borders A, B
 * and C?" must get the verdict `weak` (no answer fits every clue); for 60 triples with
 * exactly one common neighbour, that neighbour must come first and the verdict must not be
 * `weak`. (Measured once over all 2,402 single-neighbour triples and 3,000 of the 149,757
 * no-neighbour ones, 2 December 2026: no failure. Before a coordinated clue whose pattern
 * reaches only other clues counted as not supporting, 259 of all 152,159 failed.)
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { loadJsonlCatalog } from "./helpers/catalog-files.js";
import { capitalId, capitalsOf, catalogLines, choose, commonNeighbourPairs, countries, type Country } from "./helpers/world-countries-catalog.js";

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

  it("answers the capital of the common neighbour, two hops from both clues (100 pairs)", () => {
    const failures: string[] = [];
    const single = commonNeighbourPairs().filter((p) => p.common.length === 1 && capitalsOf(byCode.get(p.common[0]!.slice(2))!).length > 0);
    expect(single.length).toBeGreaterThanOrEqual(100);
    for (const { a, b, common } of choose(single, 100, 7)) {
      const x = byCode.get(common[0]!.slice(2))!;
      const expected = capitalsOf(x).map((_, i) => capitalId(x, i)).sort();
      const q = `What is the capital of the country that borders both ${a.name.common} and ${b.name.common}?`;
      const r = session.ask(q, { top: 10 }).result;
      const top = r.answers.slice(0, expected.length).map((y) => y.id).sort();
      if (JSON.stringify(top) !== JSON.stringify(expected)) failures.push(`${q} -> top ${top.join(",")} != expected ${expected.join(",")} (${x.name.common}); linked ${r.mentions.map((m) => `${m.text}=${m.entity.id}`).join(" ")}`);
    }
    // (printed when the floor is not met: the failing questions)
    expect(failures.length <= 5 ? [] : failures).toEqual([]);
  });

  it("says weak when no country borders all three, and finds the one that does (60 + 60 triples)", () => {
    // enumerated around each country X: pairs and triples of X's neighbours
    const nb = new Map(countries.map((c) => [c.cca3, new Set(c.borders)]));
    const common = (t: readonly string[]) => [...nb.get(t[0]!)!].filter((x) => !t.includes(x) && t.every((y) => nb.get(y)!.has(x)));
    const noneKeys = new Set<string>();
    const oneKeys = new Map<string, string>();
    const bordered = countries.filter((c) => c.borders.length > 0).map((c) => c.cca3);
    for (const x of countries) {
      const ns = [...x.borders].sort();
      for (let i = 0; i < ns.length; i++) {
        for (let j = i + 1; j < ns.length; j++) {
          for (let k = j + 1; k < ns.length; k++) {
            const t = [ns[i]!, ns[j]!, ns[k]!];
            const cm = common(t);
            if (cm.length === 1) oneKeys.set(t.join(" "), `c:${cm[0]!}`);
          }
          // a third country X does not border, and that no country borders together with the pair
          for (const c of bordered) {
            if (c === x.cca3 || nb.get(x.cca3)!.has(c) || c === ns[i] || c === ns[j]) continue;
            const t = [ns[i]!, ns[j]!, c].sort();
            if (common(t).length === 0) noneKeys.add(t.join(" "));
          }
        }
      }
    }
    const none = [...noneKeys].sort().map((k) => k.split(" ").map((code) => byCode.get(code)!) as [Country, Country, Country]);
    const one = [...oneKeys.entries()].sort().map(([k, x]) => [...k.split(" ").map((code) => byCode.get(code)!), x] as [Country, Country, Country, string]);
    expect(none.length).toBeGreaterThanOrEqual(60);
    expect(one.length).toBeGreaterThanOrEqual(60);
    const failures: string[] = [];
    for (const [a, b, c] of choose(none, 60, 11)) {
      const q = `Which country borders ${a.name.common}, ${b.name.common} and ${c.name.common}?`;
      const r = session.ask(q, { top: 10 }).result;
      if (r.verdict.status !== "weak") failures.push(`${q} -> ${r.verdict.status}: ${r.verdict.reason ?? ""}`);
    }
    for (const [a, b, c, x] of choose(one, 60, 13)) {
      const q = `Which country borders ${a.name.common}, ${b.name.common} and ${c.name.common}?`;
      const r = session.ask(q, { top: 10 }).result;
      if (r.answers[0]?.id !== x || r.verdict.status === "weak") failures.push(`${q} -> ${r.answers[0]?.id ?? "nothing"} (${r.verdict.status}), expected ${x}`);
    }
    expect(failures).toEqual([]);
  });
});

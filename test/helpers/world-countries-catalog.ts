/**
 * A catalog generated from the `world-countries` npm package 5.1.0 (mledoze/countries, ODbL):
 * countries (cca3 ids, common name as label, official name as alias), land borders
 * (`borders`, cca3 codes) as `r:borders` edges, subregions as `r:locatedIn` edges and capitals
 * (`capital`, names) as city entities with `r:capital` edges, written as JSONL in the project's
 * documented layout. Used by test/world-countries.test.ts.
 */
import { createRequire } from "node:module";

/** The fields of one world-countries record used here. */
export interface Country {
  readonly cca3: string;
  readonly name: { readonly common: string; readonly official: string };
  readonly borders: readonly string[];
  readonly region: string;
  readonly subregion: string;
  readonly capital?: readonly string[];
}

const require = createRequire(import.meta.url);
/** All records, by cca3. */
export const countries: readonly Country[] = (require("world-countries") as Country[]).slice().sort((a, b) => (a.cca3 < b.cca3 ? -1 : 1));

/** The catalog as JSONL lines. */
export function catalogLines(): string[] {
  const lines: object[] = [
    { kind: "type", id: "t:Country", label: "country", aliases: ["nation"] },
    { kind: "type", id: "t:Region", label: "region", aliases: ["subregion"] },
    { kind: "type", id: "t:City", label: "city", aliases: ["town"] },
    { kind: "relation", id: "r:borders", label: "borders", aliases: ["shares a border with", "neighbour of", "adjacent to"] },
    { kind: "relation", id: "r:locatedIn", label: "located in", aliases: ["part of", "lies in"] },
    { kind: "relation", id: "r:capital", label: "capital", aliases: ["capital city", "seat of government"] },
  ];
  const regions = new Set<string>();
  for (const c of countries) if (c.subregion) regions.add(c.subregion);
  for (const r of [...regions].sort()) lines.push({ id: `g:${r}`, label: r, types: ["t:Region"] });
  for (const c of countries) {
    lines.push({
      id: `c:${c.cca3}`,
      label: c.name.common,
      aliases: c.name.official !== c.name.common ? [c.name.official] : [],
      types: ["t:Country"],
      attributes: { "iso code": c.cca3 },
    });
    capitalsOf(c).forEach((name, i) => lines.push({ id: capitalId(c, i), label: name, types: ["t:City"] }));
  }
  for (const c of countries) {
    // each land border is listed by both countries in the dataset; both statements are kept
    for (const b of c.borders) lines.push({ kind: "edge", subject: `c:${c.cca3}`, relation: "r:borders", object: `c:${b}` });
    if (c.subregion) lines.push({ kind: "edge", subject: `c:${c.cca3}`, relation: "r:locatedIn", object: `g:${c.subregion}` });
    capitalsOf(c).forEach((_, i) => lines.push({ kind: "edge", subject: `c:${c.cca3}`, relation: "r:capital", object: capitalId(c, i) }));
  }
  return lines.map((l) => JSON.stringify(l));
}

/** The dataset's capitals of a country (none for a few territories, three for South Africa). */
export function capitalsOf(c: Country): readonly string[] {
  return (c.capital ?? []).filter((x) => x.trim() !== "");
}

/** The catalog id of a country's i-th capital. */
export function capitalId(c: Country, i: number): string {
  return `city:${c.cca3}:${String(i)}`;
}

/**
 * Deterministic choice of `n` items: a Fisher–Yates shuffle driven by the Lehmer generator
 * x ← 48271·x mod (2³¹ − 1) (Park & Miller 1988, multiplier as revised by Park, Miller &
 * Stockmeyer 1993).
 */
export function choose<T>(items: readonly T[], n: number, seed = 20261202): T[] {
  const a = items.slice();
  let s = seed;
  for (let i = a.length - 1; i > 0; i--) {
    s = (s * 48271) % 2147483647;
    const j = s % (i + 1);
    [a[i], a[j]] = [a[j]!, a[i]!];
  }
  return a.slice(0, n);
}

/** Every pair (A, B), A before B by cca3, with its common land neighbours (ids, sorted). */
export function commonNeighbourPairs(): { a: Country; b: Country; common: string[] }[] {
  const out: { a: Country; b: Country; common: string[] }[] = [];
  for (let i = 0; i < countries.length; i++) {
    const na = new Set(countries[i]!.borders);
    for (let j = i + 1; j < countries.length; j++) {
      const common = countries[j]!.borders.filter((x) => na.has(x));
      if (common.length > 0) out.push({ a: countries[i]!, b: countries[j]!, common: common.map((x) => `c:${x}`).sort() });
    }
  }
  return out;
}


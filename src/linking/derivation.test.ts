import { describe, expect, it } from "vitest";
import { derivedTokens, labelRoot, wordRoots } from "./derivation.js";

// an invented, sorted vocabulary of name words
const vocab = ["brask", "braskmoor", "kessia", "nigora", "nigoria", "ostrelia", "ostrelium", "quenland", "tarn", "velmay"].sort();
const bases = (w: string) => derivedTokens(w, vocab).map((d) => [vocab[d.token], d.suffix, Math.round(d.similarity * 100) / 100]);

describe("derived forms", () => {
  it("reduces label words to roots: final vowels, then a -land base", () => {
    // the rules of the header of derivation.ts (Quirk et al. 1985, App. I)
    expect(labelRoot("velmay")).toBe("velm");
    expect(labelRoot("ostrelia")).toBe("ostrel");
    expect(labelRoot("quenland")).toBe("quen");
    expect(labelRoot("brask")).toBe("brask");
  });

  it("strips one derivational suffix (and a plural -s) from the word", () => {
    expect(wordRoots("braskians").map((r) => r.root)).toContain("brask");
    expect(wordRoots("ostrelese").map((r) => `${r.root}+${r.suffix}`)).toContain("ostrel+ese");
  });

  it("finds the name a derived word comes from, closer bases first, never a longer unrelated word", () => {
    // similarity 0.9 − 0.02·d, d = letters outside the common prefix ("velm" + egian / ay: 5 + 2)
    expect(bases("velmegian")).toEqual([["velmay", "ian", 0.76]]);
    expect(bases("braskian")).toEqual([["brask", "ian", 0.84]]);
    expect(bases("quennish")).toEqual([["quenland", "ish", 0.74]]);
    // -(i)an on a base ending in -a: the longer base shares more letters (d = 1 against 3)
    expect(bases("nigorian").map((b) => b[0])).toEqual(["nigoria", "nigora"]);
    // "ostrelium" passes the root test (ostreli-an ~ ostreli-um, 2 letters left over) but ranks
    // below the base the word extends by one letter
    expect(bases("ostrelian")).toEqual([["ostrelia", "ian", 0.88], ["ostrelium", "an", 0.82]]);
    // a longer unrelated word is never a base: "braskmoor" keeps 4 letters beyond "brask"
    expect(bases("braskian").map((b) => b[0])).not.toContain("braskmoor");
    // zero derivation only onto a clipped base (Kess ~ Kessia), never the word itself
    expect(bases("kess")).toEqual([["kessia", "", 0.86]]);
    expect(bases("brask")).toEqual([]);
    expect(bases("the")).toEqual([]);
  });
});

/**
 * normalize's ASCII shortcut against its general Unicode path (NFKC, case folding, NFD,
 * combining marks removed, apostrophes dropped, non-letters/digits to spaces): the same
 * result for every ASCII string (fast-check), and the general path still taken otherwise.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { normalize, normalizeUnicode } from "./normalize.js";

describe("normalize", () => {
  it("gives the general path's result for every ASCII string (fast-check)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary-ascii", maxLength: 40 }), (text) => {
        expect(normalize(text)).toBe(normalizeUnicode(text));
      }),
      { numRuns: 2000, seed: 17 },
    );
    for (const t of ["O'Hara-Lund", "  Pier `7`  ", "A\tB\nC", "x_y.z", "\u0000\u007f", ""]) expect(normalize(t)).toBe(normalizeUnicode(t));
  });

  it("folds non-ASCII text through the Unicode passes", () => {
    expect(normalize("Bérénice  O’Hara-Lund")).toBe("berenice ohara lund"); // apostrophes are dropped, not spaced
    expect(normalize("Straße ﬁve")).toBe("strasse five"); // ß → ss; the ﬁ ligature by NFKC
  });
});

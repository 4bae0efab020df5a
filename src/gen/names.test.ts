import { describe, expect, it } from "vitest";
import { GIVEN_COUNT, inventedName, personName, SYLLABLES } from "./names.js";

describe("invented names", () => {
  it("gives distinct names to the first 300,000 indices (and distinct person names)", () => {
    // exhaustive check over a range larger than any class of a 1M-entity generated catalog
    const seen = new Set<string>();
    for (let k = 0; k < 300_000; k++) seen.add(inventedName(k));
    expect(seen.size).toBe(300_000);
    const people = new Set<string>();
    for (let k = 0; k < 100_000; k++) {
      const p = personName(k);
      people.add(`${p.given} ${p.surname}`);
    }
    expect(people.size).toBe(100_000);
    expect(GIVEN_COUNT).toBe(160);
    expect(SYLLABLES).toBe(21 * 7 * 8); // onsets × vowels × codas, counted in names.ts
  });
});

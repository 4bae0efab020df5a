/**
 * IdTable (open addressing, linear probing) against the reference it replaces, a
 * `Map<string, number>`, under fast-check generated keys: any Unicode, empty keys, keys that
 * are substrings of a larger parsed text, many keys (growth), values beyond int32 (overflow).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { IdTable } from "./intern.js";

describe("IdTable", () => {
  it("answers every get and has exactly as a Map does (fast-check)", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.string({ unit: "binary", maxLength: 12 }), fc.nat()), { maxLength: 300 }), fc.array(fc.string({ unit: "binary", maxLength: 12 }), { maxLength: 50 }), (entries, probes) => {
        const table = new IdTable();
        const map = new Map<string, number>();
        for (const [k, v] of entries) {
          if (table.get(k) === undefined) table.add(k, v);
          if (!map.has(k)) map.set(k, v);
        }
        expect(table.size).toBe(map.size);
        for (const k of [...map.keys(), ...probes]) {
          expect(table.get(k)).toBe(map.get(k));
          expect(table.has(k)).toBe(map.has(k));
        }
      }),
      { numRuns: 300, seed: 11 },
    );
  });

  it("keeps 200,000 ids through many doublings, looked up by substrings of a parsed text", () => {
    const table = new IdTable();
    const n = 200_000;
    for (let i = 0; i < n; i++) table.add(`urn:x:e:${i}`, i + 1);
    const text = Array.from({ length: 1000 }, (_, i) => `<urn:x:e:${(i * 7919) % n}> `).join("");
    let pos = 0;
    for (let i = 0; i < 1000; i++) {
      const end = text.indexOf(">", pos);
      const id = text.slice(pos + 1, end);
      expect(table.get(id)).toBe(((i * 7919) % n) + 1);
      pos = end + 2;
    }
    expect(table.get("urn:x:e:200000")).toBeUndefined();
    expect(table.size).toBe(n);
  });

  it("stores values that do not fit an int32, and clears", () => {
    const table = new IdTable();
    table.add("big", 2 ** 40);
    table.add("small", 7);
    expect(table.get("big")).toBe(2 ** 40);
    expect(table.get("small")).toBe(7);
    expect(table.size).toBe(2);
    table.clear();
    expect(table.get("big")).toBeUndefined();
    expect(table.get("small")).toBeUndefined();
    expect(table.size).toBe(0);
  });
});

/** Binary search checked against Array.prototype.indexOf (ECMAScript, linear scan) on sorted arrays of distinct values. */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { sortedIndexOf } from "./sorted-search.js";

describe("sortedIndexOf", () => {
  it("finds present values and returns -1 for absent ones (hand-computed)", () => {
    expect(sortedIndexOf([2, 5, 9], 5)).toBe(1);
    expect(sortedIndexOf([2, 5, 9], 2)).toBe(0);
    expect(sortedIndexOf([2, 5, 9], 9)).toBe(2);
    expect(sortedIndexOf([2, 5, 9], 6)).toBe(-1);
    expect(sortedIndexOf([], 1)).toBe(-1);
    expect(sortedIndexOf(["ash", "elm", "oak"], "elm")).toBe(1);
    expect(sortedIndexOf(["ash", "elm", "oak"], "fir")).toBe(-1);
  });

  it("agrees with indexOf on sorted sets of integers and strings (property)", () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: -50, max: 50 })), fc.integer({ min: -60, max: 60 }), (xs, x) => {
        const list = [...xs].sort((a, b) => a - b);
        return sortedIndexOf(list, x) === list.indexOf(x);
      }),
    );
    fc.assert(
      fc.property(fc.uniqueArray(fc.string({ maxLength: 3 })), fc.string({ maxLength: 3 }), (xs, x) => {
        const list = [...xs].sort();
        return sortedIndexOf(list, x) === list.indexOf(x);
      }),
    );
  });
});

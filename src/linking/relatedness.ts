/**
 * Milne–Witten relatedness between two entities from their graph neighbourhoods.
 *
 * [Reference] D. Milne and I. H. Witten, "An effective, low-cost measure of semantic
 * relatedness obtained from Wikipedia links", AAAI 2008 Workshop on Wikipedia and AI:
 * rel(a, b) = 1 − (ln max(|A|,|B|) − ln |A∩B|) / (ln N − ln min(|A|,|B|)), clipped to [0, 1],
 * where A, B are the link sets. tiepoint uses the catalog's edges in both directions as the
 * link sets (the paper uses incoming Wikipedia links), and counts a direct edge between a and b
 * as full relatedness (one hop), so 1- and 2-hop connections both support each other.
 */
import { sortedIndexOf } from "./sorted-search.js";

/** Relatedness in [0, 1]; `a`, `b` sorted neighbour nums, `n` the number of entities. */
export function milneWitten(aNum: number, a: readonly number[], bNum: number, b: readonly number[], n: number): number {
  if (aNum === bNum) return 1;
  if (sortedIndexOf(a, bNum) >= 0 || sortedIndexOf(b, aNum) >= 0) return 1;
  if (a.length === 0 || b.length === 0) return 0;
  let common = 0;
  let i = 0;
  let j = 0;
  while (i < a.length && j < b.length) {
    if (a[i]! === b[j]!) {
      common++;
      i++;
      j++;
    } else if (a[i]! < b[j]!) i++;
    else j++;
  }
  if (common === 0) return 0;
  const big = Math.max(a.length, b.length);
  const small = Math.min(a.length, b.length);
  const denom = Math.log(Math.max(n, big + 1)) - Math.log(small);
  if (denom <= 0) return 1;
  const r = 1 - (Math.log(big) - Math.log(common)) / denom;
  return r < 0 ? 0 : r > 1 ? 1 : r;
}

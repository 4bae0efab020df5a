/**
 * Binary search in a sorted array (common practice; Knuth, TAOCP vol. 3, §6.2.1, Algorithm B).
 * Used where a sorted list replaces a map (loaded vocabularies, neighbour lists).
 */

/** Index of `x` in `list[from .. to)` sorted ascending by `<` (UTF-16 order for strings; typed arrays too), or -1. */
export function sortedIndexOf<T extends number | string>(list: ArrayLike<T>, x: T, from = 0, to = list.length): number {
  let lo = from;
  let hi = to - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const v = list[mid]!;
    if (v === x) return mid;
    if (v < x) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

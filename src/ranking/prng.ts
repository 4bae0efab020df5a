/**
 * Seeded pseudo-random numbers for the random-walk phase of personalized PageRank.
 *
 * [Reference]: mulberry32, Tommy Ettinger (2017), public domain; a 32-bit state generator
 * with a SplitMix-style output function. Not cryptographic; chosen for speed and for giving
 * the same walks for the same seed on every platform (determinism).
 */

/** A function returning uniform floats in [0, 1). */
export type Random = () => number;

/** A mulberry32 generator seeded with the 32-bit integer `seed`. */
export function mulberry32(seed: number): Random {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

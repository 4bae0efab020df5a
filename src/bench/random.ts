/**
 * Seeded PRNG for the benchmark tools (mulberry32, Tommy Ettinger 2017, public domain);
 * kept apart from ranking's own so the benchmark's choices never shift the walks' stream.
 */

/** A mulberry32 generator of floats in [0, 1). */
export function mulberry32Bench(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Seeded pseudo-random numbers for the generators: xoshiro128** 1.1 and a bounded power-law
 * (Zipf-like) sampler.
 *
 * [Reference] D. Blackman, S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Trans. Math. Softw. 47(4), 2021 — xoshiro128** (the 32-bit "starstar" variant).
 * The four state words are filled from the seed by SplitMix32 (the 32-bit finaliser of
 * MurmurHash3, A. Appleby), so that nearby seeds give unrelated streams.
 * [Reference] A. Clauset, C. R. Shalizi, M. E. J. Newman, "Power-law distributions in
 * empirical data", SIAM Review 51(4), 2009, appendix D: inverse-transform sampling of a
 * continuous power law; here truncated to ranks 1..n and rounded down.
 */

/** Defaults of the samplers. */
export const DEFAULTS = {
  /** Exponent of {@link Rng.zipf} when none is given (hubs of ~1/74 of the draws at n = 10^6). */
  zipfExponent: 0.8,
} as const;

/** One SplitMix32 step: returns the next [state, output]. */
function splitmix32(state: number): [number, number] {
  const s = (state + 0x9e3779b9) | 0;
  let z = s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  z ^= z >>> 16;
  return [s, z >>> 0];
}

/** A deterministic random stream (xoshiro128**). Not for cryptography. */
export class Rng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  /** A stream from an integer seed, or (for tests) from four explicit 32-bit state words. */
  constructor(seed: number | readonly [number, number, number, number]) {
    if (typeof seed === "number") {
      if (!Number.isFinite(seed)) throw new RangeError(`gen/random: seed must be a finite number, got ${seed}`);
      let s = Math.trunc(seed) | 0;
      const w: number[] = [];
      for (let i = 0; i < 4; i++) {
        const [ns, out] = splitmix32(s);
        s = ns;
        w.push(out);
      }
      [this.a, this.b, this.c, this.d] = w as [number, number, number, number];
    } else {
      [this.a, this.b, this.c, this.d] = seed.map((x) => x >>> 0) as [number, number, number, number];
    }
    if ((this.a | this.b | this.c | this.d) === 0) this.d = 1; // the all-zero state is a fixed point
  }

  /** The next unsigned 32-bit output. */
  nextU32(): number {
    const b = this.b;
    const m = Math.imul(b, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = (this.d << 11) | (this.d >>> 21);
    return result;
  }

  /** A float in [0, 1) with 32 random bits. */
  next(): number {
    return this.nextU32() / 4294967296;
  }

  /** An integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }

  /** One element of a non-empty array. */
  pick<T>(items: readonly T[]): T {
    return items[this.int(items.length)]!;
  }

  /**
   * A rank in [0, n) drawn with probability roughly proportional to (rank+1)^-s
   * (bounded continuous power law, inverse transform; s ≥ 0, s ≠ 1 handled, s = 1 via log).
   */
  zipf(n: number, s: number = DEFAULTS.zipfExponent): number {
    const u = this.next();
    let r: number;
    if (Math.abs(s - 1) < 1e-9) {
      r = Math.exp(u * Math.log(n + 1));
    } else {
      const e = 1 - s;
      r = Math.pow(1 + u * (Math.pow(n + 1, e) - 1), 1 / e);
    }
    const k = Math.floor(r) - 1;
    return k < 0 ? 0 : k >= n ? n - 1 : k;
  }
}

/** A cheap integer hash (SplitMix32 finaliser) for per-index decisions that need no stream. */
export function hash32(x: number, salt = 0): number {
  return splitmix32((x ^ Math.imul(salt, 0x27d4eb2d)) | 0)[1];
}

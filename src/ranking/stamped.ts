/**
 * Stamped node arrays
 * ===================
 *
 * A node-indexed Int32 array that searches reuse from query to query instead of allocating
 * hash maps: a value is valid only where its stamp equals the current epoch, so "clearing"
 * is one increment (the usual visited-epoch technique; common practice). Not shared between
 * searches running at the same time (the searches are synchronous).
 */

/** One stamped node array pair: `value[u]` is valid where `stamp[u] === epoch`. */
export class Stamped {
  stamp: Uint32Array;
  value: Int32Array;
  epoch = 0;

  constructor(n: number) {
    this.stamp = new Uint32Array(n);
    this.value = new Int32Array(n);
  }

  /** Starts a new search (every node unset); returns this. */
  reset(): this {
    if (this.epoch >= 0xfffffffe) {
      this.stamp.fill(0);
      this.epoch = 0;
    }
    this.epoch++;
    return this;
  }

  has(u: number): boolean {
    return this.stamp[u] === this.epoch;
  }

  /** The value at u, or -1 when unset. */
  get(u: number): number {
    return this.stamp[u] === this.epoch ? this.value[u]! : -1;
  }

  set(u: number, v: number): void {
    this.stamp[u] = this.epoch;
    this.value[u] = v;
  }
}

const byOwner = new WeakMap<object, Map<string, Stamped>>();

/** The stamped array named `name` of `owner` (an index or graph) with room for `n` nodes, reset. */
export function stampedFor(owner: object, name: string, n: number): Stamped {
  let named = byOwner.get(owner);
  if (!named) {
    named = new Map();
    byOwner.set(owner, named);
  }
  let s = named.get(name);
  if (!s || s.stamp.length < n) {
    s = new Stamped(n);
    named.set(name, s);
  }
  return s.reset();
}

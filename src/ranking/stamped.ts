/**
 * Stamped node arrays
 * ===================
 *
 * A node-indexed Int32 array that searches reuse from query to query instead of allocating
 * hash maps: a value is valid only where its stamp equals the current epoch, so "clearing"
 * is one increment (the usual visited-epoch technique; common practice). Not shared between
 * searches running at the same time (the searches are synchronous).
 */

/**
 * One stamped node array: the value of u is valid where its stamp equals `epoch`. Stamp and
 * value sit side by side (cells 2u and 2u + 1), so a lookup touches one cache line — on a
 * million-node index every search step is a random access.
 */
export class Stamped {
  private readonly cells: Int32Array;
  private epoch = 0;

  constructor(n: number) {
    this.cells = new Int32Array(2 * n);
  }

  /** Nodes it has room for. */
  get size(): number {
    return this.cells.length / 2;
  }

  /** Starts a new search (every node unset); returns this. */
  reset(): this {
    if (this.epoch >= 0x7ffffffe) {
      this.cells.fill(0);
      this.epoch = 0;
    }
    this.epoch++;
    return this;
  }

  has(u: number): boolean {
    return this.cells[2 * u] === this.epoch;
  }

  /** The value at u, or -1 when unset. */
  get(u: number): number {
    return this.cells[2 * u] === this.epoch ? this.cells[2 * u + 1]! : -1;
  }

  set(u: number, v: number): void {
    this.cells[2 * u] = this.epoch;
    this.cells[2 * u + 1] = v;
  }
}

/** Scratch structures kept per owner (an index or graph) and name, grown on demand. */
const byOwner = new WeakMap<object, Map<string, Stamped | NodeBits>>();

function kept<T extends Stamped | NodeBits>(owner: object, name: string, n: number, make: (n: number) => T): T {
  let named = byOwner.get(owner);
  if (!named) {
    named = new Map();
    byOwner.set(owner, named);
  }
  let s = named.get(name) as T | undefined;
  if (!s || s.size < n) {
    s = make(n);
    named.set(name, s);
  }
  return s;
}

/** The stamped array named `name` of `owner` (an index or graph) with room for `n` nodes, reset. */
export function stampedFor(owner: object, name: string, n: number): Stamped {
  return kept(owner, name, n, (k) => new Stamped(k)).reset();
}

/**
 * A node set as a bit array with its members listed, so that clearing costs the members,
 * not the graph: one bit per node keeps a million-node membership test inside 128 KiB,
 * in cache, where a stamped array would cost a cache miss per test (common practice).
 */
export class NodeBits {
  private readonly words: Uint32Array;
  private readonly members: number[] = [];

  constructor(n: number) {
    this.words = new Uint32Array((n >>> 5) + 1);
  }

  /** Nodes it has room for (a multiple of 32). */
  get size(): number {
    return this.words.length * 32;
  }

  has(u: number): boolean {
    return (this.words[u >>> 5]! & (1 << (u & 31))) !== 0;
  }

  add(u: number): void {
    const w = u >>> 5;
    const b = 1 << (u & 31);
    if ((this.words[w]! & b) === 0) {
      this.words[w]! |= b;
      this.members.push(u);
    }
  }

  /** The members, ascending. */
  sorted(): Int32Array {
    return Int32Array.from(this.members).sort();
  }

  /** Empties the set (word by word for a few members, else the whole array); returns this. */
  clear(): this {
    if (this.members.length * 8 > this.words.length) this.words.fill(0);
    else for (const u of this.members) this.words[u >>> 5] = 0;
    this.members.length = 0;
    return this;
  }
}

/** The bit set named `name` of `owner` with room for `n` nodes, emptied. */
export function nodeBitsFor(owner: object, name: string, n: number): NodeBits {
  return kept(owner, name, n, (k) => new NodeBits(k)).clear();
}

/** A typed array of the same kind with room for at least `n` items (twice the length when that is more), `a`'s items copied. */
export function grown<T extends Int32Array | Uint32Array | Uint8Array | Float64Array>(a: T, n: number = a.length + 1): T {
  const b = new (a.constructor as new (n: number) => T)(Math.max(n, a.length * 2));
  b.set(a);
  return b;
}

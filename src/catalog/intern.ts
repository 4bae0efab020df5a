/**
 * `IdTable`: the writer's map from entity id (a string) to its num, as an open-addressing
 * hash table with linear probing (Knuth, The Art of Computer Programming vol. 3, section 6.4,
 * Algorithm L) over the 32-bit FNV-1a hash (Fowler–Noll–Vo) of the id's UTF-16 code units.
 *
 * Why not a `Map<string, number>`: at a million ids every lookup of a freshly parsed id
 * string in a `Map` chases three or four pointers (bucket, entry, key string, and for a
 * substring of the parser's input its parent), about 1 µs each on the benchmark machine.
 * Here a slot holds the hash, the key's place in one code-unit arena, its length and the
 * num side by side in one `Int32Array`, so a lookup touches the slot and the arena: about
 * half the time. The arena also stores a copy of each id, so the table does not keep the
 * parser's input blocks alive the way substrings used as `Map` keys do.
 */

/** Table sizes; all optional. */
export const DEFAULTS = {
  /** log2 of the initial slot count (the table doubles when it is half full). */
  initialBits: 12,
  /** Initial arena size in UTF-16 code units (doubles as needed). */
  initialArena: 1 << 16,
};

/** Slot fields: hash (0 = empty), arena offset, key length, value. */
const WIDTH = 4;
const MAX_INT32 = 0x7fffffff;

/** 32-bit FNV-1a (Fowler–Noll–Vo) of a string's UTF-16 code units, as a signed int32 (common practice). */
export function fnv1a32(s: string): number {
  let h = 0x811c9dc5 | 0;
  for (let i = 0; i < s.length; i++) h = Math.imul(h ^ s.charCodeAt(i), 0x01000193);
  return h;
}

/** The slot hash: FNV-1a, never 0 (0 marks an empty slot). */
function hashOf(s: string): number {
  const h = fnv1a32(s);
  return h === 0 ? 1 : h;
}

/** A string → non-negative integer map that only grows (entries are never removed). */
export class IdTable {
  private mask = 0;
  private slots = new Int32Array(0);
  private arena = new Uint16Array(0);
  private used = 0;
  private count = 0;
  /** Entries whose value or arena offset does not fit an int32 (never at realistic sizes). */
  private readonly overflow = new Map<string, number>();

  constructor() {
    this.clear();
  }

  /** Number of entries. */
  get size(): number {
    return this.count + this.overflow.size;
  }

  /** Removes every entry. */
  clear(): void {
    this.mask = (1 << DEFAULTS.initialBits) - 1;
    this.slots = new Int32Array((this.mask + 1) * WIDTH);
    this.arena = new Uint16Array(DEFAULTS.initialArena);
    this.used = 0;
    this.count = 0;
    this.overflow.clear();
  }

  /** The value of `key`, or undefined. */
  get(key: string): number | undefined {
    const h = hashOf(key);
    const slots = this.slots;
    const arena = this.arena;
    const mask = this.mask;
    const n = key.length;
    for (let p = h & mask; ; p = (p + 1) & mask) {
      const b = p * WIDTH;
      const sh = slots[b]!;
      if (sh === 0) break;
      if (sh === h && slots[b + 2] === n) {
        const o = slots[b + 1]!;
        let i = 0;
        while (i < n && arena[o + i] === key.charCodeAt(i)) i++;
        if (i === n) return slots[b + 3]!;
      }
    }
    return this.overflow.size > 0 ? this.overflow.get(key) : undefined;
  }

  /** True when `key` has a value. */
  has(key: string): boolean {
    return this.get(key) !== undefined;
  }

  /** Sets the value of a key that is not in the table yet (callers check with `get` first). */
  add(key: string, value: number): void {
    if (!Number.isInteger(value) || value < 0 || value > MAX_INT32 || this.used + key.length > MAX_INT32) {
      this.overflow.set(key, value);
      return;
    }
    if ((this.count + 1) * 2 > this.mask + 1) this.grow();
    this.place(hashOf(key), this.store(key), key.length, value);
    this.count++;
  }

  /** Copies `key` into the arena; returns its offset. */
  private store(key: string): number {
    const n = key.length;
    if (this.used + n > this.arena.length) {
      const bigger = new Uint16Array(Math.min(MAX_INT32, Math.max(this.arena.length * 2, this.used + n)));
      bigger.set(this.arena.subarray(0, this.used));
      this.arena = bigger;
    }
    const o = this.used;
    const arena = this.arena;
    for (let i = 0; i < n; i++) arena[o + i] = key.charCodeAt(i);
    this.used += n;
    return o;
  }

  /** Puts one entry in the first free slot of its probe sequence. */
  private place(h: number, offset: number, length: number, value: number): void {
    const slots = this.slots;
    const mask = this.mask;
    let p = h & mask;
    while (slots[p * WIDTH] !== 0) p = (p + 1) & mask;
    const b = p * WIDTH;
    slots[b] = h;
    slots[b + 1] = offset;
    slots[b + 2] = length;
    slots[b + 3] = value;
  }

  /** Doubles the slot count and re-places every entry. */
  private grow(): void {
    const old = this.slots;
    this.mask = this.mask * 2 + 1;
    this.slots = new Int32Array((this.mask + 1) * WIDTH);
    for (let b = 0; b < old.length; b += WIDTH) if (old[b] !== 0) this.place(old[b]!, old[b + 1]!, old[b + 2]!, old[b + 3]!);
  }
}

/**
 * Per-graph scratch arrays for the path searches
 * ==============================================
 *
 * Node-indexed typed arrays that the breadth-first searches reuse from question to question
 * instead of allocating hash maps: a value is valid only where its stamp equals the current
 * epoch, so "clearing" is one increment (the usual visited-epoch technique; common practice).
 * One set per graph (weakly held), grown on demand; not shared between concurrent searches
 * (the searches are synchronous).
 */
import type { WalkGraph } from "./types.js";

/** One stamped node array pair: `value[u]` is valid where `stamp[u] === epoch`. */
export class Stamped {
  stamp: Uint32Array;
  value: Int32Array;
  epoch = 0;

  constructor(n: number) {
    this.stamp = new Uint32Array(n);
    this.value = new Int32Array(n);
  }

  /** Starts a new search (every node unset). */
  reset(): void {
    if (this.epoch >= 0xfffffffe) {
      this.stamp.fill(0);
      this.epoch = 0;
    }
    this.epoch++;
  }

  has(u: number): boolean {
    return this.stamp[u] === this.epoch;
  }

  get(u: number): number {
    return this.stamp[u] === this.epoch ? this.value[u]! : -1;
  }

  set(u: number, v: number): void {
    this.stamp[u] = this.epoch;
    this.value[u] = v;
  }
}

const pools = new WeakMap<WalkGraph, Stamped[]>();

/** The `slot`-th scratch array of `graph` (slots 0..3 are used by explain), reset. */
export function scratch(graph: WalkGraph, slot: number): Stamped {
  let pool = pools.get(graph);
  if (!pool) {
    pool = [];
    pools.set(graph, pool);
  }
  let s = pool[slot];
  if (!s || s.stamp.length < graph.nodeCount) {
    s = new Stamped(graph.nodeCount);
    pool[slot] = s;
  }
  s.reset();
  return s;
}

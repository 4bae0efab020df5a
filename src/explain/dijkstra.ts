/**
 * Dijkstra's shortest paths on a small compact graph
 * ==================================================
 *
 * Single-source cheapest paths over a directed graph with non-negative arc costs stored as
 * CSR arrays (the evidence subgraph, evidence-graph.ts): a binary min-heap keyed by
 * (distance, node) with lazy deletion, so ties are settled by the lower node id and the
 * result is deterministic. Nodes and arcs can be blocked for one search (Yen's spur
 * searches, yen.ts); the search can stop as soon as a target is settled.
 *
 * [Reference]
 * E. W. Dijkstra, "A note on two problems in connexion with graphs", Numerische Mathematik
 * 1:269–271, 1959. Lazy deletion in the heap instead of decrease-key is common practice.
 */

/** A directed graph with non-negative arc costs as CSR arrays over node ids 0..size-1. */
export interface ArcGraph {
  /** Number of nodes. */
  readonly size: number;
  /** Arcs of node u are offsets[u] .. offsets[u+1]-1. */
  readonly offsets: Int32Array;
  /** Head (target) node of each arc. */
  readonly heads: Int32Array;
  /** Tail (source) node of each arc. */
  readonly tails: Int32Array;
  /** Cost of each arc (≥ 0). */
  readonly costs: Float64Array;
}

/** Blocking for one search; all optional. */
export interface DijkstraOptions {
  /** Stop once this node is settled. */
  readonly target?: number;
  /** Nodes not entered (blockedNode[u] === blockStamp). */
  readonly blockedNode?: Uint32Array;
  readonly blockStamp?: number;
  /** Arcs not taken. */
  readonly blockedArcs?: ReadonlySet<number>;
}

/** Distances (Infinity: unreached) and the arc each node was reached by (-1: none). */
export interface ShortestPathTree {
  readonly dist: Float64Array;
  readonly via: Int32Array;
}

/** Binary min-heap of (key, node) pairs; ties by node. */
class PairHeap {
  private keys: number[] = [];
  private nodes: number[] = [];

  get size(): number {
    return this.keys.length;
  }

  private less(i: number, j: number): boolean {
    const a = this.keys[i]!;
    const b = this.keys[j]!;
    return a < b || (a === b && this.nodes[i]! < this.nodes[j]!);
  }

  private swap(i: number, j: number): void {
    const k = this.keys[i]!;
    this.keys[i] = this.keys[j]!;
    this.keys[j] = k;
    const n = this.nodes[i]!;
    this.nodes[i] = this.nodes[j]!;
    this.nodes[j] = n;
  }

  push(key: number, node: number): void {
    this.keys.push(key);
    this.nodes.push(node);
    let i = this.keys.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.less(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }

  /** Removes the smallest pair; returns its node (its key is in `lastKey`). */
  pop(): number {
    const node = this.nodes[0]!;
    this.lastKey = this.keys[0]!;
    const k = this.keys.pop()!;
    const n = this.nodes.pop()!;
    if (this.keys.length > 0) {
      this.keys[0] = k;
      this.nodes[0] = n;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < this.keys.length && this.less(l, m)) m = l;
        if (r < this.keys.length && this.less(r, m)) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return node;
  }

  lastKey = 0;
}

/** Cheapest paths from `source` (see the file header). */
export function dijkstra(g: ArcGraph, source: number, options: DijkstraOptions = {}): ShortestPathTree {
  const dist = new Float64Array(g.size).fill(Infinity);
  const via = new Int32Array(g.size).fill(-1);
  const done = new Uint8Array(g.size);
  const { target, blockedNode, blockStamp, blockedArcs } = options;
  const blocked = (u: number) => blockedNode !== undefined && blockedNode[u] === blockStamp;
  if (blocked(source)) return { dist, via };
  dist[source] = 0;
  const heap = new PairHeap();
  heap.push(0, source);
  while (heap.size > 0) {
    const u = heap.pop();
    if (done[u] || heap.lastKey > dist[u]!) continue;
    done[u] = 1;
    if (u === target) break;
    const du = dist[u]!;
    for (let e = g.offsets[u]!, end = g.offsets[u + 1]!; e < end; e++) {
      const v = g.heads[e]!;
      if (done[v] || blocked(v) || (blockedArcs !== undefined && blockedArcs.has(e))) continue;
      const d = du + g.costs[e]!;
      if (d < dist[v]!) {
        dist[v] = d;
        via[v] = e;
        heap.push(d, v);
      }
    }
  }
  return { dist, via };
}

/** The arcs of the tree path source → `to`, or null when `to` was not reached. */
export function arcsTo(g: ArcGraph, tree: ShortestPathTree, source: number, to: number): number[] | null {
  if (to === source) return [];
  if (tree.via[to]! < 0) return null;
  const arcs: number[] = [];
  for (let x = to; x !== source; ) {
    const e = tree.via[x]!;
    if (e < 0) return null;
    arcs.push(e);
    x = g.tails[e]!;
  }
  return arcs.reverse();
}

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

import { grown } from "../ranking/index.js";

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

/**
 * Reusable arrays for repeated searches on one graph (Yen's spur searches, yen.ts): a
 * node's distance and arc are valid where its stamp is the current search's; the binary
 * min-heap of (key, node) pairs (ties by node) lives in typed arrays; nodes and arcs are
 * blocked where their block stamp is the current one ({@link DijkstraScratch.block}).
 */
export class DijkstraScratch {
  readonly dist: Float64Array;
  readonly via: Int32Array;
  private readonly seen: Uint32Array;
  private readonly done: Uint32Array;
  private readonly blockedNode: Uint32Array;
  private readonly blockedArc: Uint32Array;
  private stamp = 0;
  private blockStamp = 0;
  private keys = new Float64Array(64);
  private nodes = new Int32Array(64);
  private size = 0;

  constructor(readonly g: ArcGraph) {
    this.dist = new Float64Array(g.size);
    this.via = new Int32Array(g.size);
    this.seen = new Uint32Array(g.size);
    this.done = new Uint32Array(g.size);
    this.blockedNode = new Uint32Array(g.size);
    this.blockedArc = new Uint32Array(g.heads.length);
  }

  /** Starts a new set of blocked nodes and arcs (empty); they apply to the searches until the next call. */
  block(): void {
    this.blockStamp++;
  }

  blockNode(u: number): void {
    this.blockedNode[u] = this.blockStamp;
  }

  blockArc(e: number): void {
    this.blockedArc[e] = this.blockStamp;
  }

  /** The node's distance of the last search (Infinity: unreached). */
  distance(u: number): number {
    return this.seen[u] === this.stamp ? this.dist[u]! : Infinity;
  }

  /** The arc the last search reached `u` by (-1: none). */
  arcTo(u: number): number {
    return this.seen[u] === this.stamp ? this.via[u]! : -1;
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

  private push(key: number, node: number): void {
    if (this.size === this.keys.length) {
      this.keys = grown(this.keys);
      this.nodes = grown(this.nodes);
    }
    let i = this.size++;
    this.keys[i] = key;
    this.nodes[i] = node;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.less(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }

  /** Removes the smallest pair; returns its node (its key is in `lastKey`). */
  private pop(): number {
    const node = this.nodes[0]!;
    this.lastKey = this.keys[0]!;
    const last = --this.size;
    if (last > 0) {
      this.keys[0] = this.keys[last]!;
      this.nodes[0] = this.nodes[last]!;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < last && this.less(l, m)) m = l;
        if (r < last && this.less(r, m)) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return node;
  }

  private lastKey = 0;

  /**
   * Cheapest paths from `source` (see the file header), stopping once `target` (when ≥ 0) is
   * settled; with `blocked`, the nodes and arcs of the current {@link block} set are avoided.
   */
  search(source: number, target = -1, blocked = false): void {
    const g = this.g;
    const st = ++this.stamp;
    const { dist, via, seen, done, blockedNode, blockedArc } = this;
    const bs = blocked ? this.blockStamp : -1;
    this.size = 0;
    if (blockedNode[source] === bs) return;
    dist[source] = 0;
    via[source] = -1;
    seen[source] = st;
    this.push(0, source);
    const offsets = g.offsets;
    const heads = g.heads;
    const costs = g.costs;
    while (this.size > 0) {
      const u = this.pop();
      if (done[u] === st || this.lastKey > dist[u]!) continue;
      done[u] = st;
      if (u === target) break;
      const du = dist[u]!;
      for (let e = offsets[u]!, end = offsets[u + 1]!; e < end; e++) {
        const v = heads[e]!;
        if (done[v] === st || blockedNode[v] === bs || blockedArc[e] === bs) continue;
        const d = du + costs[e]!;
        if (seen[v] !== st || d < dist[v]!) {
          seen[v] = st;
          dist[v] = d;
          via[v] = e;
          this.push(d, v);
        }
      }
    }
  }

  /** The arcs of the last search's tree path source → `to`, or null when `to` was not reached. */
  arcsTo(source: number, to: number): number[] | null {
    if (to === source) return [];
    if (this.arcTo(to) < 0) return null;
    const arcs: number[] = [];
    for (let x = to; x !== source; ) {
      const e = this.arcTo(x);
      if (e < 0) return null;
      arcs.push(e);
      x = this.g.tails[e]!;
    }
    return arcs.reverse();
  }
}

/** Cheapest paths from `source` (see the file header). */
export function dijkstra(g: ArcGraph, source: number, options: DijkstraOptions = {}): ShortestPathTree {
  const dist = new Float64Array(g.size).fill(Infinity);
  const via = new Int32Array(g.size).fill(-1);
  const { target, blockedNode, blockStamp, blockedArcs } = options;
  const s = new DijkstraScratch(g);
  const blocked = blockedNode !== undefined || (blockedArcs !== undefined && blockedArcs.size > 0);
  if (blocked) {
    s.block();
    if (blockedNode !== undefined) for (let u = 0; u < g.size; u++) if (blockedNode[u] === blockStamp) s.blockNode(u);
    if (blockedArcs !== undefined) for (const e of blockedArcs) s.blockArc(e);
  }
  s.search(source, target ?? -1, blocked);
  for (let u = 0; u < g.size; u++) {
    dist[u] = s.distance(u);
    via[u] = s.arcTo(u);
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

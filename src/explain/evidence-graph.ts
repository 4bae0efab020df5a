/**
 * Evidence subgraph
 * =================
 *
 * The part of the relation graph that can explain the answers: every node that lies on some
 * walk of at most `maxHops` steps from a clue to one of the top answers, found by a
 * breadth-first search from each clue and from each answer (a node x is kept when
 * min_c dist(c, x) + min_a dist(x, a) ≤ maxHops), and every adjacency entry between kept
 * nodes. It becomes a graphology `DirectedGraph` (node key = entity num as a string) with one
 * edge per ordered node pair: the cheapest step between them under the path cost model, its
 * relation and direction kept as edge attributes. Both stored directions are walkable, so a
 * stored triple `a r b` gives the edge a→b (inverse false) and b→a (inverse true).
 *
 * [Reference]
 * Breadth-first search: Moore, "The shortest path through a maze", 1959. Restricting a
 * k-shortest-path search to the union of bounded balls around both endpoints is common
 * practice (it is exactly the set of nodes on walks of length ≤ maxHops).
 *
 * Hubs (degree above `hubLimit`) are kept as nodes but not expanded; each side's search
 * (one multi-source BFS from all clue seeds, one from all answers) stops after `nodeBudget`
 * nodes or `workBudget` scanned adjacency entries, and at most `maxNodes` nodes are kept
 * (fewest hops on the walk first, then lowest num), so the subgraph stays small on a
 * million-entity catalog; paths the subgraph misses are left to the bounded bidirectional
 * search on the full index. The searches use per-graph stamped arrays (scratch.ts), not maps.
 * The rows of kept hubs are not read either: a hub's arcs to kept non-hubs are taken from
 * the non-hubs' reverse entries, priced by the walk's formula from the hub's row total, and
 * arcs between two hubs are left out (such paths are the walk's least likely anyway).
 *
 * {@link evidenceSubgraph} returns the compact form (CSR arrays, searched by dijkstra.ts and
 * yenOnArcs), optionally with one virtual source node per clue whose arcs to the clue's
 * seeds cost −ln(seed share); {@link buildEvidenceGraph} the same subgraph as a graphology
 * graph (for inspection and drawing).
 */
import { createRequire } from "node:module";
import type { DirectedGraph } from "graphology";
import type { ArcGraph } from "./dijkstra.js";
import type { FlatRows, PathCostModel } from "./path-cost.js";
import { grown, linkInverse, linkRelation } from "../ranking/index.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link buildEvidenceGraph}; all optional. */
export interface EvidenceOptions {
  /** Longest clue-to-answer walk the subgraph must contain. @default 4 */
  readonly maxHops?: number;
  /** Nodes of larger degree are not expanded (the endpoints always are). @default 2000 */
  readonly hubLimit?: number;
  /** Most nodes one side's breadth-first search visits. @default 50000 */
  readonly nodeBudget?: number;
  /** Most adjacency entries one side's breadth-first search scans. @default 10000 */
  readonly workBudget?: number;
  /** Most nodes kept in the subgraph (besides the clues and answers). @default 400 */
  readonly maxNodes?: number;
}

/** The defaults of {@link EvidenceOptions}. */
export const DEFAULTS = { maxHops: 4, hubLimit: 2000, nodeBudget: 50000, workBudget: 10000, maxNodes: 400 } as const;

/** Attributes of an evidence edge. */
export interface EvidenceEdge {
  /** Path cost of the step (see path-cost.ts). */
  readonly cost: number;
  /** Relation num. */
  readonly rel: number;
  /** True when the stored triple is `target rel source`. */
  readonly inverse: boolean;
}

/** A weighted restart node of a clue (paths.ts ClueSeed). */
export interface EvidenceSeed {
  readonly node: number;
  readonly weight: number;
}

/**
 * The evidence subgraph in compact form: local node ids 0..realCount-1 are entity nums in
 * ascending order (`nums`), then one virtual source per clue (when built with seeds); at
 * most one arc per ordered node pair, the cheapest step (virtual arcs: rel −1).
 */
export class EvidenceSubgraph implements ArcGraph {
  readonly size: number;
  constructor(
    /** Entity num per real local id (ascending). */
    readonly nums: Int32Array,
    readonly realCount: number,
    readonly offsets: Int32Array,
    readonly heads: Int32Array,
    readonly tails: Int32Array,
    readonly costs: Float64Array,
    readonly rels: Int32Array,
    readonly inverse: Uint8Array,
  ) {
    this.size = offsets.length - 1;
  }

  /** Local id of an entity num, or -1 when it is not in the subgraph (a binary search in `nums`). */
  localOf(num: number): number {
    let lo = 0;
    let hi = this.realCount;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.nums[mid]! < num) lo = mid + 1;
      else hi = mid;
    }
    return lo < this.realCount && this.nums[lo] === num ? lo : -1;
  }

  /** Local id of clue `ci`'s virtual source (built with seeds only). */
  virtualOf(ci: number): number {
    return this.realCount + ci;
  }

  /** The arc u → v, or -1. */
  arc(u: number, v: number): number {
    for (let e = this.offsets[u]!, end = this.offsets[u + 1]!; e < end; e++) if (this.heads[e] === v) return e;
    return -1;
  }
}

/**
 * Relation ids a packed hub-arc key can hold: below 2^20 (a larger id would collide with the
 * next local id, so it is refused); local ids below 2^31, so a key stays an exact double.
 */
export const PACKED_RELATION_LIMIT = 1 << 20;

/** One number for (local node, relation, direction) of an arc into a hub ({@link unpackArc}). */
export function packArc(local: number, rel: number, inverse: boolean): number {
  if (!(rel >= 0 && rel < PACKED_RELATION_LIMIT)) throw new RangeError(`explain/evidence-graph: relation id ${rel} is not below 2^20, the packed arc key's limit`);
  return (local * PACKED_RELATION_LIMIT + rel) * 2 + (inverse ? 1 : 0);
}

/** The (local node, relation, direction) of a {@link packArc} key. */
export function unpackArc(key: number): { local: number; rel: number; inverse: boolean } {
  const inverse = key % 2 === 1;
  const rest = (key - (inverse ? 1 : 0)) / 2;
  const rel = rest % PACKED_RELATION_LIMIT;
  return { local: (rest - rel) / PACKED_RELATION_LIMIT, rel, inverse };
}

/**
 * The node-indexed working arrays of the evidence search on one graph, owned by this object
 * and reused question after question (the searches are synchronous): visit bits of the two
 * breadth-first searches and of the kept nodes (one bit per node, in cache), the answers'
 * hop distances (one byte per node), the local ids of the kept nodes, and the two visit
 * lists. Every user clears what it set (through its lists) before returning.
 */
class EvidenceScratch {
  readonly clueBits: Uint32Array;
  readonly answerBits: Uint32Array;
  readonly keptBits: Uint32Array;
  readonly answerHops: Uint8Array;
  readonly local: Int32Array;
  clueSeen: Int32Array = new Int32Array(1024);
  answerSeen: Int32Array = new Int32Array(1024);
  /** One row's entries to kept nodes: local target, relation, direction, probability. */
  eV = new Int32Array(64);
  eRel = new Int32Array(64);
  eInv = new Uint8Array(64);
  eP = new Float64Array(64);
  order = new Int32Array(64);

  constructor(readonly nodeCount: number) {
    const words = (nodeCount >>> 5) + 1;
    this.clueBits = new Uint32Array(words);
    this.answerBits = new Uint32Array(words);
    this.keptBits = new Uint32Array(words);
    this.answerHops = new Uint8Array(nodeCount);
    this.local = new Int32Array(nodeCount).fill(-1);
  }

  /** Room for `m` row entries. */
  rowRoom(m: number): void {
    if (m <= this.eV.length) return;
    const n = Math.max(m, this.eV.length * 2);
    this.eV = new Int32Array(n);
    this.eRel = new Int32Array(n);
    this.eInv = new Uint8Array(n);
    this.eP = new Float64Array(n);
    this.order = new Int32Array(n);
  }
}

const scratches = new WeakMap<WalkGraph, EvidenceScratch>();

function scratchOf(graph: WalkGraph): EvidenceScratch {
  let s = scratches.get(graph);
  if (s === undefined || s.nodeCount < graph.nodeCount) {
    s = new EvidenceScratch(graph.nodeCount);
    scratches.set(graph, s);
  }
  return s;
}

const hasBit = (bits: Uint32Array, u: number): boolean => (bits[u >>> 5]! & (1 << (u & 31))) !== 0;

/**
 * A multi-source breadth-first search's visit: `seen[0 … count − 1]` in BFS order (a buffer
 * of the scratch, possibly longer), its hop layers as `ends` (layer d is seen[ends[d − 1]] …
 * seen[ends[d] − 1], layer 0 the starts), so a node's distance is its layer.
 */
interface Ball {
  readonly seen: Int32Array;
  readonly count: number;
  readonly ends: number[];
}

/**
 * Multi-source hop distances up to `maxHops` (as layers, {@link Ball}) into `buffer`;
 * `visited` (all zero) gets a bit for every visited node (the caller clears them). Starts
 * are always expanded in full (whatever the budgets, so every 1-hop path is kept), hubs
 * (degree > hubLimit) otherwise not; the budgets bound everything beyond the starts' neighbours.
 */
function ball(graph: WalkGraph, starts: readonly number[], maxHops: number, hubLimit: number, nodeBudget: number, workBudget: number, visited: Uint32Array, buffer: Int32Array, flat?: FlatRows): Ball {
  let seen = buffer;
  let count = 0;
  const add = (v: number): void => {
    if (count === seen.length) seen = grown(seen);
    visited[v >>> 5]! |= 1 << (v & 31);
    seen[count++] = v;
  };
  for (const s of starts) {
    if (s < 0 || s >= graph.nodeCount || hasBit(visited, s)) continue;
    add(s);
  }
  const ends = [count];
  let work = 0;
  let lo = 0;
  for (let d = 1; d <= maxHops && count < nodeBudget; d++) {
    const hi = count;
    if (lo === hi) break;
    for (let i = lo; i < hi && (d === 1 || (count < nodeBudget && work < workBudget)); i++) {
      const u = seen[i]!;
      const deg = graph.degree(u);
      if (d > 1 && deg > hubLimit) continue;
      work += deg;
      if (flat !== undefined) {
        // the same entries in the same order as graph.forEach, read from the flat arrays
        const targets = flat.targets;
        for (let e = flat.offsets[u]!, end = flat.offsets[u + 1]!; e < end; e++) {
          const v = targets[e]!;
          if ((visited[v >>> 5]! & (1 << (v & 31))) === 0 && (d === 1 || count < nodeBudget)) add(v);
        }
        continue;
      }
      graph.forEach(u, (v) => {
        if (!hasBit(visited, v) && (d === 1 || count < nodeBudget)) add(v);
      });
    }
    ends.push(count);
    lo = hi;
  }
  return { seen, count, ends };
}

/** Clears the bits of the first `count` nodes of `list`. */
function clearBits(bits: Uint32Array, list: Int32Array, count: number): void {
  for (let i = 0; i < count; i++) bits[list[i]! >>> 5] = 0;
}

/** Hop distances from `start` up to `maxHops` (hubs above `hubLimit` not expanded, at most `nodeBudget` nodes). */
export function bfsDistances(graph: WalkGraph, start: number, maxHops: number, hubLimit: number, nodeBudget: number): Map<number, number> {
  const sc = scratchOf(graph);
  const b = ball(graph, [start], maxHops, hubLimit, nodeBudget, Infinity, sc.clueBits, sc.clueSeen);
  sc.clueSeen = b.seen;
  clearBits(sc.clueBits, b.seen, b.count);
  const out = new Map<number, number>();
  for (let d = 0, i = 0; d < b.ends.length; d++) for (; i < b.ends[d]!; i++) out.set(b.seen[i]!, d);
  return out;
}

/** Growable parallel arrays of arcs (head, cost, relation, direction). */
class ArcList {
  heads = new Int32Array(256);
  costs = new Float64Array(256);
  rels = new Int32Array(256);
  invs = new Uint8Array(256);
  length = 0;

  push(head: number, cost: number, rel: number, inv: number): void {
    if (this.length === this.heads.length) {
      this.heads = grown(this.heads);
      this.costs = grown(this.costs);
      this.rels = grown(this.rels);
      this.invs = grown(this.invs);
    }
    const i = this.length++;
    this.heads[i] = head;
    this.costs[i] = cost;
    this.rels[i] = rel;
    this.invs[i] = inv;
  }
}

/**
 * Builds the compact evidence subgraph for the clue seeds `clues` (one list per clue) and
 * `answers` (entity nums); with `virtual`, one virtual source per clue is appended.
 * Node order and arc order follow ascending node num, so the result is deterministic.
 */
export function evidenceSubgraph(
  graph: WalkGraph,
  cost: PathCostModel,
  clues: readonly (readonly EvidenceSeed[])[],
  answers: readonly number[],
  options: EvidenceOptions & { readonly virtual?: boolean } = {},
): EvidenceSubgraph {
  const o = { ...DEFAULTS, ...options };
  if (!Number.isInteger(o.maxHops) || o.maxHops < 1) throw new RangeError(`explain/evidence-graph: maxHops must be a positive integer, got ${o.maxHops}`);
  const clueNodes = [...new Set(clues.flatMap((c) => c.map((s) => s.node)))];
  // ranking's walk offers its flat rows: the loops below read them directly (same entries,
  // same order, same probabilities as forEach / forEachProbability)
  const walk = cost.flatWalk();
  const sc = scratchOf(graph);
  const fromClues = ball(graph, clueNodes, o.maxHops, o.hubLimit, o.nodeBudget, o.workBudget, sc.clueBits, sc.clueSeen, walk?.rows);
  sc.clueSeen = fromClues.seen;
  const fromAnswers = ball(graph, answers, o.maxHops, o.hubLimit, o.nodeBudget, o.workBudget, sc.answerBits, sc.answerSeen, walk?.rows);
  sc.answerSeen = fromAnswers.seen;
  // the answers' hop distances by node (1 + distance, 0 unset), one byte each
  const da = sc.answerHops;
  for (let d = 0, i = 0; d < fromAnswers.ends.length; d++) for (; i < fromAnswers.ends[d]!; i++) da[fromAnswers.seen[i]!] = d + 1;
  const endpoints = new Set([...clueNodes, ...answers].filter((x) => x >= 0 && x < graph.nodeCount));
  // the kept nodes as bits: the endpoints now, the inner nodes once chosen
  const kept = sc.keptBits;
  for (const x of endpoints) kept[x >>> 5]! |= 1 << (x & 31);
  // in the clues' BFS order, with each node's dist(clues) + dist(answers)
  let inner: number[] = [];
  const sums: number[] = [];
  const answerBits = sc.answerBits;
  for (let d = 0, i = 0; d < fromClues.ends.length; d++) {
    for (; i < fromClues.ends[d]!; i++) {
      const x = fromClues.seen[i]!;
      if (!hasBit(answerBits, x) || hasBit(kept, x)) continue;
      const sum = d + da[x]! - 1;
      if (sum <= o.maxHops) {
        inner.push(x);
        sums.push(sum);
      }
    }
  }
  for (let i = 0; i < fromAnswers.count; i++) da[fromAnswers.seen[i]!] = 0;
  clearBits(sc.clueBits, fromClues.seen, fromClues.count);
  clearBits(sc.answerBits, fromAnswers.seen, fromAnswers.count);
  if (inner.length > o.maxNodes) inner = fewestHops(inner, sums, o.maxNodes, o.maxHops);
  const nodes = Int32Array.from([...endpoints, ...inner]).sort();
  const N = nodes.length;
  const local = sc.local;
  // the kept nodes also as bits: the row scans below test every entry, and the bit array
  // stays in cache where the node-indexed local ids would cost a miss per entry on a large graph
  for (let i = 0; i < N; i++) {
    local[nodes[i]!] = i;
    kept[nodes[i]! >>> 5]! |= 1 << (nodes[i]! & 31);
  }
  const virtualCount = options.virtual ? clues.length : 0;
  const hop = cost.hopCost;
  // rows of kept hubs are not read: their arcs to kept non-hubs come from the reverse entries
  // (priced by the walk's formula from the hub's row total); hub–hub arcs are left out
  const isHub = new Uint8Array(N);
  for (let i = 0; i < N; i++) isHub[i] = graph.degree(nodes[i]!) > o.hubLimit ? 1 : 0;
  const hubAcc = new Map<number, Map<number, number>>();
  // the non-hub rows' arcs, row after row (rowEnd[ui]: end of row ui's arcs in `arcs`)
  const arcs = new ArcList();
  const rowEnd = new Int32Array(N);
  // one non-hub row: its entries to kept nodes gathered in index order into flat scratch
  // arrays, then grouped by (target, relation, direction) with a stable sort, so the
  // probabilities of one key are summed in index order (as a per-row map would)
  let m = 0;
  const keep = (v: number, vl: number, u: number, ui: number, rel: number, inverse: boolean, p: number): void => {
    if (m === sc.eV.length) sc.rowRoom(m + 1);
    sc.eV[m] = vl;
    sc.eRel[m] = rel;
    sc.eInv[m] = inverse ? 1 : 0;
    sc.eP[m] = p;
    m++;
    if (isHub[vl] === 1) {
      let back = hubAcc.get(vl);
      if (back === undefined) {
        back = new Map<number, number>();
        hubAcc.set(vl, back);
      }
      const kb = packArc(ui, rel, !inverse);
      back.set(kb, (back.get(kb) ?? 0) + cost.entryProbability(v, u, rel));
    }
  };
  for (let ui = 0; ui < N; ui++) {
    const u = nodes[ui]!;
    if (isHub[ui] === 1) {
      if (!hubAcc.has(ui)) hubAcc.set(ui, new Map<number, number>());
      rowEnd[ui] = arcs.length;
      continue;
    }
    m = 0;
    if (walk !== undefined) {
      // most entries lead out of the subgraph: test membership first, price only the kept ones
      const { offsets: off, targets, links } = walk.rows;
      const total = walk.rowTotal(u);
      for (let e = off[u]!, end = off[u + 1]!; e < end; e++) {
        const v = targets[e]!;
        if ((kept[v >>> 5]! & (1 << (v & 31))) === 0 || v === u) continue;
        const l = links[e]!;
        keep(v, local[v]!, u, ui, linkRelation(l), linkInverse(l), total > 0 ? walk.weight(e) / total : 0);
      }
    } else {
      cost.forEachProbability(u, (v, rel, inverse, p) => {
        if (!hasBit(kept, v) || v === u) return;
        keep(v, local[v]!, u, ui, rel, inverse, p);
      });
    }
    if (m > 0) rowArcs(sc, m, hop, arcs);
    rowEnd[ui] = arcs.length;
  }
  // the subgraph's arrays, rows in node order: a non-hub row's arcs from `arcs`, a hub's from its reverse entries
  const hubRows = new Map<number, ArcList>();
  let total = arcs.length;
  for (const [ui, acc] of hubAcc) {
    const row = hubRow(acc, hop);
    hubRows.set(ui, row);
    total += row.length;
  }
  for (let ci = 0; ci < virtualCount; ci++) total += clues[ci]!.length;
  const offsets = new Int32Array(N + virtualCount + 1);
  const heads = new Int32Array(total);
  const costs = new Float64Array(total);
  const rels = new Int32Array(total);
  const invs = new Uint8Array(total);
  let k = 0;
  const copy = (from: ArcList, start: number, end: number): void => {
    for (let i = start; i < end; i++, k++) {
      heads[k] = from.heads[i]!;
      costs[k] = from.costs[i]!;
      rels[k] = from.rels[i]!;
      invs[k] = from.invs[i]!;
    }
  };
  for (let ui = 0; ui < N; ui++) {
    offsets[ui] = k;
    if (isHub[ui] === 1) {
      const row = hubRows.get(ui)!;
      copy(row, 0, row.length);
    } else copy(arcs, ui === 0 ? 0 : rowEnd[ui - 1]!, rowEnd[ui]!);
  }
  for (let ci = 0; ci < virtualCount; ci++) {
    offsets[N + ci] = k;
    const seeds = clues[ci]!;
    const sum = seeds.reduce((t, s) => t + Math.max(0, s.weight), 0);
    const used = new Set<number>();
    for (const s of seeds) {
      const vl = s.node >= 0 && s.node < graph.nodeCount && hasBit(kept, s.node) ? local[s.node]! : -1;
      if (!(s.weight > 0) || vl < 0 || used.has(vl)) continue;
      used.add(vl);
      heads[k] = vl;
      costs[k] = -Math.log(s.weight / sum);
      rels[k] = -1;
      invs[k] = 0;
      k++;
    }
  }
  offsets[N + virtualCount] = k;
  for (let i = 0; i < N; i++) {
    local[nodes[i]!] = -1;
    kept[nodes[i]! >>> 5] = 0;
  }
  const tails = new Int32Array(k);
  for (let u = 0; u + 1 < offsets.length; u++) for (let e = offsets[u]!; e < offsets[u + 1]!; e++) tails[e] = u;
  return new EvidenceSubgraph(nodes, N, offsets, heads.subarray(0, k), tails, costs.subarray(0, k), rels.subarray(0, k), invs.subarray(0, k));
}

/**
 * The `max` nodes of `nodes` with the fewest hops (`sums`, whole numbers 0…maxHops), ties by
 * lowest num, as a set (in no particular order: the caller sorts the kept nodes by num): the
 * hop counts below the cut whole, the cut's own hop count by lowest num.
 */
function fewestHops(nodes: readonly number[], sums: readonly number[], max: number, maxHops: number): number[] {
  const perSum = new Int32Array(maxHops + 1);
  for (const x of sums) perSum[x]!++;
  let cut = 0;
  let below = 0;
  while (below + perSum[cut]! < max) below += perSum[cut++]!;
  const out: number[] = [];
  const atCut: number[] = [];
  for (let i = 0; i < nodes.length; i++) {
    if (sums[i]! < cut) out.push(nodes[i]!);
    else if (sums[i] === cut) atCut.push(nodes[i]!);
  }
  const lowest = Int32Array.from(atCut).sort();
  for (let i = 0; i < max - below; i++) out.push(lowest[i]!);
  return out;
}

/**
 * The arcs of one non-hub row from its `m` entries to kept nodes (in the scratch's row
 * arrays): entries grouped by (target, relation, direction) in entry order, probabilities of
 * a group summed in entry order, and per target the cheapest group (on equal cost the first:
 * smallest relation, then not inverse), appended to `out` by ascending target.
 */
function rowArcs(sc: EvidenceScratch, m: number, hop: number, out: ArcList): void {
  const { eV, eRel, eInv, eP, order } = sc;
  // insertion sort of the entry indexes by (target, relation, direction, index): a total order, so any sort gives this result
  for (let i = 0; i < m; i++) {
    let j = i;
    while (j > 0) {
      const a = order[j - 1]!;
      const b = i;
      const c = eV[a]! - eV[b]! || eRel[a]! - eRel[b]! || eInv[a]! - eInv[b]! || a - b;
      if (c <= 0) break;
      order[j] = a;
      j--;
    }
    order[j] = i;
  }
  let bestV = -1;
  let bestCost = 0;
  let bestRel = 0;
  let bestInv = 0;
  for (let i = 0; i < m; ) {
    const first = order[i]!;
    const vl = eV[first]!;
    const rel = eRel[first]!;
    const inv = eInv[first]!;
    let p = 0;
    let j = i;
    for (; j < m; j++) {
      const x = order[j]!;
      if (eV[x] !== vl || eRel[x] !== rel || eInv[x] !== inv) break;
      p += eP[x]!;
    }
    i = j;
    if (!(p > 0)) continue;
    const c = hop - Math.log(p);
    if (vl !== bestV) {
      if (bestV >= 0) out.push(bestV, bestCost, bestRel, bestInv);
      bestV = vl;
      bestCost = c;
      bestRel = rel;
      bestInv = inv;
    } else if (c < bestCost) {
      // same target: (rel, inverse) groups come in ascending order, so on equal cost the first one (smallest rel, then not inverse) stays
      bestCost = c;
      bestRel = rel;
      bestInv = inv;
    }
  }
  if (bestV >= 0) out.push(bestV, bestCost, bestRel, bestInv);
}

/** A kept hub's row from the probabilities its reverse entries gathered (packed arc keys): per target the cheapest, by ascending target. */
function hubRow(acc: ReadonlyMap<number, number>, hop: number): ArcList {
  const best = new Map<number, { cost: number; rel: number; inverse: boolean }>();
  for (const [key, p] of acc) {
    if (!(p > 0)) continue;
    const { local: vl, rel, inverse } = unpackArc(key);
    const c = hop - Math.log(p);
    const b = best.get(vl);
    if (b === undefined || c < b.cost || (c === b.cost && (rel < b.rel || (rel === b.rel && !inverse && b.inverse)))) best.set(vl, { cost: c, rel, inverse });
  }
  const row = new ArcList();
  for (const vl of [...best.keys()].sort((a, b) => a - b)) {
    const b = best.get(vl)!;
    row.push(vl, b.cost, b.rel, b.inverse ? 1 : 0);
  }
  return row;
}

/**
 * Builds the evidence subgraph for `clues` and `answers` (entity nums) as a graphology graph
 * (node key = entity num as a string; edge attributes cost, rel, inverse).
 */
export function buildEvidenceGraph(
  graph: WalkGraph,
  cost: PathCostModel,
  clues: readonly number[],
  answers: readonly number[],
  options: EvidenceOptions = {},
): DirectedGraph<Record<string, never>, EvidenceEdge> {
  const sub = evidenceSubgraph(graph, cost, [clues.map((node) => ({ node, weight: 1 }))], answers, options);
  // graphology is loaded here, on first use: the questions' path search reads the compact subgraph
  const Graph = (createRequire(import.meta.url)("graphology") as { DirectedGraph: typeof DirectedGraph }).DirectedGraph;
  const g = new Graph<Record<string, never>, EvidenceEdge>();
  for (let u = 0; u < sub.realCount; u++) g.addNode(String(sub.nums[u]));
  for (let u = 0; u < sub.realCount; u++) {
    for (let e = sub.offsets[u]!; e < sub.offsets[u + 1]!; e++) {
      g.addEdge(String(sub.nums[u]), String(sub.nums[sub.heads[e]!]), { cost: sub.costs[e]!, rel: sub.rels[e]!, inverse: sub.inverse[e] === 1 });
    }
  }
  return g;
}

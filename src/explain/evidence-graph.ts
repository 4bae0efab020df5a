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
import { DirectedGraph } from "graphology";
import type { ArcGraph } from "./dijkstra.js";
import type { FlatRows, PathCostModel } from "./path-cost.js";
import { nodeBitsFor, type NodeBits } from "../ranking/index.js";
import { scratch } from "./scratch.js";
import type { WalkGraph } from "./types.js";

const hopBytes = new WeakMap<WalkGraph, Uint8Array>();

/** A node-indexed byte array of `graph`, all zero (its user zeroes what it set before returning). */
function hopBytesFor(graph: WalkGraph): Uint8Array {
  let b = hopBytes.get(graph);
  if (b === undefined || b.length < graph.nodeCount) {
    b = new Uint8Array(graph.nodeCount);
    hopBytes.set(graph, b);
  }
  return b;
}

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
    /** Entity num per real local id. */
    readonly nums: Int32Array,
    readonly realCount: number,
    readonly offsets: Int32Array,
    readonly heads: Int32Array,
    readonly tails: Int32Array,
    readonly costs: Float64Array,
    readonly rels: Int32Array,
    readonly inverse: Uint8Array,
    private readonly localIds: ReadonlyMap<number, number>,
  ) {
    this.size = offsets.length - 1;
  }

  /** Local id of an entity num, or -1 when it is not in the subgraph. */
  localOf(num: number): number {
    return this.localIds.get(num) ?? -1;
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
 * A multi-source breadth-first search's visit: `seen` in BFS order, its hop layers as
 * `ends` (layer d is seen[ends[d − 1]] … seen[ends[d] − 1], layer 0 the starts), so a
 * node's distance is its layer and no node-indexed distance array is written.
 */
interface Ball {
  readonly seen: number[];
  readonly ends: number[];
}

/**
 * Multi-source hop distances up to `maxHops` (as layers, {@link Ball}); `visited` (an empty
 * bit set) gets every visited node. Starts are always expanded in full (whatever the budgets,
 * so every 1-hop path is kept), hubs (degree > hubLimit) otherwise not; the budgets bound
 * everything beyond the starts' neighbours.
 */
function ball(graph: WalkGraph, starts: readonly number[], maxHops: number, hubLimit: number, nodeBudget: number, workBudget: number, visited: NodeBits, flat?: FlatRows): Ball {
  const seen: number[] = [];
  for (const s of starts) {
    if (s < 0 || s >= graph.nodeCount || visited.has(s)) continue;
    visited.add(s);
    seen.push(s);
  }
  const ends = [seen.length];
  let work = 0;
  let lo = 0;
  for (let d = 1; d <= maxHops && seen.length < nodeBudget; d++) {
    const hi = seen.length;
    if (lo === hi) break;
    for (let i = lo; i < hi && (d === 1 || (seen.length < nodeBudget && work < workBudget)); i++) {
      const u = seen[i]!;
      const deg = graph.degree(u);
      if (d > 1 && deg > hubLimit) continue;
      work += deg;
      if (flat !== undefined) {
        // the same entries in the same order as graph.forEach, read from the flat arrays
        const targets = flat.targets;
        for (let e = flat.offsets[u]!, end = flat.offsets[u + 1]!; e < end; e++) {
          const v = targets[e]!;
          if (!visited.has(v) && (d === 1 || seen.length < nodeBudget)) {
            visited.add(v);
            seen.push(v);
          }
        }
        continue;
      }
      graph.forEach(u, (v) => {
        if (!visited.has(v) && (d === 1 || seen.length < nodeBudget)) {
          visited.add(v);
          seen.push(v);
        }
      });
    }
    ends.push(seen.length);
    lo = hi;
  }
  return { seen, ends };
}

/** Hop distances from `start` up to `maxHops` (hubs above `hubLimit` not expanded, at most `nodeBudget` nodes). */
export function bfsDistances(graph: WalkGraph, start: number, maxHops: number, hubLimit: number, nodeBudget: number): Map<number, number> {
  const { seen, ends } = ball(graph, [start], maxHops, hubLimit, nodeBudget, Infinity, nodeBitsFor(graph, "explain/ball-clues", graph.nodeCount));
  const out = new Map<number, number>();
  for (let d = 0, i = 0; d < ends.length; d++) for (; i < ends[d]!; i++) out.set(seen[i]!, d);
  return out;
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
  const fromClues = ball(graph, clueNodes, o.maxHops, o.hubLimit, o.nodeBudget, o.workBudget, nodeBitsFor(graph, "explain/ball-clues", graph.nodeCount), walk?.rows);
  const reachedA = nodeBitsFor(graph, "explain/ball-answers", graph.nodeCount);
  const fromAnswers = ball(graph, answers, o.maxHops, o.hubLimit, o.nodeBudget, o.workBudget, reachedA, walk?.rows);
  // the answers' hop distances by node (1 + distance, 0 unset), one byte each; cleared below
  const da = hopBytesFor(graph);
  for (let d = 0, i = 0; d < fromAnswers.ends.length; d++) for (; i < fromAnswers.ends[d]!; i++) da[fromAnswers.seen[i]!] = d + 1;
  const endpoints = new Set([...clueNodes, ...answers].filter((x) => x >= 0 && x < graph.nodeCount));
  // in the clues' BFS order (as before), with each node's dist(clues) + dist(answers)
  let inner: number[] = [];
  const sums: number[] = [];
  for (let d = 0, i = 0; d < fromClues.ends.length; d++) {
    for (; i < fromClues.ends[d]!; i++) {
      const x = fromClues.seen[i]!;
      if (!reachedA.has(x) || endpoints.has(x)) continue;
      const sum = d + da[x]! - 1;
      if (sum <= o.maxHops) {
        inner.push(x);
        sums.push(sum);
      }
    }
  }
  for (const x of fromAnswers.seen) da[x] = 0;
  if (inner.length > o.maxNodes) {
    // fewest hops first, then lowest num: one packed key per node (hops · 2^31 + num, exact
    // in a double) sorted numerically, instead of a comparator reading both distances
    const packed = new Float64Array(inner.length);
    for (let i = 0; i < inner.length; i++) packed[i] = sums[i]! * 2147483648 + inner[i]!;
    packed.sort();
    inner = Array.from(packed.subarray(0, o.maxNodes), (k) => k % 2147483648);
  }
  const nodes = [...endpoints, ...inner].sort((a, b) => a - b);
  const local = scratch(graph, 2);
  // the kept nodes also as bits: the row scans below test every entry, and the bit array
  // stays in cache where the stamped array would cost a miss per entry on a large graph
  const kept = nodeBitsFor(graph, "explain/evidence-kept", graph.nodeCount);
  const localIds = new Map<number, number>();
  nodes.forEach((x, i) => {
    local.set(x, i);
    kept.add(x);
    localIds.set(x, i);
  });
  const virtualCount = options.virtual ? clues.length : 0;
  const offsets = new Int32Array(nodes.length + virtualCount + 1);
  const heads: number[] = [];
  const costs: number[] = [];
  const rels: number[] = [];
  const invs: number[] = [];
  const hop = cost.hopCost;
  // rows of kept hubs are not read: their arcs to kept non-hubs come from the reverse entries
  // (priced by the walk's formula from the hub's row total); hub–hub arcs are left out
  const isHub = nodes.map((u) => graph.degree(u) > o.hubLimit);
  const hubAcc = new Map<number, Map<number, number>>();
  // one non-hub row: its entries to kept nodes gathered in index order into flat scratch
  // arrays, then grouped by (target, relation, direction) with a stable sort, so the
  // probabilities of one key are summed in index order (as a per-row map would)
  const eV: number[] = [];
  const eRel: number[] = [];
  const eInv: number[] = [];
  const eP: number[] = [];
  const order: number[] = [];
  const rowOut: { heads: number[]; costs: number[]; rels: number[]; invs: number[] }[] = [];
  const byEntry = (a: number, b: number): number => eV[a]! - eV[b]! || eRel[a]! - eRel[b]! || eInv[a]! - eInv[b]! || a - b;
  nodes.forEach((u, ui) => {
    if (isHub[ui]) {
      if (!hubAcc.has(ui)) hubAcc.set(ui, new Map<number, number>());
      return;
    }
    eV.length = 0;
    eRel.length = 0;
    eInv.length = 0;
    eP.length = 0;
    const keep = (v: number, vl: number, rel: number, inverse: boolean, p: number): void => {
      eV.push(vl);
      eRel.push(rel);
      eInv.push(inverse ? 1 : 0);
      eP.push(p);
      if (isHub[vl]) {
        let back = hubAcc.get(vl);
        if (back === undefined) {
          back = new Map<number, number>();
          hubAcc.set(vl, back);
        }
        const kb = (ui * 1048576 + rel) * 2 + (inverse ? 0 : 1);
        back.set(kb, (back.get(kb) ?? 0) + cost.entryProbability(v, u, rel));
      }
    };
    if (walk !== undefined) {
      // most entries lead out of the subgraph: test membership first, price only the kept ones
      const { offsets: off, targets, links } = walk.rows;
      const total = walk.rowTotal(u);
      for (let e = off[u]!, end = off[u + 1]!; e < end; e++) {
        const v = targets[e]!;
        if (!kept.has(v)) continue;
        const vl = local.get(v);
        if (vl < 0 || v === u) continue;
        const l = links[e]!;
        keep(v, vl, l >>> 1, (l & 1) === 1, total > 0 ? walk.weight(e) / total : 0);
      }
    } else {
      cost.forEachProbability(u, (v, rel, inverse, p) => {
        const vl = local.get(v);
        if (vl < 0 || v === u) return;
        keep(v, vl, rel, inverse, p);
      });
    }
    const out = { heads: [] as number[], costs: [] as number[], rels: [] as number[], invs: [] as number[] };
    rowOut[ui] = out;
    const m = eV.length;
    if (m === 0) return;
    order.length = m;
    for (let i = 0; i < m; i++) order[i] = i;
    order.sort(byEntry);
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
        if (bestV >= 0) {
          out.heads.push(bestV);
          out.costs.push(bestCost);
          out.rels.push(bestRel);
          out.invs.push(bestInv);
        }
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
    if (bestV >= 0) {
      out.heads.push(bestV);
      out.costs.push(bestCost);
      out.rels.push(bestRel);
      out.invs.push(bestInv);
    }
  });
  nodes.forEach((_u, ui) => {
    offsets[ui] = heads.length;
    if (!isHub[ui]) {
      const out = rowOut[ui]!;
      for (let i = 0; i < out.heads.length; i++) {
        heads.push(out.heads[i]!);
        costs.push(out.costs[i]!);
        rels.push(out.rels[i]!);
        invs.push(out.invs[i]!);
      }
      return;
    }
    const acc = hubAcc.get(ui)!;
    const best = new Map<number, { cost: number; rel: number; inverse: boolean }>();
    for (const [k, p] of acc) {
      if (!(p > 0)) continue;
      const inverse = k % 2 === 1;
      const rest = (k - (inverse ? 1 : 0)) / 2;
      const rel = rest % 1048576;
      const vl = (rest - rel) / 1048576;
      const c = hop - Math.log(p);
      const b = best.get(vl);
      if (b === undefined || c < b.cost || (c === b.cost && (rel < b.rel || (rel === b.rel && !inverse && b.inverse)))) best.set(vl, { cost: c, rel, inverse });
    }
    for (const vl of [...best.keys()].sort((a, b) => a - b)) {
      const b = best.get(vl)!;
      heads.push(vl);
      costs.push(b.cost);
      rels.push(b.rel);
      invs.push(b.inverse ? 1 : 0);
    }
  });
  for (let ci = 0; ci < virtualCount; ci++) {
    offsets[nodes.length + ci] = heads.length;
    const seeds = clues[ci]!;
    const total = seeds.reduce((t, s) => t + Math.max(0, s.weight), 0);
    const used = new Set<number>();
    for (const s of seeds) {
      const vl = localIds.get(s.node);
      if (!(s.weight > 0) || vl === undefined || used.has(vl)) continue;
      used.add(vl);
      heads.push(vl);
      costs.push(-Math.log(s.weight / total));
      rels.push(-1);
      invs.push(0);
    }
  }
  offsets[nodes.length + virtualCount] = heads.length;
  const tails = new Int32Array(heads.length);
  for (let u = 0; u + 1 < offsets.length; u++) for (let e = offsets[u]!; e < offsets[u + 1]!; e++) tails[e] = u;
  return new EvidenceSubgraph(Int32Array.from(nodes), nodes.length, offsets, Int32Array.from(heads), tails, Float64Array.from(costs), Int32Array.from(rels), Uint8Array.from(invs), localIds);
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
  const g = new DirectedGraph<Record<string, never>, EvidenceEdge>();
  for (let u = 0; u < sub.realCount; u++) g.addNode(String(sub.nums[u]));
  for (let u = 0; u < sub.realCount; u++) {
    for (let e = sub.offsets[u]!; e < sub.offsets[u + 1]!; e++) {
      g.addEdge(String(sub.nums[u]), String(sub.nums[sub.heads[e]!]), { cost: sub.costs[e]!, rel: sub.rels[e]!, inverse: sub.inverse[e] === 1 });
    }
  }
  return g;
}

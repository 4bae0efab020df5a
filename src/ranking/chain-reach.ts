/**
 * Chain reachability: the nodes at the end of a fixed relation-path pattern from a clue.
 *
 * Method: level-synchronous breadth-first evaluation of a fixed-length regular path query
 * R1/R2/…/Rk (Mendelzon & Wood 1995, "Finding regular simple paths in graph databases",
 * SIAM J. Comput. 24(6)): the frontier after hop i is every node reached from the previous
 * frontier through one of step i's relations in its stored direction (or in either
 * direction when `directed` is false), optionally restricted by a per-hop node test (the
 * type a noun of the question gives the node in between) and a per-hop selection of the frontier
 * (a condition on the node in between, node-select.ts). The search stops after `maxVisits` adjacency entries
 * and then returns null, so the caller does not penalise nodes it never looked at.
 */
import { csrOf, type RelationIndex } from "./relation-index.js";
import { NodeBits } from "./stamped.js";

/** Options of {@link chainReach}; all optional. */
export interface ChainReachOptions {
  /** Follow each step's stored direction (false: either direction). @default true */
  readonly directed?: boolean;
  /** Budget of adjacency entries scanned. @default 200000 */
  readonly maxVisits?: number;
  /** Only nodes passing this test stay in the frontier after hop `hop` (0-based), e.g. an intermediate type. @default all */
  readonly keep?: (hop: number, node: number) => boolean;
  /** The frontier after hop `hop` (0-based) replaced by a subset of it (conditions on an inner node, node-select.ts). @default all kept */
  readonly select?: (hop: number, frontier: Set<number>) => Set<number>;
}

/** Defaults of {@link ChainReachOptions}. */
export const DEFAULTS = { directed: true, maxVisits: 200_000 } as const;

/** One hop of the pattern: the allowed relations, each with its direction (true: against the stored triple). */
export type ChainHop = readonly { readonly relation: number; readonly inverse: boolean }[];

/**
 * The nodes a pattern reaches, ascending in one Int32Array (no object per node: a hub's
 * pattern reaches tens of thousands); membership by binary search, or by a bit per node
 * (built on the first test) when the set is large.
 */
export class NodeSet implements Iterable<number> {
  private bits: Uint32Array | undefined;

  /** `nodes` must be ascending and distinct. */
  constructor(readonly nodes: Int32Array) {}

  get size(): number {
    return this.nodes.length;
  }

  has(v: number): boolean {
    const a = this.nodes;
    const n = a.length;
    if (n === 0 || !(v >= a[0]! && v <= a[n - 1]!)) return false;
    if (n <= 32) {
      let lo = 0;
      let hi = n - 1;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (a[mid]! < v) lo = mid + 1;
        else hi = mid;
      }
      return a[lo] === v;
    }
    let bits = this.bits;
    if (bits === undefined) {
      bits = new Uint32Array((a[n - 1]! >>> 5) + 1);
      for (let i = 0; i < n; i++) bits[a[i]! >>> 5]! |= 1 << (a[i]! & 31);
      this.bits = bits;
    }
    return (bits[v >>> 5]! & (1 << (v & 31))) !== 0;
  }

  /** True when some member passes `test` (ascending order, stops at the first). */
  some(test: (v: number) => boolean): boolean {
    const a = this.nodes;
    for (let i = 0; i < a.length; i++) if (test(a[i]!)) return true;
    return false;
  }

  [Symbol.iterator](): IterableIterator<number> {
    return this.nodes.values();
  }
}

/**
 * The nodes reached by following `hops` in order from `source` (empty pattern: the source),
 * ascending; null when over budget. Each hop scans its frontier's rows in ascending node order
 * straight from the index's arrays (a relation's allowed directions in a table by relation
 * num, one bit per node for the next frontier).
 */
export function chainReach(index: RelationIndex, source: number, hops: readonly ChainHop[], options: ChainReachOptions = {}): NodeSet | null {
  const directed = options.directed ?? DEFAULTS.directed;
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  if (!(source >= 0 && source < index.nodeCount)) throw new RangeError(`ranking/chain-reach: source ${source} is not a node`);
  let frontier: Int32Array = Int32Array.of(source);
  let visits = 0;
  const keep = options.keep;
  const { offsets, targets, links } = csrOf(index);
  // relation → bit 1: forwards, bit 2: against (a relation outside the index matches no entry)
  const allowed = new Uint8Array(Math.max(index.relationCount, 1));
  const next = new NodeBits(index.nodeCount);
  for (let h = 0; h < hops.length; h++) {
    allowed.fill(0);
    for (const o of hops[h]!) if (o.relation >= 0 && o.relation < allowed.length) allowed[o.relation]! |= directed ? (o.inverse ? 2 : 1) : 3;
    next.clear();
    for (let i = 0; i < frontier.length; i++) {
      const u = frontier[i]!;
      visits += index.degree(u);
      if (visits > maxVisits) return null;
      const end = offsets[u + 1]!;
      for (let e = offsets[u]!; e < end; e++) {
        const l = links[e]!;
        const a = allowed[l >>> 1]!;
        if (a === 0 || (a & ((l & 1) === 1 ? 2 : 1)) === 0) continue;
        const v = targets[e]!;
        if (!next.has(v) && (keep === undefined || keep(h, v))) next.add(v);
      }
    }
    frontier = next.sorted();
    // a selection of the frontier between hops (node-select.ts), on a Set as it takes it
    if (options.select && h < hops.length - 1) frontier = Int32Array.from(options.select(h, new Set(frontier))).sort();
    if (frontier.length === 0) break;
  }
  return new NodeSet(frontier);
}

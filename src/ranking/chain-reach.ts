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
 * and then returns null, so the caller does not penalise nodes it never looked at. With
 * several sources of one pattern (`meet`), the first hop's frontiers are intersected: the
 * conjunctive query's shared variable (a join on it, as in a conjunctive regular path query).
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
  /**
   * Other sources of the same pattern (coordinated clues, "borders both A and B"): the
   * frontier after the first hop is the intersection of every source's, the one node of the
   * query graph where their edges meet, so a selection there sees the meeting set. @default none
   */
  readonly meet?: readonly number[];
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
  const sources = [source, ...(options.meet ?? []).filter((x) => x !== source)];
  for (const s of sources) if (!(s >= 0 && s < index.nodeCount)) throw new RangeError(`ranking/chain-reach: source ${s} is not a node`);
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
    // one hop from `from`; null when over budget
    const step = (from: Int32Array): Int32Array | null => {
      next.clear();
      for (let i = 0; i < from.length; i++) {
        const u = from[i]!;
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
      return next.sorted();
    };
    const reached = step(frontier);
    if (reached === null) return null;
    frontier = reached;
    // the other sources' first hops: the meeting set is what all of them reach
    if (h === 0) {
      for (let k = 1; k < sources.length && frontier.length > 0; k++) {
        const other = step(Int32Array.of(sources[k]!));
        if (other === null) return null;
        frontier = intersectSorted(frontier, other);
      }
    }
    // a selection of the frontier between hops (node-select.ts), on a Set as it takes it
    if (options.select && h < hops.length - 1) frontier = Int32Array.from(options.select(h, new Set(frontier))).sort();
    if (frontier.length === 0) break;
  }
  return new NodeSet(frontier);
}

/** The values two ascending arrays share, ascending (a merge). */
function intersectSorted(a: Int32Array, b: Int32Array): Int32Array {
  const out: number[] = [];
  for (let i = 0, j = 0; i < a.length && j < b.length; ) {
    if (a[i]! < b[j]!) i++;
    else if (a[i]! > b[j]!) j++;
    else {
      out.push(a[i]!);
      i++;
      j++;
    }
  }
  return Int32Array.from(out);
}

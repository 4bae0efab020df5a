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
import type { RelationIndex } from "./relation-index.js";

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

/** The nodes reached by following `hops` in order from `source` (empty pattern: the source); null when over budget. */
export function chainReach(index: RelationIndex, source: number, hops: readonly ChainHop[], options: ChainReachOptions = {}): Set<number> | null {
  const directed = options.directed ?? DEFAULTS.directed;
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  if (!(source >= 0 && source < index.nodeCount)) throw new RangeError(`ranking/chain-reach: source ${source} is not a node`);
  let frontier = new Set<number>([source]);
  let visits = 0;
  const keep = options.keep;
  for (let h = 0; h < hops.length; h++) {
    const hop = hops[h]!;
    const allowed = new Map<number, number>(); // relation → bit 1: forwards, bit 2: against
    for (const o of hop) allowed.set(o.relation, (allowed.get(o.relation) ?? 0) | (directed ? (o.inverse ? 2 : 1) : 3));
    const next = new Set<number>();
    for (const u of [...frontier].sort((a, b) => a - b)) {
      visits += index.degree(u);
      if (visits > maxVisits) return null;
      index.forEach(u, (v, rel, inverse) => {
        const a = allowed.get(rel);
        if (a !== undefined && a & (inverse ? 2 : 1) && (keep === undefined || keep(h, v))) next.add(v);
      });
    }
    frontier = options.select && h < hops.length - 1 ? options.select(h, next) : next;
    if (frontier.size === 0) break;
  }
  return frontier;
}

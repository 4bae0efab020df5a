/**
 * Catalog statistics for `tiepoint stats`: counts, the degree distribution (min, median,
 * 99th percentile by the nearest-rank method, max), the largest hubs, and the number of
 * connected components of the relation graph taken as undirected, found with union-find
 * (disjoint-set forest with path halving and union by size; Tarjan 1975, "Efficiency of a
 * Good But Not Linear Set Union Algorithm", J. ACM 22(2)). Every entity counts as a node,
 * so an entity without edges is a component of its own.
 */
import type { Catalog, CatalogCounts } from "./store.js";

/** Options of {@link catalogStats}. */
export const DEFAULTS = {
  /** How many hubs to list. */
  hubs: 10,
};

/** One hub: an entity with many edges. */
export interface Hub {
  readonly id: string;
  readonly label: string;
  /** Edges in and out. */
  readonly degree: number;
}

/** What `stats` prints. */
export interface CatalogStats {
  readonly counts: CatalogCounts;
  /** Degree (edges in + out) over all entities. */
  readonly degree: { readonly min: number; readonly median: number; readonly p99: number; readonly max: number; readonly mean: number };
  readonly hubs: readonly Hub[];
  /** Connected components (undirected), isolated entities included. */
  readonly components: number;
  readonly largestComponent: number;
  /** Entities without any edge. */
  readonly isolated: number;
}

/** Nearest-rank percentile of an ascending sorted array (NIST/common practice definition). */
export function nearestRank(sorted: ArrayLike<number>, p: number): number {
  if (sorted.length === 0) return 0;
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[rank - 1]!;
}

/** Counts connected components of `n` nodes (0..n-1) joined by `pairs` with union-find. */
export function unionFindComponents(n: number, forEachPair: (visit: (a: number, b: number) => void) => void): { components: number; largest: number } {
  const parent = new Int32Array(n);
  const size = new Int32Array(n).fill(1);
  for (let i = 0; i < n; i++) parent[i] = i;
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]!]!;
      x = parent[x]!;
    }
    return x;
  };
  let components = n;
  forEachPair((a, b) => {
    let ra = find(a);
    let rb = find(b);
    if (ra === rb) return;
    if (size[ra]! < size[rb]!) [ra, rb] = [rb, ra];
    parent[rb] = ra;
    size[ra]! += size[rb]!;
    components--;
  });
  let largest = 0;
  for (let i = 0; i < n; i++) if (parent[i] === i && size[i]! > largest) largest = size[i]!;
  return { components, largest };
}

/** Computes the statistics of a catalog (one pass over the entity and edge tables). */
export function catalogStats(cat: Catalog, options: { hubs?: number } = {}): CatalogStats {
  const hubCount = options.hubs ?? DEFAULTS.hubs;
  const counts = cat.counts();
  const nums = cat.db.prepare("SELECT num FROM entity ORDER BY num").pluck().all() as number[];
  const index = new Map<number, number>();
  nums.forEach((num, i) => index.set(num, i));
  const n = nums.length;
  const degree = new Int32Array(n);
  const edgeStmt = cat.db.prepare("SELECT src, dst FROM edge").raw(true);
  const cc = unionFindComponents(n, (visit) => {
    for (const row of edgeStmt.iterate() as IterableIterator<[number, number]>) {
      const a = index.get(row[0])!;
      const b = index.get(row[1])!;
      degree[a]!++;
      degree[b]!++;
      visit(a, b);
    }
  });
  const sorted = Int32Array.from(degree).sort();
  let sum = 0;
  let isolated = 0;
  for (let i = 0; i < n; i++) {
    sum += degree[i]!;
    if (degree[i] === 0) isolated++;
  }
  const order = Array.from({ length: n }, (_, i) => i)
    .filter((i) => degree[i]! > 0)
    .sort((a, b) => degree[b]! - degree[a]! || a - b)
    .slice(0, Math.max(hubCount * 4, hubCount));
  const hubs = order
    .map((i) => {
      const r = cat.ref(nums[i]!);
      return { id: r.id, label: r.label, degree: degree[i]! };
    })
    .sort((a, b) => b.degree - a.degree || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0))
    .slice(0, hubCount);
  return {
    counts,
    degree: { min: n ? sorted[0]! : 0, median: nearestRank(sorted, 50), p99: nearestRank(sorted, 99), max: n ? sorted[n - 1]! : 0, mean: n ? sum / n : 0 },
    hubs,
    components: cc.components,
    largestComponent: cc.largest,
    isolated,
  };
}

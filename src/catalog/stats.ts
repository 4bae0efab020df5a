/**
 * Catalog statistics for `tiepoint stats`: counts, the degree distribution (min, median,
 * 99th percentile by the nearest-rank method, max), the largest hubs, and the number of
 * connected components of the relation graph taken as undirected, found with union-find
 * (disjoint-set forest with path halving and union by size; Tarjan 1975, "Efficiency of a
 * Good But Not Linear Set Union Algorithm", J. ACM 22(2)). Every entity counts as a node,
 * so an entity without edges is a component of its own — except a type without edges
 * (`t:Boat`): type links are not edges, so such types are left out of the degrees, the
 * components and the entities without edges, and counted per type instead. Also: members
 * per type (direct, and with subtypes), edges per relation, names shared by several entities
 * (labels and aliases by normalised form: the ones a question must disambiguate), and types
 * without members.
 *
 * An attached catalog (its edges stay in a SPARQL store, README "Attaching a SPARQL store")
 * has no edge table to count: its degrees and edges per relation are the store's own counts,
 * taken by the attach (`PATH.store`), no request is made, and the components (which need the
 * edges themselves) are not computed.
 */
import type { Catalog, CatalogCounts } from "./store.js";

/** Options of {@link catalogStats}. */
export const DEFAULTS = {
  /** How many hubs to list. */
  hubs: 10,
  /** How many shared names to list (all are counted). */
  sharedNames: 10,
};

/** Members of one type. */
export interface TypeCount {
  readonly id: string;
  readonly label: string;
  /** Entities with this type as a direct type. */
  readonly members: number;
  /** Entities with this type or one of its subtypes (transitively). */
  readonly withSubtypes: number;
}

/** Edges of one relation. */
export interface RelationCount {
  readonly id: string;
  readonly label: string;
  readonly edges: number;
}

/** A name (label or alias, by normalised form) that several entities carry. */
export interface SharedName {
  /** The name as written on the first of them. */
  readonly name: string;
  readonly entities: number;
}

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
  /** Connected components (undirected), isolated entities included; null on an attached catalog (its edges are in the store). */
  readonly components: number | null;
  readonly largestComponent: number | null;
  /** Entities without any edge (types without edges are not counted). */
  readonly isolated: number;
  /** Types by members (most first, then id). */
  readonly types: readonly TypeCount[];
  /** Relations by edges (most first, then id). */
  readonly relations: readonly RelationCount[];
  /** How many names are shared by two or more entities, and the most shared ones. */
  readonly sharedNames: { readonly count: number; readonly top: readonly SharedName[] };
  /** Types that no entity has, directly or through a subtype. */
  readonly emptyTypes: readonly { readonly id: string; readonly label: string }[];
  /** An attached catalog: where its edges are (the endpoint without credentials) and when they were counted. */
  readonly store?: { readonly endpoint: string; readonly graph: string | null; readonly attachedAt: string };
}

/** The edge counts of an attached catalog's store (its binding, catalog/sparql/binding.ts). */
export interface StoreEdgeCounts {
  readonly endpoint: string;
  readonly graph: string | null;
  readonly attachedAt: string;
  readonly edges: number;
  /** Degree (edges in + out) per entity num. */
  readonly degree: ArrayLike<number>;
  /** Edges per relation (predicate num). */
  readonly relationEdges: ArrayLike<number>;
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
export function catalogStats(cat: Catalog, options: { hubs?: number; sharedNames?: number; store?: StoreEdgeCounts } = {}): CatalogStats {
  const hubCount = options.hubs ?? DEFAULTS.hubs;
  const store = options.store;
  const counts = store ? { ...cat.counts(), edges: store.edges, relations: Array.from(store.relationEdges).filter((x) => x > 0).length } : cat.counts();
  const nums = cat.db.prepare("SELECT num FROM entity ORDER BY num").pluck().all() as number[];
  const index = new Map<number, number>();
  nums.forEach((num, i) => index.set(num, i));
  const n = nums.length;
  const degree = new Int32Array(n);
  const perRelation = new Map<number, number>();
  let cc: { components: number; largest: number } | null = null;
  if (store) {
    // the store's counts (no edge is read)
    nums.forEach((num, i) => (degree[i] = store.degree[num] ?? 0));
    for (let r = 0; r < store.relationEdges.length; r++) if (store.relationEdges[r]! > 0) perRelation.set(r, store.relationEdges[r]!);
  } else {
    const edgeStmt = cat.db.prepare("SELECT src, rel, dst FROM edge").raw(true);
    cc = unionFindComponents(n, (visit) => {
      for (const row of edgeStmt.iterate() as IterableIterator<[number, number, number]>) {
        const a = index.get(row[0])!;
        const b = index.get(row[2])!;
        degree[a]!++;
        degree[b]!++;
        perRelation.set(row[1], (perRelation.get(row[1]) ?? 0) + 1);
        visit(a, b);
      }
    });
  }
  // types without edges are no nodes of the relation graph
  const typeNums = new Set(cat.db.prepare("SELECT type FROM entity_type UNION SELECT sub FROM subclass UNION SELECT sup FROM subclass").pluck().all() as number[]);
  const node = new Uint8Array(n);
  let nodes = 0;
  for (let i = 0; i < n; i++) {
    if (degree[i]! > 0 || !typeNums.has(nums[i]!)) {
      node[i] = 1;
      nodes++;
    }
  }
  const nodeDegrees = new Int32Array(nodes);
  let sum = 0;
  let isolated = 0;
  for (let i = 0, k = 0; i < n; i++) {
    if (!node[i]) continue;
    nodeDegrees[k++] = degree[i]!;
    sum += degree[i]!;
    if (degree[i] === 0) isolated++;
  }
  const sorted = nodeDegrees.sort();
  const order = Array.from({ length: n }, (_, i) => i)
    .filter((i) => degree[i]! > 0)
    .sort((a, b) => degree[b]! - degree[a]! || a - b)
    .slice(0, Math.max(hubCount * 4, hubCount));
  const hubs = order
    .map((i) => {
      const r = cat.ref(nums[i]!);
      return { id: r.id, label: r.label, degree: degree[i]! };
    })
    .sort((a, b) => b.degree - a.degree || byId(a, b))
    .slice(0, hubCount);
  const types = typeCounts(cat, typeNums);
  return {
    counts,
    degree: { min: nodes ? sorted[0]! : 0, median: nearestRank(sorted, 50), p99: nearestRank(sorted, 99), max: nodes ? sorted[nodes - 1]! : 0, mean: nodes ? sum / nodes : 0 },
    hubs,
    components: cc ? cc.components - (n - nodes) : null,
    largestComponent: cc ? cc.largest : null,
    isolated,
    types,
    relations: cat
      .predicates()
      .filter((p) => perRelation.has(p.num))
      .map((p) => ({ id: p.id, label: p.label, edges: perRelation.get(p.num)! }))
      .sort((a, b) => b.edges - a.edges || byId(a, b)),
    sharedNames: sharedNames(cat, options.sharedNames ?? DEFAULTS.sharedNames),
    emptyTypes: types.filter((t) => t.withSubtypes === 0).map((t) => ({ id: t.id, label: t.label })),
    ...(store ? { store: { endpoint: store.endpoint, graph: store.graph, attachedAt: store.attachedAt } } : {}),
  };
}

const byId = (a: { readonly id: string }, b: { readonly id: string }): number => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

/** Members of type `t`: direct, and of the type or any of its subtypes, transitively (distinct entities). */
export function typeMembers(cat: Catalog, t: number): { members: number; withSubtypes: number } {
  return membersOf(cat, t, childMap(cat));
}

function childMap(cat: Catalog): Map<number, number[]> {
  const children = new Map<number, number[]>();
  for (const [sub, sup] of cat.subclassPairs()) children.set(sup, [...(children.get(sup) ?? []), sub]);
  return children;
}

function membersOf(cat: Catalog, t: number, children: ReadonlyMap<number, readonly number[]>): { members: number; withSubtypes: number } {
  // the type and its subtypes, transitively (a cycle in the hierarchy is walked once)
  const seen = new Set<number>([t]);
  const stack = [t];
  while (stack.length > 0) {
    for (const c of children.get(stack.pop()!) ?? []) {
      if (seen.has(c)) continue;
      seen.add(c);
      stack.push(c);
    }
  }
  const members = cat.stmt("SELECT count(*) FROM entity_type WHERE type = ?").pluck().get(t) as number;
  const withSubtypes = seen.size === 1 ? members : (cat.stmt("SELECT count(DISTINCT entity) FROM entity_type WHERE type IN (SELECT value FROM json_each(?))").pluck().get(JSON.stringify([...seen])) as number);
  return { members, withSubtypes };
}

/** Members per type (see {@link typeMembers}). */
function typeCounts(cat: Catalog, typeNums: ReadonlySet<number>): TypeCount[] {
  const children = childMap(cat);
  const out: TypeCount[] = [];
  for (const t of typeNums) {
    const r = cat.ref(t);
    out.push({ id: r.id, label: r.label, ...membersOf(cat, t, children) });
  }
  return out.sort((a, b) => b.withSubtypes - a.withSubtypes || b.members - a.members || byId(a, b));
}

/** Names (normalised labels and aliases) that two or more entities carry: how many, and the most shared. */
function sharedNames(cat: Catalog, top: number): { count: number; top: SharedName[] } {
  const rows = cat.db
    .prepare("SELECT min(text) AS name, count(DISTINCT entity) AS n FROM alias WHERE norm <> '' GROUP BY norm HAVING count(DISTINCT entity) > 1 ORDER BY n DESC, norm")
    .all() as { name: string; n: number }[];
  return { count: rows.length, top: rows.slice(0, top).map((r) => ({ name: r.name, entities: r.n })) };
}

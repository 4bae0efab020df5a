/**
 * Compact relation index
 * ======================
 *
 * The catalog's relation edges as compressed sparse rows (CSR) over typed arrays, walkable in
 * both directions, plus each entity's direct types and the subtype hierarchy. Built once per
 * catalog (two passes over the edges: count, then fill; no per-edge objects) and shared by
 * every personalized PageRank variant, by the clue combination and by explain's path search.
 *
 * [Reference]: the CSR layout is common practice (e.g. Saad, "Iterative Methods for Sparse
 * Linear Systems", 2nd ed. 2003, §3.4); graphology's `src/indices/neighborhood.js` is the
 * same idea for one direction.
 *
 * Layout (node id = entity num, relation id = predicate num; node 0 is unused because SQLite
 * rowids start at 1; `n` = nodeCount = max entity num + 1; `m` = 2 × edgeCount entries):
 *
 * - `offsets: Uint32Array(n + 1)` — the adjacency entries of node u are `offsets[u] ..
 *   offsets[u + 1] - 1`; `degree(u) = offsets[u + 1] - offsets[u]` (both directions).
 * - `targets: Int32Array(m)` — the node at the other end of each entry.
 * - `links: Uint32Array(m)` — packed per entry:
 *     bit 0       inverse flag: 0 = the stored triple is `u rel target` (walked forwards),
 *                 1 = the stored triple is `target rel u` (walked against its direction);
 *     bits 1..31  the relation id (so relation ids must be < 2^31).
 *   Within a node, entries keep the order in which edges were given; a catalog's edges are
 *   given in (dst, rel, src) order (`Catalog.edges`, and index-builder.ts for a load), so the
 *   layout is deterministic. A self-loop `u rel u` gives two entries at u, one per direction.
 * - `typeOffsets: Uint32Array(n + 1)`, `typeList: Int32Array` — direct types of node u are
 *   `typeList[typeOffsets[u] .. typeOffsets[u + 1] - 1]`, ascending.
 * - `superOffsets: Uint32Array(n + 1)`, `superList: Int32Array` — direct supertypes of type t,
 *   same scheme (types are entities, so they share the node id space).
 *
 * The raw arrays never leave src/ranking: other stages use `forEach`, `degree`, `typesOf`,
 * `supertypesClosure` and `isA`; ranking's own hot loops use `csrOf` (not exported from
 * the stage's index).
 */
import type { RelationEnd, RelationEnds } from "../model/index.js";
import type { Catalog } from "../catalog/index.js";

/** The packed arrays of a {@link RelationIndex}. @internal */
export interface Csr {
  readonly nodeCount: number;
  readonly relationCount: number;
  readonly offsets: Uint32Array;
  readonly targets: Int32Array;
  readonly links: Uint32Array;
  readonly typeOffsets: Uint32Array;
  readonly typeList: Int32Array;
  readonly superOffsets: Uint32Array;
  readonly superList: Int32Array;
  /** Degrees to report instead of the row lengths (an attached store's own counts; rows hold only the pulled edges). */
  readonly degrees?: Int32Array;
}

/** A progress event of index building or snapshot handling. */
export interface IndexProgress {
  /** What is happening: "scan" (reading edges), "fill", "types", "snapshot-load", "snapshot-save", "snapshot-rejected". */
  readonly phase: string;
  /** Units done so far (edges, for "scan"). */
  readonly done?: number;
  /** Units in total, when known. */
  readonly total?: number;
  /** A human-readable note (e.g. why a snapshot was rejected). */
  readonly message?: string;
}

/** A callback receiving {@link IndexProgress} events. */
export type IndexProgressFn = (event: IndexProgress) => void;

const internals = new WeakMap<RelationIndex, Csr>();

/** The packed arrays of an index, for ranking's own hot loops. @internal */
export function csrOf(index: RelationIndex): Csr {
  const c = internals.get(index);
  if (!c) throw new TypeError("ranking/relation-index: not a RelationIndex");
  return c;
}

/** Growable Int32 buffer (amortised doubling), so a scan needs no per-edge objects. @internal */
export class IntBuffer {
  data: Int32Array;
  length = 0;
  constructor(capacity = 1024) {
    this.data = new Int32Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Int32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
}

function checkNode(name: string, v: number, nodeCount: number): void {
  if (!Number.isInteger(v) || v < 0 || v >= nodeCount) {
    throw new RangeError(`ranking/relation-index: ${name} ${v} is not a node id in 0..${nodeCount - 1}`);
  }
}

/** Builds a CSR from parallel (key, value) lists: rows of `key`, values in input order. */
function csrFromPairs(nodeCount: number, keys: Int32Array, values: Int32Array, count: number): { offsets: Uint32Array; list: Int32Array } {
  const offsets = new Uint32Array(nodeCount + 1);
  for (let i = 0; i < count; i++) offsets[keys[i]! + 1]!++;
  for (let u = 0; u < nodeCount; u++) offsets[u + 1]! += offsets[u]!;
  const cursor = offsets.slice(0, nodeCount);
  const list = new Int32Array(count);
  for (let i = 0; i < count; i++) list[cursor[keys[i]!]!++] = values[i]!;
  return { offsets, list };
}

/**
 * The compact, read-only relation index over a catalog's edges (both directions) and types.
 * Node ids are entity nums; relation ids are predicate nums.
 */
export class RelationIndex {
  /** Number of node ids (max entity num + 1; id 0 is unused in catalogs). */
  readonly nodeCount: number;
  /** Number of relation ids (max predicate num + 1). */
  readonly relationCount: number;
  /** Number of stored edges (each appears twice in the adjacency, once per direction). */
  readonly edgeCount: number;
  private readonly closureCache = new Map<number, readonly number[]>();
  /** The packed arrays (also reachable through csrOf for ranking's hot loops). */
  readonly #c: Csr;

  /** @internal use {@link RelationIndex.fromCatalog}, {@link RelationIndex.fromEdges} or `openIndex`. */
  constructor(csr: Csr) {
    this.nodeCount = csr.nodeCount;
    this.relationCount = csr.relationCount;
    this.edgeCount = csr.targets.length / 2;
    this.#c = csr;
    internals.set(this, csr);
  }

  /**
   * Stored edges per relation num (each edge counted once, from its source's entry): read
   * from the relation-end table's totals when it is at hand (a snapshot stores it), else
   * one pass over the adjacency entries (10 million at 5 million edges).
   */
  relationEdgeCounts(): Uint32Array {
    const counts = new Uint32Array(Math.max(this.relationCount, 1));
    const totals = this.#endTable?.totals;
    if (totals !== undefined && totals.length === 2 * counts.length) {
      for (let r = 0; r < counts.length; r++) counts[r] = totals[2 * r]!;
      return counts;
    }
    const links = this.#c.links;
    for (let e = 0; e < links.length; e++) {
      const l = links[e]!;
      if ((l & 1) === 0) counts[l >>> 1]!++;
    }
    return counts;
  }

  /**
   * Builds the index from a catalog: one streaming pass over its edges into flat typed
   * buffers, then a count pass and a fill pass into CSR; types and subtypes likewise.
   */
  static fromCatalog(cat: Catalog, onProgress?: IndexProgressFn): RelationIndex {
    const nodeCount = cat.maxEntityNum() + 1;
    const relationCount = cat.maxPredicateNum() + 1;
    const src = new IntBuffer(1 << 16);
    const rel = new IntBuffer(1 << 16);
    const dst = new IntBuffer(1 << 16);
    let n = 0;
    // (dst, rel, src) order: the canonical order of the fill (index-builder.ts sorts a load's edges the same way)
    for (const [s, r, d] of cat.edges()) {
      src.push(s);
      rel.push(r);
      dst.push(d);
      n++;
      if (onProgress && (n & 0xfffff) === 0) onProgress({ phase: "scan", done: n });
    }
    onProgress?.({ phase: "fill", done: n, total: n });
    onProgress?.({ phase: "types" });
    const te = new IntBuffer(1 << 12);
    const tt = new IntBuffer(1 << 12);
    for (const [e, t] of cat.entityTypePairs()) {
      te.push(e);
      tt.push(t);
    }
    const subs = cat.subclassPairs();
    const sk = new Int32Array(subs.length);
    const sv = new Int32Array(subs.length);
    subs.forEach(([a, b], i) => {
      sk[i] = a;
      sv[i] = b;
    });
    return RelationIndex.fromColumns(nodeCount, relationCount, { src: src.data, rel: rel.data, dst: dst.data, n }, { keys: te.data, values: tt.data, n: te.length }, { keys: sk, values: sv, n: subs.length });
  }

  /**
   * Builds the index from columns already in canonical order: edges by (dst, rel, src), type
   * pairs by (entity, type), subtype pairs by (sub, sup), without duplicates (as the catalog
   * yields them, and as index-builder.ts sorts a load's rows). @internal
   */
  static fromColumns(
    nodeCount: number,
    relationCount: number,
    edges: { readonly src: Int32Array; readonly rel: Int32Array; readonly dst: Int32Array; readonly n: number },
    types: { readonly keys: Int32Array; readonly values: Int32Array; readonly n: number },
    subclasses: { readonly keys: Int32Array; readonly values: Int32Array; readonly n: number },
  ): RelationIndex {
    const csr = buildCsr(nodeCount, relationCount, edges.src, edges.rel, edges.dst, edges.n);
    const t = csrFromPairs(nodeCount, types.keys, types.values, types.n);
    const sup = csrFromPairs(nodeCount, subclasses.keys, subclasses.values, subclasses.n);
    return new RelationIndex({ ...csr, typeOffsets: t.offsets, typeList: t.list, superOffsets: sup.offsets, superList: sup.list });
  }

  /**
   * An index over some of a graph's edges — the neighbourhood of a question pulled from a
   * SPARQL store (pipeline/store-edges.ts) — with `base`'s nodes, types and subtypes, whose
   * `degree(u)` (and so the walk's hub damping) is `degrees[u]`, the whole graph's count,
   * not the number of pulled entries. Edges are (src, rel, dst) nums, any order, no duplicates.
   */
  static withPulledEdges(base: RelationIndex, relationCount: number, edges: { readonly src: Int32Array; readonly rel: Int32Array; readonly dst: Int32Array; readonly n: number }, degrees: Int32Array): RelationIndex {
    const b = base.#c;
    if (degrees.length < base.nodeCount) throw new RangeError("ranking/relation-index: a degree per node is needed");
    for (let i = 0; i < edges.n; i++) {
      checkNode("edge source", edges.src[i]!, base.nodeCount);
      checkNode("edge target", edges.dst[i]!, base.nodeCount);
      if (!(edges.rel[i]! >= 0 && edges.rel[i]! < relationCount)) throw new RangeError(`ranking/relation-index: relation ${edges.rel[i]} is not in 0..${relationCount - 1}`);
    }
    const csr = buildCsr(base.nodeCount, relationCount, edges.src, edges.rel, edges.dst, edges.n);
    return new RelationIndex({ ...csr, typeOffsets: b.typeOffsets, typeList: b.typeList, superOffsets: b.superOffsets, superList: b.superList, degrees: degrees.subarray(0, base.nodeCount) });
  }

  /**
   * Builds an index from explicit edges `[src, rel, dst]` (for tests and benchmarks), with
   * optional direct types `[node, type]` and subtype pairs `[sub, sup]`.
   */
  static fromEdges(
    nodeCount: number,
    relationCount: number,
    edges: ArrayLike<readonly [number, number, number]>,
    types: ArrayLike<readonly [number, number]> = [],
    subclasses: ArrayLike<readonly [number, number]> = [],
  ): RelationIndex {
    if (!Number.isInteger(nodeCount) || nodeCount < 0) throw new RangeError(`ranking/relation-index: nodeCount must be a non-negative integer, got ${nodeCount}`);
    if (!Number.isInteger(relationCount) || relationCount < 0 || relationCount > 2 ** 31) {
      throw new RangeError(`ranking/relation-index: relationCount must be an integer in 0..2^31, got ${relationCount}`);
    }
    const m = edges.length;
    const s = new Int32Array(m);
    const r = new Int32Array(m);
    const d = new Int32Array(m);
    for (let i = 0; i < m; i++) {
      const e = edges[i]!;
      checkNode("edge source", e[0], nodeCount);
      checkNode("edge target", e[2], nodeCount);
      if (!Number.isInteger(e[1]) || e[1] < 0 || e[1] >= relationCount) throw new RangeError(`ranking/relation-index: relation ${e[1]} is not in 0..${relationCount - 1}`);
      s[i] = e[0];
      r[i] = e[1];
      d[i] = e[2];
    }
    const csr = buildCsr(nodeCount, relationCount, s, r, d, m);
    const pairs = (list: ArrayLike<readonly [number, number]>, what: string) => {
      const k = new Int32Array(list.length);
      const v = new Int32Array(list.length);
      for (let i = 0; i < list.length; i++) {
        checkNode(what, list[i]![0], nodeCount);
        checkNode(what, list[i]![1], nodeCount);
        k[i] = list[i]![0];
        v[i] = list[i]![1];
      }
      return csrFromPairs(nodeCount, k, v, list.length);
    };
    const t = pairs(types, "typed node");
    const sup = pairs(subclasses, "subtype");
    return new RelationIndex({ ...csr, typeOffsets: t.offsets, typeList: t.list, superOffsets: sup.offsets, superList: sup.list });
  }

  /** Number of adjacency entries at `u` (edges out plus edges in). */
  degree(u: number): number {
    const c = this.#c;
    if (!(u >= 0 && u < this.nodeCount)) return 0;
    return c.degrees ? c.degrees[u]! : c.offsets[u + 1]! - c.offsets[u]!;
  }

  /**
   * Calls `fn(v, rel, inverse)` for every adjacency entry of `u`, in index order.
   * `inverse` is true when the stored triple is `v rel u`.
   */
  forEach(u: number, fn: (v: number, rel: number, inverse: boolean) => void): void {
    const c = this.#c;
    if (!(u >= 0 && u < this.nodeCount)) return;
    const end = c.offsets[u + 1]!;
    for (let e = c.offsets[u]!; e < end; e++) {
      const l = c.links[e]!;
      fn(c.targets[e]!, l >>> 1, (l & 1) === 1);
    }
  }

  /** Direct type nums of node `u`, ascending. */
  typesOf(u: number): readonly number[] {
    const c = this.#c;
    if (!(u >= 0 && u < this.nodeCount)) return [];
    return Array.from(c.typeList.subarray(c.typeOffsets[u]!, c.typeOffsets[u + 1]!));
  }

  /** Type `t` and all its supertypes (transitively, cycles tolerated), ascending. */
  supertypesClosure(t: number): readonly number[] {
    const hit = this.closureCache.get(t);
    if (hit) return hit;
    const c = this.#c;
    const seen = new Set<number>([t]);
    const stack = [t];
    while (stack.length > 0) {
      const x = stack.pop()!;
      if (!(x >= 0 && x < this.nodeCount)) continue;
      for (let i = c.superOffsets[x]!; i < c.superOffsets[x + 1]!; i++) {
        const p = c.superList[i]!;
        if (!seen.has(p)) {
          seen.add(p);
          stack.push(p);
        }
      }
    }
    const out = Object.freeze([...seen].sort((a, b) => a - b));
    this.closureCache.set(t, out);
    return out;
  }

  #ends: RelationEnds | undefined;
  #endTable: RelationEndTable | undefined;

  /**
   * The direct types found at each end of each relation, with counts ({@link endTable}),
   * grouped for lookup. Used to type the answer of a question whose head noun names a
   * relation ("what is the *capital* of …": the types at the far end of `capital`).
   */
  relationEnds(): RelationEnds {
    if (this.#ends) return this.#ends;
    const t = this.endTable();
    const R = t.totals.length / 2;
    const out: RelationEnd[][] = Array.from({ length: R * 2 }, () => []);
    for (let i = 0; i < t.keys.length; i++) out[t.keys[i]!]!.push({ type: t.types[i]!, count: t.counts[i]! });
    const ends: RelationEnds = {
      types: (rel, object) => (rel >= 0 && rel < R ? out[rel * 2 + (object ? 1 : 0)]! : []),
      edges: (rel) => (rel >= 0 && rel < R ? t.totals[rel * 2]! : 0),
    };
    this.#ends = ends;
    return ends;
  }

  /**
   * The flat table behind {@link relationEnds}: one pass over the adjacency entries (each
   * stored edge is seen once from each end), counting the direct types of the node at that
   * end; computed on first use (≈ 0.2 s at 10 million entries) unless a snapshot supplied it.
   * @internal (snapshot.ts stores it)
   */
  endTable(): RelationEndTable {
    if (this.#endTable) return this.#endTable;
    const c = this.#c;
    const n = this.nodeCount;
    const R = Math.max(c.relationCount, 1);
    const slotOf = new Map<number, number>();
    const typeNums: number[] = [];
    for (let i = 0; i < c.typeList.length; i++) {
      const t = c.typeList[i]!;
      if (!slotOf.has(t)) {
        slotOf.set(t, typeNums.length);
        typeNums.push(t);
      }
    }
    const T = Math.max(typeNums.length, 1);
    const cells = R * 2 * T;
    const dense = cells <= 8_000_000 ? new Float64Array(cells) : null;
    const sparse = dense ? null : new Map<number, number>();
    const totals = new Float64Array(R * 2);
    const slots: number[] = [];
    for (let u = 0; u < n; u++) {
      const start = c.offsets[u]!;
      const end = c.offsets[u + 1]!;
      if (start === end) continue;
      // links = rel·2 + (1 when u is the stored object): the end u stands at
      for (let e = start; e < end; e++) totals[c.links[e]!]!++;
      const t0 = c.typeOffsets[u]!;
      const t1 = c.typeOffsets[u + 1]!;
      if (t0 === t1) continue;
      slots.length = 0;
      for (let i = t0; i < t1; i++) slots.push(slotOf.get(c.typeList[i]!)!);
      for (let e = start; e < end; e++) {
        const base = c.links[e]! * T;
        for (const sl of slots) {
          if (dense) dense[base + sl]!++;
          else sparse!.set(base + sl, (sparse!.get(base + sl) ?? 0) + 1);
        }
      }
    }
    const rows: [number, number, number][] = [];
    if (dense) {
      for (let i = 0; i < dense.length; i++) if (dense[i]! > 0) rows.push([Math.floor(i / T), typeNums[i % T]!, dense[i]!]);
    } else for (const [cell, count] of sparse!) rows.push([Math.floor(cell / T), typeNums[cell % T]!, count]);
    rows.sort((a, b) => a[0] - b[0] || b[2] - a[2] || a[1] - b[1]);
    const table: RelationEndTable = {
      totals,
      keys: Int32Array.from(rows, (r) => r[0]),
      types: Int32Array.from(rows, (r) => r[1]),
      counts: Float64Array.from(rows, (r) => r[2]),
    };
    this.#endTable = table;
    return table;
  }

  /** Adopts a table read from a snapshot (its shape checked by the caller). @internal */
  adoptEndTable(table: RelationEndTable): void {
    this.#endTable = table;
    this.#ends = undefined;
  }

  /**
   * Every node that {@link isA} one of `typeSet` (the types themselves left out), ascending:
   * each type of the catalog judged once, then one pass over the direct-type lists. `stop`
   * is asked every 4,096 nodes; when it says so the nodes found so far are returned with
   * `cut` (how far the pass got).
   */
  membersOf(typeSet: ReadonlySet<number>, stop?: () => boolean): { readonly nodes: number[]; readonly cut?: number } {
    const c = this.#c;
    const n = this.nodeCount;
    const typeOffsets = c.typeOffsets;
    const typeList = c.typeList;
    // per node num: bits 0–1 the judgement of it as a type (0 not judged yet, 1 in the set's
    // closure, 2 not), bit 2 when it is in the set itself (left out); the pass below reads
    // typed arrays only (it runs once per question that needs it, often before the engine has compiled it)
    const flags = new Uint8Array(n);
    for (const t of typeSet) if (t >= 0 && t < n) flags[t] = 4;
    const nodes: number[] = [];
    for (let u = 0; u < n; u++) {
      if ((u & 4095) === 0 && u > 0 && stop !== undefined && stop()) return { nodes, cut: u };
      const from = typeOffsets[u]!;
      const to = typeOffsets[u + 1]!;
      if (from === to || (flags[u]! & 4) !== 0) continue;
      for (let i = from; i < to; i++) {
        const t = typeList[i]!;
        let j = t >= 0 && t < n ? flags[t]! & 3 : 0;
        if (j === 0) {
          j = this.supertypesClosure(t).some((x) => typeSet.has(x)) ? 1 : 2;
          if (t >= 0 && t < n) flags[t] = flags[t]! | j;
        }
        if (j === 1) {
          nodes.push(u);
          break;
        }
      }
    }
    return { nodes };
  }


  /**
   * {@link isA} for one `typeSet`, as a function that keeps its answer per direct type (a
   * ranking asks about thousands of nodes of a few types).
   */
  isATest(typeSet: ReadonlySet<number>): (u: number) => boolean {
    const c = this.#c;
    const memo = new Map<number, boolean>();
    return (u) => {
      if (!(u >= 0 && u < this.nodeCount)) return false;
      for (let i = c.typeOffsets[u]!; i < c.typeOffsets[u + 1]!; i++) {
        const t = c.typeList[i]!;
        let ok = memo.get(t);
        if (ok === undefined) {
          ok = false;
          const closure = this.supertypesClosure(t);
          for (let k = 0; k < closure.length && !ok; k++) ok = typeSet.has(closure[k]!);
          memo.set(t, ok);
        }
        if (ok) return true;
      }
      return false;
    };
  }

  /** True when one of `u`'s direct types, or one of their supertypes, is in `typeSet`. */
  isA(u: number, typeSet: ReadonlySet<number>): boolean {
    const c = this.#c;
    if (!(u >= 0 && u < this.nodeCount)) return false;
    for (let i = c.typeOffsets[u]!; i < c.typeOffsets[u + 1]!; i++) {
      const closure = this.supertypesClosure(c.typeList[i]!);
      for (let k = 0; k < closure.length; k++) if (typeSet.has(closure[k]!)) return true;
    }
    return false;
  }
}

/**
 * Flat form of {@link RelationEnds}: `totals[rel·2 + end]` adjacency entries per relation end
 * (end 0 = subject, 1 = object); rows (`keys[i]` = rel·2 + end, `types[i]`, `counts[i]`)
 * sorted by key, then count descending, then type.
 */
export interface RelationEndTable {
  readonly totals: Float64Array;
  readonly keys: Int32Array;
  readonly types: Int32Array;
  readonly counts: Float64Array;
}

/** Count pass then fill pass over flat (src, rel, dst) buffers. */
function buildCsr(nodeCount: number, relationCount: number, src: Int32Array, rel: Int32Array, dst: Int32Array, n: number) {
  const offsets = new Uint32Array(nodeCount + 1);
  for (let i = 0; i < n; i++) {
    offsets[src[i]! + 1]!++;
    offsets[dst[i]! + 1]!++;
  }
  for (let u = 0; u < nodeCount; u++) offsets[u + 1]! += offsets[u]!;
  const cursor = offsets.slice(0, nodeCount);
  const targets = new Int32Array(2 * n);
  const links = new Uint32Array(2 * n);
  for (let i = 0; i < n; i++) {
    const s = src[i]!;
    const d = dst[i]!;
    const r = rel[i]! * 2;
    const a = cursor[s]!++;
    targets[a] = d;
    links[a] = r;
    const b = cursor[d]!++;
    targets[b] = s;
    links[b] = r + 1;
  }
  return { nodeCount, relationCount, offsets, targets, links };
}

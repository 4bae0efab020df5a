/**
 * Relation index from a stream of edges
 * =====================================
 *
 * Collects relation edges, direct types and subtype pairs as a load writes them (in any
 * order, duplicates allowed), then puts them into the one canonical order the relation
 * index is built in — edges by (dst, rel, src), type pairs by (entity, type), subtype pairs
 * by (sub, sup), each without duplicates — by least-significant-digit radix sort (one stable
 * counting sort per column, last column first), and hands them to the same CSR fill as
 * {@link RelationIndex.fromCatalog}. Whatever order the rows arrived in, the index is the
 * same, byte for byte, as one built by reading the finished catalog back.
 *
 * Entities removed at the end of a load (with their edges, types and aliases) are dropped
 * before the build.
 *
 * [Reference]: LSD radix sort with counting sort per digit, Knuth, The Art of Computer
 * Programming vol. 3, section 5.2.5 (the counting sort of one digit: Algorithm 5.2D).
 */
import { IntBuffer, RelationIndex } from "./relation-index.js";

const view = (b: IntBuffer) => b.data.subarray(0, b.length);

/**
 * The permutation that sorts rows `0 … n-1` by `columns[0]`, then `columns[1]`, … (all values
 * in `0 … range - 1`), stable: one counting-sort pass per column, last column first.
 */
export function radixOrder(columns: readonly Int32Array[], n: number, range: number): Int32Array {
  let order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  let next = new Int32Array(n);
  const counts = new Uint32Array(range + 1);
  for (let c = columns.length - 1; c >= 0; c--) {
    const key = columns[c]!;
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[key[i]! + 1]!++;
    for (let k = 0; k < range; k++) counts[k + 1]! += counts[k]!;
    for (let i = 0; i < n; i++) {
      const row = order[i]!;
      next[counts[key[row]!]!++] = row;
    }
    const t = order;
    order = next;
    next = t;
  }
  return order;
}

/** Sorted distinct rows as compact columns. */
type Sorted = { cols: Int32Array[]; n: number };

/** The rows of `sorted` for which `keepRow` holds, in order, compacted in place. */
function keep(sorted: Sorted, keepRow: (cols: readonly Int32Array[], row: number) => boolean): Sorted {
  const cols = sorted.cols;
  let w = 0;
  for (let i = 0; i < sorted.n; i++) {
    if (!keepRow(cols, i)) continue;
    if (w !== i) for (const col of cols) col[w] = col[i]!;
    w++;
  }
  return { cols: cols.map((col) => col.subarray(0, w)), n: w };
}

/**
 * Rows of `columns` in sorted order without duplicates and without rows whose `dropWhere`
 * columns hold a dropped node: new compact columns and their length.
 */
function sortedUnique(columns: readonly Int32Array[], n: number, range: number, drop: (row: number) => boolean): Sorted {
  const order = radixOrder(columns, n, range);
  const cols = columns.map(() => new Int32Array(n));
  let w = 0;
  for (let i = 0; i < n; i++) {
    const row = order[i]!;
    if (drop(row)) continue;
    if (w > 0) {
      let same = true;
      for (let c = 0; c < columns.length && same; c++) same = cols[c]![w - 1] === columns[c]![row];
      if (same) continue;
    }
    for (let c = 0; c < columns.length; c++) cols[c]![w] = columns[c]![row]!;
    w++;
  }
  return { cols: cols.map((col) => col.subarray(0, w)), n: w };
}

/** Collects a load's edges, types and subtype pairs; builds the relation index at the end. */
export class IndexBuilder {
  private readonly src = new IntBuffer(1 << 16);
  private readonly rel = new IntBuffer(1 << 16);
  private readonly dst = new IntBuffer(1 << 16);
  private readonly typed = new IntBuffer(1 << 12);
  private readonly type_ = new IntBuffer(1 << 12);
  private readonly sub = new IntBuffer(1 << 12);
  private readonly sup = new IntBuffer(1 << 12);
  private readonly removed = new Set<number>();
  private maxNode = 0;
  private maxRel = 0;
  /** Rows sorted ahead of `build` ({@link IndexBuilder.presort}) and the row counts they cover. */
  private presorted: { rows: readonly number[]; edges: Sorted; types: Sorted; subs: Sorted } | undefined;

  /** A relation edge `src rel dst` (entity and predicate nums). */
  edge(src: number, rel: number, dst: number): void {
    this.src.push(src);
    this.rel.push(rel);
    this.dst.push(dst);
    if (src > this.maxNode) this.maxNode = src;
    if (dst > this.maxNode) this.maxNode = dst;
    if (rel > this.maxRel) this.maxRel = rel;
  }

  /** A direct type: `entity rdf:type type`. */
  type(entity: number, type: number): void {
    this.typed.push(entity);
    this.type_.push(type);
    if (entity > this.maxNode) this.maxNode = entity;
    if (type > this.maxNode) this.maxNode = type;
  }

  /** A subtype pair: `sub rdfs:subClassOf sup`. */
  subclass(sub: number, sup: number): void {
    this.sub.push(sub);
    this.sup.push(sup);
    if (sub > this.maxNode) this.maxNode = sub;
    if (sup > this.maxNode) this.maxNode = sup;
  }

  /** An entity removed from the catalog, with every edge at it and its types. */
  remove(entity: number): void {
    this.removed.add(entity);
  }

  /**
   * Sorts the rows collected so far, before the entities a load removes at its end are known
   * (a load's second thread does this while SQLite builds its own indexes); `build` then only
   * drops the removed entities' rows from the sorted columns — the same rows in the same
   * order, since dropping a row and dropping its duplicates commute with sorting — unless
   * more rows arrived after.
   */
  presort(): void {
    const range = Math.max(this.maxNode, this.maxRel) + 1;
    const none = () => false;
    this.presorted = {
      rows: this.counts(),
      edges: sortedUnique([view(this.dst), view(this.rel), view(this.src)], this.src.length, range, none),
      types: sortedUnique([view(this.typed), view(this.type_)], this.typed.length, range, none),
      subs: sortedUnique([view(this.sub), view(this.sup)], this.sub.length, range, none),
    };
  }

  private counts(): number[] {
    return [this.src.length, this.typed.length, this.sub.length];
  }

  /** Which of `nums` appear in a row collected so far (an edge at either end, a type row on either side, a subtype pair): one pass over the rows. */
  touches(nums: readonly number[]): boolean[] {
    const mark = new Uint8Array(Math.max(this.maxNode, 0) + 1);
    for (const v of nums) if (v >= 0 && v < mark.length) mark[v] = 1;
    const hit = new Uint8Array(mark.length);
    for (const col of [this.src, this.dst, this.typed, this.type_, this.sub, this.sup]) {
      const data = view(col);
      for (let i = 0; i < data.length; i++) if (mark[data[i]!] === 1) hit[data[i]!] = 1;
    }
    return nums.map((v) => v >= 0 && v < hit.length && hit[v] === 1);
  }

  /** Edge rows collected so far (duplicates included). */
  get edgeRows(): number {
    return this.src.length;
  }

  /**
   * The relation index over everything collected, for a catalog whose largest entity num is
   * `maxEntity` and largest predicate num `maxPredicate` (both read from the finished catalog).
   * Also returns the number of distinct edges kept (to check against the catalog's row count).
   */
  build(maxEntity: number, maxPredicate: number): { index: RelationIndex; edges: number } {
    const nodeCount = maxEntity + 1;
    const relationCount = maxPredicate + 1;
    const range = Math.max(this.maxNode, this.maxRel) + 1;
    const gone = this.removed;
    const p = this.presorted;
    this.presorted = undefined;
    let edges: Sorted, types: Sorted, subs: Sorted;
    if (p !== undefined && p.rows.every((k, i) => k === this.counts()[i])) {
      // (dst, rel, src): an edge goes with either end; a type row with its entity (a byte per num: no set lookup per row)
      const mark = new Uint8Array(range);
      for (const e of gone) if (e >= 0 && e < range) mark[e] = 1;
      edges = gone.size === 0 ? p.edges : keep(p.edges, (c, i) => mark[c[0]![i]!] === 0 && mark[c[2]![i]!] === 0);
      types = gone.size === 0 ? p.types : keep(p.types, (c, i) => mark[c[0]![i]!] === 0);
      subs = p.subs;
    } else {
      const s = view(this.src);
      const d = view(this.dst);
      edges = sortedUnique([d, view(this.rel), s], this.src.length, range, gone.size === 0 ? () => false : (i) => gone.has(s[i]!) || gone.has(d[i]!));
      const te = view(this.typed);
      types = sortedUnique([te, view(this.type_)], this.typed.length, range, gone.size === 0 ? () => false : (i) => gone.has(te[i]!));
      subs = sortedUnique([view(this.sub), view(this.sup)], this.sub.length, range, () => false);
    }
    const [ed, er, es] = edges.cols as [Int32Array, Int32Array, Int32Array];
    // removed entities may hold the largest nums: what is kept must fit the finished catalog
    const beyond = (col: Int32Array, limit: number) => {
      for (let i = 0; i < col.length; i++) if (col[i]! >= limit) return true;
      return false;
    };
    if (beyond(ed, nodeCount) || beyond(es, nodeCount) || beyond(er, relationCount) || types.cols.some((c) => beyond(c, nodeCount)) || subs.cols.some((c) => beyond(c, nodeCount))) {
      throw new RangeError(`ranking/index-builder: the rows name entities or predicates beyond the catalog's largest nums (${maxEntity}, ${maxPredicate})`);
    }
    const index = RelationIndex.fromColumns(nodeCount, relationCount, { src: es, rel: er, dst: ed, n: edges.n }, { keys: types.cols[0]!, values: types.cols[1]!, n: types.n }, { keys: subs.cols[0]!, values: subs.cols[1]!, n: subs.n });
    return { index, edges: edges.n };
  }
}

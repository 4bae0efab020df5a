/**
 * Numeric attribute columns: the numbers of one attribute predicate for every entity that
 * has them, read from the catalog with ONE statement and kept as a compressed sparse row
 * (CSR) column — sorted entity nums, row offsets and a Float64Array of values, each row
 * smallest first — so that conditions over thousands of candidates cost one binary search
 * per candidate instead of one SQL statement each.
 *
 * Method: the compressed sparse row layout (Y. Saad, "Iterative Methods for Sparse Linear
 * Systems", 2nd ed., SIAM 2003, §3.4 "Storage schemes") applied to the entity × value
 * relation of one predicate, with the row lookup by binary search over the sorted entity
 * nums (Knuth, TAOCP vol. 3, §6.2.1, algorithm B). The rows are read through the index
 * `attribute_by_predicate (predicate, num)` (the bound column leads; see the query-plan test
 * test/query-plans.test.ts) and ordered by a counting sort on entity in memory, which
 * keeps each row's index order (smallest value first).
 */
import type { Catalog } from "./store.js";

/** The numbers of one attribute predicate, by entity (CSR). */
export class NumericColumn {
  /** Entity nums that carry the attribute, ascending. */
  readonly entities: Int32Array;
  /** Row `i` is `values[offsets[i] .. offsets[i+1])`. */
  readonly offsets: Int32Array;
  /** All values, each row smallest first. */
  readonly values: Float64Array;

  constructor(entities: Int32Array, offsets: Int32Array, values: Float64Array) {
    this.entities = entities;
    this.offsets = offsets;
    this.values = values;
  }

  /** Builds the column from (entity, value) pairs given in ascending value order. */
  static fromPairs(entity: Int32Array, value: Float64Array): NumericColumn {
    const n = entity.length;
    // distinct entities, ascending
    const sorted = Int32Array.from(entity).sort();
    let distinct = 0;
    for (let i = 0; i < n; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) sorted[distinct++] = sorted[i]!;
    const entities = sorted.slice(0, distinct);
    const offsets = new Int32Array(distinct + 1);
    const rowOf = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const r = rowIndex(entities, entity[i]!);
      rowOf[i] = r;
      offsets[r + 1]!++;
    }
    for (let r = 0; r < distinct; r++) offsets[r + 1]! += offsets[r]!;
    // counting sort by row, stable: each row keeps the input (ascending value) order
    const fill = offsets.slice(0, distinct);
    const values = new Float64Array(n);
    for (let i = 0; i < n; i++) values[fill[rowOf[i]!]!++] = value[i]!;
    return new NumericColumn(entities, offsets, values);
  }

  /** The values of `entity`, smallest first (empty when it has none). */
  of(entity: number): Float64Array {
    const r = rowIndex(this.entities, entity);
    return r < 0 ? EMPTY : this.values.subarray(this.offsets[r]!, this.offsets[r + 1]!);
  }

  /** The values of `entity` as a plain array (made once per row and kept; a shared empty one for none). */
  list(entity: number): readonly number[] {
    const r = rowIndex(this.entities, entity);
    if (r < 0) return NONE;
    const rows = (this.rows ??= new Array<readonly number[] | undefined>(this.entities.length));
    let row = rows[r];
    if (row === undefined) {
      const out: number[] = [];
      for (let k = this.offsets[r]!; k < this.offsets[r + 1]!; k++) out.push(this.values[k]!);
      rows[r] = row = out;
    }
    return row;
  }

  private rows?: (readonly number[] | undefined)[];

  /** Entities carrying the attribute. */
  get size(): number {
    return this.entities.length;
  }
}

const EMPTY = new Float64Array(0);
const NONE: readonly number[] = Object.freeze([]);

/** Binary search: the position of `x` in ascending `a`, or -1. */
export function rowIndex(a: Int32Array, x: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const v = a[mid]!;
    if (v < x) lo = mid + 1;
    else if (v > x) hi = mid - 1;
    else return mid;
  }
  return -1;
}

/** Reads one predicate's numbers with one statement (index order: smallest value first). */
export function readNumericColumn(cat: Catalog, predicate: number): NumericColumn {
  const rows = cat.stmt("SELECT entity, num FROM attribute WHERE predicate = ? AND num IS NOT NULL ORDER BY num").raw(true).all(predicate) as [number, number][];
  const entity = new Int32Array(rows.length);
  const value = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    entity[i] = rows[i]![0];
    value[i] = rows[i]![1];
  }
  return NumericColumn.fromPairs(entity, value);
}

/**
 * The columns of a catalog, each read on first use and kept: for one read snapshot (a
 * session's read transaction), so the values cannot change underneath.
 */
export class NumericColumns {
  private readonly cat: Catalog;
  private readonly columns = new Map<number, NumericColumn>();

  constructor(cat: Catalog) {
    this.cat = cat;
  }

  /** The column of `predicate` (read now when not yet read). */
  column(predicate: number): NumericColumn {
    let c = this.columns.get(predicate);
    if (c === undefined) {
      c = readNumericColumn(this.cat, predicate);
      this.columns.set(predicate, c);
    }
    return c;
  }

  /** The values of `predicate` on `entity`, smallest first (a kept array: do not change it). */
  numbers(entity: number, predicate: number): readonly number[] {
    return this.column(predicate).list(entity);
  }
}

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
import { closeSync, openSync, readSync, renameSync, rmSync, writeFileSync } from "node:fs";
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

/** The statement of {@link readNumericColumn} (test/query-plans.test.ts checks its plan). */
export const NUMERIC_COLUMN_SQL = "SELECT entity, num FROM attribute WHERE predicate = ? AND num IS NOT NULL ORDER BY num";

/** Reads one predicate's numbers with one statement (index order: smallest value first). */
export function readNumericColumn(cat: Catalog, predicate: number): NumericColumn {
  const rows = cat.stmt(NUMERIC_COLUMN_SQL).raw(true).all(predicate) as [number, number][];
  return columnOfRows(rows, 0, rows.length);
}

/** The column of rows [from, to) of (entity, num) rows in ascending num order. */
function columnOfRows(rows: readonly (readonly number[])[], from: number, to: number, at = 0): NumericColumn {
  const entity = new Int32Array(to - from);
  const value = new Float64Array(to - from);
  for (let i = from; i < to; i++) {
    entity[i - from] = rows[i]![at]!;
    value[i - from] = rows[i]![at + 1]!;
  }
  return NumericColumn.fromPairs(entity, value);
}

/** Every numeric predicate's column with one statement (the same index, in (predicate, num) order). */
export function readAllNumericColumns(cat: Catalog): Map<number, NumericColumn> {
  const rows = cat.stmt("SELECT predicate, entity, num FROM attribute WHERE num IS NOT NULL ORDER BY predicate, num").raw(true).all() as [number, number, number][];
  const out = new Map<number, NumericColumn>();
  for (let i = 0; i < rows.length; ) {
    let j = i;
    while (j < rows.length && rows[j]![0] === rows[i]![0]) j++;
    out.set(rows[i]![0], columnOfRows(rows, i, j, 1));
    i = j;
  }
  return out;
}

/** Format tag of the columns file. */
const MAGIC = "tiepoint-num-1";

/** The columns file beside a catalog file. */
export function numericColumnsPath(catalogPath: string): string {
  return `${catalogPath}.num`;
}

/** The columns file's header: the catalog stamp, and per predicate its three sections' byte ranges (after the header). */
interface ColumnsHeader {
  magic: string;
  uid: string;
  generation: number;
  columns: Record<string, { entities: [number, number]; offsets: [number, number]; values: [number, number] }>;
}

/**
 * Writes every numeric column of the catalog to a temporary file beside `PATH.num` and returns
 * its name (the caller renames it into place, or deletes it): an 8-byte length, the JSON
 * header, then each column's entities, offsets and values, each section starting at a multiple
 * of 8 bytes, so a question reads one column with one read and views it without copying.
 */
export function writeNumericColumnsTemp(cat: Catalog, catalogPath: string, stamp: { readonly uid: string; readonly generation: number }, columns: ReadonlyMap<number, NumericColumn> = readAllNumericColumns(cat)): string {
  const parts: Buffer[] = [];
  const header: ColumnsHeader = { magic: MAGIC, uid: stamp.uid, generation: stamp.generation, columns: {} };
  let at = 0;
  const put = (a: Int32Array | Float64Array): [number, number] => {
    const b = Buffer.from(a.buffer, a.byteOffset, a.byteLength);
    const range: [number, number] = [at, b.length];
    parts.push(b);
    const pad = (8 - (b.length % 8)) % 8;
    if (pad > 0) parts.push(Buffer.alloc(pad));
    at += b.length + pad;
    return range;
  };
  for (const [p, c] of [...columns].sort((x, y) => x[0] - y[0])) header.columns[String(p)] = { entities: put(c.entities), offsets: put(c.offsets), values: put(c.values) };
  const head = Buffer.from(JSON.stringify(header), "utf8");
  const lead = Buffer.alloc(8);
  lead.writeUInt32LE(head.length, 0);
  const headPad = Buffer.alloc((8 - ((8 + head.length) % 8)) % 8);
  const tmp = `${numericColumnsPath(catalogPath)}.${process.pid}.tmp`;
  try {
    writeFileSync(tmp, Buffer.concat([lead, head, headPad, ...parts]));
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
  return tmp;
}

/** `length` bytes from `position` of an open file, in a buffer of their own (offset 0, so typed views are aligned). */
function readAt(fd: number, position: number, length: number): Buffer {
  const bytes = new Uint8Array(new ArrayBuffer(length));
  for (let off = 0; off < length; ) {
    const got = readSync(fd, bytes, off, length - off, position + off);
    if (got === 0) throw new RangeError("catalog/numeric-column: file ended early");
    off += got;
  }
  return Buffer.from(bytes.buffer, 0, length);
}

/**
 * The columns of a catalog, each read on first use and kept: for one read snapshot (a
 * session's read transaction), so the values cannot change underneath. A column comes from
 * the columns file `PATH.num` written with the load (one read of its three sections) when the
 * file carries the catalog's stamp; otherwise from the catalog, and the file is written then
 * (best effort) so later sessions open it.
 */
export class NumericColumns {
  private readonly cat: Catalog;
  private readonly columns = new Map<number, NumericColumn>();
  private file: { readonly path: string; readonly header: ColumnsHeader; readonly base: number } | undefined;

  constructor(cat: Catalog) {
    this.cat = cat;
  }

  /**
   * Opens the catalog's columns: reads the header of `PATH.num` when it carries the catalog's
   * stamp; otherwise (a catalog loaded without preparation, or changed by a later load) reads
   * every column from the catalog and tries to save the file for the next session.
   */
  static open(cat: Catalog): NumericColumns {
    const cols = new NumericColumns(cat);
    if (cat.path === ":memory:" || cat.path === "") return cols;
    const path = numericColumnsPath(cat.path);
    const { uid, generation } = cat.version();
    try {
      const fd = openSync(path, "r");
      try {
        const hl = readAt(fd, 0, 8).readUInt32LE(0);
        const header = JSON.parse(readAt(fd, 8, hl).toString("utf8")) as ColumnsHeader;
        if (header.magic === MAGIC && header.uid === uid && header.generation === generation) {
          cols.file = { path, header, base: 8 + hl + ((8 - ((8 + hl) % 8)) % 8) };
          return cols;
        }
      } finally {
        closeSync(fd);
      }
    } catch {
      /* absent or damaged: made below */
    }
    const all = readAllNumericColumns(cat);
    for (const [p, c] of all) cols.columns.set(p, c);
    try {
      renameSync(writeNumericColumnsTemp(cat, cat.path, { uid, generation }, all), path);
    } catch {
      /* a read-only folder: the columns stay in memory */
    }
    return cols;
  }

  /** The column of `predicate` (read now when not yet read). */
  column(predicate: number): NumericColumn {
    let c = this.columns.get(predicate);
    if (c === undefined) {
      c = this.fromFile(predicate) ?? readNumericColumn(this.cat, predicate);
      this.columns.set(predicate, c);
    }
    return c;
  }

  /** The column from the file (a predicate the file lacks has no numbers: an empty column); undefined when the file cannot be read. */
  private fromFile(predicate: number): NumericColumn | undefined {
    if (!this.file) return undefined;
    const entry = this.file.header.columns[String(predicate)];
    if (!entry) return EMPTY_COLUMN;
    let fd: number | undefined;
    try {
      fd = openSync(this.file.path, "r");
      const from = entry.entities[0];
      const to = entry.values[0] + entry.values[1];
      const buf = readAt(fd, this.file.base + from, to - from);
      const view = (r: [number, number]) => buf.subarray(r[0] - from, r[0] - from + r[1]);
      const e = view(entry.entities);
      const o = view(entry.offsets);
      const v = view(entry.values);
      return new NumericColumn(new Int32Array(e.buffer, e.byteOffset, e.length / 4), new Int32Array(o.buffer, o.byteOffset, o.length / 4), new Float64Array(v.buffer, v.byteOffset, v.length / 8));
    } catch {
      this.file = undefined; // replaced or damaged since the header was read: the catalog is read instead
      return undefined;
    } finally {
      if (fd !== undefined) closeSync(fd);
    }
  }

  /** The values of `predicate` on `entity`, smallest first (a kept array: do not change it). */
  numbers(entity: number, predicate: number): readonly number[] {
    return this.column(predicate).list(entity);
  }
}

const EMPTY_COLUMN = new NumericColumn(new Int32Array(0), new Int32Array(1), new Float64Array(0));

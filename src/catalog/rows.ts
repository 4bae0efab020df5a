/**
 * Buffered bulk insertion for a load: rows are collected in memory and written by multi-row
 * `INSERT … VALUES (…), (…), …` statements (SQLite's multi-row VALUES clause: one statement
 * execution per `rows` rows instead of one per row), and edges are sorted by the leading
 * column of their primary key before they are written, so that the WITHOUT ROWID B-tree is
 * filled in key order instead of at random leaves — bulk loading from sorted input (Graefe,
 * "Modern B-Tree Techniques", Foundations and Trends in Databases 3(4), 2011).
 *
 * Neither changes what is stored: `INSERT OR IGNORE` of a set of rows gives the same table
 * whatever the order, and a buffer is written before anything reads its table (the writer
 * calls `flush`).
 */
import type Database from "better-sqlite3";

/** Buffer sizes; all optional. */
export const DEFAULTS = {
  /** Rows per multi-row INSERT statement (SQLite allows 32,766 bound parameters). */
  rowsPerInsert: 128,
  /** Edges sorted and written together (at most 2^20). */
  edgeSortRows: 1 << 18,
};

/** Rows of one table, written `rows` per statement. */
export class RowBatch {
  private readonly many: Database.Statement;
  private readonly one: Database.Statement;
  private readonly width: number;
  private readonly values: unknown[] = [];
  private readonly full: number;
  /** Rows inserted so far (ignored duplicates not counted). */
  changes = 0;

  /**
   * @param head the statement up to `VALUES`, e.g. `INSERT OR IGNORE INTO t(a, b)`
   * @param width the number of columns named in `head`
   */
  constructor(db: Database.Database, head: string, width: number, rows = DEFAULTS.rowsPerInsert) {
    const tuple = `(${Array(width).fill("?").join(", ")})`;
    this.one = db.prepare(`${head} VALUES ${tuple}`);
    this.many = db.prepare(`${head} VALUES ${Array(rows).fill(tuple).join(", ")}`);
    this.width = width;
    this.full = width * rows;
  }

  /** Adds one row (`width` values); writes the batch when it is full. */
  add(...row: unknown[]): void {
    const v = this.values;
    for (let i = 0; i < row.length; i++) v.push(row[i]);
    if (v.length === this.full) {
      this.changes += this.many.run(v).changes;
      v.length = 0;
    }
  }

  /** Writes the rows still buffered. */
  flush(): void {
    const v = this.values;
    const w = this.width;
    for (let i = 0; i < v.length; i += w) this.changes += this.one.run(v.slice(i, i + w)).changes;
    v.length = 0;
  }

  /** Drops the buffered rows (after a rollback). */
  discard(): void {
    this.values.length = 0;
  }
}

/** 2^20: the sort key packs a row's position below the source num. */
const POSITION = 1 << 20;
/** Source nums below this keep the packed sort key an exact double (2^33 · 2^20 = 2^53). */
const MAX_SORTED_SRC = 2 ** 33;
/** Nums a held edge column stores (Int32Array); a larger one ends holding. */
const MAX_HELD = 0x7fffffff;

/**
 * Relation edges `(src, rel, dst)`, sorted by `src` before each write. When told to
 * {@link SortedEdges.hold} them (a load into an empty table), it keeps every edge until the
 * next `flush` and writes them then in full key order (src, rel, dst), duplicates dropped:
 * the B-tree is filled from left to right, each leaf once (Graefe 2011, see the file header).
 */
export class SortedEdges {
  private readonly batch: RowBatch;
  private readonly capacity: number;
  private src: Float64Array;
  private rel: Float64Array;
  private dst: Float64Array;
  private n = 0;
  private maxSrc = 0;
  /** Every edge until the next flush, as Int32 columns (undefined: batches of `capacity`). */
  private held: { src: Int32Array; rel: Int32Array; dst: Int32Array; n: number; max: [number, number, number] } | undefined;

  constructor(db: Database.Database, capacity = DEFAULTS.edgeSortRows) {
    this.batch = new RowBatch(db, "INSERT OR IGNORE INTO edge(src, rel, dst)", 3);
    this.capacity = Math.max(1, Math.min(capacity, POSITION));
    const start = Math.min(this.capacity, 1024);
    this.src = new Float64Array(start);
    this.rel = new Float64Array(start);
    this.dst = new Float64Array(start);
  }

  /** Edges inserted so far (duplicates not counted). */
  get changes(): number {
    return this.batch.changes;
  }

  /** From now on keeps every edge until the next `flush` (see the class note). */
  hold(): void {
    if (this.held !== undefined) return;
    this.flush();
    this.held = { src: new Int32Array(1024), rel: new Int32Array(1024), dst: new Int32Array(1024), n: 0, max: [0, 0, 0] };
  }

  /** Adds one edge; sorts and writes the buffer when it holds `capacity` edges. */
  add(src: number, rel: number, dst: number): void {
    const h = this.held;
    if (h !== undefined) {
      if (src <= MAX_HELD && rel <= MAX_HELD && dst <= MAX_HELD && src >= 0 && rel >= 0 && dst >= 0) {
        if (h.n === h.src.length) this.growHeld(h);
        const i = h.n++;
        h.src[i] = src;
        h.rel[i] = rel;
        h.dst[i] = dst;
        const max = h.max;
        if (src > max[0]) max[0] = src;
        if (rel > max[1]) max[1] = rel;
        if (dst > max[2]) max[2] = dst;
        return;
      }
      this.writeHeld(); // a num too large for the columns: back to batches
    }
    if (this.n === this.src.length) this.grow();
    const i = this.n++;
    this.src[i] = src;
    this.rel[i] = rel;
    this.dst[i] = dst;
    if (src > this.maxSrc) this.maxSrc = src;
    if (this.n === this.capacity) this.flush();
  }

  /** Writes every buffered edge, in ascending `src` order (ties in arrival order); held edges in key order. */
  flush(): void {
    if (this.held !== undefined) {
      this.writeHeld();
      return;
    }
    const n = this.n;
    if (n === 0) return;
    const { src, rel, dst, batch } = this;
    if (this.maxSrc < MAX_SORTED_SRC) {
      const keys = new Float64Array(n);
      for (let i = 0; i < n; i++) keys[i] = src[i]! * POSITION + i;
      keys.sort();
      for (let k = 0; k < n; k++) {
        const i = keys[k]! % POSITION;
        batch.add(src[i], rel[i], dst[i]);
      }
    } else {
      for (let i = 0; i < n; i++) batch.add(src[i], rel[i], dst[i]);
    }
    batch.flush();
    this.n = 0;
    this.maxSrc = 0;
  }

  /**
   * Writes the held edges in (src, rel, dst) order, each distinct edge once, and stops
   * holding. The order comes from one numeric sort of packed keys ((src·R + rel)·D + dst,
   * exact while below 2^53), else from a comparison sort of positions.
   */
  private writeHeld(): void {
    const h = this.held!;
    this.held = undefined;
    const { src, rel, dst, n } = h;
    const batch = this.batch;
    const R = h.max[1] + 1;
    const D = h.max[2] + 1;
    if ((h.max[0] + 1) * R * D <= Number.MAX_SAFE_INTEGER) {
      const keys = new Float64Array(n);
      for (let i = 0; i < n; i++) keys[i] = (src[i]! * R + rel[i]!) * D + dst[i]!;
      keys.sort();
      let last = -1;
      for (let k = 0; k < n; k++) {
        const key = keys[k]!;
        if (key === last) continue;
        last = key;
        const d = key % D;
        const sr = (key - d) / D;
        const r = sr % R;
        batch.add((sr - r) / R, r, d);
      }
    } else {
      const order = new Uint32Array(n);
      for (let i = 0; i < n; i++) order[i] = i;
      order.sort((a, b) => src[a]! - src[b]! || rel[a]! - rel[b]! || dst[a]! - dst[b]!);
      for (let k = 0; k < n; k++) {
        const i = order[k]!;
        if (k > 0) {
          const j = order[k - 1]!;
          if (src[i] === src[j] && rel[i] === rel[j] && dst[i] === dst[j]) continue;
        }
        batch.add(src[i], rel[i], dst[i]);
      }
    }
    batch.flush();
  }

  /** Drops the buffered edges (after a rollback). */
  discard(): void {
    this.n = 0;
    this.maxSrc = 0;
    this.held = undefined;
    this.batch.discard();
  }

  private grow(): void {
    const size = Math.min(this.capacity, this.src.length * 2);
    this.src = resized(this.src, size);
    this.rel = resized(this.rel, size);
    this.dst = resized(this.dst, size);
  }

  private growHeld(h: NonNullable<SortedEdges["held"]>): void {
    h.src = resized(h.src, h.src.length * 2);
    h.rel = resized(h.rel, h.rel.length * 2);
    h.dst = resized(h.dst, h.dst.length * 2);
  }
}

/** A copy of `a` in a new array of `size` elements. */
function resized<T extends Float64Array | Int32Array>(a: T, size: number): T {
  const b = new (a.constructor as new (n: number) => T)(size);
  b.set(a);
  return b;
}

/** A surrogate code unit without its pair (in Unicode mode a pair is one code point, not matched). */
const LONE_SURROGATE = /\p{Cs}/u;
/**
 * Strings kept as UTF-8 in one growing byte buffer (a column of a held table), so that a
 * load holding millions of rows keeps neither a JS string object per value nor, through a
 * substring, the parser's input block it was cut from. Values that do not survive a UTF-8
 * round trip (a lone surrogate from an escape) are kept as strings on the side.
 */
export class TextColumn {
  private bytes = Buffer.allocUnsafe(1 << 12);
  private used = 0;
  private starts = new Float64Array(256);
  /** Byte length per row; −1 = null, −2 = kept in `odd`. */
  private lengths = new Int32Array(256);
  private readonly odd = new Map<number, string>();
  private n = 0;

  /** Rows held. */
  get length(): number {
    return this.n;
  }

  /** Appends a value; returns its row. */
  push(value: string | null): number {
    if (this.n === this.starts.length) {
      this.starts = resized(this.starts, this.n * 2);
      this.lengths = resized(this.lengths, this.n * 2);
    }
    const i = this.n++;
    this.set(i, value);
    return i;
  }

  /** Replaces row `i`'s value (the old bytes stay unused in the buffer). */
  set(i: number, value: string | null): void {
    if (value === null) {
      this.lengths[i] = -1;
      return;
    }
    if (LONE_SURROGATE.test(value)) {
      this.odd.set(i, value);
      this.lengths[i] = -2;
      return;
    }
    const most = value.length * 3;
    if (this.used + most > this.bytes.length) {
      const bigger = Buffer.allocUnsafe(Math.max(this.bytes.length * 2, this.used + most));
      this.bytes.copy(bigger, 0, 0, this.used);
      this.bytes = bigger;
    }
    const k = this.bytes.write(value, this.used, "utf8");
    this.starts[i] = this.used;
    this.lengths[i] = k;
    this.used += k;
  }

  /** Row `i`'s value. */
  get(i: number): string | null {
    const k = this.lengths[i]!;
    if (k === -1) return null;
    if (k === -2) return this.odd.get(i)!;
    const a = this.starts[i]!;
    return this.bytes.toString("utf8", a, a + k);
  }

  /** Drops every row. */
  clear(): void {
    if (this.bytes.length > 1 << 20) this.bytes = Buffer.allocUnsafe(1 << 12);
    if (this.starts.length > 1 << 16) {
      this.starts = new Float64Array(256);
      this.lengths = new Int32Array(256);
    }
    this.used = 0;
    this.n = 0;
    this.odd.clear();
  }
}

/**
 * Rows of one table whose first column is an entity num. When told to {@link HeldRows.hold}
 * them (a load into an empty catalog) it keeps every row until the next `flush` and writes
 * them then ordered by that num, rows of one entity in arrival order (a stable sort, so an
 * `INSERT OR IGNORE` keeps the same first row of each key): the table's B-tree, whose key
 * starts with the entity, is filled nearly left to right instead of at random leaves (the
 * files usually name entities in another order than the nums they got). Otherwise rows go
 * straight to a {@link RowBatch}.
 */
export class HeldRows {
  private readonly batch: RowBatch;
  /** Per column: numbers (null as NaN) or text. */
  private readonly kinds: readonly ("num" | "text")[];
  private nums: Float64Array[] = [];
  private texts: TextColumn[] = [];
  private n = 0;
  private holding = false;

  /**
   * @param head the statement up to `VALUES`, as for {@link RowBatch}
   * @param kinds each column's kind, the first an entity num
   */
  constructor(db: Database.Database, head: string, kinds: readonly ("num" | "text")[]) {
    this.batch = new RowBatch(db, head, kinds.length);
    this.kinds = kinds;
  }

  /** Rows inserted so far (ignored duplicates not counted). */
  get changes(): number {
    return this.batch.changes;
  }

  /** From now on keeps every row until the next `flush`. */
  hold(): void {
    if (this.holding) return;
    this.batch.flush();
    this.holding = true;
    this.nums = this.kinds.map((k) => new Float64Array(k === "num" ? 1024 : 0));
    this.texts = this.kinds.map((k) => (k === "text" ? new TextColumn() : (undefined as unknown as TextColumn)));
    this.n = 0;
  }

  /** Adds one row (a value per column; a num column's value a number or null). */
  add(...row: unknown[]): void {
    if (!this.holding) {
      this.batch.add(...row);
      return;
    }
    const i = this.n++;
    const kinds = this.kinds;
    for (let c = 0; c < kinds.length; c++) {
      if (kinds[c] === "text") this.texts[c]!.push(row[c] as string | null);
      else {
        let col = this.nums[c]!;
        if (i === col.length) col = this.nums[c] = resized(col, col.length * 2);
        col[i] = row[c] === null ? NaN : (row[c] as number);
      }
    }
  }

  /**
   * Writes every row (held ones ordered by entity, see the class note) and stops holding,
   * unless `holdOn` (a flush before one statement reads or changes the rows written so far).
   */
  flush(holdOn = false): void {
    const held = this.holding;
    if (this.holding) {
      this.holding = false;
      const n = this.n;
      const order = stableOrder(this.nums[0]!, n);
      const row: unknown[] = new Array(this.kinds.length);
      for (let k = 0; k < n; k++) {
        const i = order[k]!;
        for (let c = 0; c < this.kinds.length; c++) {
          if (this.kinds[c] === "text") row[c] = this.texts[c]!.get(i);
          else {
            const v = this.nums[c]![i]!;
            row[c] = Number.isNaN(v) ? null : v;
          }
        }
        this.batch.add(...row);
      }
      this.nums = [];
      this.texts = [];
      this.n = 0;
    }
    this.batch.flush();
    if (held && holdOn) this.hold();
  }

  /** Drops the buffered rows (after a rollback). */
  discard(): void {
    this.holding = false;
    this.nums = [];
    this.texts = [];
    this.n = 0;
    this.batch.discard();
  }
}

/** Positions 0 … n − 1 ordered by `key` (non-negative integers), ties in position order. */
function stableOrder(key: Float64Array, n: number): Uint32Array {
  const order = new Uint32Array(n);
  let max = 0;
  for (let i = 0; i < n; i++) if (key[i]! > max) max = key[i]!;
  const span = 2 ** Math.ceil(Math.log2(n + 1));
  if ((max + 1) * span <= Number.MAX_SAFE_INTEGER) {
    // one numeric sort of packed keys: num · span + position
    const packed = new Float64Array(n);
    for (let i = 0; i < n; i++) packed[i] = key[i]! * span + i;
    packed.sort();
    for (let k = 0; k < n; k++) order[k] = packed[k]! % span;
  } else {
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => key[a]! - key[b]! || a - b);
  }
  return order;
}

/**
 * Entity rows made in this transaction, held back until `capacity` of them are waiting, so
 * that a new entity's label and description go into its INSERT instead of two UPDATEs; when
 * told to {@link PendingEntities.hold} them (a load into an empty catalog), every one until
 * the next `flush`, so no row is written before the files have given its label and
 * description. Nums are handed out in order, as SQLite would (the largest num + 1), so the
 * pending rows are always the nums `base … base + count − 1`, and they are written in that order.
 */
export class PendingEntities {
  private readonly batch: RowBatch;
  private readonly capacity: number;
  private holding = false;
  private base = 0;
  private readonly ids = new TextColumn();
  private readonly labels = new TextColumn();
  private readonly descriptions = new TextColumn();

  constructor(db: Database.Database, capacity: number) {
    this.batch = new RowBatch(db, "INSERT INTO entity(num, id, label, description)", 4);
    this.capacity = Math.max(1, capacity);
  }

  /** From now on keeps every row until the next `flush`. */
  hold(): void {
    this.holding = true;
  }

  /** True when entity `num` is still waiting to be written. */
  has(num: number): boolean {
    return num >= this.base && num - this.base < this.ids.length;
  }

  /** True when `capacity` rows are waiting (the caller writes them before adding another). */
  get full(): boolean {
    return !this.holding && this.ids.length >= this.capacity;
  }

  /** Adds the row of a new entity; `num` must follow the last one added (or start a run after a flush). */
  add(num: number, id: string): void {
    if (this.ids.length === 0) this.base = num;
    else if (num !== this.base + this.ids.length) throw new Error(`pending entity num ${num} out of order`);
    this.ids.push(id);
    this.labels.push(null);
    this.descriptions.push(null);
  }

  label(num: number): string | null {
    return this.labels.get(num - this.base);
  }

  setLabel(num: number, text: string): void {
    this.labels.set(num - this.base, text);
  }

  description(num: number): string | null {
    return this.descriptions.get(num - this.base);
  }

  setDescription(num: number, text: string): void {
    this.descriptions.set(num - this.base, text);
  }

  /** Writes every waiting row, in num order, and stops holding. */
  flush(): void {
    const { ids, labels, descriptions, batch } = this;
    for (let i = 0; i < ids.length; i++) batch.add(this.base + i, ids.get(i), labels.get(i), descriptions.get(i));
    batch.flush();
    this.clear();
    this.holding = false;
  }

  /** Drops the waiting rows (after a rollback). */
  discard(): void {
    this.batch.discard();
    this.clear();
    this.holding = false;
  }

  private clear(): void {
    this.ids.clear();
    this.labels.clear();
    this.descriptions.clear();
  }
}

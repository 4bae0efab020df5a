/**
 * Relation index snapshot: a binary file beside the catalog
 * =========================================================
 *
 * `PATH.idx` holds the relation index of the catalog at `PATH`, so that a query process
 * starts by reading typed arrays instead of scanning SQLite. It is stamped with the
 * catalog's uid and generation and a CRC-32 of its payload; a torn (short, bad checksum),
 * stale (older generation), foreign (other catalog uid, wrong magic or format version) or
 * otherwise unreadable snapshot is rejected and rebuilt, never trusted.
 *
 * File layout (little-endian; every array starts at a multiple of 8 bytes):
 *
 *   offset size  field
 *   0      8     magic "TPRIDX\0\1"
 *   8      4     format version (u32, = 4)
 *   12     4     header length in bytes (u32, = 128)
 *   16     8     catalog generation (f64)
 *   24     4     nodeCount n (u32)
 *   28     4     relationCount (u32)
 *   32     4     adjacency entries m = 2 × edges (u32)
 *   36     4     type entries (u32)
 *   40     4     subtype entries (u32)
 *   44     4     CRC-32 of bytes [128, end) (u32)
 *   48     8     total file length in bytes (f64)
 *   56     4     uid length in bytes (u32, ≤ 64)
 *   60     64    catalog uid (UTF-8, zero padded)
 *   124    4     rows k of the relation-end type table (u32)
 *   128          offsets u32[n+1], targets i32[m], links u32[m], typeOffsets u32[n+1],
 *                typeList i32[types], superOffsets u32[n+1], superList i32[subtypes],
 *                then the walk tables (transition.ts `WalkTables`) at the default hub
 *                exponent: β f64, hub f64[n], rowTotal f64[n], measure f64[n],
 *                scaled f64[m], hubAt f64[m] — so a query process does not rebuild them
 *                (about 0.8 s at 1,000,000 nodes / 5,000,000 edges); then the
 *                relation-end type table (relation-index.ts `RelationEndTable`, about
 *                0.2 s to count at that size): totals f64[2·max(relationCount, 1)],
 *                keys i32[k], types i32[k], counts f64[k]; then the salience at the default
 *                options (salience.ts, a global PageRank by power iteration: 1.0 s at M,
 *                ~10 s at L, which a question process would otherwise run before its first
 *                suggestions): iterations f64, pagerank f64[n], percentile f32[n]
 *
 * Writing goes to a temporary file in the same folder, fsync, then rename over `PATH.idx`
 * (atomic on POSIX), so a reader sees the old file or the new one, never half of one.
 *
 * [Reference]: CRC-32 (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320), via node:zlib's crc32
 * when present (Node ≥ 20.15), else the table method of Sarwate, CACM 1988.
 */
import { closeSync, fstatSync, fsyncSync, openSync, readSync, renameSync, unlinkSync, writeSync, existsSync } from "node:fs";
import { endianness } from "node:os";
import * as zlib from "node:zlib";
import type { Catalog } from "../catalog/index.js";
import { RelationIndex, csrOf, type Csr, type IndexProgressFn, type RelationEndTable } from "./relation-index.js";
import { adoptWalkTables, walkTables, DEFAULTS as TRANSITION_DEFAULTS, type WalkTables } from "./transition.js";
import { adoptSalience, salienceOf, type Salience } from "./salience.js";

/** Snapshot format constants. */
export const SNAPSHOT = Object.freeze({
  magic: "TPRIDX\u0000\u0001",
  version: 4,
  headerLength: 128,
  /** File name suffix beside the catalog. */
  suffix: ".idx",
});

const nativeCrc = (zlib as unknown as { crc32?: (data: Uint8Array, value?: number) => number }).crc32;

let table: Uint32Array | null = null;
/** CRC-32 by the table method (Sarwate 1988). @internal exported for its test */
export function crc32Table(data: Uint8Array, value = 0): number {
  if (table === null) {
    table = new Uint32Array(256);
    for (let i = 0; i < 256; i++) {
      let c = i;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      table[i] = c >>> 0;
    }
  }
  let c = ~value >>> 0;
  for (let i = 0; i < data.length; i++) c = table[(c ^ data[i]!) & 0xff]! ^ (c >>> 8);
  return ~c >>> 0;
}

/** CRC-32 of `data` continuing from `value` (native when available). @internal */
export function crc32(data: Uint8Array, value = 0): number {
  if (data.length === 0) return value >>> 0; // node:zlib's crc32 returns 0 for an empty view of an empty buffer
  return nativeCrc ? nativeCrc(data, value) >>> 0 : crc32Table(data, value);
}

/** Why a snapshot was not used. */
export type SnapshotRejection = "missing" | "unreadable" | "foreign" | "version" | "stale" | "torn" | "checksum" | "endianness";

/** The outcome of {@link readSnapshot}. */
export type SnapshotRead = { readonly ok: true; readonly index: RelationIndex } | { readonly ok: false; readonly reason: SnapshotRejection; readonly detail: string };

const align8 = (x: number) => (x + 7) & ~7;

function sections(c: Csr, w: WalkTables, e: RelationEndTable, s: Salience): ArrayBufferView[] {
  return [c.offsets, c.targets, c.links, c.typeOffsets, c.typeList, c.superOffsets, c.superList, new Float64Array([w.hubExponent]), w.hub, w.rowTotal, w.measure, w.scaled, w.hubAt, e.totals, e.keys, e.types, e.counts, new Float64Array([s.iterations]), s.pagerank, s.percentile];
}

/** Writes the snapshot of `index` for the catalog stamp `(uid, generation)` atomically to `file`. */
export function writeSnapshot(file: string, index: RelationIndex, stamp: { uid: string; generation: number }): void {
  renameSync(writeSnapshotTemp(file, index, stamp), file);
}

/**
 * Writes the snapshot of `index` to a temporary file beside `file` (fsynced) and returns its
 * path: the caller renames it over `file` when it should take effect, or deletes it.
 */
export function writeSnapshotTemp(file: string, index: RelationIndex, stamp: { uid: string; generation: number }): string {
  if (endianness() !== "LE") throw new RangeError("ranking/snapshot: snapshots are little-endian; this machine is big-endian");
  const c = csrOf(index);
  const ends = index.endTable();
  const parts = sections(c, walkTables(index, TRANSITION_DEFAULTS.hubExponent), ends, salienceOf(index));
  let length = SNAPSHOT.headerLength;
  for (const p of parts) length += align8(p.byteLength);
  const header = Buffer.alloc(SNAPSHOT.headerLength);
  header.write(SNAPSHOT.magic, 0, "latin1");
  header.writeUInt32LE(SNAPSHOT.version, 8);
  header.writeUInt32LE(SNAPSHOT.headerLength, 12);
  header.writeDoubleLE(stamp.generation, 16);
  header.writeUInt32LE(c.nodeCount, 24);
  header.writeUInt32LE(c.relationCount, 28);
  header.writeUInt32LE(c.targets.length, 32);
  header.writeUInt32LE(c.typeList.length, 36);
  header.writeUInt32LE(c.superList.length, 40);
  header.writeDoubleLE(length, 48);
  const uid = Buffer.from(stamp.uid, "utf8");
  if (uid.length > 64) throw new RangeError("ranking/snapshot: catalog uid longer than 64 bytes");
  header.writeUInt32LE(uid.length, 56);
  uid.copy(header, 60);
  header.writeUInt32LE(ends.keys.length, 124);
  const pad = new Uint8Array(8);
  let crc = 0;
  for (const p of parts) {
    const bytes = new Uint8Array(p.buffer, p.byteOffset, p.byteLength);
    crc = crc32(bytes, crc);
    const extra = align8(p.byteLength) - p.byteLength;
    if (extra > 0) crc = crc32(pad.subarray(0, extra), crc);
  }
  header.writeUInt32LE(crc, 44);
  const tmp = `${file}.tmp-${process.pid}-${Date.now().toString(36)}`;
  const fd = openSync(tmp, "w", 0o644);
  try {
    writeSync(fd, header);
    for (const p of parts) {
      const bytes = new Uint8Array(p.buffer, p.byteOffset, p.byteLength);
      // write in chunks of 64 MiB (writeSync may write less than asked)
      for (let off = 0; off < bytes.length; ) off += writeSync(fd, bytes, off, Math.min(bytes.length - off, 1 << 26));
      const extra = align8(p.byteLength) - p.byteLength;
      if (extra > 0) writeSync(fd, pad, 0, extra);
    }
    fsyncSync(fd);
    closeSync(fd);
  } catch (e) {
    closeSync(fd);
    try {
      unlinkSync(tmp);
    } catch {
      /* already gone */
    }
    throw e;
  }
  return tmp;
}

/**
 * Reads and verifies the snapshot `file` against the catalog stamp. The arrays are views
 * straight into one buffer read from the file (no per-element copy).
 */
export function readSnapshot(file: string, stamp: { uid: string; generation: number }): SnapshotRead {
  if (endianness() !== "LE") return { ok: false, reason: "endianness", detail: "big-endian machine" };
  if (!existsSync(file)) return { ok: false, reason: "missing", detail: "no snapshot file" };
  let fd: number;
  try {
    fd = openSync(file, "r");
  } catch (e) {
    return { ok: false, reason: "unreadable", detail: (e as Error).message };
  }
  try {
    const size = fstatSync(fd).size;
    if (size < SNAPSHOT.headerLength) return { ok: false, reason: "torn", detail: `file has ${size} bytes, shorter than the header` };
    const header = Buffer.alloc(SNAPSHOT.headerLength);
    readSync(fd, header, 0, SNAPSHOT.headerLength, 0);
    if (header.toString("latin1", 0, 8) !== SNAPSHOT.magic) return { ok: false, reason: "foreign", detail: "not a tiepoint relation index snapshot (bad magic)" };
    const version = header.readUInt32LE(8);
    if (version !== SNAPSHOT.version || header.readUInt32LE(12) !== SNAPSHOT.headerLength) {
      return { ok: false, reason: "version", detail: `snapshot format ${version}, this build reads ${SNAPSHOT.version}` };
    }
    const uid = header.toString("utf8", 60, 60 + Math.min(64, header.readUInt32LE(56)));
    if (uid !== stamp.uid) return { ok: false, reason: "foreign", detail: `snapshot of catalog ${uid}, not ${stamp.uid}` };
    const generation = header.readDoubleLE(16);
    if (generation !== stamp.generation) return { ok: false, reason: "stale", detail: `snapshot of generation ${generation}, catalog is at ${stamp.generation}` };
    const n = header.readUInt32LE(24);
    const relationCount = header.readUInt32LE(28);
    const m = header.readUInt32LE(32);
    const nt = header.readUInt32LE(36);
    const ns = header.readUInt32LE(40);
    const expected = header.readDoubleLE(48);
    const k = header.readUInt32LE(124);
    const R = Math.max(relationCount, 1);
    const lengths = [4 * (n + 1), 4 * m, 4 * m, 4 * (n + 1), 4 * nt, 4 * (n + 1), 4 * ns, 8, 8 * n, 8 * n, 8 * n, 8 * m, 8 * m, 16 * R, 4 * k, 4 * k, 8 * k, 8, 8 * n, 4 * n];
    let length = SNAPSHOT.headerLength;
    for (const l of lengths) length += align8(l);
    if (length !== expected || size !== expected) return { ok: false, reason: "torn", detail: `file has ${size} bytes, its header promises ${expected} (arrays need ${length})` };
    const payload = new Uint8Array(new ArrayBuffer(size - SNAPSHOT.headerLength));
    for (let off = 0; off < payload.length; ) {
      const got = readSync(fd, payload, off, Math.min(payload.length - off, 1 << 26), SNAPSHOT.headerLength + off);
      if (got === 0) return { ok: false, reason: "torn", detail: "file ended early" };
      off += got;
    }
    if (crc32(payload) !== header.readUInt32LE(44)) return { ok: false, reason: "checksum", detail: "payload checksum mismatch (torn or corrupted file)" };
    let at = 0;
    const take = <T>(make: (buf: ArrayBuffer, offset: number, bytes: number) => T, bytes: number): T => {
      const v = make(payload.buffer, at, bytes);
      at += align8(bytes);
      return v;
    };
    const u32 = (b: ArrayBuffer, o: number, k: number) => new Uint32Array(b, o, k / 4);
    const i32 = (b: ArrayBuffer, o: number, k: number) => new Int32Array(b, o, k / 4);
    const f64 = (b: ArrayBuffer, o: number, k: number) => new Float64Array(b, o, k / 8);
    const csr: Csr = {
      nodeCount: n,
      relationCount,
      offsets: take(u32, lengths[0]!),
      targets: take(i32, lengths[1]!),
      links: take(u32, lengths[2]!),
      typeOffsets: take(u32, lengths[3]!),
      typeList: take(i32, lengths[4]!),
      superOffsets: take(u32, lengths[5]!),
      superList: take(i32, lengths[6]!),
    };
    if (csr.offsets[n] !== m || csr.typeOffsets[n] !== nt || csr.superOffsets[n] !== ns) {
      return { ok: false, reason: "torn", detail: "offsets do not match the entry counts" };
    }
    const hubExponent = take(f64, lengths[7]!)[0]!;
    const walk: WalkTables = {
      hubExponent,
      hub: take(f64, lengths[8]!),
      rowTotal: take(f64, lengths[9]!),
      measure: take(f64, lengths[10]!),
      scaled: take(f64, lengths[11]!),
      hubAt: take(f64, lengths[12]!),
    };
    const ends: RelationEndTable = { totals: take(f64, lengths[13]!), keys: take(i32, lengths[14]!), types: take(i32, lengths[15]!), counts: take(f64, lengths[16]!) };
    const iterations = take(f64, lengths[17]!)[0]!;
    const salience: Salience = { iterations, pagerank: take(f64, lengths[18]!), percentile: take((b, o, bytes) => new Float32Array(b, o, bytes / 4), lengths[19]!) };
    for (let i = 0; i < k; i++) {
      const key = ends.keys[i]!;
      if (!(key >= 0 && key < 2 * R) || (i > 0 && key < ends.keys[i - 1]!)) return { ok: false, reason: "torn", detail: "relation-end table out of order" };
    }
    const index = new RelationIndex(csr);
    adoptWalkTables(index, walk);
    index.adoptEndTable(ends);
    adoptSalience(index, salience);
    return { ok: true, index };
  } finally {
    closeSync(fd);
  }
}

/** Options of {@link openIndex}; all optional. */
export interface OpenIndexOptions {
  /** Receives progress events (build phases, snapshot load/save, why a snapshot was rejected). */
  readonly onProgress?: IndexProgressFn;
  /** Never read or write a snapshot file (build in memory). @default false */
  readonly noSnapshot?: boolean;
}

/** The snapshot path of a catalog file. */
export function snapshotPath(catalogPath: string): string {
  return catalogPath + SNAPSHOT.suffix;
}

/**
 * The relation index of `cat`: loaded from the snapshot `PATH.idx` when it is valid for the
 * catalog's current uid and generation, otherwise built from the catalog and saved there
 * (in-memory catalogs, read-only folders and failed writes: kept in memory only).
 */
export function openIndex(cat: Catalog, options: OpenIndexOptions = {}): RelationIndex {
  const progress = options.onProgress;
  const memory = cat.path === ":memory:" || cat.path === "";
  const file = snapshotPath(cat.path);
  if (!memory && !options.noSnapshot) {
    progress?.({ phase: "snapshot-load", message: file });
    const read = readSnapshot(file, cat.version());
    if (read.ok) return read.index;
    if (read.reason !== "missing") progress?.({ phase: "snapshot-rejected", message: `${file}: ${read.reason}: ${read.detail}; rebuilding` });
  }
  // one read transaction: the stamp and the arrays come from the same catalog state
  let stamp = { uid: "", generation: 0 };
  let index: RelationIndex | undefined;
  const build = () => {
    stamp = cat.version();
    index = RelationIndex.fromCatalog(cat, progress);
  };
  if (cat.db.inTransaction) build();
  else cat.db.transaction(build)();
  if (index === undefined) throw new TypeError("ranking/snapshot: index build produced nothing");
  if (!memory && !options.noSnapshot) {
    try {
      progress?.({ phase: "snapshot-save", message: file });
      writeSnapshot(file, index, stamp);
    } catch (e) {
      progress?.({ phase: "snapshot-save", message: `${file}: not saved (${(e as Error).message}); using the index in memory` });
    }
  }
  return index;
}

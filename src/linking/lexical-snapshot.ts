/**
 * The linker's lexical snapshot: what mention detection and candidate scoring need from the
 * whole catalog, computed in one pass and saved beside the catalog file (`PATH.link`),
 * stamped with the catalog uid and generation so a later load invalidates it.
 *
 * Contents (all compact typed arrays or joined strings):
 * - `degree[num]`: edges at each entity, both directions (prominence prior);
 * - the alias token vocabulary (normalised tokens of every label and alias) with postings
 *   (entity nums, sorted, unique) — partial and reordered names, fuzzy correction;
 * - a 32-bit FNV-1a hash set of every alias's normalised and stemmed key, so n-gram spans
 *   that cannot match skip the SQLite lookup (a false positive only costs one lookup);
 * - context-term document frequencies for BM25 (stemmed). An entity's context document is its
 *   description, its neighbours' labels and (at half weight) its neighbours' descriptions, in
 *   the spirit of extended gloss overlap (S. Banerjee and T. Pedersen, CICLing 2002). The
 *   neighbour part of df is counted without materialising documents: a label or description
 *   term of entity e is credited to deg(e) further documents (an upper bound that ignores two
 *   neighbours sharing a term), capped at N.
 * Building reads the edge, alias and entity tables once each (no per-question scans), or takes
 * the rows a load writes (lexical-builder.ts: the same builder either way).
 */
import { closeSync, fstatSync, openSync, readSync, renameSync, writeFileSync, unlinkSync } from "node:fs";
import type { Catalog } from "../catalog/index.js";
import { fnv1a32 } from "../catalog/index.js";
import { sortedIndexOf } from "./sorted-search.js";
import { LexicalBuilder, NEIGHBOUR_DESCRIPTION_WEIGHT, type LexicalParts } from "./lexical-builder.js";

/** Format tag written at the start of the snapshot file. */
const MAGIC = "tiepoint-link-3";

export { NEIGHBOUR_DESCRIPTION_WEIGHT };

/** FNV-1a 32-bit hash of a string's UTF-16 code units (Fowler–Noll–Vo; common practice). */
export function fnv1a(s: string): number {
  return (fnv1a32(s) | 1) >>> 0; // unsigned, never 0 (0 marks an empty slot)
}

/** Open-addressing hash set of 32-bit hashes (linear probing). */
class HashSet32 {
  readonly table: Uint32Array;
  private readonly mask: number;
  constructor(table: Uint32Array) {
    this.table = table;
    this.mask = table.length - 1;
  }
  has(h: number): boolean {
    let i = h & this.mask;
    for (;;) {
      const v = this.table[i]!;
      if (v === 0) return false;
      if (v === h) return true;
      i = (i + 1) & this.mask;
    }
  }
}

/** The whole file in a buffer of its own, starting at offset 0 (so 8-aligned sections can be viewed as typed arrays). */
function readAligned(path: string): Buffer {
  const fd = openSync(path, "r");
  try {
    const size = fstatSync(fd).size;
    const bytes = new Uint8Array(new ArrayBuffer(size));
    for (let off = 0; off < size; ) {
      const got = readSync(fd, bytes, off, Math.min(size - off, 1 << 26), off);
      if (got === 0) throw new RangeError("linking/lexical-snapshot: file ended early");
      off += got;
    }
    return Buffer.from(bytes.buffer, 0, size);
  } finally {
    closeSync(fd);
  }
}

/** The lexical snapshot of one catalog generation. */
export class LexicalSnapshot {
  /** Catalog uid and generation this snapshot was built from. */
  readonly uid: string;
  readonly generation: number;
  /** Number of entities (BM25's N). */
  readonly entityCount: number;
  /** Edges at each entity num, both directions. */
  readonly degree: Int32Array;
  /** Alias token vocabulary, sorted. */
  readonly vocab: readonly string[];
  /** CSR postings: entities whose label/alias contains vocab[i] are `postings[offsets[i]..offsets[i+1])`. */
  readonly offsets: Int32Array;
  readonly postings: Int32Array;
  private readonly keys: HashSet32;
  /** Longest alias in tokens. */
  readonly maxAliasTokens: number;
  /** Context terms (stems), sorted, and their document frequencies. */
  readonly terms: readonly string[];
  readonly df: Int32Array;
  /** Average context-document length in terms. */
  readonly avgDocLength: number;

  private constructor(p: {
    uid: string; generation: number; entityCount: number; degree: Int32Array; vocab: string[]; offsets: Int32Array; postings: Int32Array;
    keys: Uint32Array; maxAliasTokens: number; terms: string[]; df: Int32Array; avgDocLength: number;
  }) {
    this.uid = p.uid;
    this.generation = p.generation;
    this.entityCount = p.entityCount;
    this.degree = p.degree;
    this.vocab = p.vocab;
    this.offsets = p.offsets;
    this.postings = p.postings;
    this.keys = new HashSet32(p.keys);
    this.maxAliasTokens = p.maxAliasTokens;
    this.terms = p.terms;
    this.df = p.df;
    this.avgDocLength = p.avgDocLength;
  }

  /** Degree of an entity num (0 when unknown). */
  degreeOf(num: number): number {
    return num >= 0 && num < this.degree.length ? this.degree[num]! : 0;
  }

  /** True when some alias may have this normalised or stemmed key (false: certainly none). */
  mayBeKey(key: string): boolean {
    return this.keys.has(fnv1a(key));
  }

  /** Id of an alias token in the vocabulary, or -1. */
  tokenId(token: string): number {
    return sortedIndexOf(this.vocab, token);
  }

  /** Entities whose label or alias contains alias token id `t` (sorted nums). */
  entitiesWithToken(t: number): Int32Array {
    return this.postings.subarray(this.offsets[t]!, this.offsets[t + 1]!);
  }

  /** Document frequency of a context term (stem), 0 when unseen. */
  documentFrequency(term: string): number {
    const i = sortedIndexOf(this.terms, term);
    return i < 0 ? 0 : this.df[i]!;
  }

  /** Builds the snapshot from the catalog's tables (one pass over edges, aliases, entities). */
  static build(cat: Catalog): LexicalSnapshot {
    const { uid, generation } = cat.version();
    const degree = new Int32Array(cat.maxEntityNum() + 1);
    for (const [s, , d] of cat.edges()) {
      degree[s]!++;
      degree[d]!++;
    }
    const builder = LexicalSnapshot.builder();
    for (const [entity, norm, stem] of cat.aliases()) builder.alias(entity, norm, stem);
    let entityCount = 0;
    for (const [num, label, description] of cat.entityTexts()) {
      entityCount++;
      if (label) builder.label(num, label);
      if (description) builder.description(num, description);
    }
    return LexicalSnapshot.fromParts(uid, generation, builder.finish(degree, entityCount));
  }

  /** A builder for this snapshot's contents from a stream of rows (lexical-builder.ts). */
  static builder(): LexicalBuilder {
    return new LexicalBuilder(fnv1a);
  }

  /** The snapshot file beside a catalog file. */
  static pathFor(catalogPath: string): string {
    return `${catalogPath}.link`;
  }

  /** The snapshot of catalog `uid` at `generation` from a builder's parts (lexical-builder.ts). */
  static fromParts(uid: string, generation: number, p: LexicalParts): LexicalSnapshot {
    return new LexicalSnapshot({ uid, generation, ...p });
  }

  /** Serialises to `path` (written to a temporary file, then renamed into place). */
  save(path: string): void {
    renameSync(this.saveTemp(path), path);
  }

  /** Serialises to a temporary file beside `path` and returns its name (the caller renames or deletes it). */
  saveTemp(path: string): string {
    const vocabBuf = Buffer.from(this.vocab.join("\n"), "utf8");
    const termBuf = Buffer.from(this.terms.join("\n"), "utf8");
    const parts: [string, Buffer][] = [
      ["degree", Buffer.from(this.degree.buffer, this.degree.byteOffset, this.degree.byteLength)],
      ["offsets", Buffer.from(this.offsets.buffer, this.offsets.byteOffset, this.offsets.byteLength)],
      ["postings", Buffer.from(this.postings.buffer, this.postings.byteOffset, this.postings.byteLength)],
      ["keys", Buffer.from(this.keys.table.buffer, this.keys.table.byteOffset, this.keys.table.byteLength)],
      ["df", Buffer.from(this.df.buffer, this.df.byteOffset, this.df.byteLength)],
      ["vocab", vocabBuf],
      ["terms", termBuf],
    ];
    const sections: Record<string, [number, number]> = {};
    let at = 0;
    for (const [name, b] of parts) {
      sections[name] = [at, b.length];
      at += b.length + ((8 - (b.length % 8)) % 8);
    }
    const header = Buffer.from(
      JSON.stringify({
        magic: MAGIC, uid: this.uid, generation: this.generation, entityCount: this.entityCount,
        maxAliasTokens: this.maxAliasTokens, avgDocLength: this.avgDocLength, vocabSize: this.vocab.length, termCount: this.terms.length, sections,
      }),
      "utf8",
    );
    const headLen = 8 + header.length + ((8 - ((8 + header.length) % 8)) % 8);
    const out = Buffer.alloc(headLen + at);
    out.writeUInt32LE(header.length, 0);
    header.copy(out, 8);
    for (const [name, b] of parts) b.copy(out, headLen + sections[name]![0]);
    const tmp = `${path}.${process.pid}.tmp`;
    try {
      writeFileSync(tmp, out);
    } catch (e) {
      try {
        unlinkSync(tmp);
      } catch {
        /* nothing to clean */
      }
      throw e;
    }
    return tmp;
  }

  /** Loads a snapshot saved for exactly this uid and generation; undefined when missing or stale. */
  static load(path: string, uid: string, generation: number): LexicalSnapshot | undefined {
    let buf: Buffer;
    try {
      buf = readAligned(path);
    } catch {
      return undefined;
    }
    try {
      const hl = buf.readUInt32LE(0);
      const h = JSON.parse(buf.subarray(8, 8 + hl).toString("utf8")) as {
        magic: string; uid: string; generation: number; entityCount: number; maxAliasTokens: number; avgDocLength: number;
        vocabSize: number; termCount: number; sections: Record<string, [number, number]>;
      };
      if (h.magic !== MAGIC || h.uid !== uid || h.generation !== generation) return undefined;
      const base = 8 + hl + ((8 - ((8 + hl) % 8)) % 8);
      const sec = (name: string) => {
        const [o, n] = h.sections[name]!;
        return buf.subarray(base + o, base + o + n);
      };
      // sections start at multiples of 8 in a buffer of their own: views, no copies
      const ints = (name: string) => {
        const b = sec(name);
        return new Int32Array(b.buffer, b.byteOffset, b.length / 4);
      };
      const keysB = sec("keys");
      const keys = new Uint32Array(keysB.buffer, keysB.byteOffset, keysB.length / 4);
      const vocabText = sec("vocab").toString("utf8");
      const termText = sec("terms").toString("utf8");
      const vocab = h.vocabSize === 0 ? [] : vocabText.split("\n");
      const terms = h.termCount === 0 ? [] : termText.split("\n");
      if (vocab.length !== h.vocabSize || terms.length !== h.termCount) return undefined;
      return new LexicalSnapshot({
        uid, generation, entityCount: h.entityCount, degree: ints("degree"), vocab, offsets: ints("offsets"), postings: ints("postings"),
        keys, maxAliasTokens: h.maxAliasTokens, terms, df: ints("df"), avgDocLength: h.avgDocLength,
      });
    } catch {
      return undefined; // a damaged snapshot is rebuilt, never trusted
    }
  }

  /** Loads the snapshot beside a catalog file, or builds it and tries to save it there. */
  static forCatalog(cat: Catalog): LexicalSnapshot {
    const { uid, generation } = cat.version();
    if (cat.path === ":memory:" || cat.path === "") return LexicalSnapshot.build(cat);
    const path = LexicalSnapshot.pathFor(cat.path);
    const found = LexicalSnapshot.load(path, uid, generation);
    if (found) return found;
    const built = LexicalSnapshot.build(cat);
    try {
      built.save(path);
    } catch {
      /* read-only folder: keep it in memory only */
    }
    return built;
  }
}

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
 * - the alias vocabulary's trigram table (fuzzy-index.ts) and the inverted index of the
 *   descriptions (description-match.ts), each read from the file only when a question first
 *   needs it (one read of its own sections; both after the others), so opening the snapshot
 *   does not pay for them, nor a question for the one it does not use;
 * - context-term document frequencies for BM25 (stemmed). An entity's context document is its
 *   description, its neighbours' labels and (at half weight) its neighbours' descriptions, in
 *   the spirit of extended gloss overlap (S. Banerjee and T. Pedersen, CICLing 2002). The
 *   neighbour part of df is counted without materialising documents: a label or description
 *   term of entity e is credited to deg(e) further documents (an upper bound that ignores two
 *   neighbours sharing a term), capped at N.
 * Building reads the edge, alias and entity tables once each (no per-question scans), or takes
 * the rows a load writes (lexical-builder.ts: the same builder either way).
 */
import { closeSync, openSync, readSync, renameSync, writeFileSync, unlinkSync } from "node:fs";
import type { Catalog } from "../catalog/index.js";
import { fnv1a32 } from "../catalog/index.js";
import { sortedIndexOf } from "./sorted-search.js";
import { LexicalBuilder, NEIGHBOUR_DESCRIPTION_WEIGHT, type LexicalParts } from "./lexical-builder.js";
import type { TrigramTable } from "./fuzzy-index.js";
import type { DescriptionTable } from "./description-match.js";

/** Format tag written at the start of the snapshot file. */
const MAGIC = "tiepoint-link-4";

/** Sections read when a question first needs them (the trigram table, the description index), not at open. */
const LAZY_GRAMS = ["gramKeys", "gramOffsets", "gramPostings"] as const;
const LAZY_DESCRIPTIONS = ["descOffsets", "descPostings", "descTf", "descLengths", "descTerms"] as const;
const LAZY: readonly string[] = [...LAZY_GRAMS, ...LAZY_DESCRIPTIONS];

/** The snapshot file's header. */
interface Header {
  magic: string; uid: string; generation: number; entityCount: number; maxAliasTokens: number; avgDocLength: number;
  vocabSize: number; termCount: number; descTermCount: number; descDocuments: number; descAvgLength: number; sections: Record<string, [number, number]>;
}

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

/** `length` bytes of the open file from `position`, in a buffer of its own starting at offset 0 (so 8-aligned sections can be viewed as typed arrays). */
function readRange(fd: number, position: number, length: number): Buffer {
  const bytes = new Uint8Array(new ArrayBuffer(length));
  for (let off = 0; off < length; ) {
    const got = readSync(fd, bytes, off, Math.min(length - off, 1 << 26), position + off);
    if (got === 0) throw new RangeError("linking/lexical-snapshot: file ended early");
    off += got;
  }
  return Buffer.from(bytes.buffer, 0, length);
}

/** The header of an open snapshot file and where its sections start. */
function readHeader(fd: number): { h: Header; base: number } {
  const hl = readRange(fd, 0, 8).readUInt32LE(0);
  const h = JSON.parse(readRange(fd, 8, hl).toString("utf8")) as Header;
  return { h, base: 8 + hl + ((8 - ((8 + hl) % 8)) % 8) };
}

/** The byte range [from, to) of the named sections, relative to the sections' start. */
function spanOf(sections: Record<string, [number, number]>, names: readonly string[]): [number, number] {
  let from = Infinity;
  let to = 0;
  for (const name of names) {
    const [o, n] = sections[name]!;
    from = Math.min(from, o);
    to = Math.max(to, o + n);
  }
  return from === Infinity ? [0, 0] : [from, to];
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
  /** The trigram table and the description index: in memory, or still in the file (read on first use). */
  private gramTable: TrigramTable | undefined;
  private descTable: DescriptionTable | undefined;
  private readonly file: { readonly path: string; readonly sections: Record<string, [number, number]> } | undefined;

  private constructor(p: {
    uid: string; generation: number; entityCount: number; degree: Int32Array; vocab: string[]; offsets: Int32Array; postings: Int32Array;
    keys: Uint32Array; maxAliasTokens: number; terms: string[]; df: Int32Array; avgDocLength: number;
    grams?: TrigramTable; descriptions?: DescriptionTable; file?: { path: string; sections: Record<string, [number, number]> };
  }) {
    this.gramTable = p.grams;
    this.descTable = p.descriptions;
    this.file = p.file;
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

  /** The vocabulary's trigram table (fuzzy-index.ts); undefined when the file no longer holds this generation's. */
  grams(): TrigramTable | undefined {
    if (!this.gramTable) this.readLazy("grams");
    return this.gramTable;
  }

  /** The description index's table (description-match.ts); undefined when the file no longer holds this generation's. */
  descriptions(): DescriptionTable | undefined {
    if (!this.descTable) this.readLazy("descriptions");
    return this.descTable;
  }

  /**
   * Reads one lazy part (the trigram table, or the description index) with one read of its
   * sections only, after checking that the file is still this snapshot's: a question that
   * corrects a misspelling does not pay for the description index, nor the other way round
   * (each fresh megabyte read costs its page faults as well as the copy).
   */
  private readLazy(part: "grams" | "descriptions"): void {
    if (!this.file) return;
    let fd: number | undefined;
    try {
      fd = openSync(this.file.path, "r");
      const { h, base } = readHeader(fd);
      if (h.magic !== MAGIC || h.uid !== this.uid || h.generation !== this.generation || JSON.stringify(h.sections) !== JSON.stringify(this.file.sections)) return;
      const names = part === "grams" ? LAZY_GRAMS : LAZY_DESCRIPTIONS;
      const [from, to] = spanOf(h.sections, names);
      const buf = readRange(fd, base + from, to - from);
      const sec = (name: string) => {
        const [o, n] = h.sections[name]!;
        return buf.subarray(o - from, o - from + n);
      };
      const ints = (name: string) => {
        const b = sec(name);
        return new Int32Array(b.buffer, b.byteOffset, b.length / 4);
      };
      if (part === "grams") {
        const gk = sec("gramKeys");
        this.gramTable = { keys: new Float64Array(gk.buffer, gk.byteOffset, gk.length / 8), offsets: ints("gramOffsets"), postings: ints("gramPostings") };
        return;
      }
      const terms = h.descTermCount === 0 ? [] : sec("descTerms").toString("utf8").split("\n");
      if (terms.length !== h.descTermCount) return;
      this.descTable = { terms, offsets: ints("descOffsets"), postings: ints("descPostings"), tf: ints("descTf"), lengths: ints("descLengths"), documents: h.descDocuments, avgLength: h.descAvgLength };
    } catch {
      /* a damaged or replaced file: the caller builds what it needs */
    } finally {
      if (fd !== undefined) closeSync(fd);
    }
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
    const grams = this.grams();
    const desc = this.descriptions();
    if (!grams || !desc) throw new Error("linking/lexical-snapshot: the snapshot's file changed since it was read; build it again to save it");
    const view = (a: Int32Array | Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
    const parts: [string, Buffer][] = [
      ["degree", Buffer.from(this.degree.buffer, this.degree.byteOffset, this.degree.byteLength)],
      ["offsets", Buffer.from(this.offsets.buffer, this.offsets.byteOffset, this.offsets.byteLength)],
      ["postings", Buffer.from(this.postings.buffer, this.postings.byteOffset, this.postings.byteLength)],
      ["keys", Buffer.from(this.keys.table.buffer, this.keys.table.byteOffset, this.keys.table.byteLength)],
      ["df", Buffer.from(this.df.buffer, this.df.byteOffset, this.df.byteLength)],
      ["vocab", vocabBuf],
      ["terms", termBuf],
      // read on first use (LAZY)
      ["gramKeys", view(grams.keys)],
      ["gramOffsets", view(grams.offsets)],
      ["gramPostings", view(grams.postings)],
      ["descOffsets", view(desc.offsets)],
      ["descPostings", view(desc.postings)],
      ["descTf", view(desc.tf)],
      ["descLengths", view(desc.lengths)],
      ["descTerms", Buffer.from(desc.terms.join("\n"), "utf8")],
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
        maxAliasTokens: this.maxAliasTokens, avgDocLength: this.avgDocLength, vocabSize: this.vocab.length, termCount: this.terms.length,
        descTermCount: desc.terms.length, descDocuments: desc.documents, descAvgLength: desc.avgLength, sections,
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
    let fd: number;
    try {
      fd = openSync(path, "r");
    } catch {
      return undefined;
    }
    try {
      const { h, base } = readHeader(fd);
      if (h.magic !== MAGIC || h.uid !== uid || h.generation !== generation) return undefined;
      // the sections a question always needs, with one read; the lazy ones come after them
      const eager = Object.keys(h.sections).filter((name) => !(LAZY as readonly string[]).includes(name));
      const [, end] = spanOf(h.sections, eager);
      const buf = readRange(fd, base, end);
      const sec = (name: string) => {
        const [o, n] = h.sections[name]!;
        return buf.subarray(o, o + n);
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
        keys, maxAliasTokens: h.maxAliasTokens, terms, df: ints("df"), avgDocLength: h.avgDocLength, file: { path, sections: h.sections },
      });
    } catch {
      return undefined; // a damaged snapshot is rebuilt, never trusted
    } finally {
      closeSync(fd);
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

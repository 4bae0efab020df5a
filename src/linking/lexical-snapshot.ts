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
 * Building reads the edge, alias and entity tables once each (no per-question scans).
 */
import { readFileSync, renameSync, writeFileSync, unlinkSync } from "node:fs";
import type { Catalog } from "../catalog/index.js";
import { fnv1a32, stemToken, tokens } from "../catalog/index.js";
import { isStopWord } from "./stopwords.js";
import { sortedIndexOf } from "./sorted-search.js";

/** Format tag written at the start of the snapshot file. */
const MAGIC = "tiepoint-link-3";

/** Weight of a neighbour's description in an entity's context document (see linker.ts). */
export const NEIGHBOUR_DESCRIPTION_WEIGHT = 0.5;

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
  static withCapacity(n: number): HashSet32 {
    let size = 16;
    while (size < n * 2) size *= 2;
    return new HashSet32(new Uint32Array(size));
  }
  add(h: number): void {
    let i = h & this.mask;
    while (this.table[i] !== 0) {
      if (this.table[i] === h) return;
      i = (i + 1) & this.mask;
    }
    this.table[i] = h;
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

/** A growable Int32 array. */
class IntList {
  data = new Int32Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.data.length) {
      const d = new Int32Array(this.data.length * 2);
      d.set(this.data);
      this.data = d;
    }
    this.data[this.length++] = v;
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
    const maxNum = cat.maxEntityNum();
    const degree = new Int32Array(maxNum + 1);
    for (const [s, , d] of cat.edges()) {
      degree[s]!++;
      degree[d]!++;
    }
    const vocabMap = new Map<string, number>();
    const pairTok = new IntList();
    const pairEnt = new IntList();
    const keyHashes = new IntList();
    let maxAliasTokens = 1;
    for (const [entity, , norm] of cat.aliases()) {
      if (norm === "") continue;
      const toks = norm.split(" ");
      if (toks.length > maxAliasTokens) maxAliasTokens = toks.length;
      keyHashes.push(fnv1a(norm));
      keyHashes.push(fnv1a(toks.map(stemToken).join(" ")));
      for (const t of toks) {
        let id = vocabMap.get(t);
        if (id === undefined) {
          id = vocabMap.size;
          vocabMap.set(t, id);
        }
        pairTok.push(id);
        pairEnt.push(entity);
      }
    }
    // sort the vocabulary and remap ids so the file and iteration order are deterministic
    const vocab = [...vocabMap.keys()].sort();
    const remap = new Int32Array(vocabMap.size);
    vocab.forEach((t, i) => (remap[vocabMap.get(t)!] = i));
    const counts = new Int32Array(vocab.length + 1);
    for (let i = 0; i < pairTok.length; i++) counts[remap[pairTok.data[i]!]! + 1]!++;
    for (let i = 0; i < vocab.length; i++) counts[i + 1]! += counts[i]!;
    const fill = counts.slice(0, vocab.length);
    const raw = new Int32Array(pairTok.length);
    for (let i = 0; i < pairTok.length; i++) raw[fill[remap[pairTok.data[i]!]!]!++] = pairEnt.data[i]!;
    // sort + dedupe each posting list
    const offsets = new Int32Array(vocab.length + 1);
    let w = 0;
    for (let t = 0; t < vocab.length; t++) {
      const list = raw.subarray(counts[t]!, counts[t + 1]!).sort();
      offsets[t] = w;
      let last = -1;
      for (const e of list) if (e !== last) raw[w++] = last = e;
    }
    offsets[vocab.length] = w;
    const postings = raw.slice(0, w);
    const keys = HashSet32.withCapacity(keyHashes.length);
    for (let i = 0; i < keyHashes.length; i++) keys.add(keyHashes.data[i]! >>> 0);

    // context-term document frequencies
    const df = new Map<string, number>();
    let entityCount = 0;
    let totalLength = 0;
    for (const [num, label, description] of cat.entityTexts()) {
      entityCount++;
      const deg = degree[num] ?? 0;
      if (description) {
        // own document (weight 1) and, at half weight, the documents of its deg neighbours
        const seen = new Set<string>();
        for (const t of tokens(description)) {
          if (isStopWord(t)) continue;
          totalLength += 1 + NEIGHBOUR_DESCRIPTION_WEIGHT * deg;
          const s = stemToken(t);
          if (!seen.has(s)) {
            seen.add(s);
            df.set(s, (df.get(s) ?? 0) + 1 + deg);
          }
        }
      }
      if (label && deg > 0) {
        const seen = new Set<string>();
        for (const t of tokens(label)) {
          if (isStopWord(t)) continue;
          totalLength += deg;
          const s = stemToken(t);
          if (!seen.has(s)) {
            seen.add(s);
            df.set(s, (df.get(s) ?? 0) + deg);
          }
        }
      }
    }
    const terms = [...df.keys()].sort();
    const dfArr = new Int32Array(terms.length);
    terms.forEach((t, i) => (dfArr[i] = Math.min(entityCount, df.get(t)!)));
    return new LexicalSnapshot({
      uid, generation, entityCount, degree, vocab, offsets, postings, keys: keys.table, maxAliasTokens,
      terms, df: dfArr, avgDocLength: entityCount > 0 ? totalLength / entityCount : 0,
    });
  }

  /** Serialises to `path` (written to a temporary file, then renamed into place). */
  save(path: string): void {
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
      renameSync(tmp, path);
    } catch (e) {
      try {
        unlinkSync(tmp);
      } catch {
        /* nothing to clean */
      }
      throw e;
    }
  }

  /** Loads a snapshot saved for exactly this uid and generation; undefined when missing or stale. */
  static load(path: string, uid: string, generation: number): LexicalSnapshot | undefined {
    let buf: Buffer;
    try {
      buf = readFileSync(path);
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
      const ints = (name: string) => {
        const b = sec(name);
        const copy = new Int32Array(b.length / 4);
        new Uint8Array(copy.buffer).set(b);
        return copy;
      };
      const keysB = sec("keys");
      const keys = new Uint32Array(keysB.length / 4);
      new Uint8Array(keys.buffer).set(keysB);
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
    const path = `${cat.path}.link`;
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

/**
 * Lexical snapshot from a stream of rows
 * ======================================
 *
 * Accumulates what the linker's lexical snapshot (lexical-snapshot.ts) holds — the alias
 * token vocabulary with its postings and trigram table (fuzzy-index.ts), the hash set of
 * alias keys, the context-term document frequencies for BM25 and the inverted index of the
 * descriptions (description-match.ts) — from alias rows and entity texts in any order, so a load can
 * build it from the rows it writes instead of reading the catalog back afterwards. The same
 * builder serves the read-back path (`LexicalSnapshot.build`), so both give the same snapshot.
 *
 * An entity's label and description may be set more than once during a load (a preferred
 * label, appended descriptions): the last text given wins, as in the catalog row. The term
 * statistics of a text do not depend on the entity's degree, so they are computed when the
 * text arrives and combined with the degrees at the end (see lexical-snapshot.ts for the
 * document model: own description, neighbours' labels, neighbours' descriptions at half weight).
 *
 * Canonical orders (independent of arrival): vocabulary and terms sorted, postings sorted and
 * unique, key hashes inserted into the open-addressing set in ascending order.
 */
import { stemToken, tokens } from "../catalog/index.js";
import { isStopWord } from "./stopwords.js";
import { DescriptionTableBuilder, type DescriptionTable } from "./description-match.js";
import { trigramTable, type TrigramTable } from "./fuzzy-index.js";

/** Builder settings; all optional. */
export const DEFAULTS = {
  /** Porter stems remembered per token (texts repeat their words; the memo is emptied when full). */
  stemMemo: 200_000,
};

/** Weight of a neighbour's description in an entity's context document (see linker.ts). */
export const NEIGHBOUR_DESCRIPTION_WEIGHT = 0.5;

/** FNV-1a-based alias key hash, unsigned and never 0 (0 marks an empty slot). */
export type KeyHash = (key: string) => number;

/** A growable Int32 list. */
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

/** What {@link LexicalBuilder.finish} produces (the fields of a lexical snapshot). */
export interface LexicalParts {
  readonly entityCount: number;
  readonly degree: Int32Array;
  readonly vocab: string[];
  readonly offsets: Int32Array;
  readonly postings: Int32Array;
  /** Open-addressing table of the alias key hashes (linear probing, size a power of two). */
  readonly keys: Uint32Array;
  readonly maxAliasTokens: number;
  readonly terms: string[];
  readonly df: Int32Array;
  readonly avgDocLength: number;
  /** The vocabulary's trigram postings (fuzzy-index.ts). */
  readonly grams: TrigramTable;
  /** The inverted index of the description stems (description-match.ts). */
  readonly descriptions: DescriptionTable;
}

/** Collects alias rows and entity texts; makes the lexical snapshot's parts at the end. */
export class LexicalBuilder {
  private readonly hash: KeyHash;
  private readonly vocabMap = new Map<string, number>();
  /** Per alias token occurrence: token id and entity. */
  private readonly pairTok = new IntList();
  private readonly pairEnt = new IntList();
  /** Per alias: entity, normalised-key hash, stemmed-key hash, token count. */
  private readonly aliasEnt = new IntList();
  private readonly aliasNorm = new IntList();
  private readonly aliasStem = new IntList();
  private readonly aliasTokens = new IntList();
  /** Context terms (stems) by id. */
  private readonly termIds = new Map<string, number>();
  private readonly termList: string[] = [];
  /** Text statistics records: [non-stop token count, distinct stems k, stem id × k, count of each × k]. */
  private readonly records = new IntList();
  /** Per entity num: the record of its current label / description (−1: none). */
  private labelAt: Int32Array = new Int32Array(1024).fill(-1);
  private descAt: Int32Array = new Int32Array(1024).fill(-1);
  private maxText = 0;
  private readonly removed = new Set<number>();
  private readonly stems = new Map<string, string>();

  /** @param hash the alias key hash of the snapshot (lexical-snapshot.ts `fnv1a`) */
  constructor(hash: KeyHash) {
    this.hash = hash;
  }

  /** One label or alias row: its normalised form and the stemmed form of that (space-joined tokens). */
  alias(entity: number, norm: string, stem: string): void {
    if (norm === "") return;
    const toks = norm.split(" ");
    this.aliasEnt.push(entity);
    this.aliasNorm.push(this.hash(norm));
    this.aliasStem.push(this.hash(stem));
    this.aliasTokens.push(toks.length);
    for (const t of toks) {
      let id = this.vocabMap.get(t);
      if (id === undefined) {
        id = this.vocabMap.size;
        this.vocabMap.set(t, id);
      }
      this.pairTok.push(id);
      this.pairEnt.push(entity);
    }
  }

  /** The entity's label is now `text` (null: none). */
  label(entity: number, text: string | null): void {
    this.labelAt = this.slot(this.labelAt, entity);
    this.labelAt[entity] = text ? this.record(text) : -1;
  }

  /** The entity's description is now `text` (null: none). */
  description(entity: number, text: string | null): void {
    this.descAt = this.slot(this.descAt, entity);
    this.descAt[entity] = text ? this.record(text) : -1;
  }

  /** An entity removed from the catalog, with its aliases. */
  remove(entity: number): void {
    this.removed.add(entity);
  }

  private slot(arr: Int32Array, n: number): Int32Array {
    if (n > this.maxText) this.maxText = n;
    if (n < arr.length) return arr;
    const bigger = new Int32Array(Math.max(n + 1, arr.length * 2)).fill(-1);
    bigger.set(arr);
    return bigger;
  }

  private stem(t: string): string {
    let s = this.stems.get(t);
    if (s === undefined) {
      s = stemToken(t);
      if (this.stems.size >= DEFAULTS.stemMemo) this.stems.clear();
      this.stems.set(t, s);
    }
    return s;
  }

  /** Appends the statistics record of a text: non-stop tokens, then its distinct stems. */
  private record(text: string): number {
    const at = this.records.length;
    let count = 0;
    const ids: number[] = [];
    const tfs: number[] = [];
    for (const t of tokens(text)) {
      if (isStopWord(t)) continue;
      count++;
      const s = this.stem(t);
      let id = this.termIds.get(s);
      if (id === undefined) {
        id = this.termList.length;
        this.termIds.set(s, id);
        this.termList.push(s);
      }
      const k = ids.indexOf(id);
      if (k < 0) {
        ids.push(id);
        tfs.push(1);
      } else tfs[k]!++;
    }
    this.records.push(count);
    this.records.push(ids.length);
    for (const id of ids) this.records.push(id);
    for (const tf of tfs) this.records.push(tf);
    return at;
  }

  /**
   * The snapshot's parts, given each entity's degree (edges at it, both directions) and the
   * number of entity rows (BM25's N).
   */
  finish(degree: Int32Array, entityCount: number): LexicalParts {
    const gone = this.removed;
    // alias token vocabulary, sorted, and postings (sorted, unique per token)
    const used = new Uint8Array(this.vocabMap.size);
    for (let i = 0; i < this.pairTok.length; i++) if (!gone.has(this.pairEnt.data[i]!)) used[this.pairTok.data[i]!] = 1;
    const vocab = [...this.vocabMap.keys()].filter((t) => used[this.vocabMap.get(t)!] === 1).sort();
    const remap = new Int32Array(this.vocabMap.size).fill(-1);
    vocab.forEach((t, i) => (remap[this.vocabMap.get(t)!] = i));
    const counts = new Int32Array(vocab.length + 1);
    for (let i = 0; i < this.pairTok.length; i++) {
      const t = remap[this.pairTok.data[i]!]!;
      if (t >= 0 && !gone.has(this.pairEnt.data[i]!)) counts[t + 1]!++;
    }
    for (let i = 0; i < vocab.length; i++) counts[i + 1]! += counts[i]!;
    const fill = counts.slice(0, vocab.length);
    const raw = new Int32Array(counts[vocab.length]!);
    for (let i = 0; i < this.pairTok.length; i++) {
      const t = remap[this.pairTok.data[i]!]!;
      if (t >= 0 && !gone.has(this.pairEnt.data[i]!)) raw[fill[t]!++] = this.pairEnt.data[i]!;
    }
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

    // alias keys: a set of hashes, inserted in ascending order
    let maxAliasTokens = 1;
    const hashes: number[] = [];
    for (let i = 0; i < this.aliasEnt.length; i++) {
      if (gone.has(this.aliasEnt.data[i]!)) continue;
      hashes.push(this.aliasNorm.data[i]! >>> 0, this.aliasStem.data[i]! >>> 0);
      if (this.aliasTokens.data[i]! > maxAliasTokens) maxAliasTokens = this.aliasTokens.data[i]!;
    }
    const sortedHashes = Uint32Array.from(hashes).sort();
    let size = 16;
    while (size < sortedHashes.length * 2) size *= 2;
    const keys = new Uint32Array(size);
    const mask = size - 1;
    for (const h of sortedHashes) {
      let i = h & mask;
      while (keys[i] !== 0 && keys[i] !== h) i = (i + 1) & mask;
      keys[i] = h;
    }

    // context-term document frequencies (own description, neighbours' labels and descriptions)
    const T = this.termList.length;
    const dfSum = new Float64Array(T);
    const seen = new Uint8Array(T);
    const rec = this.records.data;
    let totalLength = 0;
    for (let num = 0; num <= this.maxText; num++) {
      if (gone.has(num)) continue;
      const deg = num < degree.length ? degree[num]! : 0;
      const d = num < this.descAt.length ? this.descAt[num]! : -1;
      if (d >= 0) {
        totalLength += rec[d]! * (1 + NEIGHBOUR_DESCRIPTION_WEIGHT * deg);
        for (let k = 0; k < rec[d + 1]!; k++) {
          const id = rec[d + 2 + k]!;
          dfSum[id]! += 1 + deg;
          seen[id] = 1;
        }
      }
      const l = num < this.labelAt.length ? this.labelAt[num]! : -1;
      if (l >= 0 && deg > 0) {
        totalLength += rec[l]! * deg;
        for (let k = 0; k < rec[l + 1]!; k++) {
          const id = rec[l + 2 + k]!;
          dfSum[id]! += deg;
          seen[id] = 1;
        }
      }
    }
    const terms = this.termList.filter((_, id) => seen[id] === 1).sort();
    const df = Int32Array.from(terms, (t) => Math.min(entityCount, dfSum[this.termIds.get(t)!]!));

    // the description index (description-match.ts): every description's stems with their counts, entities ascending
    const descriptions = new DescriptionTableBuilder();
    for (let num = 0; num <= this.maxText && num < this.descAt.length; num++) {
      const d = this.descAt[num]!;
      if (d < 0 || gone.has(num)) continue;
      const k = rec[d + 1]!;
      const stems: [string, number][] = [];
      for (let j = 0; j < k; j++) stems.push([this.termList[rec[d + 2 + j]!]!, rec[d + 2 + k + j]!]);
      descriptions.add(num, stems, rec[d]!);
    }
    return {
      entityCount, degree, vocab, offsets, postings, keys, maxAliasTokens, terms, df, avgDocLength: entityCount > 0 ? totalLength / entityCount : 0,
      grams: trigramTable(vocab), descriptions: descriptions.finish(),
    };
  }
}

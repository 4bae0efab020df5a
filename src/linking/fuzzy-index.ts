/**
 * Fuzzy token lookup: a character trigram index over the alias token vocabulary, candidates
 * re-scored by Levenshtein distance (fastest-levenshtein) and Jaro–Winkler similarity.
 *
 * [Reference] E. Ukkonen, "Approximate string-matching with q-grams and maximal matches",
 * Theoretical Computer Science 92, 1992 (the q-gram lemma: one edit destroys at most q
 * q-grams, so a token within k edits keeps at least |grams| − 3k of the query's trigrams);
 * V. I. Levenshtein 1966; Jaro 1989 / Winkler 1990 (see jaro-winkler.ts).
 * The trigram postings are a compressed sparse row table (Saad 2003, §3.4) built with the
 * name index at load time (lexical-builder.ts) and saved in it (lexical-snapshot.ts), read on
 * a session's first question with an unknown content word: no question builds it.
 */
import { distance } from "fastest-levenshtein";
import { jaroWinkler } from "./jaro-winkler.js";
import { sortedIndexOf } from "./sorted-search.js";

/** Options of {@link FuzzyTokenIndex.nearest}. */
export const DEFAULTS = {
  /** Shortest query token that is corrected at all. */
  minLength: 4,
  /** Largest edit distance accepted: 1 up to this length, 2 above it. */
  oneEditUpTo: 6,
  /** Candidates kept after re-scoring. */
  limit: 5,
} as const;

/** A vocabulary token close to the query. */
export interface FuzzyHit {
  /** Index in the vocabulary. */
  readonly token: number;
  /** Levenshtein distance. */
  readonly edits: number;
  /** Jaro–Winkler similarity. */
  readonly similarity: number;
}

/** The trigrams of a token padded with `$` at both ends, each as a number (three UTF-16 code units: c0·2³² + c1·2¹⁶ + c2, exact in a double), distinct, in first-seen order. */
function trigramKeys(token: string): number[] {
  const p = `$${token}$`;
  const out: number[] = [];
  for (let i = 0; i + 3 <= p.length; i++) {
    const k = p.charCodeAt(i) * 4294967296 + p.charCodeAt(i + 1) * 65536 + p.charCodeAt(i + 2);
    if (!out.includes(k)) out.push(k);
  }
  return out;
}

/**
 * The trigram postings of a vocabulary as a compressed sparse row table: `keys` the distinct
 * trigram keys ascending, token ids of key `g` at `postings[offsets[g] .. offsets[g+1])`,
 * ascending. Built once per catalog with the name index (lexical-builder.ts) and saved in it,
 * so a question opens it instead of building it.
 */
export interface TrigramTable {
  readonly keys: Float64Array;
  readonly offsets: Int32Array;
  readonly postings: Int32Array;
}

/** Builds the trigram table of `vocab` (one pass to number the keys, a counting sort into rows, the rows put in key order). */
export function trigramTable(vocab: readonly string[]): TrigramTable {
  const idOf = new Map<number, number>();
  const pairKey: number[] = [];
  const pairTok: number[] = [];
  for (let t = 0; t < vocab.length; t++) {
    for (const k of trigramKeys(vocab[t]!)) {
      let id = idOf.get(k);
      if (id === undefined) idOf.set(k, (id = idOf.size));
      pairKey.push(id);
      pairTok.push(t);
    }
  }
  const G = idOf.size;
  const keyOfId = new Float64Array(G);
  for (const [k, id] of idOf) keyOfId[id] = k;
  const keys = keyOfId.slice().sort();
  const rowOfId = new Int32Array(G);
  const rank = new Map<number, number>();
  keys.forEach((k, g) => rank.set(k, g));
  for (let id = 0; id < G; id++) rowOfId[id] = rank.get(keyOfId[id]!)!;
  const offsets = new Int32Array(G + 1);
  for (const id of pairKey) offsets[rowOfId[id]! + 1]!++;
  for (let g = 0; g < G; g++) offsets[g + 1]! += offsets[g]!;
  const fill = offsets.slice(0, G);
  const postings = new Int32Array(pairKey.length);
  // tokens arrive ascending, so each row is ascending
  for (let i = 0; i < pairKey.length; i++) postings[fill[rowOfId[pairKey[i]!]!]!++] = pairTok[i]!;
  return { keys, offsets, postings };
}

/** Trigram index over a token vocabulary. */
export class FuzzyTokenIndex {
  private readonly vocab: readonly string[];
  private readonly table: TrigramTable;

  /** @param table the vocabulary's trigram table (the name index's saved one; built from `vocab` when absent) */
  constructor(vocab: readonly string[], table?: TrigramTable) {
    this.vocab = vocab;
    this.table = table ?? trigramTable(vocab);
  }

  /** Vocabulary tokens within the edit budget of `query`, best first (ties by token). */
  nearest(query: string, options: { minLength?: number; oneEditUpTo?: number; limit?: number; maxEdits?: number } = {}): FuzzyHit[] {
    const minLength = options.minLength ?? DEFAULTS.minLength;
    if (query.length < minLength) return [];
    const maxEdits = options.maxEdits ?? (query.length <= (options.oneEditUpTo ?? DEFAULTS.oneEditUpTo) ? 1 : 2);
    const limit = options.limit ?? DEFAULTS.limit;
    const qg = trigramKeys(query);
    // a string within k edits keeps at least |grams| − 3k of the query's trigrams
    const need = Math.max(1, qg.length - 3 * maxEdits);
    const count = new Map<number, number>();
    const { keys, offsets, postings } = this.table;
    for (const g of qg) {
      const row = sortedIndexOf(keys, g);
      if (row < 0) continue;
      const from = offsets[row]!;
      const to = offsets[row + 1]!;
      if (to - from > 50_000) continue; // extremely common trigrams filter nothing
      for (let i = from; i < to; i++) count.set(postings[i]!, (count.get(postings[i]!) ?? 0) + 1);
    }
    const hits: FuzzyHit[] = [];
    for (const [t, c] of count) {
      if (c < need) continue;
      const cand = this.vocab[t]!;
      if (Math.abs(cand.length - query.length) > maxEdits || cand === query) continue;
      const edits = distance(query, cand);
      if (edits > maxEdits) continue;
      hits.push({ token: t, edits, similarity: jaroWinkler(query, cand) });
    }
    hits.sort((a, b) => a.edits - b.edits || b.similarity - a.similarity || a.token - b.token);
    return hits.slice(0, limit);
  }
}

/**
 * Fuzzy token lookup: a character trigram index over the alias token vocabulary, candidates
 * re-scored by Levenshtein distance (fastest-levenshtein) and Jaro–Winkler similarity.
 *
 * [Reference] E. Ukkonen, "Approximate string-matching with q-grams and maximal matches",
 * Theoretical Computer Science 92, 1992 (the q-gram lemma: one edit destroys at most q
 * q-grams, so a token within k edits keeps at least |grams| − 3k of the query's trigrams);
 * V. I. Levenshtein 1966; Jaro 1989 / Winkler 1990 (see jaro-winkler.ts).
 * Built lazily, only when a question has a content word the exact index does not know, so
 * start-up on a large catalog never pays for it.
 */
import { distance } from "fastest-levenshtein";
import { jaroWinkler } from "./jaro-winkler.js";

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

function trigrams(token: string): string[] {
  const p = `$${token}$`;
  const out: string[] = [];
  for (let i = 0; i + 3 <= p.length; i++) out.push(p.slice(i, i + 3));
  return out;
}

/** Trigram index over a token vocabulary. */
export class FuzzyTokenIndex {
  private readonly vocab: readonly string[];
  private readonly grams = new Map<string, number[]>();

  constructor(vocab: readonly string[]) {
    this.vocab = vocab;
    for (let i = 0; i < vocab.length; i++) {
      const seen = new Set<string>();
      for (const g of trigrams(vocab[i]!)) {
        if (seen.has(g)) continue;
        seen.add(g);
        let list = this.grams.get(g);
        if (!list) this.grams.set(g, (list = []));
        list.push(i);
      }
    }
  }

  /** Vocabulary tokens within the edit budget of `query`, best first (ties by token). */
  nearest(query: string, options: { minLength?: number; oneEditUpTo?: number; limit?: number; maxEdits?: number } = {}): FuzzyHit[] {
    const minLength = options.minLength ?? DEFAULTS.minLength;
    if (query.length < minLength) return [];
    const maxEdits = options.maxEdits ?? (query.length <= (options.oneEditUpTo ?? DEFAULTS.oneEditUpTo) ? 1 : 2);
    const limit = options.limit ?? DEFAULTS.limit;
    const qg = [...new Set(trigrams(query))];
    // a string within k edits keeps at least |grams| − 3k of the query's trigrams
    const need = Math.max(1, qg.length - 3 * maxEdits);
    const count = new Map<number, number>();
    for (const g of qg) {
      const list = this.grams.get(g);
      if (!list || list.length > 50_000) continue; // extremely common trigrams filter nothing
      for (const t of list) count.set(t, (count.get(t) ?? 0) + 1);
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

/**
 * Okapi BM25 context similarity between the question's other words and a candidate entity's
 * context document (its description and its neighbours' labels).
 *
 * [Reference] S. Robertson and H. Zaragoza, "The Probabilistic Relevance Framework: BM25 and
 * Beyond", Foundations and Trends in IR 3(4), 2009: score = Σ_t idf(t)·tf·(k1+1) /
 * (tf + k1·(1 − b + b·|d|/avgdl)), idf(t) = ln(1 + (N − df + 0.5)/(df + 0.5)) (the
 * non-negative idf variant). k1 = 1.2, b = 0.75 are the values the survey reports as usual.
 * Document frequencies come from the lexical snapshot (computed once per catalog generation).
 */

/** BM25 parameters. */
export const DEFAULTS = {
  /** Term-frequency saturation k1 (Robertson & Zaragoza 2009). */
  k1: 1.2,
  /** Length normalisation b (Robertson & Zaragoza 2009). */
  b: 0.75,
} as const;

/** Corpus statistics BM25 needs. */
export interface Bm25Stats {
  /** Number of documents N. */
  readonly documents: number;
  /** Average document length. */
  readonly avgLength: number;
  /** Document frequency of a term. */
  documentFrequency(term: string): number;
}

/** Robertson–Spärck Jones idf with +1 inside the log (never negative). */
export function idf(stats: Bm25Stats, term: string): number {
  const n = Math.max(1, stats.documents);
  const df = Math.min(n, stats.documentFrequency(term));
  return Math.log(1 + (n - df + 0.5) / (df + 0.5));
}

/**
 * BM25 score of a document (its term counts and length) for the query terms (each counted once).
 */
export function bm25(
  query: readonly string[],
  doc: ReadonlyMap<string, number>,
  docLength: number,
  stats: Bm25Stats,
  options: { k1?: number; b?: number } = {},
): number {
  const k1 = options.k1 ?? DEFAULTS.k1;
  const b = options.b ?? DEFAULTS.b;
  const avg = stats.avgLength > 0 ? stats.avgLength : 1;
  let score = 0;
  for (const t of new Set(query)) {
    const tf = doc.get(t) ?? 0;
    if (tf === 0) continue;
    score += (idf(stats, t) * tf * (k1 + 1)) / (tf + k1 * (1 - b + (b * docLength) / avg));
  }
  return score;
}

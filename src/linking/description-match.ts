/**
 * Entities named by what they are: a definite noun phrase of the question that is no name ("the
 * terminal based chat client", "the survey ship built in 1994") linked to the entities whose
 * description fits it.
 *
 * [Reference] Okapi BM25 over the entities' own descriptions (S. Robertson and H. Zaragoza,
 * "The Probabilistic Relevance Framework: BM25 and Beyond", 2009; bm25.ts), with an inverted
 * index of description stems built once per linker, and only when a question has such a
 * phrase. A candidate must contain at least `minTerms` distinct query stems and at least half
 * of them; its similarity is `scale` × the share of the query's IDF mass it contains (a
 * description holding every rare word of the phrase scores `scale`). When the phrase's words
 * name a type, candidates of that type (or a subtype) come first. The phrase: after "the" (a
 * definite description), the longest run of content words that no mention covers, up to a stop word or a
 * relation word, with at least `minTerms` words that are neither type nor relation words.
 */
import type { Catalog } from "../catalog/index.js";
import { stemToken, tokens } from "../catalog/index.js";
import { bm25 } from "./bm25.js";
import { isStopWord } from "./stopwords.js";

/** Options of {@link DescriptionIndex.match}. */
export const DEFAULTS = {
  /** Fewest distinct phrase stems a description must contain. */
  minTerms: 2,
  /** Similarity of a description holding all of the phrase's IDF mass. */
  scale: 0.9,
  /** Candidates returned. */
  limit: 8,
} as const;

/** Entities read between two checks of the time budget while the index is built (a check is a clock read). */
const BUILD_CHECK_EVERY = 4096;

/** A description that fits a phrase. */
export interface DescriptionHit {
  readonly num: number;
  readonly similarity: number;
  readonly score: number;
}

/** An inverted index of the stems of every entity's description. */
export class DescriptionIndex {
  private readonly postings = new Map<string, Map<number, number>>();
  private readonly lengths = new Map<number, number>();
  private readonly avgLength: number;
  /** True when `stop` ended the build early: the index misses entities and must not be kept. */
  readonly cut: boolean = false;

  /** Reads every description; `stop` (the question's time budget) is asked every {@link BUILD_CHECK_EVERY} entities and ends the build early. */
  constructor(cat: Catalog, stop?: () => boolean) {
    let total = 0;
    let seen = 0;
    for (const [num, , description] of cat.entityTexts()) {
      if (stop !== undefined && seen++ % BUILD_CHECK_EVERY === 0 && stop()) {
        this.cut = true;
        break;
      }
      if (!description) continue;
      let length = 0;
      for (const t of tokens(description)) {
        if (isStopWord(t)) continue;
        const s = stemToken(t);
        let p = this.postings.get(s);
        if (!p) this.postings.set(s, (p = new Map()));
        p.set(num, (p.get(num) ?? 0) + 1);
        length++;
      }
      this.lengths.set(num, length);
      total += length;
    }
    this.avgLength = this.lengths.size > 0 ? total / this.lengths.size : 1;
  }

  /** Entities whose description fits the query stems, best first (ties by num). `typed(num)`: the candidate has the phrase's type. */
  match(query: readonly string[], typed?: (num: number) => boolean, options: Partial<typeof DEFAULTS> = {}): DescriptionHit[] {
    const o = { ...DEFAULTS, ...options };
    const terms = [...new Set(query)];
    const stats = { documents: this.lengths.size, avgLength: this.avgLength, documentFrequency: (t: string) => this.postings.get(t)?.size ?? 0 };
    const idf = (t: string) => Math.log(1 + (stats.documents - stats.documentFrequency(t) + 0.5) / (stats.documentFrequency(t) + 0.5));
    const mass = terms.reduce((a, t) => a + idf(t), 0);
    if (mass <= 0) return [];
    const hits = new Map<number, number>();
    for (const t of terms) for (const num of this.postings.get(t)?.keys() ?? []) hits.set(num, (hits.get(num) ?? 0) + 1);
    const need = Math.max(o.minTerms, Math.ceil(terms.length / 2));
    const out: (DescriptionHit & { typedOk: boolean })[] = [];
    for (const [num, count] of hits) {
      if (count < need) continue;
      const doc = new Map<string, number>();
      let held = 0;
      for (const t of terms) {
        const tf = this.postings.get(t)?.get(num);
        if (tf) {
          doc.set(t, tf);
          held += idf(t);
        }
      }
      out.push({ num, similarity: (o.scale * held) / mass, score: bm25(terms, doc, this.lengths.get(num) ?? 0, stats), typedOk: typed ? typed(num) : false });
    }
    out.sort((a, b) => Number(b.typedOk) - Number(a.typedOk) || b.score - a.score || a.num - b.num);
    return out.slice(0, o.limit).map(({ num, similarity, score }) => ({ num, similarity, score }));
  }
}

/**
 * Entities named by what they are: a definite noun phrase of the question that is no name ("the
 * terminal based chat client", "the survey ship built in 1994") linked to the entities whose
 * description fits it.
 *
 * [Reference] Okapi BM25 over the entities' own descriptions (S. Robertson and H. Zaragoza,
 * "The Probabilistic Relevance Framework: BM25 and Beyond", 2009; bm25.ts), with an inverted
 * index of description stems built with the name index at load time and saved in it (a catalog
 * whose name index lacks it builds it on the first question with such a phrase, within that
 * question's time budget). A candidate must contain at least `minTerms` distinct query stems and at least half
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
import { sortedIndexOf } from "./sorted-search.js";

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

/**
 * The inverted index of the description stems as compressed sparse row arrays (Saad 2003,
 * §3.4): `terms` sorted; the entities whose description holds `terms[i]` at
 * `postings[offsets[i] .. offsets[i+1])`, ascending, with its count in `tf` at the same place;
 * `lengths[num]` the description's non-stop token count (0: none or no description);
 * `documents` the entities with a description. Built with the name index at load time
 * (lexical-builder.ts) and saved in it (lexical-snapshot.ts), so no question builds it.
 */
export interface DescriptionTable {
  readonly terms: readonly string[];
  readonly offsets: Int32Array;
  readonly postings: Int32Array;
  readonly tf: Int32Array;
  readonly lengths: Int32Array;
  readonly documents: number;
  readonly avgLength: number;
}

/** Collects descriptions (as stem counts) in ascending entity order; makes the table. */
export class DescriptionTableBuilder {
  private readonly termIds = new Map<string, number>();
  private readonly termList: string[] = [];
  private readonly pairTerm: number[] = [];
  private readonly pairEnt: number[] = [];
  private readonly pairTf: number[] = [];
  private readonly lengthOf: number[] = [];
  private documents = 0;
  private total = 0;

  /** Entity `num`'s description: its stems with their counts, and its non-stop token count. Call in ascending `num`. */
  add(num: number, stems: Iterable<readonly [string, number]>, length: number): void {
    for (const [s, tf] of stems) {
      let id = this.termIds.get(s);
      if (id === undefined) {
        id = this.termList.length;
        this.termIds.set(s, id);
        this.termList.push(s);
      }
      this.pairTerm.push(id);
      this.pairEnt.push(num);
      this.pairTf.push(tf);
    }
    this.lengthOf[num] = length;
    this.documents++;
    this.total += length;
  }

  /** The table (rows in sorted term order, each row in the order added: ascending entity). */
  finish(): DescriptionTable {
    const terms = [...this.termList].sort();
    const rowOf = new Int32Array(this.termList.length);
    terms.forEach((t, i) => (rowOf[this.termIds.get(t)!] = i));
    const offsets = new Int32Array(terms.length + 1);
    for (const id of this.pairTerm) offsets[rowOf[id]! + 1]!++;
    for (let i = 0; i < terms.length; i++) offsets[i + 1]! += offsets[i]!;
    const fill = offsets.slice(0, terms.length);
    const postings = new Int32Array(this.pairTerm.length);
    const tf = new Int32Array(this.pairTerm.length);
    for (let i = 0; i < this.pairTerm.length; i++) {
      const at = fill[rowOf[this.pairTerm[i]!]!]!++;
      postings[at] = this.pairEnt[i]!;
      tf[at] = this.pairTf[i]!;
    }
    const lengths = new Int32Array(this.lengthOf.length);
    this.lengthOf.forEach((l, num) => (lengths[num] = l));
    return { terms, offsets, postings, tf, lengths, documents: this.documents, avgLength: this.documents > 0 ? this.total / this.documents : 1 };
  }
}

/** The stems of a description (stop words left out) with their counts, and its non-stop token count. */
export function descriptionStems(description: string, stem: (t: string) => string = stemToken): { stems: Map<string, number>; length: number } {
  const stems = new Map<string, number>();
  let length = 0;
  for (const t of tokens(description)) {
    if (isStopWord(t)) continue;
    const s = stem(t);
    stems.set(s, (stems.get(s) ?? 0) + 1);
    length++;
  }
  return { stems, length };
}

/** An inverted index of the stems of every entity's description. */
export class DescriptionIndex {
  private readonly table: DescriptionTable;

  constructor(table: DescriptionTable) {
    this.table = table;
  }

  /**
   * Reads every description of the catalog (when the name index holds no table); `stop` (the
   * question's time budget) is asked every {@link BUILD_CHECK_EVERY} entities and ends the
   * build early: undefined then (an index missing entities is never kept).
   */
  static fromCatalog(cat: Catalog, stop?: () => boolean): DescriptionIndex | undefined {
    const b = new DescriptionTableBuilder();
    let seen = 0;
    for (const [num, , description] of cat.entityTexts()) {
      if (stop !== undefined && seen++ % BUILD_CHECK_EVERY === 0 && stop()) return undefined;
      if (!description) continue;
      const { stems, length } = descriptionStems(description);
      b.add(num, stems, length);
    }
    return new DescriptionIndex(b.finish());
  }

  /** The row of a term, or -1. */
  private row(t: string): number {
    return sortedIndexOf(this.table.terms, t);
  }

  /** Entities whose description fits the query stems, best first (ties by num). `typed(num)`: the candidate has the phrase's type. */
  match(query: readonly string[], typed?: (num: number) => boolean, options: Partial<typeof DEFAULTS> = {}): DescriptionHit[] {
    const o = { ...DEFAULTS, ...options };
    const { offsets, postings, tf, lengths } = this.table;
    const terms = [...new Set(query)];
    const rows = new Map(terms.map((t) => [t, this.row(t)]));
    const documentFrequency = (t: string) => {
      const r = rows.get(t) ?? this.row(t);
      return r < 0 ? 0 : offsets[r + 1]! - offsets[r]!;
    };
    const stats = { documents: this.table.documents, avgLength: this.table.avgLength, documentFrequency };
    const idf = (t: string) => Math.log(1 + (stats.documents - stats.documentFrequency(t) + 0.5) / (stats.documentFrequency(t) + 0.5));
    const mass = terms.reduce((a, t) => a + idf(t), 0);
    if (mass <= 0) return [];
    const hits = new Map<number, number>();
    for (const t of terms) {
      const r = rows.get(t)!;
      if (r >= 0) for (let i = offsets[r]!; i < offsets[r + 1]!; i++) hits.set(postings[i]!, (hits.get(postings[i]!) ?? 0) + 1);
    }
    const need = Math.max(o.minTerms, Math.ceil(terms.length / 2));
    const out: (DescriptionHit & { typedOk: boolean })[] = [];
    for (const [num, count] of hits) {
      if (count < need) continue;
      const doc = new Map<string, number>();
      let held = 0;
      for (const t of terms) {
        const r = rows.get(t)!;
        const at = r < 0 ? -1 : sortedIndexOf(postings, num, offsets[r]!, offsets[r + 1]!);
        if (at >= 0) {
          doc.set(t, tf[at]!);
          held += idf(t);
        }
      }
      out.push({ num, similarity: (o.scale * held) / mass, score: bm25(terms, doc, num < lengths.length ? lengths[num]! : 0, stats), typedOk: typed ? typed(num) : false });
    }
    out.sort((a, b) => Number(b.typedOk) - Number(a.typedOk) || b.score - a.score || a.num - b.num);
    return out.slice(0, o.limit).map(({ num, similarity, score }) => ({ num, similarity, score }));
  }
}

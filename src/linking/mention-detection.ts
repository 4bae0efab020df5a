/**
 * Mention detection: leftmost-longest matching of token n-grams against the alias index, then
 * fuzzy spans for what is left (misspelt, partial or reordered names).
 *
 * [Reference] Leftmost-longest dictionary matching is the usual gazetteer method (common
 * practice; cf. R. Mihalcea and A. Csomai, "Wikify!", CIKM 2007, n-gram lookup against an
 * anchor dictionary). Fuzzy spans: token corrections from a trigram index re-scored by edit
 * distance (fuzzy-index.ts), candidates gathered from the alias-token postings, and a span
 * similarity = Dice overlap of the span's and the alias's token sets where tokens match
 * exactly or with Jaro–Winkler ≥ `tokenMatch` (so word order does not matter).
 * Rules: a fuzzy span needs a word with a letter that is not a type or relation word (numbers
 * alone never become fuzzy names); a span may not end with a stop word, may start with one only when it is exactly an
 * alias ("the Dawn"), and a span that is only stop words or
 * exactly a type or relation phrase of the catalog never becomes a mention.
 *
 * Relation words. A one-word span whose word is, by Porter stem, a content word of a relation
 * label or alias ("lives" of "lives in", "hosted" of "hosted by") is already explained by the
 * catalog's relation vocabulary — the words question analysis reads as relation cues. Such a
 * span is a mention only for the candidates it names *as written*: the word equals the label or
 * alias (normalised, not only by stem, not a fuzzy correction, not one token of a longer name)
 * and, when the question's capitals carry information, it is written like the name — in capitals
 * for a code (an alias with no lower-case letter, "HELD", "VK-7"), capitalised for a capitalised
 * name. Otherwise the relation is the better explanation: the span is left unlinked, its nearest
 * names kept as suggestions, and the word stays free for the relation cues. (Capitalisation as
 * the cue for proper names and codes: common practice in gazetteer matching, cf. Mikheev,
 * Moens and Grover, "Named entity recognition without gazetteers", EACL 1999.) Questions typed
 * without capitals, or with every word capitalised, are case-blind: there only an exact,
 * non-code match keeps a relation word linked.
 */
import type { AliasHit } from "../catalog/index.js";
import type { FuzzyTokenIndex } from "./fuzzy-index.js";
import { jaroWinkler } from "./jaro-winkler.js";
import type { LexicalSnapshot } from "./lexical-snapshot.js";
import { isStopWord } from "./stopwords.js";
import type { QuestionToken } from "./text-spans.js";

/** Options of {@link detectMentions}. */
export const DEFAULTS = {
  /** Longest n-gram tried. */
  maxTokens: 8,
  /** Similarity of a stem-only match (an exact normalised match is 1). */
  stemSimilarity: 0.95,
  /** Factor on the Dice similarity of a partial or reordered name. */
  partialFactor: 0.95,
  /** Jaro–Winkler needed for two tokens to count as the same word in a fuzzy span. */
  tokenMatch: 0.88,
  /** Lowest span similarity for a fuzzy candidate. */
  minSimilarity: 0.5,
  /** Lowest similarity for a fuzzy name that absorbs a neighbouring exact span. */
  mergeSimilarity: 0.8,
  /** Lowest similarity for a suggestion on an unlinked span. */
  minSuggestion: 0.3,
  /** Fuzzy candidates kept per span. */
  maxFuzzyCandidates: 8,
  /** Word runs tried for fuzzy names per text (questions have a few; keeps long texts fast). */
  maxFuzzyRuns: 64,
  /** Posting lists longer than this only filter, they never generate candidates. */
  maxGenerator: 5000,
} as const;

/** What mention detection needs from the catalog (the Linker implements it). */
export interface AliasLexicon {
  readonly snapshot: LexicalSnapshot;
  byNorm(norm: string): readonly AliasHit[];
  byStem(stem: string): readonly AliasHit[];
  /** Aliases of an entity as [text, norm, kind]. */
  aliasRows(num: number): readonly (readonly [string, string, number])[];
  /** True when the normalised or stemmed phrase is a type or relation word of the catalog. */
  isVocabularyPhrase(norm: string, stem: string): boolean;
  /** True when the entity is a type (types are never fuzzy candidates). */
  isTypeEntity(num: number): boolean;
  /** True when the word's stem is a content word of some relation label or alias. */
  isRelationWord(norm: string, stem: string): boolean;
  /** The lazily built fuzzy index over the alias token vocabulary. */
  fuzzy(): FuzzyTokenIndex;
}

/** A candidate entity for a span. */
export interface SpanCandidate {
  readonly num: number;
  /** String similarity of the span to the entity's best alias, 0..1. */
  readonly similarity: number;
  /** 0 when the best alias is the entity's label, 1 for another alias. */
  readonly kind: number;
}

/** A candidate as found, with the stored text of the alias it matched (for the relation-word rule). */
interface FoundCandidate extends SpanCandidate {
  readonly alias: string;
}

/** A detected span (token indexes) with its candidates. */
export interface DetectedSpan {
  readonly first: number;
  /** One past the last token. */
  readonly last: number;
  readonly match: "exact" | "stem" | "fuzzy";
  readonly candidates: readonly SpanCandidate[];
}

/** A run of content words that nothing matched, with the nearest names. */
export interface UnmatchedRun {
  readonly first: number;
  readonly last: number;
  readonly suggestions: readonly SpanCandidate[];
  /** True when the run is one relation word whose names matched it only loosely (see the header). */
  readonly relationWord?: boolean;
}

/** Result of {@link detectMentions}. */
export interface Detection {
  readonly spans: readonly DetectedSpan[];
  readonly unmatched: readonly UnmatchedRun[];
}

function hitsToCandidates(hits: readonly AliasHit[], similarity: number): SpanCandidate[] {
  const best = new Map<number, number>();
  for (const h of hits) {
    const k = best.get(h.entity);
    if (k === undefined || h.kind < k) best.set(h.entity, h.kind);
  }
  return [...best].sort((a, b) => a[0] - b[0]).map(([num, kind]) => ({ num, similarity, kind }));
}

const LOWER = /\p{Ll}/u;
const LETTER = /\p{L}/u;
const CAPITAL = /\p{Lu}|\p{Lt}/u;

/** Letters of a code (an alias with at least two letters and no lower-case one: "HELD", "VK-7"), else 0. */
export function codeLetters(alias: string): number {
  let letters = 0;
  for (const ch of alias) {
    if (LOWER.test(ch)) return 0;
    if (LETTER.test(ch)) letters++;
  }
  return letters >= 2 ? letters : 0;
}

/**
 * True when question word `tok`, equal (normalised) to `alias`, is written like it: a code in
 * capitals ("MICA's" writes MICA, "held" does not write HELD), a capitalised name capitalised.
 * A case-blind question can confirm no code, and any other alias.
 */
export function writtenAs(tok: QuestionToken, alias: string, caseBlind: boolean): boolean {
  const code = codeLetters(alias);
  if (code > 0) return !caseBlind && tok.upper >= code;
  if (caseBlind) return true;
  for (const ch of alias) if (LETTER.test(ch)) return !CAPITAL.test(ch) || tok.marked;
  return true;
}

/** The best few of a span's candidates as suggestions: by similarity, then prominence, then num. */
function asSuggestions(cands: readonly SpanCandidate[], lex: AliasLexicon): SpanCandidate[] {
  const d = (n: number) => lex.snapshot.degreeOf(n);
  return [...cands]
    .sort((a, b) => b.similarity - a.similarity || d(b.num) - d(a.num) || a.num - b.num)
    .slice(0, 3)
    .map((c) => ({ num: c.num, similarity: c.similarity, kind: c.kind }));
}

/**
 * Detects mentions in the question tokens. `blocked[i]` marks tokens already taken (pins).
 * `allEligible` lets lower-case words start fuzzy spans (a question typed without capitals).
 */
export function detectMentions(
  toks: readonly QuestionToken[],
  lex: AliasLexicon,
  blocked: readonly boolean[],
  allEligible: boolean,
  options: Partial<typeof DEFAULTS> = {},
): Detection {
  const o = { ...DEFAULTS, ...options };
  const n = toks.length;
  const maxLen = Math.min(o.maxTokens, lex.snapshot.maxAliasTokens);
  const spans: DetectedSpan[] = [];
  const unmatched: UnmatchedRun[] = [];
  const covered = blocked.slice();
  // capitals tell names from words only when some words are capitalised and some are not
  let blind: boolean | undefined;
  const caseBlind = () => (blind ??= allEligible || toks.every((t) => t.marked || !LETTER.test(t.norm)));
  /** A one-word relation span keeps only the candidates it names as written (see the header). */
  const relationWord = (k: number) => lex.isRelationWord(toks[k]!.norm, toks[k]!.stem);
  const explained = (k: number, cands: readonly SpanCandidate[]) => {
    unmatched.push({ first: k, last: k + 1, suggestions: asSuggestions(cands, lex), relationWord: true });
    covered[k] = true;
  };
  // 1. leftmost-longest exact (normalised) or stemmed match
  let i = 0;
  while (i < n) {
    if (covered[i]) {
      i++;
      continue;
    }
    // a span may start with a stop word only as an exact alias ("the Dawn", "The Rastou record")
    const leadingStop = isStopWord(toks[i]!.norm);
    let found: DetectedSpan | undefined;
    let norm = "";
    let stem = "";
    const keys: [string, string, number][] = [];
    for (let len = 1; len <= maxLen && i + len <= n; len++) {
      const t = toks[i + len - 1]!;
      if (covered[i + len - 1]) break;
      norm = len === 1 ? t.norm : `${norm} ${t.norm}`;
      stem = len === 1 ? t.stem : `${stem} ${t.stem}`;
      keys.push([norm, stem, len]);
    }
    for (let k = keys.length - 1; k >= 0 && !found; k--) {
      const [kn, ks, len] = keys[k]!;
      if (isStopWord(toks[i + len - 1]!.norm) || (leadingStop && len < 2)) continue;
      const normKey = lex.snapshot.mayBeKey(kn);
      const stemKey = !leadingStop && lex.snapshot.mayBeKey(ks);
      if ((!normKey && !stemKey) || lex.isVocabularyPhrase(kn, ks)) continue;
      let hits: readonly AliasHit[] = [];
      if (normKey) {
        hits = lex.byNorm(kn);
        if (hits.length > 0) found = { first: i, last: i + len, match: "exact", candidates: hitsToCandidates(hits, 1) };
      }
      if (!found && stemKey) {
        hits = lex.byStem(ks);
        if (hits.length > 0) found = { first: i, last: i + len, match: "stem", candidates: hitsToCandidates(hits, o.stemSimilarity) };
      }
      if (found && len === 1 && relationWord(i)) {
        const tok = toks[i]!;
        const named = found.match === "exact" ? new Set(hits.filter((h) => writtenAs(tok, h.text, caseBlind())).map((h) => h.entity)) : new Set<number>();
        if (named.size === 0) {
          explained(i, found.candidates);
          found = undefined;
          break;
        }
        found = { ...found, candidates: found.candidates.filter((c) => named.has(c.num)) };
      }
    }
    if (found) {
      spans.push(found);
      for (let k = found.first; k < found.last; k++) covered[k] = true;
      i = found.last;
    } else i++;
  }
  // 2. fuzzy spans over runs of uncovered content words; capitalised type or relation words
  //    may sit inside a run (as in a misspelt "Shoal Chian Survey") but never form one alone
  const free = (k: number) => !covered[k] && !isStopWord(toks[k]!.norm) && toks[k]!.norm.length >= 2 && (allEligible || toks[k]!.marked);
  const endsAt = new Map<number, DetectedSpan>(spans.map((sp) => [sp.last, sp]));
  const startsAt = new Map<number, DetectedSpan>(spans.map((sp) => [sp.first, sp]));
  const vocabularyWord = (k: number) => lex.isVocabularyPhrase(toks[k]!.norm, toks[k]!.stem);
  // a fuzzy name needs a word with a letter that is not a type or relation word ("20,000" is not one)
  const nameWord = (k: number) => /\p{L}/u.test(toks[k]!.norm) && !vocabularyWord(k);
  /** Fuzzy-matches tokens [a, b); what the found name leaves on either side is tried again. */
  const piece = (a: number, b: number, depth: number): void => {
    let hasName = false;
    for (let k = a; k < b && !hasName; k++) hasName = nameWord(k);
    if (!hasName) return;
    const result = fuzzySpan(toks.slice(a, b), lex, o);
    if (result.candidates.length === 0) {
      unmatched.push({ first: a, last: b, suggestions: result.suggestions });
      return;
    }
    const first = a + result.first;
    const last = a + result.last;
    let candidates: readonly SpanCandidate[] = result.candidates;
    if (last - first === 1 && relationWord(first)) {
      // only an exact alias written like the name keeps a relation word linked
      candidates = result.candidates.filter((c) => c.similarity === 1 && writtenAs(toks[first]!, c.alias, caseBlind()));
      if (candidates.length === 0) explained(first, result.candidates);
    }
    if (candidates.length > 0) {
      spans.push({ first, last, match: "fuzzy", candidates: candidates.map((c) => ({ num: c.num, similarity: c.similarity, kind: c.kind })) });
      for (let k = first; k < last; k++) covered[k] = true;
    }
    if (depth < 3) {
      if (first > a) piece(a, first, depth + 1);
      if (last < b) piece(last, b, depth + 1);
    }
  };
  i = 0;
  let runs = 0;
  while (i < n && runs < o.maxFuzzyRuns) {
    if (!free(i) || (vocabularyWord(i) && !toks[i]!.marked)) {
      i++;
      continue;
    }
    let j = i;
    while (j < n && j - i < o.maxTokens && free(j) && (!vocabularyWord(j) || toks[j]!.marked)) j++;
    const a = i;
    let hasName = false;
    for (let k = a; k < j && !hasName; k++) hasName = nameWord(k);
    if (!hasName) {
      i = Math.max(i + 1, j);
      continue;
    }
    runs++;
    // an exact span right before or after the run may be the start or end of the same name
    const beforeSpan = endsAt.get(a);
    const afterSpan = startsAt.get(j);
    const from = beforeSpan ? beforeSpan.first : a;
    const to = afterSpan ? afterSpan.last : j;
    if (from !== a || to !== j) {
      const merged = fuzzySpan(toks.slice(from, to), lex, o);
      let first = from + merged.first;
      let last = from + merged.last;
      const reachesRun = merged.candidates.length > 0 && last > a && first < j;
      const spansExact = first < a || last > j;
      if (reachesRun && spansExact && merged.candidates[0]!.similarity >= o.mergeSimilarity) {
        // the merged name replaces the exact spans it touches (and grows to cover them)
        for (const sp of [beforeSpan, afterSpan]) {
          if (sp && sp.first < last && first < sp.last) {
            first = Math.min(first, sp.first);
            last = Math.max(last, sp.last);
            spans.splice(spans.indexOf(sp), 1);
            endsAt.delete(sp.last);
            startsAt.delete(sp.first);
          }
        }
        spans.push({ first, last, match: "fuzzy", candidates: merged.candidates.map((c) => ({ num: c.num, similarity: c.similarity, kind: c.kind })) });
        for (let k = first; k < last; k++) covered[k] = true;
        if (first > a) piece(a, first, 0);
        if (last < j) piece(last, j, 0);
        i = Math.max(i + 1, j);
        continue;
      }
    }
    piece(a, j, 0);
    i = Math.max(i + 1, j);
  }
  spans.sort((a, b) => a.first - b.first);
  return { spans, unmatched };
}

interface FuzzyResult {
  first: number;
  last: number;
  candidates: FoundCandidate[];
  suggestions: SpanCandidate[];
}

/** Similarity of a token list to an alias's tokens: Dice over exact-or-close token matches. */
function spanSimilarity(run: readonly string[], alias: readonly string[], tokenMatch: number): { sim: number; used: boolean[] } {
  const used = run.map(() => false);
  const taken = alias.map(() => false);
  let matched = 0;
  for (let r = 0; r < run.length; r++) {
    let best = 0;
    let at = -1;
    for (let a = 0; a < alias.length; a++) {
      if (taken[a]) continue;
      const s = run[r] === alias[a] ? 1 : jaroWinkler(run[r]!, alias[a]!);
      if (s > best) {
        best = s;
        at = a;
      }
    }
    if (at >= 0 && best >= tokenMatch) {
      taken[at] = true;
      used[r] = true;
      matched += best;
    }
  }
  return { sim: (2 * matched) / (run.length + alias.length), used };
}

function fuzzySpan(run: readonly QuestionToken[], lex: AliasLexicon, o: typeof DEFAULTS): FuzzyResult {
  const snap = lex.snapshot;
  // token alternatives: the token itself when known, else close vocabulary tokens
  const lists: Int32Array[] = [];
  for (const t of run) {
    const id = snap.tokenId(t.norm);
    if (id >= 0) lists.push(snap.entitiesWithToken(id));
    else {
      const near = lex.fuzzy().nearest(t.norm);
      if (near.length === 0) continue;
      const merged = new Set<number>();
      for (const h of near) for (const e of snap.entitiesWithToken(h.token)) merged.add(e);
      lists.push(Int32Array.from([...merged].sort((a, b) => a - b)));
    }
  }
  const empty: FuzzyResult = { first: 0, last: run.length, candidates: [], suggestions: [] };
  if (lists.length === 0) return empty;
  const gens = lists.filter((l) => l.length <= o.maxGenerator);
  if (gens.length === 0) return empty;
  const votes = new Map<number, number>();
  for (const l of gens) for (const e of l) votes.set(e, (votes.get(e) ?? 0) + 1);
  // keep the entities sharing the most tokens with the run (bounded work per question)
  const ranked = [...votes].sort((a, b) => b[1] - a[1] || a[0] - b[0]).slice(0, 200);
  const runNorms = run.map((t) => t.norm);
  // each entity keeps its best alias by sim·(1 + covered)/(1 + |run|): a longer name that
  // covers more of the run beats a short alias matching one word of it exactly
  const scored: { num: number; sim: number; key: number; kind: number; used: boolean[]; alias: string }[] = [];
  for (const [num] of ranked) {
    if (lex.isTypeEntity(num)) continue;
    let best = { sim: 0, key: 0, kind: 1, used: [] as boolean[], alias: "" };
    for (const [text, norm, kind] of lex.aliasRows(num)) {
      const at = norm.split(" ");
      const s = spanSimilarity(runNorms, at, o.tokenMatch);
      // score only the covered part of the run: the span shrinks to the matched tokens
      const first = s.used.indexOf(true);
      if (first < 0) continue;
      const last = s.used.lastIndexOf(true) + 1;
      const sub = spanSimilarity(runNorms.slice(first, last), at, o.tokenMatch);
      const exact = runNorms.slice(first, last).join(" ") === norm;
      const sim = exact ? 1 : sub.sim * o.partialFactor;
      const key = (sim * (1 + last - first)) / (1 + runNorms.length);
      if (key > best.key || (key === best.key && kind < best.kind)) best = { sim, key, kind, used: s.used, alias: text };
    }
    if (best.sim > 0) scored.push({ num, sim: best.sim, key: best.key, kind: best.kind, used: best.used, alias: best.alias });
  }
  scored.sort((a, b) => b.key - a.key || b.sim - a.sim || a.num - b.num);
  const suggestions = scored.filter((s) => s.sim >= o.minSuggestion).slice(0, 3).map((s) => ({ num: s.num, similarity: s.sim, kind: s.kind }));
  const top = scored[0];
  if (!top || top.sim < o.minSimilarity) return { ...empty, suggestions };
  const first = top.used.indexOf(true);
  const last = top.used.lastIndexOf(true) + 1;
  // candidates: everything that matches the same tokens about as well
  const candidates = scored
    .filter((s) => s.sim >= o.minSimilarity && s.used.indexOf(true) >= first && s.used.lastIndexOf(true) + 1 <= last)
    .slice(0, o.maxFuzzyCandidates)
    .map((s) => ({ num: s.num, similarity: s.sim, kind: s.kind, alias: s.alias }));
  return { first, last, candidates, suggestions };
}

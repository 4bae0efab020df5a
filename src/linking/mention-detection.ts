/**
 * Mention detection: leftmost-longest matching of token n-grams against the alias index, then
 * fuzzy spans for what is left (misspelt, partial or reordered names).
 *
 * [Reference] Leftmost-longest dictionary matching is the usual gazetteer method (common
 * practice; cf. R. Mihalcea and A. Csomai, "Wikify!", CIKM 2007, n-gram lookup against an
 * anchor dictionary). Fuzzy spans: token corrections from a trigram index re-scored by edit
 * distance (fuzzy-index.ts), candidates gathered from the alias-token postings, and a span
 * similarity = Dice overlap of the span's and the alias's token sets where tokens match
 * exactly or with Jaro–Winkler ≥ `tokenMatch` (so word order does not matter), or — a word of
 * at least 4 letters that no name holds (fuzzy-index.ts `minLength`) — one edit away from a
 * name's word, which counts as a match at `tokenMatch`: a single insertion, deletion or
 * substitution is the most common misspelling (F. J. Damerau, "A technique for computer
 * detection and correction of spelling errors", CACM 7, 1964: over 80 % of errors), while
 * Jaro–Winkler rates such a pair of short words low when the edit is early ("purl" ~ "curl"
 * 0.83, "wile" ~ "file" 0.83). The word then has every name one edit away as a candidate,
 * linked as a fuzzy match the user sees and can pin; the verdict reads the other spellings as
 * other senses (explain/verdict.ts rule 4). When the word is not written like a name (no capital
 * beyond an orthographic one) such a candidate is `loose`: an English word one edit from a short
 * name ("take" ~ "make") is far more likely than a misspelt name, so the linker keeps a loose
 * candidate only when the rest of the question supports it (linker.ts).
 * In a case-blind question a fuzzy name needs `blindSimilarity`, except the one word of a
 * definite description ("the kyat") that exactly one entity's names hold (`soleHolder`; cf.
 * definite descriptions, Russell 1905, linker.ts): it refers to that entity.
 * An initialism in capitals before one word of a name ("US dollar") links to the names whose
 * words before that word have those initials ("United States dollar"; `initialismSpan`).
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
 * non-code match keeps a relation word linked. A word that is a type or relation phrase only
 * by its stem ("required" ~ the alias "requires") but written exactly as a name, right before
 * a type noun ("which *required* packages"), is a modifier naming that entity (an attributive
 * participle, Quirk et al. 1985 §7.15 ff.), not the relation: it stays a mention.
 */
import type { AliasHit } from "../catalog/index.js";
import type { MatchKind } from "../model/index.js";
import type { DerivedToken } from "./derivation.js";
import type { FuzzyTokenIndex } from "./fuzzy-index.js";
import { DEFAULTS as FUZZY_DEFAULTS } from "./fuzzy-index.js";
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
  /**
   * Lowest similarity for a fuzzy name in a case-blind question (no capitals beyond the first
   * word): there any content word may start a span, so a word matching a name only in part or
   * loosely ("tarns" ~ one word of "Tarn Kingdom") is no name; a misspelt whole name still is.
   */
  blindSimilarity: 0.75,
  /** Similarity of a name written with an initialism for some of its words ("US dollar"). */
  initialismSimilarity: 0.85,
  /** Names holding the word after an initialism checked at most (each is one alias read; a more common word names too little). */
  maxInitialismHolders: 256,
  /** Similarity of a name written as separate words that the catalog writes as one ("Viet Nam" for Vietnam). */
  joinedSimilarity: 0.9,
  /** Most words joined into one name. */
  maxJoined: 3,
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

/** Verb inflections that a name never carries (the -ed and -ing forms, Quirk et al. 1985 §3.5 ff.; see `verbForm` in {@link detectMentions}). */
const VERBAL_INFLECTIONS: readonly string[] = ["ed", "ing"];

/** {@link DEFAULTS} with any values. */
type Options = { -readonly [K in keyof typeof DEFAULTS]: number };

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
  /** True when the word (normalised or stemmed) is the last word of some type label or alias (a type's head noun). */
  isTypeHead(norm: string, stem: string): boolean;
  /** The lazily built fuzzy index over the alias token vocabulary. */
  fuzzy(): FuzzyTokenIndex;
  /** Vocabulary tokens a normalised word may be derived from (derivation.ts), best first. */
  derived(norm: string): readonly DerivedToken[];
  /** IDF weights of alias tokens over the catalog's names. */
  weights(): Weights;
}

/** A candidate entity for a span. */
export interface SpanCandidate {
  readonly num: number;
  /** String similarity of the span to the entity's best alias, 0..1. */
  readonly similarity: number;
  /** 0 when the best alias is the entity's label, 1 for another alias. */
  readonly kind: number;
  /** How the span matched the entity's name (absent: label or alias, by `kind`). */
  readonly match?: MatchKind;
  /** For a derived form: the suffix stripped from the question word and the name it was derived from. */
  readonly derivation?: { readonly suffix: string; readonly base: string };
  /** Matched through a word one edit from the name's that is not written like a name (see the file header); the linker keeps it only with support. */
  readonly loose?: boolean;
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

/** A found candidate without its alias text. */
function plainCandidate(c: SpanCandidate): SpanCandidate {
  return { num: c.num, similarity: c.similarity, kind: c.kind, ...(c.match ? { match: c.match } : {}), ...(c.derivation ? { derivation: c.derivation } : {}), ...(c.loose ? { loose: true } : {}) };
}

/** A candidate whose name is wholly or partly present inside a longer name phrase: `partialFactor` × its similarity. */
function absorbedCandidate(c: SpanCandidate, o: Options): SpanCandidate {
  return { ...plainCandidate(c), similarity: c.similarity * o.partialFactor, match: c.match === "derived" || c.match === "fuzzy" ? c.match : "partial" };
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

/**
 * An initialism in capitals followed by one word of a name, the name being the words the
 * initials stand for and that word ("US dollar" → "United States dollar"): the short form's
 * letters are the initials of consecutive words of the long form (the abbreviation matching of
 * Schwartz & Hearst 2003, "A simple algorithm for identifying abbreviation definitions in
 * biomedical text", PSB, restricted to word initials). The candidates are the entities whose
 * label or alias is exactly that, at `initialismSimilarity` (a name not written as the
 * catalog writes it, shown as a fuzzy match the user can pin).
 */
function initialismSpan(toks: readonly QuestionToken[], k: number, lex: AliasLexicon, o: Options): DetectedSpan | undefined {
  const short = toks[k]!;
  const word = toks[k + 1]!;
  const letters = short.norm;
  if (letters.length < 2 || letters.length > 5 || !/^\p{L}+$/u.test(letters) || short.upper !== letters.length) return undefined;
  if (isStopWord(word.norm) || !LETTER.test(word.norm)) return undefined;
  const id = lex.snapshot.tokenId(word.norm);
  if (id < 0) return undefined;
  const holders = lex.snapshot.entitiesWithToken(id);
  if (holders.length > o.maxInitialismHolders) return undefined;
  const candidates: SpanCandidate[] = [];
  for (const e of holders) {
    if (lex.isTypeEntity(e)) continue;
    for (const [, norm, kind] of lex.aliasRows(e)) {
      const ws = norm.split(" ");
      if (ws.length !== letters.length + 1 || ws[ws.length - 1] !== word.norm) continue;
      if (ws.slice(0, -1).map((w) => w[0]).join("") !== letters) continue;
      if (!candidates.some((c) => c.num === e)) candidates.push({ num: e, similarity: o.initialismSimilarity, kind, match: "fuzzy" });
    }
  }
  return candidates.length > 0 ? { first: k, last: k + 2, match: "fuzzy", candidates } : undefined;
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
  const o: Options = { ...DEFAULTS, ...options };
  const n = toks.length;
  // joined names ("Viet Nam") span up to maxJoined words even where every alias is one word
  const maxLen = Math.min(o.maxTokens, Math.max(lex.snapshot.maxAliasTokens, o.maxJoined));
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
  /**
   * A one-word name that is also a derived form of other names ("Ostrelian", a language's label,
   * and an adjective of Ostrelia) keeps those as candidates too, at the derived similarity: the
   * question's other words decide. Only for a word written like a name (capitalised, unless the
   * question is case-blind) with a real suffix, used attributively (before a type noun:
   * "Ostrelian ports", not "speak Ostrelian"), and only names that are that one base word.
   */
  /** True when a type's head noun follows within 2 words, neither a stop word ("Braskian towns", "a Braskian research port"). */
  const modifiesTypeNoun = (k0: number) => {
    for (let k = k0; k < n && k < k0 + 2; k++) {
      const t = toks[k]!;
      if (isStopWord(t.norm) || !LETTER.test(t.norm)) return false;
      if (lex.isTypeHead(t.norm, t.stem)) return true;
    }
    return false;
  };
  const withDerived = (span: DetectedSpan): DetectedSpan => {
    const tok = toks[span.first]!;
    if ((!caseBlind() && !tok.marked) || !modifiesTypeNoun(span.last)) return span;
    const have = new Set(span.candidates.map((c) => c.num));
    const extra: SpanCandidate[] = [];
    for (const d of lex.derived(tok.norm)) {
      if (d.suffix === "") continue;
      for (const h of lex.byNorm(lex.snapshot.vocab[d.token]!)) {
        if (have.has(h.entity) || lex.isTypeEntity(h.entity)) continue;
        have.add(h.entity);
        extra.push({ num: h.entity, similarity: d.similarity, kind: h.kind, match: "derived", derivation: { suffix: d.suffix, base: h.text } });
      }
    }
    return extra.length === 0 ? span : { ...span, candidates: [...span.candidates, ...extra] };
  };
  /**
   * True when token k, not written like a name (no capital of its own), ends in a verbal
   * inflection (`VERBAL_INFLECTIONS`: the -ed and -ing forms of English verbs, Quirk et al. 1985
   * §3.5 ff.) that none of the stem-matched aliases `hits` ends in ("filed" against "file").
   */
  const verbForm = (k: number, hits: readonly AliasHit[]): boolean => {
    const t = toks[k]!;
    if (t.marked && !caseBlind()) return false;
    const suffix = VERBAL_INFLECTIONS.find((x) => t.norm.endsWith(x) && t.norm.length > x.length + 2);
    if (suffix === undefined) return false;
    return hits.every((h) => !h.text.toLowerCase().endsWith(suffix));
  };
  /**
   * Tokens [k, k + len) written as separate words of a name the catalog writes as one ("Viet
   * Nam" for Vietnam, "SQLite 3" for sqlite3, "Neo Vim" for neovim): the words joined without
   * their spaces equal a label or alias. Every word must be a content word (no stop word, no
   * type or relation word of the catalog), so that a relation phrase or a type noun is never
   * glued to a name. A name not written as the catalog writes it: a fuzzy link at
   * `joinedSimilarity`, shown and pinnable as any other (issue 16, names not written as the
   * catalog writes them; compound spelling variation, open/closed compounds, is common
   * practice in record linkage: cf. P. Christen, "Data Matching", Springer 2012, §4.2).
   */
  const joinedSpan = (k: number, len: number): DetectedSpan | undefined => {
    let joined = "";
    for (let j = k; j < k + len; j++) {
      const t = toks[j]!;
      if (isStopWord(t.norm) || !/[\p{L}\p{N}]/u.test(t.norm) || /\s/u.test(t.norm) || lex.isVocabularyPhrase(t.norm, t.stem)) return undefined;
      joined += t.norm;
    }
    if (!lex.snapshot.mayBeKey(joined)) return undefined;
    const hits = lex.byNorm(joined).filter((h) => !lex.isTypeEntity(h.entity));
    if (hits.length === 0) return undefined;
    return { first: k, last: k + len, match: "fuzzy", candidates: hitsToCandidates(hits, o.joinedSimilarity).map((c) => ({ ...c, match: "fuzzy" as const })) };
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
      if (!normKey && !stemKey) {
        if (len >= 2 && len <= o.maxJoined && !leadingStop) found = joinedSpan(i, len);
        continue;
      }
      // a word that is a type or relation phrase only by its stem ("required" ~ "requires") but is
      // written exactly as a name, before a type noun ("required packages"), is that name used as a modifier
      if (lex.isVocabularyPhrase(kn, ks) && !(len === 1 && normKey && !lex.isVocabularyPhrase(kn, kn) && modifiesTypeNoun(i + 1))) continue;
      let hits: readonly AliasHit[] = [];
      if (normKey) {
        hits = lex.byNorm(kn);
        if (hits.length > 0) found = { first: i, last: i + len, match: "exact", candidates: hitsToCandidates(hits, 1) };
      }
      if (!found && stemKey) {
        hits = lex.byStem(ks);
        if (hits.length > 0) found = { first: i, last: i + len, match: "stem", candidates: hitsToCandidates(hits, o.stemSimilarity) };
      }
      if (!found && len >= 2 && len <= o.maxJoined && !leadingStop) found = joinedSpan(i, len);
      // a lower-case word whose stem names something only through a verb's inflection ("filed" ~
      // "file") is the verb: a name is not inflected for tense or aspect (a relation word's form,
      // "hosted", is left to the relation-word rule below)
      if (found && found.match === "stem" && len === 1 && !relationWord(i) && verbForm(i, hits)) {
        unmatched.push({ first: i, last: i + 1, suggestions: asSuggestions(found.candidates, lex) });
        covered[i] = true;
        found = undefined;
        break;
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
      if (found.last - found.first === 1) found = withDerived(found);
      spans.push(found);
      for (let k = found.first; k < found.last; k++) covered[k] = true;
      i = found.last;
    } else i++;
  }
  // 1b. an initialism written in capitals before a word of a name ("US dollar" for "United
  //     States dollar"): the initials of the name's words before that word spell it
  for (let k = 0; k + 1 < n; k++) {
    if (covered[k] || covered[k + 1] || caseBlind()) continue;
    const found = initialismSpan(toks, k, lex, o);
    if (found) {
      spans.push(found);
      covered[k] = covered[k + 1] = true;
      k++;
    }
  }
  // 2. fuzzy spans over runs of uncovered content words; capitalised type or relation words
  //    may sit inside a run (as in a misspelt "Shoal Chian Survey") but never form one alone
  const free = (k: number) => !covered[k] && !isStopWord(toks[k]!.norm) && toks[k]!.norm.length >= 2 && (allEligible || toks[k]!.marked);
  const endsAt = new Map<number, DetectedSpan>(spans.map((sp) => [sp.last, sp]));
  const startsAt = new Map<number, DetectedSpan>(spans.map((sp) => [sp.first, sp]));
  const vocabularyWord = (k: number) => lex.isVocabularyPhrase(toks[k]!.norm, toks[k]!.stem);
  // a fuzzy name needs a word with a letter that is not a type or relation word ("20,000" is not one)
  const nameWord = (k: number) => /\p{L}/u.test(toks[k]!.norm) && !vocabularyWord(k);
  const hasNameIn = (a: number, b: number) => {
    for (let k = a; k < b; k++) if (nameWord(k)) return true;
    return false;
  };
  /**
   * True when tokens [a, b) match catalog names only weakly (a best similarity below
   * `mergeSimilarity`, as a generic word matches one word of a longer name: "Kingdom" of
   * "Tarn Kingdom"): next to a name in the same name phrase they are part of that name's
   * long form, not a name of their own.
   */
  const weakOnly = (a: number, b: number, allowUnknown = false) => {
    if (caseBlind() || !hasNameIn(a, b) || (!allowUnknown && unknownIn(a, b))) return false;
    for (let k = a; k < b; k++) if (relationWord(k) || vocabularyWord(k)) return false;
    const r = fuzzySpan(toks.slice(a, b), lex, o);
    return r.candidates.length === 0 || r.candidates[0]!.similarity < o.mergeSimilarity;
  };
  /**
   * True when some word of [a, b) is in no catalog name: a number no name holds ("999" of
   * "KX-999"), or a word no name holds even misspelt or derived (words shorter than the fuzzy
   * index corrects are never called unknown).
   */
  const unknownIn = (a: number, b: number) => {
    for (let k = a; k < b; k++) {
      const t = toks[k]!;
      if (isStopWord(t.norm) || lex.snapshot.tokenId(t.norm) >= 0) continue;
      if (/^\p{N}+$/u.test(t.norm)) return true;
      if (t.norm.length >= FUZZY_DEFAULTS.minLength && LETTER.test(t.norm) && lex.fuzzy().nearest(t.norm).length === 0 && lex.derived(t.norm).length === 0) return true;
    }
    return false;
  };
  /** Fuzzy-matches tokens [a, b); what the found name leaves on either side is absorbed (weak) or tried again. */
  /**
   * In a case-blind question, the one word of a definite description ("the kyat", ending the
   * phrase) that exactly one entity's names hold: the entity the phrase refers to by a word of
   * its name ("Burmese kyat"), as "the Dawn" names "Skerrin Dawn". Its own similarity stands
   * (not the blind floor). Undefined when the word is not such a word.
   */
  const soleHolder = (a: number, b: number): number | undefined => {
    if (b - a !== 1 || a === 0 || toks[a - 1]!.norm !== "the" || (b < n && !isStopWord(toks[b]!.norm))) return undefined;
    const t = toks[a]!;
    if (!nameWord(a) || relationWord(a) || lex.isTypeHead(t.norm, t.stem)) return undefined;
    const id = lex.snapshot.tokenId(t.norm);
    if (id < 0) return undefined;
    const holders = [...lex.snapshot.entitiesWithToken(id)].filter((e) => !lex.isTypeEntity(e));
    return holders.length === 1 ? holders[0] : undefined;
  };
  const piece = (a: number, b: number, depth: number): void => {
    if (!hasNameIn(a, b)) return;
    let result = fuzzySpan(toks.slice(a, b), lex, caseBlind() ? { ...o, minSimilarity: Math.max(o.minSimilarity, o.blindSimilarity) } : o);
    const sole = result.candidates.length === 0 && caseBlind() ? soleHolder(a, b) : undefined;
    if (sole !== undefined) {
      const own = fuzzySpan(toks.slice(a, b), lex, o);
      result = { ...own, candidates: own.candidates.filter((c) => c.num === sole) };
    }
    if (result.candidates.length === 0) {
      // a run that holds a relation word and matches no name as a whole ("purl depend"): the
      // relation word is read as the relation, and the words on either side are tried alone
      const cut = b - a > 1 && depth < 3 ? toks.slice(a, b).findIndex((_, k) => relationWord(a + k)) : -1;
      if (cut >= 0) {
        if (cut > 0) piece(a, a + cut, depth + 1);
        if (a + cut + 1 < b) piece(a + cut + 1, b, depth + 1);
        if (!covered[a + cut]) unmatched.push({ first: a + cut, last: a + cut + 1, suggestions: [], relationWord: true });
        return;
      }
      if (b - a === 1 && relationWord(a) && result.suggestions.length > 0) explained(a, result.suggestions);
      else unmatched.push({ first: a, last: b, suggestions: result.suggestions });
      return;
    }
    let first = a + result.first;
    let last = a + result.last;
    let candidates: readonly SpanCandidate[] = result.candidates;
    if (last - first === 1 && relationWord(first)) {
      // only an exact alias written like the name keeps a relation word linked
      candidates = result.candidates.filter((c) => c.similarity === 1 && writtenAs(toks[first]!, c.alias, caseBlind()));
      if (candidates.length === 0) explained(first, result.candidates);
    }
    // a weak name inside a capitalised phrase whose other words no catalog name holds
    // ("Zorblax Institute"): the phrase names something the catalog does not hold
    if (candidates.length > 0 && !caseBlind() && candidates[0]!.similarity < o.mergeSimilarity && (unknownIn(a, first) || unknownIn(last, b))) {
      unmatched.push({ first: a, last: b, suggestions: result.suggestions });
      return;
    }
    if (candidates.length > 0) {
      const before = first > a && weakOnly(a, first);
      const after = last < b && weakOnly(last, b);
      if (before) first = a;
      if (after) last = b;
      spans.push({ first, last, match: "fuzzy", candidates: candidates.map((c) => (before || after ? absorbedCandidate(c, o) : plainCandidate(c))) });
      for (let k = first; k < last; k++) covered[k] = true;
    }
    if (depth < 3) {
      if (first > a) piece(a, first, depth + 1);
      if (last < b) piece(last, b, depth + 1);
    }
  };
  /** English connectors inside a name phrase ("Kingdom of Brask", "Republic of the Velm"); common practice. */
  const connector = (k: number) => toks[k]!.norm === "of" || toks[k]!.norm === "the";
  /** An exact span that ends at `a` or starts at `j`, directly or across connectors. */
  const hostOf = (a: number, j: number): DetectedSpan | undefined => {
    let k = j;
    while (k < n && k - j < 2 && connector(k) && !covered[k]) k++;
    const after = startsAt.get(k);
    if (after && (k === j || toks.slice(j, k).some((t) => t.norm === "of"))) return after;
    k = a;
    while (k > 0 && a - k < 2 && connector(k - 1) && !covered[k - 1]) k--;
    const before = endsAt.get(k);
    if (before && (k === a || toks.slice(k, a).some((t) => t.norm === "of"))) return before;
    return undefined;
  };
  i = 0;
  let runs = 0;
  while (i < n && runs < o.maxFuzzyRuns) {
    if (!free(i) || (vocabularyWord(i) && !toks[i]!.marked)) {
      i++;
      continue;
    }
    let j = i;
    const inRun = (k: number) => k < n && free(k) && (!vocabularyWord(k) || toks[k]!.marked);
    for (;;) {
      while (j < n && j - i < o.maxTokens && inRun(j)) j++;
      // a capitalised name phrase goes on across "of" / "of the" ("Republic of Kessia")
      if (caseBlind() || j >= n || toks[j]!.norm !== "of" || covered[j]) break;
      const next = toks[j + 1]?.norm === "the" && !covered[j + 1] ? j + 2 : j + 1;
      if (next - i >= o.maxTokens || !inRun(next)) break;
      j = next;
    }
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
        spans.push({ first, last, match: "fuzzy", candidates: merged.candidates.map(plainCandidate) });
        for (let k = first; k < last; k++) covered[k] = true;
        if (first > a) piece(a, first, 0);
        if (last < j) piece(last, j, 0);
        i = Math.max(i + 1, j);
        continue;
      }
    }
    // a run matching other names only weakly, joined to an exact name ("the Kingdom of Brask",
    // "Federal Republic of Velmarra"): one name phrase, linked as that name, partially
    const host = hostOf(a, j);
    if (host && weakOnly(a, j, true)) {
      const first = Math.min(a, host.first);
      const last = Math.max(j, host.last);
      const grown: DetectedSpan = { first, last, match: "fuzzy", candidates: host.candidates.map((c) => absorbedCandidate(c, o)) };
      spans.splice(spans.indexOf(host), 1, grown);
      startsAt.delete(host.first);
      endsAt.delete(host.last);
      startsAt.set(first, grown);
      endsAt.set(last, grown);
      for (let k = first; k < last; k++) covered[k] = true;
      i = Math.max(i + 1, j);
      continue;
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

/** How one run token matched an alias token: exactly, by a close spelling, or as a derived form. */
type TokenMatch = "exact" | "fuzzy" | "derived";

/** Per run token: the alias tokens it may stand for, with similarity and how (besides exact equality). */
type TokenAlternatives = ReadonlyMap<string, { readonly sim: number; readonly how: TokenMatch; readonly suffix?: string; readonly loose?: boolean }>;

/** IDF weights of alias tokens (see {@link tokenWeight}). */
export interface Weights {
  of(token: string): number;
}

/**
 * Weight of an alias token: its inverse document frequency over the catalog's names,
 * ln(1 + N/df) (N entities, df entities whose label or alias holds the token; K. Spärck Jones,
 * "A statistical interpretation of term specificity", J. Documentation 28, 1972); stop words 0;
 * a word no name holds counts as the rarest (df = 1).
 */
export function tokenWeights(snap: LexicalSnapshot): Weights {
  const n = Math.max(1, snap.entityCount);
  const cache = new Map<string, number>();
  return {
    of(token: string): number {
      let w = cache.get(token);
      if (w === undefined) {
        if (isStopWord(token)) w = 0;
        else {
          const id = snap.tokenId(token);
          const df = id >= 0 ? Math.max(1, snap.entitiesWithToken(id).length) : 1;
          w = Math.log(1 + n / df);
        }
        cache.set(token, w);
      }
      return w;
    },
  };
}

/** Result of {@link spanSimilarity}: the weighted Dice and, per run token, whether and how it matched. */
interface SpanMatch {
  readonly sim: number;
  readonly used: boolean[];
  /** The least exact way a matched token matched ("exact" when all did). */
  readonly how: TokenMatch;
  readonly suffix?: string;
  /** Some matched word is a loose one-edit spelling (see the file header). */
  readonly loose: boolean;
}

/**
 * Similarity of a token list to an alias's tokens: Dice's coefficient (L. R. Dice, Ecology 26,
 * 1945) over IDF-weighted tokens, each run token matched to at most one alias token exactly,
 * as a derived form, or with Jaro–Winkler ≥ `tokenMatch` (so word order does not matter). A
 * matched pair counts its similarity × the alias token's weight on both sides; an unmatched
 * token counts its own weight. Rare words carry a name, generic ones ("republic", "institute"
 * in a catalog with many of them) little. Falls back to unweighted counts when every token
 * weighs 0 (only stop words).
 */
function spanSimilarity(run: readonly string[], alias: readonly string[], tokenMatch: number, weights: Weights, alts?: readonly (TokenAlternatives | undefined)[]): SpanMatch {
  const used = run.map(() => false);
  const taken = alias.map(() => false);
  let matched = 0;
  let runWeight = 0;
  let plainMatched = 0;
  let how: TokenMatch = "exact";
  let suffix: string | undefined;
  let loose = false;
  for (let r = 0; r < run.length; r++) {
    let best = 0;
    let at = -1;
    let bestHow: TokenMatch = "exact";
    let bestSuffix: string | undefined;
    let bestLoose = false;
    for (let a = 0; a < alias.length; a++) {
      if (taken[a]) continue;
      let s: number;
      let h: TokenMatch = "exact";
      let sx: string | undefined;
      let lx = false;
      if (run[r] === alias[a]) s = 1;
      else {
        // a derived form is read as one even when its spelling is also close ("Tarnuvian" ~ Tarnu)
        const alt = alts?.[r]?.get(alias[a]!);
        if (alt) {
          s = alt.sim;
          h = alt.how;
          sx = alt.suffix;
          lx = alt.loose === true;
        } else {
          const jw = jaroWinkler(run[r]!, alias[a]!);
          s = jw >= tokenMatch ? jw : 0;
          h = "fuzzy";
        }
      }
      if (s > best) {
        best = s;
        at = a;
        bestHow = h;
        bestSuffix = sx;
        bestLoose = lx;
      }
    }
    if (at >= 0 && best > 0) {
      taken[at] = true;
      used[r] = true;
      const w = weights.of(alias[at]!);
      matched += best * w;
      runWeight += w;
      plainMatched += best;
      if (bestLoose) loose = true;
      if (bestHow === "derived" || (bestHow === "fuzzy" && how === "exact")) {
        how = bestHow;
        suffix = bestSuffix;
      }
    } else runWeight += weights.of(run[r]!);
  }
  let aliasWeight = 0;
  for (const t of alias) aliasWeight += weights.of(t);
  const total = runWeight + aliasWeight;
  const sim = total > 0 ? (2 * matched) / total : (2 * plainMatched) / (run.length + alias.length);
  return { sim, used, how, loose, ...(suffix !== undefined ? { suffix } : {}) };
}

function fuzzySpan(run: readonly QuestionToken[], lex: AliasLexicon, o: Options): FuzzyResult {
  const snap = lex.snapshot;
  const weights = lex.weights();
  // token alternatives: the token itself when known, else close vocabulary tokens; and the
  // vocabulary tokens the word may be derived from (derivation.ts)
  const lists: Int32Array[] = [];
  const alts: (Map<string, { sim: number; how: TokenMatch; suffix?: string; loose?: boolean }> | undefined)[] = [];
  for (const t of run) {
    const id = snap.tokenId(t.norm);
    const alt = new Map<string, { sim: number; how: TokenMatch; suffix?: string; loose?: boolean }>();
    const merged = new Set<number>();
    const near = new Set<number>();
    if (id < 0) {
      for (const h of lex.fuzzy().nearest(t.norm)) {
        near.add(h.token);
        // one edit away is a misspelling whatever the letters' order says (Jaro–Winkler rates
        // "purl" ~ "curl" 0.83, below `tokenMatch`): it counts as a match at `tokenMatch`
        if (h.edits === 1 && h.similarity < o.tokenMatch) alt.set(snap.vocab[h.token]!, { sim: o.tokenMatch, how: "fuzzy", loose: !(t.marked && !t.initial) });
        for (const e of snap.entitiesWithToken(h.token)) merged.add(e);
      }
    }
    // a spelling within the edit budget is read as a misspelling, not as a derived form
    for (const d of lex.derived(t.norm)) {
      if (near.has(d.token)) continue;
      alt.set(snap.vocab[d.token]!, { sim: d.similarity, how: "derived", suffix: d.suffix });
      for (const e of snap.entitiesWithToken(d.token)) merged.add(e);
    }
    alts.push(alt.size > 0 ? alt : undefined);
    if (id >= 0) {
      const own = snap.entitiesWithToken(id);
      if (merged.size === 0) {
        lists.push(own);
        continue;
      }
      for (const e of own) merged.add(e);
    }
    if (merged.size > 0) lists.push(Int32Array.from([...merged].sort((a, b) => a - b)));
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
  const runStop = runNorms.map(isStopWord);
  const runContent = runStop.filter((x) => !x).length;
  // each entity keeps its best alias by sim·(1 + covered)/(1 + |run|), counting content words:
  // a longer name that covers more of the run beats a short alias matching one word of it exactly
  const scored: { num: number; sim: number; key: number; kind: number; used: boolean[]; alias: string; match: MatchKind; loose: boolean; suffix?: string; base?: string }[] = [];
  for (const [num] of ranked) {
    if (lex.isTypeEntity(num)) continue;
    let best: (typeof scored)[number] | undefined;
    for (const [text, norm, kind] of lex.aliasRows(num)) {
      const at = norm.split(" ");
      const s = spanSimilarity(runNorms, at, o.tokenMatch, weights, alts);
      // score only the covered part of the run: the span shrinks to the matched tokens
      const first = s.used.indexOf(true);
      if (first < 0) continue;
      const last = s.used.lastIndexOf(true) + 1;
      const sub = spanSimilarity(runNorms.slice(first, last), at, o.tokenMatch, weights, alts.slice(first, last));
      const exact = runNorms.slice(first, last).join(" ") === norm;
      const sim = exact ? 1 : sub.sim * o.partialFactor;
      let covered = 0;
      for (let k = first; k < last; k++) if (!runStop[k]) covered++;
      const key = (sim * (1 + covered)) / (1 + runContent);
      const match: MatchKind = exact ? (kind === 0 ? "label" : "alias") : sub.how === "exact" ? "partial" : sub.how;
      if (!best || key > best.key || (key === best.key && kind < best.kind)) {
        best = { num, sim, key, kind, used: s.used, alias: text, match, loose: !exact && sub.loose, ...(match === "derived" ? { suffix: sub.suffix ?? "", base: text } : {}) };
      }
    }
    if (best && best.sim > 0) scored.push(best);
  }
  scored.sort((a, b) => b.key - a.key || b.sim - a.sim || a.num - b.num);
  const suggestions = scored.filter((s) => s.sim >= o.minSuggestion).slice(0, 3).map((s) => ({ num: s.num, similarity: s.sim, kind: s.kind }));
  const top = scored[0];
  if (!top || top.sim < o.minSimilarity) return { ...empty, suggestions };
  const first = top.used.indexOf(true);
  const last = top.used.lastIndexOf(true) + 1;
  // candidates: everything that matches the same tokens about as well; one that explains only
  // part of the span's content words ("Americas" for "Central American") keeps that share of
  // its similarity, as the ranking key does: the span's words are what is linked
  const contentIn = (a: number, b: number) => {
    let c = 0;
    for (let k = a; k < b; k++) if (!runStop[k]) c++;
    return c;
  };
  const spanContent = contentIn(first, last);
  const candidates = scored
    .filter((s) => s.sim >= o.minSimilarity && s.used.indexOf(true) >= first && s.used.lastIndexOf(true) + 1 <= last)
    .slice(0, o.maxFuzzyCandidates)
    .map((s) => {
      const own = contentIn(s.used.indexOf(true), s.used.lastIndexOf(true) + 1);
      const similarity = own < spanContent ? (s.sim * (1 + own)) / (1 + spanContent) : s.sim;
      return { num: s.num, similarity, kind: s.kind, alias: s.alias, match: s.match, ...(s.loose ? { loose: true } : {}), ...(s.suffix !== undefined ? { derivation: { suffix: s.suffix, base: s.base! } } : {}) };
    })
    .filter((s) => s.similarity >= o.minSimilarity);
  return { first, last, candidates, suggestions };
}

/**
 * The linker: question text → linked mentions with calibrated confidences and alternatives.
 *
 * Pipeline per question: tokens with UTF-16 spans (text-spans.ts) → pins applied → mention
 * detection (mention-detection.ts) → per candidate: prior, string similarity, BM25 context,
 * type/relation compatibility → collective disambiguation (collective-disambiguation.ts).
 * A relation counts as named for a mention's candidates only when the words naming it lie
 * outside the mention: a word is either a name or a relation cue, never evidence for both
 * (question analysis likewise reads relation cues only outside linked mentions). The relation
 * vocabulary (content-word stems of predicate labels and aliases) is read from the catalog and
 * feeds detection's relation-word rule (mention-detection.ts).
 * `Linker.fromCatalog` loads the lexical snapshot (saved beside the catalog, see
 * lexical-snapshot.ts) and the type and relation vocabulary once; per question it makes only
 * indexed SQLite lookups (aliases by normalised key, a candidate's description, neighbours).
 */
import type { AliasHit, Catalog } from "../catalog/index.js";
import { normalize, stemKey, stemToken, tokens } from "../catalog/index.js";
import type { Alternative, EntityRef, MatchKind, Mention, NotFoundDoc } from "../model/index.js";
import { TiepointError } from "../model/index.js";
import { bm25 } from "./bm25.js";
import type { CandidateEvidence, ScoringOptions } from "./collective-disambiguation.js";
import { disambiguate } from "./collective-disambiguation.js";
import type { DerivedToken } from "./derivation.js";
import { derivedTokens } from "./derivation.js";
import { DescriptionIndex, DEFAULTS as DESCRIPTION_DEFAULTS } from "./description-match.js";
import { FuzzyTokenIndex } from "./fuzzy-index.js";
import { LexicalSnapshot, NEIGHBOUR_DESCRIPTION_WEIGHT } from "./lexical-snapshot.js";
import type { AliasLexicon, DetectedSpan, SpanCandidate, Weights } from "./mention-detection.js";
import { detectMentions, DEFAULTS as DETECTION_DEFAULTS, tokenWeights } from "./mention-detection.js";
import { milneWitten } from "./relatedness.js";
import { isStopWord } from "./stopwords.js";
import type { QuestionToken } from "./text-spans.js";
import { questionTokens } from "./text-spans.js";

/** Options of {@link linkQuestion}. */
export const DEFAULTS = {
  /** Alternatives listed per mention. */
  maxAlternatives: 4,
  /** Alternatives below this confidence are not listed. */
  minAlternative: 0.005,
  /** Candidates scored per mention (best by string similarity, then prominence). */
  maxCandidates: 24,
  /** Neighbour labels per direction in a candidate's context document. */
  contextNeighbours: 30,
  /** Neighbours per direction in a candidate's link set for relatedness. */
  linkSetLimit: 500,
  /** Context words taken on each side of a mention (a question is shorter; long texts stay linear). */
  contextWindow: 40,
  /** Above this many mentions, coherence is skipped (each mention is scored on its own). */
  maxCoherentMentions: 16,
  /** Entries kept in each per-linker cache. */
  cacheSize: 20_000,
  /**
   * A mention whose best candidate has a lower confidence than this is reported as not found
   * (`LinkResult.notFound`, with that candidate as the nearest). 0.2: below what one fuzzy
   * candidate at the lowest accepted similarity gets alone (1/(1 + e^(3.8 − 6·0.5)) ≈ 0.31), so
   * only a name split over many weak candidates or matching none well falls under it.
   */
  notFoundBelow: 0.2,
} as const;

/** A user's override of one link: `text` in the question is `entity` (an id or an exact label). */
export interface Pin {
  readonly text: string;
  readonly entity: string;
}

/** A mention with entity nums (for ranking) next to the contract fields. */
export interface LinkedMention extends Mention {
  readonly num: number;
  readonly alternatives: readonly (Alternative & { readonly num: number })[];
}

/** Words that name something the catalog does not hold (see {@link NotFoundDoc}). */
export type NotFound = NotFoundDoc;

/** The user-facing line for a not-found name: "no catalog entity matches 'KX-999'; nearest: KX-114, 6 %". */
export function notFoundNote(nf: NotFound): string {
  const near = nf.nearest;
  const how = !near ? "" : near.confidence !== undefined ? `${Math.round(near.confidence * 100)} %` : near.similarity !== undefined ? `similarity ${near.similarity.toFixed(2)}` : "";
  return `no catalog entity matches '${nf.text}'${near ? `; nearest: ${near.label}${how ? `, ${how}` : ""}` : ""}`;
}

/** A span of content words that nothing linked to, with the nearest catalog names. */
export interface UnlinkedSpan {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  readonly suggestions: readonly EntityRef[];
  /** True when the span is a relation word its nearest names match only loosely (read as a relation, not a name). */
  readonly relationWord?: boolean;
}

/** Result of {@link linkQuestion}. */
export interface LinkResult {
  readonly mentions: readonly LinkedMention[];
  readonly unlinked: readonly UnlinkedSpan[];
  /** Names the catalog does not hold (see {@link NotFound}), by position. */
  readonly notFound: readonly NotFound[];
}

/** Options of {@link linkQuestion}. */
export interface LinkOptions {
  /** User overrides; each must occur in the question and name an existing entity. */
  readonly pins?: readonly Pin[];
  /** @default 4 */
  readonly maxAlternatives?: number;
  /** Weights of the confidence combination (see collective-disambiguation.ts). */
  readonly scoring?: ScoringOptions;
  /**
   * The question's time budget: once this says true, the optional passes are left out —
   * definite descriptions matched against the entities' descriptions, and the nearest names
   * offered for unlinked words (names are still linked). @default never
   */
  readonly stop?: () => boolean;
}

/** Options of {@link Linker.fromCatalog}. */
export interface LinkerOptions {
  /** Use this snapshot instead of loading or building one (tests, tools). */
  readonly snapshot?: LexicalSnapshot;
}

/** A type or relation phrase found in the question: token range and what it names. */
interface VocabularyOccurrence {
  readonly first: number;
  /** One past the last token. */
  readonly last: number;
  readonly types: readonly number[];
  readonly relations: readonly number[];
}

/**
 * What the question's vocabulary names for a mention on tokens [first, last): every type, and
 * the relations of the phrases outside the mention (a mention's own words are no relation cue).
 */
function namedOutside(occ: readonly VocabularyOccurrence[], first: number, last: number): { types: Set<number>; relations: Set<number> } {
  const types = new Set<number>();
  const relations = new Set<number>();
  for (const o of occ) {
    for (const n of o.types) types.add(n);
    if (o.last <= first || o.first >= last) for (const n of o.relations) relations.add(n);
  }
  return { types, relations };
}

/** Content words that may stand between a modifier and its type noun ("a Braskian deep-water port"). */
const MODIFIER_GAP = 2;

/**
 * Types of the noun a mention pre-modifies: a type phrase starting within {@link MODIFIER_GAP}
 * content words after the mention, none of them a stop word, and no punctuation between
 * ("Braskian towns", "a Braskian research port"; not "lives in Harnesk, works at …").
 * Attributive use of a proper name or its adjective before a head noun: Quirk et al. 1985,
 * ch. 17 (premodification), from memory.
 */
function modifiedTypes(occ: readonly VocabularyOccurrence[], toks: readonly QuestionToken[], span: { first: number; last: number }, question: string): Set<number> | undefined {
  for (let k = span.last; k < toks.length && k <= span.last + MODIFIER_GAP; k++) {
    if (/[,;:()]/.test(question.slice(toks[k - 1]!.end, toks[k]!.start))) return undefined;
    const o = occ.find((x) => x.first === k && x.types.length > 0);
    if (o) return new Set(o.types);
    if (isStopWord(toks[k]!.norm)) return undefined;
  }
  return undefined;
}

/**
 * The evidence a pre-modifier may draw from the question's vocabulary: a name before a type
 * noun ("Central American countries", "a Braskian port") stands in some relation to the
 * noun's referent, it is not one of them, and the question's verbs take the head noun as
 * their argument, not the modifier (Quirk et al. 1985, ch. 17, premodification by nouns and
 * proper names; from memory). So the modified noun's types do not count as the mention's
 * type, and no relation counts as named for it; mod(c) weighs the link instead.
 */
function asModifier(named: { types: Set<number>; relations: Set<number> }, modified: ReadonlySet<number>): { types: Set<number>; relations: Set<number> } {
  return { types: new Set([...named.types].filter((t) => !modified.has(t))), relations: new Set() };
}

/** A small bounded cache (drops everything when full; simple and deterministic). */
class Bounded<K, V> {
  private readonly map = new Map<K, V>();
  constructor(private readonly cap: number) {}
  get(k: K, make: () => V): V {
    let v = this.map.get(k);
    if (v === undefined) {
      if (this.map.size >= this.cap) this.map.clear();
      v = make();
      this.map.set(k, v);
    }
    return v;
  }
  clear(): void {
    this.map.clear();
  }
}

interface ContextDoc {
  readonly terms: Map<string, number>;
  readonly length: number;
}

/** The loaded linking state of one catalog. */
export class Linker implements AliasLexicon {
  readonly catalog: Catalog;
  readonly snapshot: LexicalSnapshot;
  private readonly phraseTypes = new Map<string, number[]>();
  private readonly phraseRelations = new Map<string, number[]>();
  private readonly supertypes = new Map<number, ReadonlySet<number>>();
  /** Every word (normalised or stemmed) of some type or relation phrase. */
  private readonly phraseWords = new Set<string>();
  /** Porter stems of the content words (not stop words) of every relation label and alias. */
  private readonly relationStems = new Set<string>();
  /** Per content-word stem of a relation label or alias: the relations it is a word of. */
  private readonly relationsByStem = new Map<string, Set<number>>();
  /** Last words (normalised and stemmed) of every type label and alias: the types' head nouns. */
  private readonly typeHeads = new Set<string>();
  /** Longest type or relation phrase, in tokens. */
  private readonly maxPhrase: number;
  private fuzzyIndex: FuzzyTokenIndex | undefined;
  private readonly docs = new Bounded<number, ContextDoc>(DEFAULTS.cacheSize);
  private readonly links = new Bounded<number, number[]>(DEFAULTS.cacheSize);
  private readonly typeCache = new Bounded<number, readonly number[]>(DEFAULTS.cacheSize);
  private readonly refs = new Bounded<number, EntityRef>(DEFAULTS.cacheSize);
  private readonly aliasHits = new Bounded<string, readonly AliasHit[]>(DEFAULTS.cacheSize);
  private readonly relationEdges = new Bounded<string, boolean>(DEFAULTS.cacheSize);
  private readonly neighbourTypes = new Bounded<string, boolean>(DEFAULTS.cacheSize);
  private readonly derivedCache = new Bounded<string, readonly DerivedToken[]>(DEFAULTS.cacheSize);
  private tokenWeights: Weights | undefined;
  private descriptionIndex: DescriptionIndex | undefined;

  /**
   * Drops what was read from the catalog's edges (context texts, link sets, relation and
   * neighbour-type checks): an attached catalog's edges change between questions, as each
   * question pulls its neighbourhood from the store (pipeline/store-edges.ts).
   */
  forgetEdges(): void {
    this.docs.clear();
    this.links.clear();
    this.relationEdges.clear();
    this.neighbourTypes.clear();
  }

  private constructor(cat: Catalog, snapshot: LexicalSnapshot) {
    this.catalog = cat;
    this.snapshot = snapshot;
    let maxPhrase = 1;
    const add = (map: Map<string, number[]>, text: string, num: number) => {
      for (const key of [normalize(text), stemKey(text)]) {
        if (key === "") continue;
        const list = map.get(key) ?? [];
        if (!list.includes(num)) list.push(num);
        map.set(key, list);
        const words = key.split(" ");
        for (const w of words) this.phraseWords.add(w);
        maxPhrase = Math.max(maxPhrase, words.length);
      }
    };
    const types = cat.types();
    const parents = new Map<number, readonly number[]>();
    for (const t of types) {
      parents.set(t.num, t.parents);
      add(this.phraseTypes, t.label, t.num);
      for (const a of t.aliases) add(this.phraseTypes, a, t.num);
      for (const text of [t.label, ...t.aliases]) {
        const words = tokens(text);
        const head = words[words.length - 1];
        if (head !== undefined) this.typeHeads.add(head).add(stemToken(head));
      }
    }
    for (const t of types) {
      const seen = new Set<number>([t.num]);
      const stack = [...t.parents];
      while (stack.length > 0) {
        const p = stack.pop()!;
        if (seen.has(p)) continue;
        seen.add(p);
        stack.push(...(parents.get(p) ?? []));
      }
      this.supertypes.set(t.num, seen);
    }
    for (const p of cat.predicates()) {
      for (const text of [p.label, ...p.aliases]) {
        add(this.phraseRelations, text, p.num);
        for (const t of tokens(text)) {
          if (isStopWord(t)) continue;
          const st = stemToken(t);
          this.relationStems.add(st);
          let rs = this.relationsByStem.get(st);
          if (!rs) this.relationsByStem.set(st, (rs = new Set()));
          rs.add(p.num);
        }
      }
    }
    this.maxPhrase = maxPhrase;
  }

  /**
   * Loads what linking needs from `cat` once (the snapshot file is reused while current). A linker
   * reflects the catalog as it was when made (it caches lookups): make a new one after a load.
   */
  static fromCatalog(cat: Catalog, options: LinkerOptions = {}): Linker {
    return new Linker(cat, options.snapshot ?? LexicalSnapshot.forCatalog(cat));
  }

  /** @internal */
  byNorm(norm: string): readonly AliasHit[] {
    return this.aliasHits.get(`n ${norm}`, () => this.catalog.byNorm(norm));
  }

  /** @internal */
  byStem(stem: string): readonly AliasHit[] {
    return this.aliasHits.get(`s ${stem}`, () => this.catalog.byStem(stem));
  }

  /** @internal id and label of an entity (cached). */
  ref(num: number): EntityRef {
    return this.refs.get(num, () => this.catalog.ref(num));
  }

  /** @internal */
  aliasRows(num: number): readonly (readonly [string, string, number])[] {
    return this.catalog.aliasRows(num);
  }

  /** @internal */
  isVocabularyPhrase(norm: string, stem: string): boolean {
    return this.phraseTypes.has(norm) || this.phraseTypes.has(stem) || this.phraseRelations.has(norm) || this.phraseRelations.has(stem);
  }

  /** @internal */
  isTypeEntity(num: number): boolean {
    return this.supertypes.has(num);
  }

  /** @internal */
  isTypeHead(norm: string, stem: string): boolean {
    return this.typeHeads.has(norm) || this.typeHeads.has(stem);
  }

  /** @internal */
  isRelationWord(norm: string, stem: string): boolean {
    return this.relationStems.has(stem) || this.relationStems.has(norm);
  }

  /** @internal true when the entity has an edge of a relation one of whose label or alias words has one of these stems ("maintains" of "maintained by"). */
  hasRelationOfWord(num: number, stems: readonly string[]): boolean {
    for (const st of stems) {
      for (const r of this.relationsByStem.get(st) ?? []) {
        if (this.relationEdges.get(`${num} ${r}`, () => this.catalog.hasRelationEdge(num, r))) return true;
      }
    }
    return false;
  }

  /** @internal */
  fuzzy(): FuzzyTokenIndex {
    return (this.fuzzyIndex ??= new FuzzyTokenIndex(this.snapshot.vocab, this.snapshot.grams()));
  }

  /** @internal vocabulary tokens a word may be derived from (derivation.ts; cached). */
  derived(norm: string): readonly DerivedToken[] {
    return this.derivedCache.get(norm, () => (this.phraseWords.has(norm) ? [] : derivedTokens(norm, this.snapshot.vocab)));
  }

  /**
   * @internal the description index (description-match.ts): the name index's table (made at
   * load time), read on first use; when the name index holds none, built from the catalog, and
   * undefined when `stop` (the question's time budget) ended that build early (nothing is
   * kept, a later question builds it again).
   */
  descriptions(stop?: () => boolean): DescriptionIndex | undefined {
    if (this.descriptionIndex) return this.descriptionIndex;
    const table = this.snapshot.descriptions();
    const built = table ? new DescriptionIndex(table) : DescriptionIndex.fromCatalog(this.catalog, stop);
    if (built === undefined) return undefined;
    return (this.descriptionIndex = built);
  }

  /** @internal true when the entity has (a subtype of) one of `types`. */
  hasType(num: number, types: ReadonlySet<number>): boolean {
    for (const t of this.typesOf(num)) for (const s of this.supertypes.get(t) ?? [t]) if (types.has(s)) return true;
    return false;
  }

  /** @internal IDF weights of alias tokens. */
  weights(): Weights {
    return (this.tokenWeights ??= tokenWeights(this.snapshot));
  }

  /** Type and relation phrases in the question: each n-gram (normalised or stemmed) naming some, as a token range. */
  vocabularyOccurrences(toks: readonly QuestionToken[]): VocabularyOccurrence[] {
    const out: VocabularyOccurrence[] = [];
    for (let i = 0; i < toks.length; i++) {
      let norm = "";
      let stem = "";
      for (let len = 1; len <= this.maxPhrase && i + len <= toks.length; len++) {
        const t = toks[i + len - 1]!;
        if (!this.phraseWords.has(t.norm) && !this.phraseWords.has(t.stem)) break;
        norm = len === 1 ? t.norm : `${norm} ${t.norm}`;
        stem = len === 1 ? t.stem : `${stem} ${t.stem}`;
        const tn = this.phraseTypes.get(norm);
        const ts = stem === norm ? undefined : this.phraseTypes.get(stem);
        const rn = this.phraseRelations.get(norm);
        const rs = stem === norm ? undefined : this.phraseRelations.get(stem);
        if (tn || ts || rn || rs) out.push({ first: i, last: i + len, types: [...(tn ?? []), ...(ts ?? [])], relations: [...(rn ?? []), ...(rs ?? [])] });
      }
    }
    return out;
  }

  /** Type and relation nums named by n-grams of the question (normalised or stemmed). */
  vocabularyIn(toks: readonly QuestionToken[]): { types: Set<number>; relations: Set<number> } {
    return namedOutside(this.vocabularyOccurrences(toks), 0, 0);
  }

  /** @internal the context document of an entity: its description, neighbours' labels and (half weight) descriptions, type labels; stemmed. */
  contextDoc(num: number): ContextDoc {
    return this.docs.get(num, () => {
      const terms = new Map<string, number>();
      let length = 0;
      const addText = (text: string | null, weight: number) => {
        if (!text) return;
        for (const t of tokens(text)) {
          if (isStopWord(t)) continue;
          const s = stemToken(t);
          terms.set(s, (terms.get(s) ?? 0) + weight);
          length += weight;
        }
      };
      addText(this.catalog.descriptionOf(num), 1);
      for (const [label, description] of this.catalog.neighbourTexts(num, DEFAULTS.contextNeighbours)) {
        addText(label, 1);
        addText(description, NEIGHBOUR_DESCRIPTION_WEIGHT);
      }
      for (const t of this.typesOf(num)) addText(this.ref(t).label, 1);
      return { terms, length };
    });
  }

  /** @internal direct types of an entity (cached). */
  typesOf(num: number): readonly number[] {
    return this.typeCache.get(num, () => this.catalog.typesOf(num));
  }

  /** @internal sorted link set of an entity (cached). */
  linkSet(num: number): number[] {
    return this.links.get(num, () => [...new Set(this.catalog.neighbourNums(num, DEFAULTS.linkSetLimit))].sort((a, b) => a - b));
  }

  /** @internal Milne–Witten relatedness of two entities. */
  relatedness(a: number, b: number): number {
    return milneWitten(a, this.linkSet(a), b, this.linkSet(b), this.snapshot.entityCount);
  }

  /** @internal BM25 statistics of the catalog. */
  get stats() {
    const s = this.snapshot;
    return { documents: s.entityCount, avgLength: s.avgDocLength, documentFrequency: (t: string) => s.documentFrequency(t) };
  }

  /** @internal true when the entity has a neighbour of (a subtype of) one of `types`. */
  hasNeighbourOfType(num: number, types: ReadonlySet<number>): boolean {
    return this.neighbourTypes.get(`${num} ${[...types].sort((a, b) => a - b).join(",")}`, () => {
      for (const n of this.linkSet(num)) {
        for (const t of this.typesOf(n)) for (const s of this.supertypes.get(t) ?? [t]) if (types.has(s)) return true;
      }
      return false;
    });
  }

  /** @internal evidence for one candidate; `modified`: the types of the noun the mention pre-modifies. */
  evidence(c: SpanCandidate, query: readonly string[], named: { types: Set<number>; relations: Set<number> }, withContext: boolean, modified?: ReadonlySet<number>): CandidateEvidence {
    let score = 0;
    if (withContext && query.length > 0) {
      const doc = this.contextDoc(c.num);
      score = bm25(query, doc.terms, doc.length, this.stats);
    }
    let typeOk = 0;
    if (named.types.size > 0) {
      for (const t of this.typesOf(c.num)) {
        for (const s of this.supertypes.get(t) ?? [t]) if (named.types.has(s)) typeOk = 1;
      }
    }
    let relOk = 0;
    for (const r of named.relations) {
      if (this.relationEdges.get(`${c.num} ${r}`, () => this.catalog.hasRelationEdge(c.num, r))) {
        relOk = 1;
        break;
      }
    }
    const modOk = withContext && modified && modified.size > 0 && this.hasNeighbourOfType(c.num, modified) ? 1 : 0;
    return { num: c.num, similarity: c.similarity, kind: c.kind, degree: this.snapshot.degreeOf(c.num), bm25: score, typeCompat: typeOk, relationCompat: relOk, modifierCompat: modOk };
  }
}

/**
 * Parses a `--pin` value `TEXT=ENTITY` (split at the first "="; both sides trimmed, non-empty).
 * @throws TiepointError `cli/usage` naming the bad value.
 */
export function parsePin(s: string): Pin {
  const at = s.indexOf("=");
  const text = at < 0 ? "" : s.slice(0, at).trim();
  const entity = at < 0 ? "" : s.slice(at + 1).trim();
  if (text === "" || entity === "") {
    throw new TiepointError("cli/usage", `--pin "${s}": expected TEXT=ENTITY, e.g. --pin "Ada=p:ada" (ENTITY is an id or an exact label)`);
  }
  return { text, entity };
}

/** Token range of the first occurrence of `text` (normalised) in the question tokens, or undefined. */
function findTokens(toks: readonly QuestionToken[], text: string): [number, number] | undefined {
  const want = tokens(text);
  if (want.length === 0) return undefined;
  for (let i = 0; i + want.length <= toks.length; i++) {
    let ok = true;
    for (let k = 0; k < want.length && ok; k++) ok = toks[i + k]!.norm === want[k];
    if (ok) return [i, i + want.length];
  }
  const wantStem = want.map(stemToken);
  for (let i = 0; i + want.length <= toks.length; i++) {
    let ok = true;
    for (let k = 0; k < want.length && ok; k++) ok = toks[i + k]!.stem === wantStem[k];
    if (ok) return [i, i + want.length];
  }
  return undefined;
}

/** Candidates of a span, trimmed to the best `limit` by similarity, then prominence, then num. */
function topCandidates(span: DetectedSpan, linker: Linker, limit: number): SpanCandidate[] {
  const list = [...span.candidates];
  if (list.length <= limit) return list;
  const d = (n: number) => linker.snapshot.degreeOf(n);
  return list.sort((a, b) => b.similarity - a.similarity || d(b.num) - d(a.num) || a.num - b.num).slice(0, limit);
}

/**
 * Links the question's mentions to catalog entities. Never throws on any text; throws a
 * TiepointError (`linking/pin`) only for a pin whose text is not in the question or whose entity
 * does not exist.
 */
export function linkQuestion(question: string, linker: Linker, options: LinkOptions = {}): LinkResult {
  const maxAlt = options.maxAlternatives ?? DEFAULTS.maxAlternatives;
  const cat = linker.catalog;
  const toks = questionTokens(question);
  const blocked = toks.map(() => false);
  const pinned: { first: number; last: number; num: number }[] = [];
  for (const pin of options.pins ?? []) {
    const what = `--pin "${pin.text}=${pin.entity}"`;
    const nums = cat.byLabelOrId(pin.entity);
    if (nums.length === 0) throw new TiepointError("linking/pin", `${what}: no entity has the id or exact label "${pin.entity}"`);
    if (nums.length > 1) {
      const ids = nums.slice(0, 5).map((n) => linker.ref(n).id).join(", ");
      throw new TiepointError("linking/pin", `${what}: the label "${pin.entity}" names ${nums.length} entities (${ids}); pin one by its id`);
    }
    const range = findTokens(toks, pin.text);
    if (!range) throw new TiepointError("linking/pin", `${what}: "${pin.text}" does not occur in the question`);
    for (let k = range[0]; k < range[1]; k++) {
      if (blocked[k]) throw new TiepointError("linking/pin", `${what}: overlaps another pin`);
    }
    for (let k = range[0]; k < range[1]; k++) blocked[k] = true;
    pinned.push({ first: range[0], last: range[1], num: nums[0]! });
  }
  // capitals mark names only when some word that does not open a sentence has one: the first
  // word of a sentence and the pronoun "I" are capitalised by orthography, not because they are
  // names (common practice; text-spans.ts `initial`)
  const allEligible = !toks.some((t) => !t.initial && t.upper > 0);
  const detected = detectMentions(toks, linker, blocked, allEligible);
  const vocabulary = linker.vocabularyOccurrences(toks);
  const { spans: described, replaced } = options.stop?.() ? { spans: [] as DetectedSpan[], replaced: new Set<DetectedSpan>() } : describedSpans(toks, detected.spans, blocked, vocabulary, linker, options.stop);
  const det = {
    spans: [...detected.spans.filter((sp) => !replaced.has(sp)), ...described].sort((a, b) => a.first - b.first),
    unmatched: detected.unmatched.filter((u) => !described.some((d) => u.first < d.last && d.first < u.last)),
  };
  const namedAll = namedOutside(vocabulary, 0, 0);
  // context words: every content token outside the mention (computed per mention)
  const contentStems = toks.map((t) => (isStopWord(t.norm) ? "" : t.stem));
  const spans = det.spans.map((s) => topCandidates(s, linker, DEFAULTS.maxCandidates));
  const evidence = spans.map((cands, m) => {
    const span = det.spans[m]!;
    const query: string[] = [];
    const lo = Math.max(0, span.first - DEFAULTS.contextWindow);
    const hi = Math.min(toks.length, span.last + DEFAULTS.contextWindow);
    for (let k = lo; k < hi; k++) if (contentStems[k] !== "" && (k < span.first || k >= span.last)) query.push(contentStems[k]!);
    const outside = vocabulary.some((o) => o.relations.length > 0 && o.last > span.first && o.first < span.last) ? namedOutside(vocabulary, span.first, span.last) : namedAll;
    const modified = modifiedTypes(vocabulary, toks, span, question);
    const named = modified ? asModifier(outside, modified) : outside;
    // context only decides between candidates; an unambiguous span skips it
    const all = cands.map((c) => linker.evidence(c, query, named, cands.length > 1, modified));
    // a loose one-edit spelling (mention-detection.ts: a lower-case word one edit from a short
    // name, "take" ~ "make") names the candidate only when the question names, outside the word,
    // a relation the candidate has an edge of — by a phrase of the relation's, or by a word of
    // it ("what does purl depend on", "who maintains purl": perl depends on things and is
    // maintained by someone); a type alone does not do ("which packages take …": most names
    // are packages), and otherwise an English word is the likelier reading
    const words = toks.filter((t, k) => (k < span.first || k >= span.last) && !isStopWord(t.norm)).map((t) => t.stem);
    return all.filter((e, k) => !cands[k]!.loose || e.relationCompat > 0 || linker.hasRelationOfWord(e.num, words));
  });
  // coherence is joint over the question's mentions; a very long text is scored mention by mention
  const coherent = evidence.length <= DEFAULTS.maxCoherentMentions;
  const scored = disambiguate(evidence, coherent ? (a, b) => linker.relatedness(a, b) : undefined, options.scoring);
  const mentions: LinkedMention[] = [];
  const spanText = (first: number, last: number) => {
    const start = toks[first]!.start;
    const end = toks[last - 1]!.end;
    return { text: question.slice(start, end), start, end };
  };
  for (const p of pinned) {
    const ref = linker.ref(p.num);
    mentions.push({ ...spanText(p.first, p.last), entity: ref, num: p.num, confidence: 1, alternatives: [], pinned: true });
  }
  const notFound: NotFound[] = [];
  det.spans.forEach((span, m) => {
    const withRefs = scored[m]!.map((c) => ({ ...c, ref: linker.ref(c.num) }));
    withRefs.sort((a, b) => b.confidence - a.confidence || (a.ref.id < b.ref.id ? -1 : a.ref.id > b.ref.id ? 1 : 0));
    const best = withRefs[0];
    if (!best) return;
    const how = new Map(spans[m]!.map((c) => [c.num, c]));
    const bestHow = how.get(best.num)!;
    const text = spanText(span.first, span.last);
    const compound = compoundAfter(question, toks, span.last);
    mentions.push({
      ...text,
      entity: best.ref,
      num: best.num,
      confidence: round(best.confidence),
      alternatives: withRefs
        .slice(1)
        .filter((a) => a.confidence >= DEFAULTS.minAlternative)
        .slice(0, maxAlt)
        .map((a) => ({ id: a.ref.id, label: a.ref.label, confidence: round(a.confidence), num: a.num, match: matchOf(how.get(a.num)!) })),
      match: matchOf(bestHow),
      ...(bestHow.derivation ? { derivation: bestHow.derivation } : {}),
      ...(compound ? { compound } : {}),
    });
    if (best.confidence < DEFAULTS.notFoundBelow) notFound.push({ ...text, linked: true, nearest: { ...best.ref, confidence: round(best.confidence) } });
  });
  mentions.sort((a, b) => a.start - b.start);
  let unlinked: UnlinkedSpan[] = det.unmatched
    .map((u) => ({
      ...spanText(u.first, u.last),
      suggestions: u.suggestions.map((s) => cat.ref(s.num)),
      ...(u.relationWord ? { relationWord: true } : {}),
    }))
    .sort((a, b) => a.start - b.start);
  if (mentions.length === 0 && unlinked.length === 0 && !options.stop?.()) {
    // nothing linked and no name-like words: offer the nearest names for the content words
    const runs: [number, number][] = [];
    for (let i = 0; i < toks.length; i++) {
      if (isStopWord(toks[i]!.norm) || toks[i]!.norm.length < 2 || linker.isVocabularyPhrase(toks[i]!.norm, toks[i]!.stem)) continue;
      const last = runs[runs.length - 1];
      if (last && last[1] === i) last[1] = i + 1;
      else runs.push([i, i + 1]);
    }
    const outside = toks.map(() => true);
    for (const [a, b] of runs.slice(0, 8)) for (let k = a; k < b; k++) outside[k] = false;
    const again = detectMentions(toks, linker, outside, true);
    unlinked = runs.slice(0, 8).map(([a, b]) => {
      const near = [...again.spans.filter((s) => s.first >= a && s.last <= b).flatMap((s) => s.candidates), ...again.unmatched.filter((u) => u.first >= a && u.last <= b).flatMap((u) => u.suggestions)];
      return { ...spanText(a, b), suggestions: near.slice(0, 3).map((s) => cat.ref(s.num)) };
    });
  }
  for (const u of det.unmatched) {
    // a run is name-like when written like one: a capital on a word that does not open a sentence, or a digit
    if (u.relationWord || !toks.slice(u.first, u.last).some((t) => (t.marked && !t.initial) || /\p{N}/u.test(t.norm))) continue;
    const near = u.suggestions[0];
    notFound.push({ ...spanText(u.first, u.last), linked: false, nearest: near ? { ...cat.ref(near.num), similarity: round(near.similarity) } : null });
  }
  notFound.sort((a, b) => a.start - b.start);
  return { mentions, unlinked, notFound };
}

/**
 * The definite article opens a phrase that refers to one entity; an indefinite one ("has a cable
 * car") mostly predicates, so it is not read as a name (definite descriptions: B. Russell, "On
 * Denoting", Mind 14, 1905; common practice).
 */
const DETERMINERS: ReadonlySet<string> = new Set(["the"]);

/** Share of the phrase's IDF mass a description must hold to replace names found inside the phrase, or to take in a post-modifier. */
const DESCRIPTION_OVER_NAMES = 0.85;

/**
 * Prepositions that open a post-modifier of a noun phrase ("the ferry *across* the canal",
 * "the game *with* the little cat", "the library *for* Python"): Quirk et al. 1985, ch. 17
 * (postmodification by prepositional phrases; from memory). Common practice to list them.
 */
const POSTMODIFYING: ReadonlySet<string> = new Set(["of", "for", "with", "across", "in", "on", "from", "near", "about", "without", "under", "over", "between", "around", "along"]);

/** Articles that may open the noun phrase of a post-modifier. */
const ARTICLES: ReadonlySet<string> = new Set(["the", "a", "an"]);

/**
 * Spans naming an entity by what it is (description-match.ts): after "the", the longest
 * run of content words up to a stop word or a relation word; candidates are the entities
 * whose description fits. Words no name matched exactly count as free (a fuzzy name's words
 * too: "the Concurrent Versions System" is no close spelling of a name). A phrase with no
 * name inside needs `minTerms` free words that are neither type nor relation words. A phrase
 * holding names ("the high-level *Python* *web* development framework", "the lightweight
 * *PDF viewer*") needs one free word and a description holding at least
 * {@link DESCRIPTION_OVER_NAMES} of the whole phrase's IDF mass: then the phrase is one
 * description and the names inside it are its modifiers (they are returned in `replaced`).
 * The phrase takes in a prepositional post-modifier ("the ferry across the canal") when a
 * description holds that share of the longer phrase too.
 */
function describedSpans(
  toks: readonly QuestionToken[],
  spans: readonly DetectedSpan[],
  blocked: readonly boolean[],
  vocabulary: readonly VocabularyOccurrence[],
  linker: Linker,
  stop?: () => boolean,
): { spans: DetectedSpan[]; replaced: Set<DetectedSpan> } {
  const taken = blocked.slice();
  for (const sp of spans) for (let k = sp.first; k < sp.last; k++) taken[k] = true;
  const startsAt = new Map(spans.map((sp) => [sp.first, sp]));
  const out: DetectedSpan[] = [];
  const replaced = new Set<DetectedSpan>();
  const content = (k: number) => !isStopWord(toks[k]!.norm) && !linker.isRelationWord(toks[k]!.norm, toks[k]!.stem);
  /** The run of content words and names from `j` on. */
  const run = (j: number) => {
    let free = 0;
    let words = 0;
    const inner: DetectedSpan[] = [];
    for (;;) {
      if (j >= toks.length || blocked[j]) break;
      const sp = startsAt.get(j);
      if (sp) {
        let all = true;
        for (let k = sp.first; k < sp.last && all; k++) all = !isStopWord(toks[k]!.norm);
        if (!all) break;
        inner.push(sp);
        words += sp.last - sp.first;
        if (sp.match === "fuzzy") free += sp.last - sp.first;
        j = sp.last;
        continue;
      }
      if (taken[j] || !content(j)) break;
      if (!linker.isVocabularyPhrase(toks[j]!.norm, toks[j]!.stem) && !linker.isTypeHead(toks[j]!.norm, toks[j]!.stem)) free++;
      words++;
      j++;
    }
    return { end: j, free, words, inner };
  };
  const describe = (i: number, j: number) => {
    const types = new Set<number>();
    for (const o of vocabulary) if (o.first > i && o.last <= j) for (const t of o.types) types.add(t);
    const query = toks.slice(i + 1, j).filter((t) => !isStopWord(t.norm)).map((t) => t.stem);
    // the index's one-time build checks the time budget; cut short, no phrase gets a description
    return linker.descriptions(stop)?.match(query, types.size > 0 ? (n) => linker.hasType(n, types) : undefined) ?? [];
  };
  const strong = (hits: readonly { similarity: number }[]) => hits.length > 0 && hits[0]!.similarity >= DESCRIPTION_OVER_NAMES * DESCRIPTION_DEFAULTS.scale;
  for (let i = 0; i + 1 < toks.length; i++) {
    if (!DETERMINERS.has(toks[i]!.norm)) continue;
    const base = run(i + 1);
    let { end: j, free, words } = base;
    let inner = base.inner;
    let hits: ReturnType<typeof describe> | undefined;
    // a post-modifier: preposition, an optional article, a further run
    if (j < toks.length && POSTMODIFYING.has(toks[j]!.norm) && words > 0) {
      let k = j + 1;
      if (k < toks.length && ARTICLES.has(toks[k]!.norm)) k++;
      const more = run(k);
      if (more.words > 0 && base.free + more.free >= DESCRIPTION_DEFAULTS.minTerms) {
        const longer = describe(i, more.end);
        if (strong(longer)) {
          hits = longer;
          j = more.end;
          free += more.free;
          words += more.words;
          inner = [...inner, ...more.inner];
        }
      }
    }
    if (!hits) {
      if (inner.length === 0 ? free < DESCRIPTION_DEFAULTS.minTerms : free < 1 || words < DESCRIPTION_DEFAULTS.minTerms) continue;
      hits = describe(i, j);
      if (inner.length > 0 && !strong(hits)) continue;
    }
    if (hits.length > 0) {
      out.push({ first: i + 1, last: j, match: "fuzzy", candidates: hits.map((h) => ({ num: h.num, similarity: h.similarity, kind: 0, match: "description" as const })) });
      for (let k = i + 1; k < j; k++) taken[k] = true;
      for (const sp of inner) replaced.add(sp);
    }
    i = j - 1;
  }
  return { spans: out, replaced };
}

/** How a candidate matched: its own match kind, else its label or alias (exact or by stem). */
function matchOf(c: SpanCandidate): MatchKind {
  return c.match ?? (c.kind === 0 ? "label" : "alias");
}

/** The second element of a hyphenated compound right after token `last` ("based" in "Vask-based"), if any. */
function compoundAfter(question: string, toks: readonly QuestionToken[], last: number): string | undefined {
  const prev = toks[last - 1];
  const next = toks[last];
  if (!prev || !next || !/^[-‐‑]$/u.test(question.slice(prev.end, next.start)) || !/^\p{L}+$/u.test(next.norm)) return undefined;
  return next.norm;
}

function round(x: number): number {
  return Math.round(x * 10000) / 10000;
}

/**
 * Scores the catalog candidates of one given span of `question` (start/end UTF-16 offsets) with
 * the linker's local evidence (prior, string similarity, BM25 context); for evaluations.
 * Candidates are the entities whose alias equals the span (normalised, else stemmed), or the
 * given `candidates` (each then treated as an exact match; its label counts as the label kind).
 * Returns nums best first with confidences; empty when the span names no entity.
 */
export function rankSpanCandidates(
  question: string,
  start: number,
  end: number,
  linker: Linker,
  options: { scoring?: ScoringOptions; candidates?: readonly number[] } = {},
): { num: number; confidence: number }[] {
  const toks = questionTokens(question);
  const inside = toks.map((t) => t.start >= start && t.end <= end);
  const spanToks = toks.filter((_, k) => inside[k]);
  if (spanToks.length === 0) return [];
  let cands: SpanCandidate[];
  if (options.candidates) {
    cands = options.candidates.map((num) => ({ num, similarity: 1, kind: linker.aliasRows(num).some((r) => r[2] === 0 && r[1] === spanToks.map((t) => t.norm).join(" ")) ? 0 : 1 }));
  } else {
    const norm = spanToks.map((t) => t.norm).join(" ");
    const stem = spanToks.map((t) => t.stem).join(" ");
    let hits: readonly AliasHit[] = linker.byNorm(norm);
    let sim = 1;
    if (hits.length === 0) {
      hits = linker.byStem(stem);
      sim = DETECTION_DEFAULTS.stemSimilarity;
    }
    const best = new Map<number, number>();
    for (const h of hits) best.set(h.entity, Math.min(best.get(h.entity) ?? 1, h.kind));
    cands = [...best].sort((a, b) => a[0] - b[0]).map(([num, kind]) => ({ num, similarity: sim, kind }));
  }
  const query = toks.filter((t, k) => !inside[k] && !isStopWord(t.norm)).map((t) => t.stem);
  const first = inside.indexOf(true);
  const named = namedOutside(linker.vocabularyOccurrences(toks), first, inside.lastIndexOf(true) + 1);
  const ev = cands.map((c) => linker.evidence(c, query, named, true));
  return disambiguate([ev], undefined, options.scoring)[0]!.map((c) => ({ num: c.num, confidence: c.confidence }));
}

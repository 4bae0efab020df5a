/**
 * The pipeline session: one opened catalog with its relation index, linker and question
 * model, loaded once and reused for every question (`ask`, `check`, the terminal screen).
 *
 * ask(question) = linkQuestion → analyze → rank → answers + verdict (+ explanation), each
 * stage timed. Answers and verdict are made in one place, {@link Session.answersOf}.
 */
import { Catalog, NumericColumns, demoCatalogPath, normalize, readBinding } from "../catalog/index.js";
import { analyze, buildAttributeModel, buildQuestionModel, detectConditions, readQuestion, readingDoc, type Analysis, type AttributeModel, type EntityComparison, type QueryGraph, type QuestionModel } from "../analysis/index.js";
import { Linker, linkQuestion, notFoundNote, type LinkResult, type Pin } from "../linking/index.js";
import { DEADLINE_DEFAULTS, DISCLAIMER, Deadline, LIMITS, TiepointError, checkQuestionLength, checkTop, type Answer, type AskResult, type EntityRef, type Mention, type Verdict } from "../model/index.js";
import { applyConditions, chainReach, clueSeeds, openIndex, rank, type ConditionOutcome, type IndexProgress, type Ranked, type RankOptions, type ReachMemo, type RelationIndex, type SparseScores } from "../ranking/index.js";
import { linkFacts } from "./link-facts.js";
import { answerComparison, answerIdentity, answerValue, type DirectAnswer } from "./direct.js";
import { StoreEdges, type PullFigures, type StoreOptions } from "./store-edges.js";
import { LocalEdges, type EdgeAccess, type StoreDescription } from "./edge-access.js";
import { conditionDocs, conditionExplanation, conditionSteps, countDoc, decideVerdict, explain, whyNotFigures, whyNotReasons, PATH_DEFAULTS, VERDICT_DEFAULTS, WHY_NOT_DEFAULTS, type Explanation, type VerdictContext, type WhyNot } from "../explain/index.js";

/** A progress event while a session opens. */
export interface SessionProgress {
  /** "catalog", "index", "linker", "model", "ready". */
  readonly phase: string;
  /** Index building detail, when phase is "index". */
  readonly index?: IndexProgress;
}

/** Options of {@link Session.open}; all optional. */
export interface SessionOptions {
  /** Catalog file. @default the demo catalog (demoCatalogPath()) */
  readonly db?: string;
  /** Progress while opening (to stderr in the CLI). */
  readonly onProgress?: (p: SessionProgress) => void;
  /** Ranking options used for every question. */
  readonly rank?: RankOptions;
  /** An attached catalog's store: request timeout and credentials (pipeline/store-edges.ts). */
  readonly store?: StoreOptions;
}

/** Options of {@link Session.ask}; all optional. */
export interface AskOptions {
  /** Answers returned. @default 10 */
  readonly top?: number;
  /** User-fixed links (`--pin TEXT=ENTITY`). */
  readonly pins?: readonly Pin[];
  /** Clue indexes to leave out of the ranking (ablation). */
  readonly dropClues?: readonly number[];
  /** Entities (ids or exact labels) to explain the absence of (`--why-not`). */
  readonly whyNot?: readonly string[];
  /** Re-ask each suggested clue's question and mark it `verified` when it comes out unique with the same answer (verified ones first). @default false */
  readonly verifySuggestions?: boolean;
  /**
   * The question's time budget in milliseconds (0: none): once spent, the long stages
   * (conditions over every entity of a type, paths of later answers, clue ablation,
   * suggestions, why-not, suggestion checks) stop early, and the result says what was cut
   * (`budget`, a note). @default 3000 (model DEADLINE_DEFAULTS.timeLimitMs)
   */
  readonly timeLimitMs?: number;
  /** Run the clue ablation (its re-rankings are the explanation's costliest part; `check` prints none). @default true */
  readonly ablation?: boolean;
  /** Suggest clues for a tied or weak verdict. @default true */
  readonly suggestions?: boolean;
  /** Only the answers and the verdict (the re-asks that check suggestions): no ablation, no suggestions, no answer paths, coverage rows or per-answer condition values. @default false */
  readonly verdictOnly?: boolean;
}

/** Defaults of {@link AskOptions}. */
export const DEFAULTS = {
  top: 10,
  /** Entities explained for one `--why-not` name that several share. */
  maxWhyNotPerName: 5,
  /** Nearest names offered for an unknown `--why-not` name. */
  didYouMean: 3,
} as const;

/** Milliseconds per stage of one question. */
export interface AskTimings {
  readonly link: number;
  /** Reading the question: analysis, conditions and the query graph. */
  readonly analyze: number;
  /** Ranking (PageRank, patterns, the conditions applied) and the link facts of the verdict. */
  readonly rank: number;
  readonly explain: number;
  readonly total: number;
}

/** Everything one question produced. */
export interface AskOutcome {
  /** The contract document of `ask --json`. */
  readonly result: AskResult;
  readonly analysis: Analysis;
  readonly ranked: Ranked;
  readonly timings: AskTimings;
  /** Paths, coverage, verdict, ablation, suggestions and why-not reports (explain stage). */
  readonly explanation?: Explanation;
  /** The question's conditions as applied to the ranking (absent when it has none). */
  readonly conditions?: ConditionOutcome;
  /** The question's reading (analysis query-graph.ts). */
  readonly reading: QueryGraph;
}

/** One loaded catalog, ready for questions. */
export class Session {
  readonly catalog: Catalog;
  readonly index: RelationIndex;
  readonly linker: Linker;
  readonly model: QuestionModel;
  private readonly rankOptions: RankOptions;
  private readonly idCache = new Map<number, { id: string; label: string }>();
  /** Entities per label (explain's suggested clues), kept like `idCache`. */
  private readonly labelCounts = new Map<string, number>();
  /** When set, the explanation adds its milliseconds per part here (paths, ablation, verdict, suggestions, whyNot; the bench's profile). */
  explainPhaseMs: Record<string, number> | undefined;
  private attributeModel?: AttributeModel;
  /** Numeric attribute values by predicate, read once per predicate in this session's snapshot. */
  private readonly numericColumns: NumericColumns;

  /** Where the relation edges come from (edge-access.ts): the catalog file, or the SPARQL store an attached catalog's edges are pulled from (store-edges.ts). */
  readonly edges: EdgeAccess;

  private constructor(catalog: Catalog, index: RelationIndex, linker: Linker, model: QuestionModel, rankOptions: RankOptions, edges: EdgeAccess, numericColumns: NumericColumns) {
    this.edges = edges;
    this.catalog = catalog;
    this.index = index;
    this.linker = linker;
    this.model = model;
    this.rankOptions = rankOptions;
    this.numericColumns = numericColumns;
  }

  /** Opens the catalog (read-only), its relation index (snapshot or rebuilt), linker and question model. */
  static open(options: SessionOptions = {}): Session {
    const progress = options.onProgress;
    const path = options.db ?? demoCatalogPath();
    progress?.({ phase: "catalog" });
    const catalog = Catalog.open(path, { readonly: true });
    try {
      // an attached catalog: its edges come from the store, per question (before any edge statement is prepared)
      const binding = readBinding(path, catalog.version());
      const store = binding ? new StoreEdges(catalog, binding, options.store ?? {}) : undefined;
      // one read transaction for the session's life: the index, the linker, the model and
      // every later catalog read see one committed state, even while a load writes the
      // catalog (WAL snapshot isolation, https://www.sqlite.org/wal.html; README "Failure modes")
      catalog.db.exec("BEGIN");
      catalog.version();
      progress?.({ phase: "index" });
      const index = openIndex(catalog, { onProgress: (e: IndexProgress) => progress?.({ phase: "index", index: e }) });
      if (binding) index.adoptEndTable(binding.ends);
      progress?.({ phase: "linker" });
      const linker = Linker.fromCatalog(catalog);
      progress?.({ phase: "model" });
      const model = buildQuestionModel(catalog, { relationEdgeCounts: binding ? binding.relationEdges : index.relationEdgeCounts(), relationEnds: () => index.relationEnds(), typesOf: (n) => index.typesOf(n) });
      // the numeric attribute columns (catalog numeric-column.ts): the file written with the load, opened per column on first use
      const columns = NumericColumns.open(catalog);
      progress?.({ phase: "ready" });
      return new Session(catalog, index, linker, model, options.rank ?? {}, store ?? new LocalEdges(), columns);
    } catch (e) {
      endRead(catalog);
      catalog.close();
      throw e;
    }
  }

  /** This session's catalog, linker and model over another relation index (an attached store's pull); the index's own session when it is this one's. */
  withIndex(index: RelationIndex): Session {
    if (index === this.index) return this;
    const s = new Session(this.catalog, index, this.linker, this.model, this.rankOptions, new LocalEdges(), this.numericColumns);
    s.explainPhaseMs = this.explainPhaseMs;
    return s;
  }

  /** The attached store (endpoint without credentials, graph, time of the attach); undefined for a loaded catalog. */
  get store(): StoreDescription | undefined {
    return this.edges.store;
  }

  /** What the last question pulled from the store (requests, rows, entities, ms); undefined for a loaded catalog. */
  pullFigures(): PullFigures | undefined {
    return this.edges instanceof StoreEdges ? { ...this.edges.figures } : undefined;
  }

  /** The catalog's counts, with the relation edges of its store on an attached catalog (the store's count taken at the attach). */
  counts(): ReturnType<Catalog["counts"]> {
    const c = this.catalog.counts();
    const e = this.edges.counts();
    return e ? { ...c, edges: e.edges, relations: Array.from(e.relationEdges).filter((x) => x > 0).length } : c;
  }

  /**
   * Answers one question, on any catalog: the edge access (edge-access.ts) gives the index the
   * question reads — a loaded catalog's own, or the neighbourhood pulled from an attached
   * catalog's store — and the same pipeline ({@link ask}) runs on it.
   */
  askAsync(question: string, options: AskOptions = {}): Promise<AskOutcome> {
    return this.edges.forQuestion(this, question, options.pins, (index) => this.withIndex(index).ask(question, options));
  }

  /**
   * This session over a relation index holding the rows of `nums` and `rings` rings of
   * neighbours around them (compose's target, an entity card): itself for a loaded catalog,
   * the pulled neighbourhood for an attached one (whose catalog edge reads see the same rows).
   */
  async around(nums: readonly number[], rings: number): Promise<Session> {
    return this.withIndex(await this.edges.around(this, nums, rings));
  }

  /** Answers one question on this session's relation index as it is (the pipeline itself; {@link askAsync} for any catalog). */
  ask(question: string, options: AskOptions = {}, shared?: SharedWork): AskOutcome {
    if (this.edges.store) throw new TypeError("pipeline/session: an attached catalog's questions go through askAsync (its edges are pulled per question)");
    const top = options.top ?? DEFAULTS.top;
    checkTop(top);
    if (question.trim() === "") throw new TiepointError("pipeline/question", "the question is empty");
    checkQuestionLength(question);
    const t0 = performance.now();
    const deadline = new Deadline(options.timeLimitMs ?? DEADLINE_DEFAULTS.timeLimitMs);
    const linked = linkQuestion(question, this.linker, { stop: () => deadline.stop("linking"), ...(options.pins !== undefined ? { pins: options.pins } : {}) });
    const link = capMentions(linked);
    const limitNotes =
      link === linked ? [] : [`${linked.mentions.length} names were linked; only the ${LIMITS.maxMentions} most confident are used as clues (limit: README "Failure modes")`];
    const t1 = performance.now();
    const { cond, analysis, reading, ranked: maybeRanked, matchedNodes, conditions, pprMemo, reachMemo, lookup, readMs } = this.readAndRank(question, link, deadline, options.dropClues, shared);
    // the reading (analysis, conditions, query graph) apart from the ranking that follows it in readAndRank
    const tRead = t1 + readMs;
    if (cond.value || cond.compare || cond.identity) {
      const expected = new Set(analysis.answerTypes.map((t) => t.num));
      const direct = cond.value
        ? answerValue(this.catalog, cond.value)
        : cond.compare
          ? answerComparison(this.catalog, cond.compare.described ? this.describedComparison(cond.compare, analysis, reading) : cond.compare, this.attributes().attributes.map((a) => ({ ...a, score: 0, wordIndexes: [] })))
          : answerIdentity(this.catalog, cond.identity!, analysis, VERDICT_DEFAULTS.senseRatio, (n) => this.index.isA(n, expected));
      // a value question has no ranking to compare a --why-not entity with: say so (names still checked)
      const asked = options.whyNot ?? [];
      for (const name of asked) this.whyNotEntities(name);
      const whyNotNote = asked.length > 0 ? [`--why-not ${asked.map((n) => JSON.stringify(n)).join(", ")}: this question is answered from attribute values, not by ranking, so there is nothing to compare with`] : [];
      return this.directOutcome(question, analysis, reading, direct, [...limitNotes, ...whyNotNote], top, { link: t1 - t0, analyze: tRead - t1 }, t0);
    }
    const ranked = maybeRanked!;
    // the answer's conditions (those on an inner node are the reading's, applied in the ranking's pattern check)
    const answerConditions = reading.conditions;
    const withConditions = (r: Ranked) => (answerConditions.length > 0 ? applyConditions(analysis, r, answerConditions, this.index, lookup).ranked : r);
    // the link facts of the verdict: names not found, senses in doubt (each evaluated once more)
    const facts = linkFacts(question, analysis, ranked.clues, link, {
      names: (num) => this.catalog.aliasRows(num).map((r) => r[0]),
      otherSense: (text, id, sameName) => (deadline.stop("other senses") ? null : this.otherSenseAnswers(question, text, id, options.pins ?? [], deadline, sameName)),
    });
    const verdictContext: VerdictContext = {
      reading: { graph: reading, matched: matchedNodes!, fallback: ranked.fallback === true, open: ranked.open ?? 0 },
      ...(conditions ? { conditions: { list: answerConditions, outcome: conditions } } : {}),
      notFound: facts.notFound,
      partial: facts.partial,
      // a number the conditions read ("built in the 1970s") is no name
      unlinked: facts.unlinked.filter((u) => !cond.conditions.some((c) => u.start < c.end && u.end > c.start)),
      doubts: facts.doubts,
      ref: (n) => this.ref(n),
    };
    const t3 = performance.now();
    const asked = (options.whyNot ?? []).map((e) => ({ name: e, nums: this.whyNotEntities(e) }));
    const whyNot = [...new Set(asked.flatMap((x) => x.nums))];
    const sharedNotes = asked.filter((x) => x.nums.length > 1).map((x) => this.sharedNameNote(x.name, x.nums));
    const parts = { ablation: options.verdictOnly !== true && (options.ablation ?? true), suggestions: options.verdictOnly !== true && (options.suggestions ?? true), paths: options.verdictOnly !== true };
    const made = this.answersOf(analysis, ranked, top, { reading, dropClues: options.dropClues ?? [], whyNot, pprMemo, reachMemo, deadline, verdictContext, parts, ...(conditions ? { rerankWith: withConditions } : {}) });
    let { answers } = made;
    const verdict = made.verdict;
    // a verdict-only re-ask (a suggestion's check) reads the verdict and the first answer's id: no condition steps per answer, no explanation
    if (conditions && options.verdictOnly !== true) {
      const nodeOf = new Map(ranked.candidates.slice(0, top).map((c) => [this.ref(c.node).id, c.node]));
      answers = answers.map((a) => {
        const node = nodeOf.get(a.id);
        return node === undefined ? a : { ...a, values: conditionSteps(node, answerConditions, conditions) };
      });
      // a question with no clue has no explanation of its own; a tie gets the clues that would single out the first answer
      if (!made.explanation || verdict.status === "tied") made.explanation = conditionExplanation(question, answers, verdict, conditions, this.index, this.catalog, made.explanation, { suggestions: parts.suggestions, deadline });
    }
    let explanation = whyNot.length > 0 ? this.completeWhyNot(whyNot, made.explanation, answers, verdict, analysis, ranked, conditions ? { list: answerConditions, outcome: conditions } : undefined) : made.explanation;
    if (options.verifySuggestions && explanation && explanation.suggestions.length > 0 && answers[0]) {
      const want = answers[0].id;
      // the checks share this question's clue walks and pattern end sets: each is the same wherever its memo key is (ranking rank.ts)
      const checks: SharedWork = { pprMemo, reachMemo };
      // each re-ask gets what is left of the budget; once it is spent the rest stay unchecked
      const checked = explanation.suggestions.map((sg) => {
        if (deadline.stop("suggestion checks")) return sg;
        const left = deadline.remaining();
        // the re-ask needs only its answers and verdict: no ablation, no suggestions of its own
        const again = this.ask(sg.question, { top: 3, verdictOnly: true, timeLimitMs: left === Infinity ? 0 : Math.max(1, left), ...(options.pins !== undefined ? { pins: options.pins } : {}) }, checks).result;
        return { ...sg, verified: again.verdict.status === "unique" && again.answers[0]?.id === want };
      });
      explanation = { ...explanation, suggestions: [...checked.filter((x) => x.verified), ...checked.filter((x) => !x.verified)] };
    }
    const t4 = performance.now();
    const mentions = mentionDocs(analysis);
    const result: AskResult = {
      question,
      mentions,
      answerTypes: analysis.answerTypes.map((t) => ({ id: t.id, label: t.label })),
      answers,
      verdict,
      notes: [...limitNotes, ...link.notFound.filter((n) => n.linked).map(notFoundNote), ...facts.added.map(notFoundNote), ...analysis.notes, ...ranked.notes, ...sharedNotes, ...budgetNotes(deadline)],
      ...(link.notFound.length + facts.added.length > 0 ? { notFound: [...link.notFound, ...facts.added].sort((a, b) => a.start - b.start) } : {}),
      disclaimer: DISCLAIMER,
      // the entities that satisfy the reading and its conditions (the conditions' fit set after the filters)
      reading: readingDoc(reading, analysis, this.model, ranked.matched !== undefined ? { matched: conditions && ranked.matched > 0 && ranked.fallback !== true ? conditions.fit.length : ranked.matched, fallback: ranked.fallback === true } : { matched: null, fallback: false }),
      ...(conditions ? { conditions: conditionDocs(answerConditions, conditions) } : {}),
      ...(conditions?.count ? { count: countDoc(conditions, this.catalog)! } : {}),
      ...(explanation && explanation.suggestions.length > 0
        ? { suggestions: explanation.suggestions.map((sg) => ({ text: sg.text, question: sg.question, triple: sg.triple, rulesOut: sg.rulesOut, ...(sg.verified !== undefined ? { verified: sg.verified } : {}) })) }
        : {}),
      ...(deadline.hit ? { budget: { limitMs: deadline.limitMs, hit: true as const, cut: deadline.cuts } } : {}),
    };
    return { result, analysis, ranked, explanation, reading, ...(conditions ? { conditions } : {}), timings: { link: t1 - t0, analyze: tRead - t1, rank: t3 - tRead, explain: t4 - t3, total: t4 - t0 } };
  }

  /**
   * Reads a linked question (analysis, conditions, the query graph) and, unless it is a value
   * or comparison question, ranks it and applies its conditions.
   */
  /** The attribute vocabulary for the condition detector, read only when it reaches a quantity or dimension word (a scan of every literal), not for every question's first ask. */
  private lazyAttributes(): AttributeModel {
    const session = this;
    return {
      get attributes() {
        return session.attributes().attributes;
      },
      get textAttributes() {
        return session.attributes().textAttributes;
      },
      textValues: (p: number, texts: readonly string[]) => session.catalog.attributeValuesIn(p, texts),
    };
  }

  /** The reading (query graph) of a question, without ranking it (an attached catalog sends it to its store before the first run, store-edges.ts). */
  readingOf(question: string, pins: readonly Pin[] | undefined): QueryGraph {
    const link = capMentions(linkQuestion(question, this.linker, pins !== undefined ? { pins } : {}));
    return readQuestion(detectConditions(analyze(question, link, this.model), this.model, this.lazyAttributes()), this.model);
  }

  /**
   * A comparison between described entities ("the country whose capital is A or the one whose
   * capital is B"): each compared clue stands for the entities its chain of the reading reaches
   * (ranking chain-reach.ts, the stored directions); a clue whose chain reaches none stands for itself.
   */
  private describedComparison(c: EntityComparison, analysis: Analysis, reading: QueryGraph): EntityComparison {
    const nodes = c.mentions.flatMap((mi, k) => {
      const ci = analysis.clues.findIndex((x) => x.mention === mi);
      const ch = ci >= 0 ? reading.chains[ci] : undefined;
      const own = c.nodes[k]!;
      if (!ch || ch.steps.length === 0 || !(own >= 0 && own < this.index.nodeCount)) return [own];
      const reached = chainReach(this.index, own, ch.steps.map((st) => st.options));
      return reached && reached.size > 0 ? [...reached].sort((a, b) => a - b) : [own];
    });
    return { ...c, nodes };
  }

  /** Attribute values for the conditions: numbers through per-predicate columns, texts and value lookups from the catalog. */
  private attributeLookup() {
    return {
      numbers: (e: number, p: number) => this.numericColumns.numbers(e, p),
      column: (p: number) => this.numericColumns.column(p),
      texts: (e: number, p: number) => this.catalog.attributeTexts(e, p),
      entitiesWith: (p: number, v: string) => this.catalog.entitiesWithValue(p, v),
    };
  }

  private readAndRank(question: string, link: LinkResult, deadline: Deadline, dropClues?: readonly number[], shared?: SharedWork): ReadAndRank {
    // conditions (comparisons, superlatives, exclusions, counts): src/analysis/conditions.ts
    const t0 = performance.now();
    const cond = detectConditions(analyze(question, link, this.model), this.model, this.lazyAttributes());
    const analysis = cond.analysis;
    const reading = readQuestion(cond, this.model);
    const readMs = performance.now() - t0;
    // numeric values through per-predicate columns (one statement per attribute, kept by the session)
    const lookup = this.attributeLookup();
    // per-clue PageRank vectors of this question, reused by the ablation's re-rankings
    const pprMemo = shared?.pprMemo ?? new Map<string, SparseScores>();
    // and its clues' pattern end sets, reused likewise
    const reachMemo: ReachMemo = shared?.reachMemo ?? new Map();
    if (cond.value || cond.compare || cond.identity) return { cond, analysis, reading, lookup, pprMemo, reachMemo, readMs };
    const ranked0 = rank(analysis, this.index, { ...this.rankOptions, pprMemo, reachMemo, reading, deadline, attributes: lookup, ...(dropClues ? { dropClues } : {}) });
    const conditions = reading.conditions.length > 0 ? applyConditions(analysis, ranked0, reading.conditions, this.index, lookup, { deadline }) : undefined;
    // the entities that satisfy the reading (all of them, not only the ranking's first `matched`), before any filter or reordering
    const matchedNodes = new Set(ranked0.fallback ? [] : (ranked0.matchedNodes?.() ?? ranked0.candidates.slice(0, ranked0.matched ?? 0).map((c) => c.node)));
    return { cond, analysis, reading, lookup, pprMemo, reachMemo, readMs, ranked: conditions?.ranked ?? ranked0, matchedNodes, ...(conditions ? { conditions } : {}) };
  }

  /**
   * The answers of the question with the words `text` read as entity `id` (pinned) that
   * satisfy that reading and its conditions (link-facts.ts); null for a value question.
   */
  private otherSenseAnswers(question: string, text: string, id: string, pins: readonly Pin[], deadline: Deadline, sameName = false): EntityRef[] | null {
    const link = capMentions(linkQuestion(question, this.linker, { pins: [...pins, { text, entity: id }] }));
    const { ranked, conditions, matchedNodes, reading } = this.readAndRank(question, link, deadline);
    if (!ranked || !matchedNodes) return null;
    // a reading with a clue no pattern holds selects nothing: the other sense is not evaluated —
    // unless the other sense has the very same name and the reading matched, a clue held by a
    // neighbour constraint included ("In which country is the city of Kingston?": both cities
    // are one hop from their country); a sense of another name ("Americas" for "South
    // American") is held to the full reading
    if (!readingHolds(reading, ranked) && !(sameName && ranked.fallback !== true && matchedNodes.size > 0 && reading.chains.every((ch) => ch.steps.length <= VERDICT_DEFAULTS.maxSteps))) return null;
    // a count: the counted entities; otherwise the entities that satisfy the reading and the conditions
    const nodes = conditions?.count ? conditions.count.entities : ranked.candidates.map((c) => c.node).filter((n) => matchedNodes.has(n));
    return nodes.map((n) => this.ref(n));
  }

  /** The outcome of a question answered by attribute values (pipeline/direct.ts): no walk, no paths. */
  private directOutcome(
    question: string,
    analysis: Analysis,
    reading: QueryGraph,
    direct: DirectAnswer,
    limitNotes: readonly string[],
    top: number,
    times: { link: number; analyze: number },
    t0: number,
  ): AskOutcome {
    const answers = direct.answers.slice(0, top);
    const ranked: Ranked = {
      clues: analysis.clues,
      candidates: answers.map((a) => ({ node: this.catalog.byLabelOrId(a.id)[0] ?? -1, score: a.score, perClue: [], covered: analysis.clues.length })),
      typeFiltered: false,
      relationWeights: new Float64Array(Math.max(this.index.relationCount, 1)).fill(1),
      notes: [],
    };
    const result: AskResult = {
      question,
      mentions: mentionDocs(analysis),
      answerTypes: analysis.answerTypes.map((t) => ({ id: t.id, label: t.label })),
      answers,
      verdict: direct.verdict,
      notes: [...limitNotes, ...analysis.notes, ...direct.notes],
      disclaimer: DISCLAIMER,
      values: direct.values,
      reading: readingDoc(reading, analysis, this.model, { matched: direct.values.length > 0 ? answers.length : reading.identity ? 1 : 0, fallback: false }),
    };
    const total = performance.now() - t0;
    return { result, analysis, ranked, reading, timings: { link: times.link, analyze: times.analyze, rank: total - times.link - times.analyze, explain: 0, total } };
  }

  /**
   * The answers (with paths) and the verdict of a ranking: the one call site where the
   * explanation stage plugs in (explain(): paths, coverage, verdict, ablation through
   * re-ranking, why-not, suggestions). With no clue or no candidate: no paths, the verdict from the conditions and link facts alone.
   */
  answersOf(
    analysis: Analysis,
    ranked: Ranked,
    top: number,
    extra: {
      /** The question's reading: the ablation's re-rankings evaluate the same one (without the dropped clues). */
      readonly reading?: QueryGraph;
      readonly dropClues?: readonly number[];
      readonly whyNot?: readonly number[];
      readonly rerankWith?: (r: Ranked) => Ranked;
      /** Per-clue PageRank vectors of this analysis (rank's `pprMemo`), shared by the re-rankings. */
      readonly pprMemo?: Map<string, SparseScores>;
      /** The clues' pattern end sets of this analysis (rank's `reachMemo`), shared by the re-rankings. */
      readonly reachMemo?: ReachMemo;
      /** The question's time budget (explain's long stages stop early once it is spent). */
      readonly deadline?: Deadline;
      /** What the verdict reads besides the ranking (explain/verdict.ts): reading, conditions, link facts. */
      readonly verdictContext?: VerdictContext;
      /** Which optional parts of the explanation run. @default both */
      readonly parts?: { readonly ablation: boolean; readonly suggestions: boolean; readonly paths?: boolean };
    } = {},
  ): { answers: Answer[]; verdict: Verdict; explanation?: Explanation } {
    if (ranked.clues.length === 0 || ranked.candidates.length === 0) {
      // nothing to explain: the basic verdict says why
      const answers: Answer[] = ranked.candidates.slice(0, top).map((c) => {
        const ref = this.ref(c.node);
        return { id: ref.id, label: ref.label, score: c.score, types: this.index.typesOf(c.node).map((t) => this.ref(t).id), paths: [] };
      });
      const verdict = decideVerdict({
        clues: ranked.clues.map((c) => c.label),
        candidates: ranked.candidates.map((c) => ({ node: c.node, ...this.ref(c.node), score: c.score, covered: c.covered })),
        equivalent: null,
        maxHops: PATH_DEFAULTS.maxHops,
        context: extra.verdictContext ?? { ref: (n) => this.ref(n) },
      });
      return { answers, verdict };
    }
    // ranked.clues are analysis.clues minus dropClues: map a ranked clue index back
    const dropped = new Set(extra.dropClues ?? []);
    const kept = analysis.clues.map((_, i) => i).filter((i) => !dropped.has(i));
    const pprMemo = extra.pprMemo ?? new Map<string, SparseScores>();
    const reachMemo: ReachMemo = extra.reachMemo ?? new Map();
    const explanation = explain(analysis, ranked, this.index, this.catalog, {
      top,
      ...(this.rankOptions.alpha !== undefined ? { restart: this.rankOptions.alpha } : {}),
      ...(this.rankOptions.hubExponent !== undefined ? { hubExponent: this.rankOptions.hubExponent } : {}),
      // re-ranking without a clue reuses the other clues' walks (same relation weights, pprMemo)
      rerank: (a, drop) => {
        const r = rank(a, this.index, { ...this.rankOptions, pprMemo, reachMemo, walkWeights: ranked.relationWeights, attributes: this.attributeLookup(), ...(extra.reading ? { reading: extra.reading } : {}), dropClues: [...dropped, ...drop.map((i) => kept[i]!)] });
        return extra.rerankWith ? extra.rerankWith(r) : r;
      },
      whyNot: extra.whyNot ?? [],
      ...(extra.verdictContext ? { verdictContext: extra.verdictContext } : {}),
      ...(extra.deadline ? { deadline: extra.deadline } : {}),
      ...(extra.parts ? { ablation: extra.parts.ablation, suggestions: extra.parts.suggestions, answerPaths: extra.parts.paths ?? true } : {}),
      // the session reads one committed catalog state (one read transaction), so ids and labels can be kept across questions
      refs: this.idCache,
      labelCounts: this.labelCounts,
      ...(this.explainPhaseMs !== undefined ? { phaseMs: this.explainPhaseMs } : {}),
      seeds: (clue) => clueSeeds(analysis, analysis.clues.find((c) => c.node === clue.node && c.mention === clue.mention) ?? analysis.clues[0]!, this.index, this.rankOptions),
    });
    return { answers: [...explanation.answers], verdict: explanation.verdict, explanation };
  }

  /**
   * Every asked why-not entity gets a report, also when the explanation stage did not run
   * (no clue linked: the ranking is by type and conditions alone), and each report lists the
   * conditions the entity fails.
   */
  private completeWhyNot(
    nums: readonly number[],
    made: Explanation | undefined,
    answers: readonly Answer[],
    verdict: Verdict,
    analysis: Analysis,
    ranked: Ranked,
    conditions: { readonly list: Parameters<typeof conditionSteps>[1]; readonly outcome: ConditionOutcome } | undefined,
  ): Explanation {
    const source = { candidates: ranked.candidates, answerTypes: analysis.answerTypes, typesOf: (n: number) => this.index.typesOf(n), isA: (n: number, t: ReadonlySet<number>) => this.index.isA(n, t), ref: (n: number) => this.ref(n) };
    const reports = nums.map((num): WhyNot => {
      const entity = this.ref(num);
      let w = made?.whyNot.find((x) => x.entity.id === entity.id);
      if (!w) {
        const base = { ...whyNotFigures(num, source, analysis.clues.some((c) => c.node === num)), perClue: [] };
        const why = whyNotReasons(base, PATH_DEFAULTS.maxHops, WHY_NOT_DEFAULTS.longHops);
        if (ranked.clues.length === 0) why.push("no clue entity was linked, so no path or clue score compares it with the best answer");
        w = { ...base, reasons: why };
      }
      const failed = conditions ? conditionSteps(num, conditions.list, conditions.outcome).filter((x) => !x.satisfied) : [];
      return failed.length > 0 ? { ...w, reasons: [...w.reasons, ...failed.map((x) => `fails a condition of the question: ${x.text}`)] } : w;
    });
    const base: Explanation = made ?? { answers, verdict, coverage: { clues: [], rows: [], maxHops: PATH_DEFAULTS.maxHops }, ablation: [], suggestions: [], whyNot: [], labels: {} };
    return { ...base, whyNot: reports };
  }

  /**
   * The entities a `--why-not` name stands for: an id; else every entity with that exact
   * label; else every entity whose label, then alias, matches it after normalisation (case,
   * accents, punctuation). A shared name gives them all (each is explained, none picked
   * silently), at most {@link DEFAULTS}.maxWhyNotPerName. No match: a one-line error with the
   * nearest names the linker finds for the text ("did you mean").
   */
  whyNotEntities(text: string): number[] {
    let nums = this.catalog.byLabelOrId(text);
    if (nums.length === 0) {
      const norm = normalize(text);
      const hits = norm === "" ? [] : this.catalog.byNorm(norm);
      const labels = hits.filter((h) => h.kind === 0).map((h) => h.entity);
      nums = [...new Set(labels.length > 0 ? labels : hits.map((h) => h.entity))].sort((a, b) => a - b);
    }
    if (nums.length === 0) {
      const near = this.nearestNames(text);
      const hint = near.length > 0 ? `; did you mean ${near.map((r) => `${r.label} [${r.id}]`).join(", or ")}?` : "; no label of the catalog comes close";
      throw new TiepointError("pipeline/entity", `no entity with id or label ${JSON.stringify(text)} in the catalog${hint}`);
    }
    return nums.slice(0, DEFAULTS.maxWhyNotPerName);
  }

  /** Up to {@link DEFAULTS}.didYouMean entities the linker reads into `text` (its best readings and their alternatives). */
  private nearestNames(text: string): { id: string; label: string }[] {
    const link = linkQuestion(text.slice(0, LIMITS.maxQuestionChars), this.linker);
    const ids = new Map<string, { id: string; label: string }>();
    for (const m of link.mentions) for (const r of [m.entity, ...m.alternatives]) if (!ids.has(r.id)) ids.set(r.id, { id: r.id, label: r.label });
    return [...ids.values()].slice(0, DEFAULTS.didYouMean);
  }

  /** The note for a `--why-not` name that several entities share. */
  private sharedNameNote(name: string, nums: readonly number[]): string {
    const list = nums.map((n) => {
      const r = this.ref(n);
      const types = this.index.typesOf(n).map((t) => this.ref(t).label);
      return `${r.id}${types.length > 0 ? ` (${types.join(", ")})` : ""}`;
    });
    return `--why-not ${JSON.stringify(name)}: ${nums.length} entities have this name (${list.join("; ")}); each is explained, give an id to explain one`;
  }

  /** Id and label of an entity num (cached). */
  ref(num: number): { id: string; label: string } {
    let r = this.idCache.get(num);
    if (!r) {
      r = this.catalog.ref(num);
      this.idCache.set(num, r);
    }
    return r;
  }

  /** The catalog's attribute vocabulary for conditions (built on first use). */
  attributes(): AttributeModel {
    if (!this.attributeModel) this.attributeModel = buildAttributeModel(this.catalog);
    return this.attributeModel;
  }

  /** Ends the session's read transaction and closes the catalog. */
  close(): void {
    endRead(this.catalog);
    this.catalog.close();
  }
}

/** The note of a question whose time budget was spent: what was cut (README "Time budget"). */
function budgetNotes(deadline: Deadline): string[] {
  if (!deadline.hit) return [];
  return [`time limit of ${deadline.limitMs} ms reached: ${deadline.cuts.join(", ")} stopped early; the answers found so far are shown (raise it with --time-limit; README "Time budget")`];
}

/** The contract's mention documents of an analysis. */
function mentionDocs(analysis: Analysis): Mention[] {
  return analysis.mentions.map((m) => ({
    text: m.text,
    start: m.start,
    end: m.end,
    entity: { id: m.entity.id, label: m.entity.label },
    confidence: m.confidence,
    alternatives: m.alternatives.map((a) => ({ id: a.id, label: a.label, confidence: a.confidence, ...(a.match ? { match: a.match } : {}) })),
    ...(m.pinned ? { pinned: true } : {}),
    ...(m.match && !m.pinned ? { match: m.match } : {}),
    ...(m.derivation ? { derivation: m.derivation } : {}),
    ...(m.compound ? { compound: m.compound } : {}),
  }));
}

/** True when every clue of the reading is held by a relation-path pattern the ranking evaluated (explain/verdict.ts rule 3). */
function readingHolds(reading: QueryGraph, ranked: Ranked): boolean {
  return reading.chains.length === ranked.clues.length && (ranked.open ?? 0) === 0 && reading.chains.every((ch) => ch.steps.length > 0 && ch.steps.length <= VERDICT_DEFAULTS.maxSteps);
}

/**
 * Work one question shares with the questions it asks in turn (the checks of its suggested
 * clues): the per-clue PageRank vectors, keyed by seeds and relation weights, and the clues'
 * pattern end sets, keyed by clue, relation hops and hop types (ranking rank.ts); a check whose
 * clue walks the same way, or reads the same pattern, reuses them instead of searching again.
 */
interface SharedWork {
  readonly pprMemo: Map<string, SparseScores>;
  readonly reachMemo: ReachMemo;
}

/** A question read and ranked ({@link Session}.readAndRank); no ranking for a value or comparison question. */
interface ReadAndRank {
  readonly cond: ReturnType<typeof detectConditions>;
  readonly analysis: Analysis;
  readonly reading: QueryGraph;
  readonly lookup: { numbers: (e: number, p: number) => readonly number[]; texts: (e: number, p: number) => string[]; entitiesWith: (p: number, v: string) => number[] };
  readonly pprMemo: Map<string, SparseScores>;
  readonly reachMemo: ReachMemo;
  /** Milliseconds of the reading alone (analysis, conditions, query graph), before the ranking. */
  readonly readMs: number;
  readonly ranked?: Ranked;
  /** The entities that satisfy the reading (ranking `Ranked.matched`, taken before the conditions). */
  readonly matchedNodes?: ReadonlySet<number>;
  readonly conditions?: ConditionOutcome;
}

/** Ends the session's read transaction (nothing was written in it). */
function endRead(catalog: Catalog): void {
  if (catalog.db.open && catalog.db.inTransaction) catalog.db.exec("ROLLBACK");
}

/**
 * At most {@link LIMITS}.maxMentions linked mentions go on as clues (README "Failure modes"):
 * the most confident ones (ties: earlier in the question), back in question order; the
 * dropped ones are listed as unlinked words.
 */
function capMentions(link: LinkResult): LinkResult {
  if (link.mentions.length <= LIMITS.maxMentions) return link;
  const order = link.mentions.map((m, i) => i).sort((a, b) => link.mentions[b]!.confidence - link.mentions[a]!.confidence || a - b);
  const keep = new Set(order.slice(0, LIMITS.maxMentions));
  const dropped = link.mentions.filter((_, i) => !keep.has(i)).map((m) => ({ text: m.text, start: m.start, end: m.end, suggestions: [] }));
  return { ...link, mentions: link.mentions.filter((_, i) => keep.has(i)), unlinked: [...link.unlinked, ...dropped].sort((a, b) => a.start - b.start) };
}

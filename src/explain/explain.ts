/**
 * Explanation of one ranked question
 * ==================================
 *
 * Puts the explain stage's algorithms together for one question: the paths from every clue
 * to the top answers (paths.ts: Dijkstra and Yen 1971 on the evidence subgraph, bounded
 * bidirectional BFS on the full index), the clue-coverage table (coverage.ts), the
 * structural equivalence of rivals (relation-pattern.ts), the verdict (verdict.ts), clue
 * ablation (ablation.ts, one re-ranking per clue through the `rerank` callback), why-not
 * reports (why-not.ts) and suggested clues for tied or weak questions (suggest.ts).
 *
 * Path costs use the ranking's walk (ranking/transition.ts) with this question's relation
 * weights and the ranking's restart probability, so the best path is the walk that carries
 * the most of the answer's score.
 */
import type { Catalog } from "../catalog/index.js";
import { normalize } from "../catalog/index.js";
import type { Answer, AnswerPath, Deadline, EntityRef, Verdict } from "../model/index.js";
import { RANK_DEFAULTS, TRANSITION_DEFAULTS, salienceOf, transition, type RelationIndex } from "../ranking/index.js";
import { clueRole, preferredByClue, type AblationEntry } from "./ablation.js";
import { coverageTable, type CoverageCell, type CoverageTable } from "./coverage.js";
import { PathCostModel } from "./path-cost.js";
import { findPaths, type AnswerPaths, type ClueSeed, type NumPath, type PathOptions, DEFAULTS as PATH_DEFAULTS } from "./paths.js";
import { matchPattern } from "./relation-pattern.js";
import { suggestClues, type FactLookup, type SuggestedClue, type SuggestOptions } from "./suggest.js";
import type { ExplainAnalysis, ExplainClue, ExplainRanked } from "./types.js";
import { decideVerdict, type VerdictCandidate, type VerdictContext, type VerdictOptions } from "./verdict.js";
import { whyNotFigures, whyNotReasons, DEFAULTS as WHY_NOT_DEFAULTS, type WhyNot, type WhyNotClue, type WhyNotOptions } from "./why-not.js";

/** Options of {@link explain}; all optional. */
export interface ExplainOptions<A extends ExplainAnalysis = ExplainAnalysis> {
  /** Answers returned with paths. @default 10 */
  readonly top?: number;
  /** Rows of the coverage table (and candidates the verdict inspects in detail). @default 10 */
  readonly rows?: number;
  /** Restart probability of the walk (the ranking's α). @default ranking's default */
  readonly restart?: number;
  /** β of the hub damping (the ranking's). @default ranking's default */
  readonly hubExponent?: number;
  /** Relation weights of the walk. @default `ranked.relationWeights` when present, else 1 */
  readonly relationWeights?: Float64Array;
  /** Path search options (paths.ts, evidence-graph.ts). */
  readonly paths?: PathOptions;
  /** Verdict thresholds (verdict.ts). */
  readonly verdict?: VerdictOptions;
  /** The reading, conditions and link facts the verdict reads (verdict.ts rules 1–5; absent: the score rules alone). */
  readonly verdictContext?: VerdictContext;
  /** Suggested-clue options (suggest.ts). */
  readonly suggest?: SuggestOptions;
  /** Why-not options (why-not.ts). */
  readonly whyNotOptions?: WhyNotOptions;
  /** Re-ranks `analysis` without the clues `dropClues`; enables ablation and why-not score parts. */
  readonly rerank?: (analysis: A, dropClues: readonly number[]) => ExplainRanked;
  /** The question's time budget: paths, ablation, suggestions and why-not stop early once it is spent, recording what they cut. */
  readonly deadline?: Deadline;
  /** Run clue ablation (needs `rerank`). @default true */
  readonly ablation?: boolean;
  /** Suggest clues for a tied or weak verdict. @default true */
  readonly suggestions?: boolean;
  /**
   * Give the answers their paths and fill the coverage table. Off, only the paths the verdict
   * reads are searched (each candidate's cheapest and alternative paths per clue), not the
   * reading's lead paths; the answers carry no paths and the table no rows (a re-ask that
   * only wants the verdict and the answer set). @default true
   */
  readonly answerPaths?: boolean;
  /** Entity nums to report on ("why not this one?"). */
  readonly whyNot?: readonly number[];
  /** The restart seeds of a clue as the ranking used them (ranking's `clueSeeds`). @default the clue's entity alone */
  readonly seeds?: (clue: ExplainClue) => readonly ClueSeed[];
  /**
   * A cache of entity ids and labels by num that the caller keeps across questions (valid
   * while the catalog does not change, e.g. for one read transaction). @default a fresh one per call
   */
  readonly refs?: Map<number, EntityRef>;
  /** Like `refs`: a cache of how many entities carry a label or alias, by label. @default a fresh one per call */
  readonly labelCounts?: Map<string, number>;
  /** When given, milliseconds spent per part (paths, ablation, verdict, suggestions, whyNot) are added to it (the bench's profile). */
  readonly phaseMs?: Record<string, number>;
}

/** The defaults of {@link ExplainOptions}. */
export const DEFAULTS = { top: 10, rows: 10, ablation: true } as const;

/** Everything explain produces for one question. */
export interface Explanation {
  /** The contract's answers, best first, each with its paths (best per clue first, then alternatives). */
  readonly answers: readonly Answer[];
  readonly verdict: Verdict;
  readonly coverage: CoverageTable;
  /** One entry per clue (empty without `rerank`, or with ablation off). */
  readonly ablation: readonly AblationEntry[];
  /** Clues that would single out the best answer (tied or weak questions only). */
  readonly suggestions: readonly SuggestedClue[];
  readonly whyNot: readonly WhyNot[];
  /** Labels of every entity and relation id that appears in the paths. */
  readonly labels: Readonly<Record<string, string>>;
}

const relationCache = new WeakMap<Catalog, Map<number, EntityRef & { readonly aliases: readonly string[] }>>();

/** Entity and relation names from the catalog, cached per call (relations per catalog). */
class Names implements FactLookup {
  private readonly refs: Map<number, EntityRef>;
  private readonly rels: Map<number, EntityRef & { readonly aliases: readonly string[] }>;
  private readonly counts: Map<string, number>;
  readonly used = new Map<string, string>();
  /** Salience percentile per entity (set before suggestions are made; ranking's salienceOf). */
  salience?: (num: number) => number;

  constructor(
    private readonly cat: Catalog,
    refs?: Map<number, EntityRef>,
    counts?: Map<string, number>,
  ) {
    this.refs = refs ?? new Map<number, EntityRef>();
    this.counts = counts ?? new Map<string, number>();
    let rels = relationCache.get(cat);
    if (!rels) {
      rels = new Map(cat.predicates().map((p) => [p.num, { id: p.id, label: p.label, aliases: p.aliases }]));
      relationCache.set(cat, rels);
    }
    this.rels = rels;
  }

  ref(num: number): EntityRef {
    let r = this.refs.get(num);
    if (!r) {
      r = this.cat.ref(num);
      this.refs.set(num, r);
    }
    return r;
  }

  /** The id of `num` when it has been read already (by this question or, with a shared cache, an earlier one). */
  cachedId(num: number): string | undefined {
    return this.refs.get(num)?.id;
  }

  relation(rel: number): EntityRef {
    const r = this.rels.get(rel);
    return r ? { id: r.id, label: r.label } : { id: `#${rel}`, label: `relation ${rel}` };
  }

  relationAliases(rel: number): readonly string[] {
    return this.rels.get(rel)?.aliases ?? [];
  }

  attributes(num: number): readonly { predicate: string; label: string; value: string }[] {
    return this.cat.attributes(num);
  }

  labelCount(label: string): number {
    let n = this.counts.get(label);
    if (n === undefined) {
      n = new Set(this.cat.byNorm(normalize(label)).map((h) => h.entity)).size;
      this.counts.set(label, n);
    }
    return n;
  }

  /** Records the labels of a path's ids. */
  note(path: NumPath): void {
    for (const s of path.steps) {
      const a = this.ref(s.from);
      const b = this.ref(s.to);
      const r = this.relation(s.rel);
      this.used.set(a.id, a.label);
      this.used.set(b.id, b.label);
      this.used.set(r.id, r.label);
    }
  }
}

/**
 * A ranked candidate as the verdict reads it: its id and label are read from the catalog
 * only when the verdict asks for them (it names the top, the rivals and the tied ones; up to
 * 200 candidates per ranking would be one row read each). Optional fields are set only when known.
 */
class NamedCandidate implements VerdictCandidate {
  declare reached?: readonly boolean[];
  declare hops?: readonly (number | null)[];
  declare cued?: readonly boolean[];
  declare chainFit?: number;
  declare chainMissed?: readonly number[];
  private ref: EntityRef | undefined;

  constructor(
    readonly node: number,
    readonly score: number,
    readonly covered: number,
    private readonly names: Names,
  ) {}

  get id(): string {
    return (this.ref ??= this.names.ref(this.node)).id;
  }

  get label(): string {
    return (this.ref ??= this.names.ref(this.node)).label;
  }
}

function toAnswerPath(p: NumPath, names: Names): AnswerPath {
  names.note(p);
  return {
    from: names.ref(p.start).id,
    steps: p.steps.map((s) => ({ from: names.ref(s.from).id, relation: names.relation(s.rel).id, to: names.ref(s.to).id, inverse: s.inverse })),
  };
}

/**
 * The relation-pattern matches, per clue, of the top answer's evidence: the nodes matched
 * both by its cheapest path and by its path that reads most like the question (among its
 * best and alternative paths, the one with the most steps over cued relations, then the
 * fewest uncued steps, then the cheapest). Null: too many matches.
 */
function patternSets(index: RelationIndex, cost: PathCostModel, clueCount: number, top: AnswerPaths | undefined, cued: ReadonlySet<number>, targets: ReadonlySet<number>): (Set<number> | null | undefined)[] {
  const rate = (p: NumPath): [number, number, number] => {
    const c = p.steps.filter((s) => cued.has(s.rel)).length;
    return [c, p.steps.length - c, p.cost];
  };
  return Array.from({ length: clueCount }, (_, i) => {
    const paths = top?.byClue[i] ?? [];
    let best: NumPath | undefined;
    for (const p of paths) {
      if (!best) {
        best = p;
        continue;
      }
      const [a1, a2, a3] = rate(p);
      const [b1, b2, b3] = rate(best);
      if (a1 > b1 || (a1 === b1 && (a2 < b2 || (a2 === b2 && a3 < b3)))) best = p;
    }
    if (!best) return undefined;
    const rows = cost.flatWalk()?.rows;
    const match = (p: NumPath) => matchPattern(index, p.start, p.steps.map((s) => ({ rel: s.rel, inverse: s.inverse })), { targets, ...(rows !== undefined ? { rows } : {}) });
    const cheapest = paths[0]!;
    const a = match(cheapest);
    if (best === cheapest || a === null) return a;
    const b = match(best);
    return b === null ? null : new Set([...a].filter((x) => b.has(x)));
  });
}

function intersect(sets: readonly (Set<number> | null | undefined)[], skip = -1): Set<number> | null {
  let out: Set<number> | null = null;
  for (let i = 0; i < sets.length; i++) {
    if (i === skip) continue;
    const s: Set<number> | null | undefined = sets[i];
    if (s === null) return null;
    if (s === undefined) continue;
    const prev: Set<number> | null = out;
    out = prev === null ? new Set(s) : new Set([...prev].filter((x: number) => s.has(x)));
  }
  return out;
}

/**
 * Explains a ranked question: paths, coverage, verdict, ablation, why-not and suggestions.
 * `index` is the ranking's relation index, `catalog` the store the ids and labels come from.
 */
export function explain<A extends ExplainAnalysis>(
  analysis: A,
  ranked: ExplainRanked & { readonly relationWeights?: Float64Array },
  index: RelationIndex,
  catalog: Catalog,
  options: ExplainOptions<A> = {},
): Explanation {
  const top = options.top ?? DEFAULTS.top;
  const rows = options.rows ?? DEFAULTS.rows;
  if (!Number.isInteger(top) || top < 1) throw new RangeError(`explain: top must be a positive integer, got ${top}`);
  if (!Number.isInteger(rows) || rows < 1) throw new RangeError(`explain: rows must be a positive integer, got ${rows}`);
  const names = new Names(catalog, options.refs, options.labelCounts);
  const lap = lapTimer(options.phaseMs);
  const relationWeights = options.relationWeights ?? ranked.relationWeights;
  const walkOptions = {
    ...(relationWeights !== undefined ? { relationWeights } : {}),
    hubExponent: options.hubExponent ?? TRANSITION_DEFAULTS.hubExponent,
  };
  const cost = new PathCostModel(index, { restart: options.restart ?? RANK_DEFAULTS.alpha, transition: transition(index, walkOptions), ...walkOptions });
  const maxHops = options.paths?.maxHops ?? PATH_DEFAULTS.maxHops;
  const clues = ranked.clues;
  const clueSeeds = clues.map((c): readonly ClueSeed[] => {
    const given = options.seeds?.(c) ?? [];
    return given.length > 0 ? given : [{ node: c.node, weight: 1 }];
  });
  const seedNodes = new Set(clueSeeds.flatMap((ss) => ss.map((x) => x.node)));
  const clueRefs = clues.map((c): EntityRef => ({ id: c.id, label: c.label }));
  const n = Math.min(ranked.candidates.length, Math.max(top, rows));
  const shown = ranked.candidates.slice(0, n);
  const deadline = options.deadline;
  // the lead path per clue follows the reading's pattern the ranking matched (paths.ts)
  const missOf = ranked.chainMissOf;
  const answerPaths = options.answerPaths ?? true;
  // the lead paths (the reading's pattern) only order the shown paths; the verdict reads `byClue`
  const leads = answerPaths && ranked.patterns ? { patterns: ranked.patterns } : {};
  // without answer paths (a verdict-only re-ask) only the best answer's alternatives are read
  // (the verdict's relation patterns); the others need their cheapest path, Yen's first one
  const verdictOnly = answerPaths ? {} : { alternativesFor: Math.min(1, options.paths?.alternativesFor ?? PATH_DEFAULTS.alternativesFor) };
  const pathSet = findPaths(
    index,
    cost,
    clueSeeds,
    shown.map((c) => c.node),
    { ...options.paths, ...leads, ...verdictOnly, ...(missOf ? { offPattern: (ci: number, a: number) => missOf(a).includes(ci) } : {}) },
    deadline,
  );
  const byNode = new Map(pathSet.answers.map((a) => [a.answer, a]));

  const answers: Answer[] = shown.slice(0, top).map((c, i) => {
    const ref = names.ref(c.node);
    const ap = pathSet.answers[i]!;
    if (!answerPaths) return { id: ref.id, label: ref.label, score: c.score, types: index.typesOf(c.node).map((t) => names.ref(t).id), paths: [] };
    const best = ap.shown.flatMap((ps) => (ps[0] ? [toAnswerPath(ps[0], names)] : []));
    const alts = ap.shown.flatMap((ps) => ps.slice(1).map((p) => toAnswerPath(p, names)));
    return { id: ref.id, label: ref.label, score: c.score, types: index.typesOf(c.node).map((t) => names.ref(t).id), paths: [...best, ...alts] };
  });
  // the table shows the paths as the answers do (the reading's lead path first)
  const coverage = coverageTable(clueRefs, pathSet.answers.slice(0, answerPaths ? rows : 0).map((a) => ({ ...a, byClue: a.shown })), (x) => names.ref(x), (r) => names.relation(r), maxHops);

  const reachedOf = (node: number, skip = -1): boolean[] | undefined => {
    const ap = byNode.get(node);
    return ap ? ap.byClue.map((ps) => ps.length > 0).filter((_, i) => i !== skip) : undefined;
  };
  const hopsOf = (node: number, skip = -1): (number | null)[] | undefined => {
    const ap = byNode.get(node);
    return ap ? ap.byClue.map((ps) => (ps[0] ? ps[0].steps.length : null)).filter((_, i) => i !== skip) : undefined;
  };
  const cued = new Set(analysis.relationCues.filter((c) => c.weight > 1).map((c) => c.relation));
  const cuedOf = (node: number, skip = -1): boolean[] | undefined => {
    const ap = byNode.get(node);
    return ap ? ap.byClue.map((ps) => (ps[0] ? ps[0].steps.every((st) => cued.has(st.rel)) : false)).filter((_, i) => i !== skip) : undefined;
  };
  // ids and labels are read from the catalog only for the candidates the verdict names
  // (top, rivals, tied ones): up to 200 candidates per ranking would be one row read each
  const verdictCandidates = (cands: ExplainRanked["candidates"], skip = -1, withPaths = true, chainMissOf?: ExplainRanked["chainMissOf"]): VerdictCandidate[] =>
    cands.map((c, k) => {
      // only the best candidate's pattern misses matter to the verdict
      const chainMissed = k === 0 && chainMissOf ? chainMissOf(c.node) : undefined;
      const v = new NamedCandidate(c.node, c.score, c.covered, names);
      if (withPaths && byNode.has(c.node)) {
        v.reached = reachedOf(c.node, skip);
        v.hops = hopsOf(c.node, skip);
        v.cued = cuedOf(c.node, skip);
      }
      if (c.chainFit !== undefined) v.chainFit = c.chainFit;
      if (chainMissed && chainMissed.length > 0) v.chainMissed = chainMissed;
      return v;
    });
  const topPaths = shown.length > 0 ? pathSet.answers[0] : undefined;
  lap("paths");
  // the re-rankings of the clue ablation (one per clue), done first: the relation patterns
  // are only ever asked about the candidates of the ranking and of these re-rankings
  const ablate = options.rerank !== undefined && (options.ablation ?? DEFAULTS.ablation) && shown.length > 0;
  // the time budget: the re-rankings stop once it is spent, and the ablation then covers the clues done
  const withouts: ExplainRanked[] = [];
  if (ablate) for (let i = 0; i < clues.length && !deadline?.stop("ablation"); i++) withouts.push(options.rerank!(analysis, [i]));
  lap("ablation");
  const asked = new Set<number>(ranked.candidates.map((c) => c.node));
  for (const w of withouts) for (const c of w.candidates) asked.add(c.node);
  const patterns = patternSets(index, cost, clues.length, topPaths, cued, asked);
  const verdict = decideVerdict(
    {
      clues: clues.map((c) => c.label),
      candidates: verdictCandidates(ranked.candidates, -1, true, ranked.chainMissOf),
      equivalent: intersect(patterns),
      maxHops,
      ...(options.verdictContext ? { context: options.verdictContext } : {}),
    },
    options.verdict,
  );
  lap("verdict");

  // clue ablation
  const ablation: AblationEntry[] = [];
  if (ablate) {
    const topRef = names.ref(shown[0]!.node);
    clues.slice(0, withouts.length).forEach((clue, i) => {
      const without = withouts[i]!;
      const first = without.candidates[0];
      const topWithout = first ? names.ref(first.node) : null;
      const same = first !== undefined && first.node === shown[0]!.node;
      const verdictWithout = decideVerdict(
        {
          clues: clues.filter((_, j) => j !== i).map((c) => c.label),
          candidates: same ? verdictCandidates(without.candidates, i, true, without.chainMissOf) : verdictCandidates(without.candidates, -1, false, without.chainMissOf),
          equivalent: same ? intersect(patterns, i) : null,
          maxHops,
        },
        options.verdict,
      );
      const pref = preferredByClue(ranked.candidates, i);
      ablation.push({
        clue: { id: clue.id, label: clue.label },
        role: clueRole(topRef, verdict, topWithout, verdictWithout),
        topWithout,
        verdictWithout,
        pullsTowards: pref !== null && pref !== shown[0]!.node ? names.ref(pref) : null,
      });
    });
  }

  lap("ablation");
  // suggested clues
  let suggestions: SuggestedClue[] = [];
  if ((verdict.status === "tied" || verdict.status === "weak") && shown.length > 1 && (options.suggestions ?? true) && !deadline?.stop("suggestions")) {
    const s1 = shown[0]!.score;
    // the tied ids were read by the verdict through `names`, so the cached ids are enough
    // (reading every candidate's id would cost one catalog row each)
    const idToNode = new Map<string, number>();
    for (const c of ranked.candidates) {
      const id = names.cachedId(c.node);
      if (id !== undefined) idToNode.set(id, c.node);
    }
    const rivals =
      verdict.tiedWith.length > 0
        ? verdict.tiedWith.map((id) => idToNode.get(id)!).filter((x) => x !== undefined)
        : ranked.candidates.slice(1).filter((c, j) => j === 0 || c.score >= 0.5 * s1).map((c) => c.node);
    // the salience (a global PageRank, computed once per index) is asked for the budget after each iteration: cut, no suggestions
    const sal = deadline ? salienceOf(index, {}, () => deadline.stop("suggestions")) : salienceOf(index);
    if (sal) {
      const pct = sal.percentile;
      names.salience = (n) => pct[n] ?? 0;
      suggestions = suggestClues(index, names, analysis.question, shown[0]!.node, rivals, seedNodes, options.suggest);
    }
  }

  lap("suggestions");
  // why not
  const whyNot: WhyNot[] = [];
  for (const num of options.whyNot ?? []) {
    if (deadline?.stop("why-not")) break;
    whyNot.push(whyNotOf(num, analysis, ranked, clueSeeds, index, cost, names, pathSet.answers[0], options));
  }
  lap("whyNot");
  for (const w of whyNot) names.used.set(w.entity.id, w.entity.label);
  for (const c of clueRefs) names.used.set(c.id, c.label);
  for (const a of answers) names.used.set(a.id, a.label);
  return { answers, verdict, coverage, ablation, suggestions, whyNot, labels: Object.fromEntries([...names.used].sort((a, b) => (a[0] < b[0] ? -1 : 1))) };
}

/**
 * Adds the milliseconds since the previous lap to `into[name]` and the CPU milliseconds of the
 * process (process.cpuUsage, user + system) to `into[name + "Cpu"]` (nothing when `into` is absent).
 */
function lapTimer(into: Record<string, number> | undefined): (name: string) => void {
  if (into === undefined) return () => {};
  let last = performance.now();
  let lastCpu = process.cpuUsage();
  return (name) => {
    const now = performance.now();
    const cpu = process.cpuUsage();
    into[name] = (into[name] ?? 0) + (now - last);
    into[name + "Cpu"] = (into[name + "Cpu"] ?? 0) + (cpu.user - lastCpu.user + cpu.system - lastCpu.system) / 1000;
    last = now;
    lastCpu = cpu;
  };
}

function whyNotOf<A extends ExplainAnalysis>(
  num: number,
  analysis: A,
  ranked: ExplainRanked,
  clueSeeds: readonly (readonly ClueSeed[])[],
  index: RelationIndex,
  cost: PathCostModel,
  names: Names,
  bestPaths: AnswerPaths | undefined,
  options: ExplainOptions<A>,
): WhyNot {
  const longHops = options.whyNotOptions?.longHops ?? WHY_NOT_DEFAULTS.longHops;
  const maxHops = options.paths?.maxHops ?? PATH_DEFAULTS.maxHops;
  const clues = ranked.clues;
  const pos = ranked.candidates.findIndex((c) => c.node === num);
  let parts: readonly number[] | null = pos >= 0 ? ranked.candidates[pos]!.perClue : null;
  if (parts === null && options.rerank) {
    const open = options.rerank({ ...analysis, answerTypes: [] }, []);
    parts = open.candidates.find((c) => c.node === num)?.perClue ?? null;
  }
  const best = ranked.candidates[0];
  const mine = findPaths(index, cost, clueSeeds, [num], { ...options.paths, alternatives: 0 }).answers[0]!;
  const cells: readonly CoverageCell[] = coverageTable([], [mine], (x) => names.ref(x), (r) => names.relation(r), maxHops).rows[0]!.cells;
  const perClue: WhyNotClue[] = clues.map((c, i) => {
    const cell = cells[i]!;
    const bestHops = bestPaths?.byClue[i]?.[0]?.steps.length;
    const weak = !cell.reached || cell.hops! > longHops || (bestHops !== undefined && cell.hops! > bestHops);
    return { clue: { id: c.id, label: c.label }, score: parts ? (parts[i] ?? null) : null, bestScore: best ? (best.perClue[i] ?? null) : null, cell, weak };
  });
  const source = { candidates: ranked.candidates, answerTypes: analysis.answerTypes, typesOf: (n: number) => index.typesOf(n), isA: (n: number, t: ReadonlySet<number>) => index.isA(n, t), ref: (n: number) => names.ref(n) };
  const base: Omit<WhyNot, "reasons"> = {
    ...whyNotFigures(num, source, clueSeeds.some((ss) => ss.some((x) => x.node === num))),
    perClue,
  };
  return { ...base, reasons: whyNotReasons(base, maxHops, longHops) };
}

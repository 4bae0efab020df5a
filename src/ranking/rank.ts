/**
 * Answer ranking: one personalized PageRank per clue, combined over the clues, filtered by
 * the expected answer type.
 *
 * Method: for each clue c, a personalized PageRank (Haveliwala 2002, "Topic-sensitive
 * PageRank") restarting at the clue's entity — weighted by link confidence, with a share
 * spread over the mention's alternatives when the confidence is below `spreadBelow` — over
 * the walk of transition.ts with this question's relation-cue weights (uncued relations keep
 * weight 1). The query-time approximation is pprFast (forward push + random walks; see
 * ppr-fast.ts).
 *
 * Each clue's score at a candidate v is multiplied by deg(v)^γ (γ = half the walk's hub
 * exponent β by default), undoing part of the damping of the last step into v: hub damping
 * keeps the walk from flowing *through* hubs, but a hub that is itself the answer (a country
 * with many neighbours) should not lose to a small node for it; full compensation (γ = β)
 * lets 2-hop hubs overtake 1-hop answers.
 *
 * Per-clue scores are normalised by their maximum over the eligible candidates and combined
 * by combine.ts (weighted geometric mean with a floor + clue coverage, coverage first), then
 * multiplied by `cueMiss` per question word whose cued relation no path of at most 3 hops
 * from the clues to the candidate uses (cue-paths.ts). The walk's relation weights are a
 * soft preference; this makes the named relations count along the whole path, so a
 * multi-hop answer beats the intermediate entity. A relation walked only against the
 * direction the sentence gives it from the clue (the reading's `cueDirections`) counts as
 * half unused (`wrongWay`): word order is only a hint.
 *
 * Then each clue's relation-path pattern — read from the question's reading, analysis
 * query-graph.ts `QueryGraph.chains` (its relation words in hop order, each with a direction
 * and, when a type noun stands between two of them, the type of the node in between); the
 * ranking computes no reading of its own — is matched exactly — hop count, relations, directions — by
 * chain-reach.ts (a fixed-length regular path query, Mendelzon & Wood 1995): a candidate
 * off the pattern gets `chainMiss`, one on it only when directions or intermediate types
 * are ignored `chainLoose`, combined over the clues like their scores ({@link chainFitOf}).
 * A pattern that reaches no eligible candidate is ignored, so a wrong reading of the
 * question cannot empty the ranking. With `dropClues`, relation cues attributed only to
 * dropped clues are removed from the cue check and the patterns (ablation without their
 * words); the walks keep the full question's weights when the caller passes them
 * (`walkWeights`, as the pipeline's ablation does), so no new PageRank is needed.
 *
 * Clue entities are never answers of their own question; an alternative seeded with a
 * low-confidence clue may be, with its restart mass α·s(v) removed from its score.
 * Candidates are filtered by the expected types (their subtypes included, via
 * RelationIndex.isA); when the filter leaves nothing, the unfiltered ranking is returned
 * with a note. Ties are broken by entity num (the catalog's insertion order, deterministic)
 * after score.
 */
import type { Analysis, Clue, CueChain, QueryGraph } from "../analysis/index.js";
import { chainReach, type ChainHop, type ChainReachOptions, type NodeSet } from "./chain-reach.js";
import { combineClueScores, DEFAULTS as COMBINE_DEFAULTS, type CombineOptions } from "./combine.js";
import type { Seed, SparseScores } from "./ppr-options.js";
import { pprFast, type FastOptions } from "./ppr-fast.js";
import { cueReach, MAX_CUES, type CuePathOptions } from "./cue-paths.js";
import type { RelationIndex } from "./relation-index.js";
import type { AttributeLookup } from "./attribute-values.js";
import { selectAt } from "./node-select.js";
import { nodeBitsFor, stampedFor } from "./stamped.js";
import { DEFAULTS as TRANSITION_DEFAULTS } from "./transition.js";

/** Options of {@link rank}; all optional. */
export interface RankOptions extends CombineOptions {
  /**
   * Restart probability α of each clue's walk. @default 0.5 — questions are answered within
   * a few hops, so mass should at least halve per hop (the walk's mean length is 1/α − 1 = 1
   * step); PageRank's web-scale 0.15 spreads it over ~6 hops.
   */
  readonly alpha?: number;
  /** Push tolerance ε of the query-time PageRank (ppr-fast.ts). @default pprFast's default */
  readonly tolerance?: number;
  /** β of the hub damping (see transition.ts). @default the walk's default */
  readonly hubExponent?: number;
  /**
   * γ of the answer-end compensation: each clue's score at v is multiplied by deg(v)^γ,
   * undoing the hub damping of the walk's last step into v (damping is meant for passing
   * through a hub, not for ending at one). @default half the walk's β
   */
  readonly endCompensation?: number;
  /** Below this link confidence a clue's restart mass is shared with its alternatives. @default 0.6 */
  readonly spreadBelow?: number;
  /** At most this many alternatives share a low-confidence clue's restart mass. @default 3 */
  readonly maxAlternatives?: number;
  /** Candidates returned. @default 200 */
  readonly limit?: number;
  /**
   * Factor per question word whose cued relation no short path from the clues to the
   * candidate uses (cue-paths.ts); 1 disables the check. @default 0.1
   */
  readonly cueMiss?: number;
  /**
   * Share of a cue word counted as unused when its relation is walked only against the
   * direction the question implies ("which paper cites X" reached through "X cites it").
   * @default 0.5
   */
  readonly wrongWay?: number;
  /** Options of the cue-path search. */
  readonly cuePaths?: CuePathOptions;
  /** A node enters the candidate pool when some clue scores it above prune × floor × that clue's best score. @default 0.01 */
  readonly prune?: number;
  /** Clue indexes (into `analysis.clues`) to leave out (ablation). @default none */
  readonly dropClues?: readonly number[];
  /**
   * Relation weights of the walks, instead of those of the analysis's cues. The ablation
   * passes the full question's (`Ranked.relationWeights`), so that re-ranking without a clue
   * reuses the other clues' walks (through `pprMemo`) while the dropped clue's words still
   * leave the cue check and the patterns. @default relationWeightsOf(analysis)
   */
  readonly walkWeights?: Float64Array;
  /**
   * Per-clue PageRank vectors already computed for this same question and options, keyed by
   * the clue's seeds and the walk's relation weights; filled and reused, so re-ranking without a clue (ablation) runs no new
   * PageRank. Valid for one analysis and one set of options only. @default none
   */
  readonly pprMemo?: Map<string, SparseScores>;
  /**
   * The clues' pattern end sets (chain-reach.ts) already computed for this same question,
   * keyed by clue entity, pattern and variant; filled and reused, so the re-rankings without a
   * clue (ablation) do not search the other clues' patterns again. Valid for one question's
   * reading and options only. @default none
   */
  readonly reachMemo?: ReachMemo;
  /**
   * Factor of a candidate that the clue's relation-path pattern (analysis cue-chains.ts)
   * does not reach, when some candidate is reached by it; combined over the clues as a
   * weighted geometric mean. 1 disables the check. @default 0.05 — about the ratio of a one-hop to a two-hop neighbour's normalised walk score, so a candidate off the pattern falls behind one on it unless it is far closer
   */
  readonly chainMiss?: number;
  /** Factor of a candidate the pattern reaches only with some hop walked the other way. @default 0.6 */
  readonly chainLoose?: number;
  /**
   * A clue with no relation word constrains the answers to its neighbours only when it has at
   * most this many edges (a hub's neighbours say little, and reading them all costs). @default 20000
   */
  readonly anyMaxDegree?: number;
  /** Longest pattern checked, in hops (longer chains are left to the cue check). @default 3 */
  readonly chainMaxSteps?: number;
  /**
   * The question's reading (analysis query-graph.ts): its per-clue relation-path patterns
   * (`chains`) and the direction the sentence gives each relation cue from each clue
   * (`cueDirections`). The ranking reads them and computes neither. @default none: no pattern
   * check, and the cue check counts either direction of a cued relation as expected
   */
  readonly reading?: RankReading;
  /** Attribute values, for the conditions on an inner node of the reading (node-select.ts). @default none: such conditions are not applied */
  readonly attributes?: AttributeLookup;
  /** Options of the pattern search (chain-reach.ts). */
  readonly chainReach?: ChainReachOptions;
  /** The question's time budget: once spent, the cue-path check (an ordering refinement) is left out and "ranking" is recorded as cut. @default none */
  readonly deadline?: { stop(stage: "ranking"): boolean };
}

/** Pattern end sets of one question by clue, pattern and variant ({@link RankOptions}.reachMemo). */
export type ReachMemo = Map<string, NodeSet | null>;

/** The parts of the question's reading (analysis `QueryGraph`) that the ranking evaluates. */
export type RankReading = Pick<QueryGraph, "chains" | "cueDirections">;

/** Defaults of {@link RankOptions}. */
export const DEFAULTS = {
  alpha: 0.5,
  cueMiss: 0.1,
  wrongWay: 0.5,
  chainMiss: 0.05,
  chainLoose: 0.6,
  chainMaxSteps: 3,
  anyMaxDegree: 20000,
  prune: 0.01,
  spreadBelow: 0.6,
  maxAlternatives: 3,
  limit: 200,
} as const;

/** One ranked candidate answer. */
export interface RankedCandidate {
  /** Entity num. */
  readonly node: number;
  /** Combined score (weighted geometric mean of normalised clue scores), comparable within one question. */
  readonly score: number;
  /** Normalised score per clue (same order as `Ranked.clues`), 0..1. */
  readonly perClue: readonly number[];
  /** Clues with a non-negligible score (≥ the cover threshold). */
  readonly covered: number;
  /** Cue words (weighted by match score) that no short path from the clues uses; absent when not checked. */
  readonly cueMissing?: number;
  /** Factor from the clues' relation-path patterns (1: every checked pattern reaches it); absent when not checked. */
  readonly chainFit?: number;
}

/** The ranking of one question. */
export interface Ranked {
  /** The clues used (after `dropClues`). */
  readonly clues: readonly Clue[];
  /** Best first: coverage, then score, then node. Seeds excluded. */
  readonly candidates: readonly RankedCandidate[];
  /** True when the expected-type filter was applied (false: no types, or fallback). */
  readonly typeFiltered: boolean;
  /** Relation weights used for the walk (index = relation num). */
  readonly relationWeights: Float64Array;
  /** Notes for the user (type filter fallback, unreachable clues). */
  readonly notes: readonly string[];
  /**
   * The clues (indexes into `clues`) whose relation-path pattern was checked and reaches
   * `node` neither exactly nor loosely; absent when no pattern was checked.
   */
  readonly chainMissOf?: (node: number) => readonly number[];
  /**
   * How many candidates satisfy the whole reading (every checked clue pattern reaches them
   * exactly); they come first. Absent when no pattern was checked.
   */
  readonly matched?: number;
  /** True when some clue's pattern reaches no candidate, so no entity satisfies the whole reading: the order is the PageRank's. */
  readonly fallback?: boolean;
  /** Clues the reading does not constrain by a relation word (their neighbours may order the answers, never decide the verdict); absent when no pattern was checked. */
  readonly open?: number;
  /**
   * Per clue (same order as `clues`): the reading's relation-path pattern as it was matched
   * (with or without its intermediate types and directions), a one-hop pattern of any
   * relation for a clue constrained to its neighbours; undefined for a clue whose pattern was
   * not checked or reaches no candidate. Absent when no pattern was checked.
   */
  readonly patterns?: readonly (RankedPattern | undefined)[];
  /**
   * Every entity that satisfies the whole reading (each checked pattern reaches it exactly,
   * each neighbour constraint holds, of the expected type when the type filter applied), not
   * only those among `candidates`: ascending node numbers, computed on the first call. Absent
   * when no pattern was checked; empty when `fallback`.
   */
  readonly matchedNodes?: () => readonly number[];
}

/** A clue's relation-path pattern as the ranking matched it (explain's first path walks it). */
export interface RankedPattern {
  /** Per hop: the allowed relations, each with its direction; empty: any relation. */
  readonly hops: readonly ChainHop[];
  /** Per hop: the types the node it reaches must have (empty: any); the last hop reaches the answer. */
  readonly types: readonly (readonly number[])[];
  /** False when the hops' directions were not required. */
  readonly directed: boolean;
}

/** A node set as the whole-reading intersection reads it (a pattern's end set or a clue's neighbours). */
type NodeTest = { readonly size: number; has(v: number): boolean; [Symbol.iterator](): Iterator<number> };

/** The pattern of a clue constrained to its neighbours: one hop of any relation. */
const ANY_HOP: RankedPattern = { hops: [[]], types: [[]], directed: false };

/** The per-question relation weights: 1 everywhere, the cue weight on cued relations. */
export function relationWeightsOf(analysis: Analysis, index: RelationIndex): Float64Array {
  const rho = new Float64Array(Math.max(index.relationCount, 1)).fill(1);
  for (const cue of analysis.relationCues) if (cue.relation >= 0 && cue.relation < rho.length) rho[cue.relation] = Math.max(rho[cue.relation]!, cue.weight);
  return rho;
}

/** The restart seeds of one clue (the clue entity and, when unsure, its alternatives). */
export function clueSeeds(analysis: Analysis, clue: Clue, index: RelationIndex, options: RankOptions = {}): Seed[] {
  const spreadBelow = options.spreadBelow ?? DEFAULTS.spreadBelow;
  const maxAlt = options.maxAlternatives ?? DEFAULTS.maxAlternatives;
  const inIndex = (n: number) => n >= 0 && n < index.nodeCount;
  // the link confidence decides the spread (the clue weight may also carry other factors)
  const mention = analysis.mentions[clue.mention];
  const confidence = mention?.confidence ?? clue.weight;
  const seeds: Seed[] = inIndex(clue.node) ? [{ node: clue.node, weight: Math.max(confidence, 1e-3) }] : [];
  if (mention && confidence < spreadBelow) {
    for (const alt of mention.alternatives.slice(0, maxAlt)) {
      if (alt.num !== clue.node && inIndex(alt.num) && alt.confidence > 0) seeds.push({ node: alt.num, weight: alt.confidence });
    }
  }
  return seeds;
}

/** Ranks the candidate answers of an analysed question. */
export function rank(analysis: Analysis, index: RelationIndex, options: RankOptions = {}): Ranked {
  const drop = new Set(options.dropClues ?? []);
  const chainsAll = options.reading?.chains ?? [];
  // the cues kept (indexes into the question's own analysis.relationCues) and the clues kept
  const keptCues = drop.size > 0 ? cuesWithoutDropped(analysis, chainsAll, drop) : analysis.relationCues.map((_, i) => i);
  if (keptCues.length < analysis.relationCues.length) analysis = { ...analysis, relationCues: keptCues.map((i) => analysis.relationCues[i]!) };
  const keptClues = analysis.clues.map((_, i) => i).filter((i) => !drop.has(i));
  const clues = keptClues.map((i) => analysis.clues[i]!);
  const chains = chainsAll.filter((_, i) => !drop.has(i));
  // per kept clue, per kept cue: the direction the sentence gives it (the reading's), when read
  const directions = options.reading ? keptClues.map((c) => keptCues.map((i) => options.reading!.cueDirections[c]?.[i])) : undefined;
  const rho = options.walkWeights ?? relationWeightsOf(analysis, index);
  const notes: string[] = [];
  if (clues.length === 0) return { clues, candidates: [], typeFiltered: false, relationWeights: rho, notes };

  const alpha = options.alpha ?? DEFAULTS.alpha;
  // the clue entities themselves are never answers (alternatives seeded with them may be)
  const seedNodes = new Set<number>(clues.map((c) => c.node));
  const perClue: SparseScores[] = [];
  // the memo key holds the relation weights too (dropping a clue may drop its cues)
  let rhoText: string | undefined;
  const rhoKey = (): string => (rhoText ??= Array.from(rho, (w, i) => (w !== 1 ? `${i}=${w}` : "")).filter((x) => x !== "").join(";"));
  const restart: Map<number, number>[] = [];
  const usable: boolean[] = [];
  for (const clue of clues) {
    const seeds = clueSeeds(analysis, clue, index, options);
    const total = seeds.reduce((a, s) => a + s.weight, 0);
    restart.push(new Map(seeds.map((s) => [s.node, (alpha * s.weight) / total])));
    if (seeds.length === 0 || seeds.every((s) => index.degree(s.node) === 0)) {
      notes.push(`clue "${clue.label}" has no relations in the catalog: it cannot support any answer`);
    }
    usable.push(seeds.length > 0);
    const memoKey = options.pprMemo ? `${rhoKey()}|${seeds.map((x) => `${x.node}:${x.weight}`).join(",")}` : "";
    const memo = options.pprMemo?.get(memoKey);
    const scores = memo ?? (seeds.length > 0 ? clueScores(index, seeds, { alpha, tolerance: options.tolerance, relationWeights: rho, hubExponent: options.hubExponent }) : { nodes: new Int32Array(0), scores: new Float64Array(0) });
    if (options.pprMemo && !memo) options.pprMemo.set(memoKey, scores);
    perClue.push(scores);
  }

  // candidate pool: every node any clue reaches, minus the clue entities; a seeded
  // alternative keeps only the mass that walked to it (π(v) − α·s(v) ≥ 0), not its restart
  // Nodes far below every clue's best score would only tie at the combination floor: they
  // are left out (below prune × floor × the clue's largest score), which bounds the work
  // when a walk touches many nodes.
  const floor = options.floor ?? COMBINE_DEFAULTS.floor;
  const prune = options.prune ?? DEFAULTS.prune;
  // the pool lives in flat arrays (a node's slot, then one row of clue scores per slot), not
  // in a map of per-node arrays: a walk reaches thousands of nodes per clue
  const slots = stampedFor(index, "rank/pool", index.nodeCount);
  // pool membership as bits (in cache) before the slot lookup (a random access)
  const inPool = nodeBitsFor(index, "rank/in-pool", index.nodeCount);
  const C = clues.length;
  const seedList = [...seedNodes];
  const isSeed = (v: number): boolean => {
    for (let k = 0; k < seedList.length; k++) if (seedList[k] === v) return true;
    return false;
  };
  const poolNodes: number[] = [];
  let rows = new Float64Array(256 * C);
  /** Gives node v the next pool slot (rows grow by doubling); returns the slot. */
  const addToPool = (v: number): number => {
    const slot = poolNodes.length;
    slots.set(v, slot);
    inPool.add(v);
    poolNodes.push(v);
    if ((slot + 1) * C > rows.length) {
      const grown = new Float64Array(rows.length * 2);
      grown.set(rows);
      rows = grown;
    }
    return slot;
  };
  perClue.forEach((sp, c) => {
    let top = 0;
    for (let i = 0; i < sp.scores.length; i++) if (sp.scores[i]! > top && !isSeed(sp.nodes[i]!)) top = sp.scores[i]!;
    const cut = top * floor * prune;
    const rn = [...restart[c]!.keys()];
    const rw = rn.map((x) => restart[c]!.get(x)!);
    for (let i = 0; i < sp.nodes.length; i++) {
      const v = sp.nodes[i]!;
      let s = sp.scores[i]!;
      for (let k = 0; k < rn.length; k++) if (rn[k] === v) s -= rw[k]!;
      if (!(s > cut) || isSeed(v)) continue;
      const slot = inPool.has(v) ? slots.get(v) : addToPool(v);
      rows[slot * C + c] = s;
    }
  });
  const rowOf = (slot: number): Float64Array => rows.subarray(slot * C, slot * C + C);

  const gamma = options.endCompensation ?? (options.hubExponent ?? TRANSITION_DEFAULTS.hubExponent) / 2;
  if (gamma !== 0) {
    for (let slot = 0; slot < poolNodes.length; slot++) {
      const f = Math.pow(Math.max(index.degree(poolNodes[slot]!), 1), gamma);
      for (let c = 0; c < C; c++) rows[slot * C + c]! *= f;
    }
  }

  // the ends of a clue's pattern that the walk left out of the pool join it, with no walk
  // score (the pattern puts them first): those of a pattern with conditions on an inner node
  // (the largest package is a hub, whose neighbours the walk's hub penalty starves), and those
  // of a pattern none of whose ends the pool holds (a three-hop chain through hubs) — the
  // conjunctive query's answers are its matches, whatever the walk reached (Mendelzon & Wood 1995)
  const selected = new Map<number, NodeSet | null>();
  const reachCache = options.reachMemo ?? new Map<string, NodeSet | null>();
  if (chains.some((ch) => ch.steps.length > 1)) {
    const ends = new Map<number, { set: NodeSet | null; selected: boolean }>();
    chainFitOf(chains, clues, clues.map(() => 1), index, new Set(), { ...options, reachMemo: reachCache }, selected, ends);
    for (const { set, selected: sel } of ends.values()) {
      if (set === null || set.size === 0 || set.size > MAX_ADDED_ENDS) continue;
      if (!sel && set.some((v) => inPool.has(v))) continue;
      for (const v of set) if (!inPool.has(v) && !isSeed(v)) addToPool(v);
    }
  }

  const typeSet = new Set(analysis.answerTypes.map((t) => t.num));
  const isAnswerType = index.isATest(typeSet);
  // eligible candidates as pool slots, in pool order
  let eligible: number[] = poolNodes.map((_, slot) => slot);
  let typeFiltered = false;
  if (typeSet.size > 0) {
    const typed = eligible.filter((slot) => isAnswerType(poolNodes[slot]!));
    if (typed.length > 0) {
      eligible = typed;
      typeFiltered = true;
    } else {
      notes.push(`no reachable entity is a ${analysis.answerTypes.map((t) => t.label).join(" or ")}: answers of any type shown`);
    }
  }

  // normalise each clue by its best eligible candidate
  const max = new Float64Array(C);
  for (const slot of eligible) {
    for (let c = 0; c < C; c++) if (rows[slot * C + c]! > max[c]!) max[c] = rows[slot * C + c]!;
  }
  clues.forEach((clue, c) => {
    if (usable[c] && !(max[c]! > 0) && eligible.length > 0) notes.push(`clue "${clue.label}" reaches no candidate answer`);
  });
  const weights = clues.map((c) => Math.max(c.weight, 1e-3));
  const cueMiss = options.cueMiss ?? DEFAULTS.cueMiss;
  // the cue-path search may enter the pool and the seeds (as bits: it tests every entry it scans)
  let cueFit: ((v: number) => number) | undefined;
  // the time budget: once spent, the cue-path search (an ordering refinement) is left out
  if (cueMiss < 1 && !options.deadline?.stop("ranking")) {
    const within = nodeBitsFor(index, "rank/within", index.nodeCount);
    for (const v of poolNodes) within.add(v);
    for (const v of seedList) if (v >= 0 && v < index.nodeCount) within.add(v);
    cueFit = cueFitOf(analysis, clues, directions, index, options, (v) => within.has(v));
  }
  const chainCheck = chainFitOf(chains, clues, weights, index, new Set(eligible.map((slot) => poolNodes[slot]!)), { ...options, reachMemo: reachCache }, selected);
  const chainFit = chainCheck?.fit;
  // every eligible candidate's figures in flat arrays (a hub's clue makes tens of thousands
  // eligible); objects are made only for the `limit` returned, picked by a bounded heap
  const n = eligible.length;
  const nodeAt = new Int32Array(n);
  const scoreAt = new Float64Array(n);
  const coveredAt = new Int32Array(n);
  const missingAt = new Float64Array(n);
  const fitAt = new Float64Array(n);
  const normOf = (slot: number): number[] => Array.from(rowOf(slot), (s, c) => (max[c]! > 0 ? s / max[c]! : 0));
  const norm = new Float64Array(C);
  for (let i = 0; i < n; i++) {
    const slot = eligible[i]!;
    const v = poolNodes[slot]!;
    for (let c = 0; c < C; c++) norm[c] = max[c]! > 0 ? rows[slot * C + c]! / max[c]! : 0;
    const { score, covered } = combineClueScores(norm, weights, options);
    const missing = cueFit ? cueFit(v) : 0;
    const fit = chainFit ? chainFit(v) : 1;
    nodeAt[i] = v;
    scoreAt[i] = score * Math.pow(cueMiss, missing) * fit;
    coveredAt[i] = covered;
    missingAt[i] = missing;
    fitAt[i] = fit;
  }
  const candidateAt = (i: number): RankedCandidate => {
    const v = nodeAt[i]!;
    const perClue = normOf(eligible[i]!);
    const [score, covered, missing, fit] = [scoreAt[i]!, coveredAt[i]!, missingAt[i]!, fitAt[i]!];
    // (no object spread: one literal per shape, same keys in the same order)
    if (cueFit && chainFit) return { node: v, score, perClue, covered, cueMissing: missing, chainFit: fit };
    if (cueFit) return { node: v, score, perClue, covered, cueMissing: missing };
    if (chainFit) return { node: v, score, perClue, covered, chainFit: fit };
    return { node: v, score, perClue, covered };
  };
  const limit = options.limit ?? DEFAULTS.limit;
  // best first: (the whole reading satisfied, when some candidate does), coverage, score, node
  const firstOf = (fitsFirst: Uint8Array | undefined) =>
    topOf(n, limit, (i, j) => {
      if (fitsFirst && fitsFirst[i] !== fitsFirst[j]) return fitsFirst[i]! > fitsFirst[j]!;
      if (coveredAt[i] !== coveredAt[j]) return coveredAt[i]! > coveredAt[j]!;
      if (scoreAt[i] !== scoreAt[j]) return scoreAt[i]! > scoreAt[j]!;
      return nodeAt[i]! < nodeAt[j]!;
    }).map(candidateAt);
  // a clue with no relation word ("~" in the reading: "*Nordic* towns", "in *Africa*") is a
  // one-hop constraint of any relation, kept only when some eligible candidate is its
  // neighbour (else it says nothing about this catalog) and the clue has at most `anyMaxDegree` edges
  const eligibleSet = new Set(eligible.map((slot) => poolNodes[slot]!));
  const adjacency: Set<number>[] = [];
  // per clue: the pattern the structure was matched with (explain walks it for the first path)
  const patterns: (RankedPattern | undefined)[] = clues.map((_, c) => chainCheck?.patterns[c]);
  let open = 0;
  chains.forEach((ch, c) => {
    const node = clues[c]!.node;
    if (ch.steps.length > 0) return;
    if (!(node >= 0 && node < index.nodeCount) || index.degree(node) > (options.anyMaxDegree ?? DEFAULTS.anyMaxDegree)) {
      open++;
      return;
    }
    const adj = new Set<number>();
    index.forEach(node, (v) => adj.add(v));
    if ([...adj].some((v) => eligibleSet.has(v))) {
      adjacency.push(adj);
      patterns[c] = ANY_HOP;
    }
    // a neighbour constraint orders the answers but does not decide the verdict: the
    // question may mean a longer path its words did not name ("the town of the lab of X")
    open++;
  });
  // the reading's structure first: the candidates every checked pattern reaches exactly
  // (a conjunctive path query over the clues' patterns), each group in score order
  if (!chainCheck && adjacency.length === 0) return { clues, candidates: firstOf(undefined), typeFiltered, relationWeights: rho, notes };
  const fits = (i: number) => (!chainCheck || (chainFit !== undefined && fitAt[i] === 1 && chainCheck.misses(nodeAt[i]!).length === 0)) && adjacency.every((a) => a.has(nodeAt[i]!));
  const fitFlags = new Uint8Array(n);
  let matchedCount = 0;
  if ((chainCheck?.ignored ?? 0) === 0) for (let i = 0; i < n; i++) if (fits(i)) matchedCount += fitFlags[i] = 1;
  const matched = { length: matchedCount };
  const ordered = firstOf(matched.length > 0 ? fitFlags : undefined);
  if (matched.length === 0) notes.push("no entity satisfies the whole reading of the question: the answers are ranked by PageRank alone and fit only part of it");
  // the whole matched set, beyond the walk's pool: the intersection of the patterns' exact
  // end sets and the neighbour sets, smallest first, then the pool's other tests
  let whole: number[] | undefined;
  const matchedNodes = (): readonly number[] => {
    if (whole) return whole;
    if (matched.length === 0) return (whole = []);
    const sets: NodeTest[] = [...(chainCheck?.exact ?? []), ...adjacency].sort((a, b) => a.size - b.size);
    whole = [];
    for (const v of sets[0] ?? []) {
      if (isSeed(v) || (typeFiltered && !isAnswerType(v))) continue;
      let all = true;
      for (let k = 1; k < sets.length && all; k++) all = sets[k]!.has(v);
      if (all) whole.push(v);
    }
    whole.sort((a, b) => a - b);
    return whole;
  };
  return {
    clues,
    candidates: ordered,
    typeFiltered,
    relationWeights: rho,
    notes,
    ...(chainCheck ? { chainMissOf: chainCheck.misses } : {}),
    matched: matched.length,
    fallback: matched.length === 0,
    open,
    patterns,
    matchedNodes,
  };
}

/** One clue's query-time personalized PageRank (push + random walks, ppr-fast.ts). */
function clueScores(index: RelationIndex, seeds: readonly Seed[], options: { alpha: number; tolerance?: number; relationWeights: Float64Array; hubExponent?: number }): SparseScores {
  const opts: FastOptions = { alpha: options.alpha, relationWeights: options.relationWeights };
  return pprFast(index, seeds, {
    ...opts,
    ...(options.tolerance !== undefined ? { tolerance: options.tolerance } : {}),
    ...(options.hubExponent !== undefined ? { hubExponent: options.hubExponent } : {}),
  });
}

/**
 * The cue check of one question: a function giving, for a candidate, the summed match
 * score of the cue words that no short path from the clues uses — or undefined when there
 * is nothing to check (no cue, or every clue's search ran out of budget).
 */
function cueFitOf(
  analysis: Analysis,
  clues: readonly Clue[],
  directions: readonly (readonly (boolean | undefined)[])[] | undefined,
  index: RelationIndex,
  options: RankOptions,
  within: (v: number) => boolean,
): ((v: number) => number) | undefined {
  const cueIdx = analysis.relationCues.map((_, i) => i).filter((i) => analysis.relationCues[i]!.relation >= 0 && analysis.relationCues[i]!.relation < index.relationCount).slice(0, MAX_CUES);
  const cues = cueIdx.map((i) => analysis.relationCues[i]!);
  if (cues.length === 0) return undefined;
  // per question word: its best cue score and the cues it matched
  const wordScore = new Map<string, number>();
  const wordCues = new Map<string, number[]>();
  cues.forEach((c, i) => {
    for (const w of c.words) {
      wordScore.set(w, Math.max(wordScore.get(w) ?? 0, c.score));
      wordCues.set(w, [...(wordCues.get(w) ?? []), i]);
    }
  });
  const rels = cues.map((x) => x.relation);
  const reaches = clues
    .map((c, k) => {
      const dirs = directions?.[k];
      const expectInverse = dirs ? cueIdx.map((i) => dirs[i]) : undefined;
      return cueReach(index, c.node, rels, { within, ...(expectInverse ? { expectInverse } : {}), ...options.cuePaths });
    })
    .filter((r) => r !== null);
  if (reaches.length === 0) return undefined;
  const words = [...wordScore.keys()].sort();
  const wrongWay = options.wrongWay ?? DEFAULTS.wrongWay;
  // unused cue weight of a mask: a word is satisfied by one of its cues walked the expected
  // way, partly (wrongWay) by one walked the other way
  // a pure function of the mask (at most 2^16 of them), asked for every candidate: memoised
  const missingMemo = new Map<number, number>();
  const missingOf = (mask: number): number => {
    let m = missingMemo.get(mask);
    if (m === undefined) {
      m = words.reduce((sum, w) => {
        let miss = 1;
        for (const i of wordCues.get(w)!) {
          if (mask & (1 << (2 * i))) miss = 0;
          else if (mask & (1 << (2 * i + 1))) miss = Math.min(miss, wrongWay);
        }
        return sum + miss * wordScore.get(w)!;
      }, 0);
      missingMemo.set(mask, m);
    }
    return m;
  };
  // the exhaustive search over one mask per clue (one closure for every candidate): per
  // clue the range of its masks in `reaches[c].masks` (a node not reached: the one mask 0)
  const C = reaches.length;
  const from = new Int32Array(C);
  const to = new Int32Array(C);
  const lists: Int32Array[] = reaches.map((r) => r.masks);
  const NONE = Int32Array.of(0);
  let best = Infinity;
  const walk = (i: number, union: number): void => {
    if (i === C) {
      best = Math.min(best, missingOf(union));
      return;
    }
    const l = lists[i]!;
    for (let k = from[i]!; k < to[i]!; k++) walk(i + 1, union | l[k]!);
  };
  return (v) => {
    let combos = 1;
    for (let c = 0; c < C; c++) {
      const r = reaches[c]!;
      const e = r.find(v);
      if (e < 0) {
        lists[c] = NONE;
        from[c] = 0;
        to[c] = 1;
      } else {
        lists[c] = r.masks;
        from[c] = r.start(e);
        to[c] = r.end(e);
      }
      combos *= to[c]! - from[c]!;
    }
    // one mask per clue, the union leaving the least cue weight unused: exhaustive while
    // the combinations are few, greedy (clue by clue) beyond
    if (combos <= 512) {
      best = Infinity;
      walk(0, 0);
      return best;
    }
    let union = 0;
    for (let c = 0; c < C; c++) {
      const l = lists[c]!;
      let pick = l[from[c]!]!;
      for (let k = from[c]!; k < to[c]!; k++) if (missingOf(union | l[k]!) < missingOf(union | pick)) pick = l[k]!;
      union |= pick;
    }
    return missingOf(union);
  };
}

/**
 * The relation cues kept when clues are dropped (indexes into `analysis.relationCues`): all but
 * those whose every place in the question belongs to a dropped clue (the reading's chain
 * attribution): with "X" dropped from "which person wrote R and leads X?", "leads" no longer
 * steers the walk, the cue check or the patterns.
 */
function cuesWithoutDropped(analysis: Analysis, chains: readonly CueChain[], drop: ReadonlySet<number>): number[] {
  const keep = new Set<number>();
  const attributed = new Set<number>();
  chains.forEach((ch, c) => {
    for (const st of ch.steps) {
      for (const o of st.options) {
        attributed.add(o.cue);
        if (!drop.has(c)) keep.add(o.cue);
      }
    }
  });
  return analysis.relationCues.map((_, i) => i).filter((i) => keep.has(i) || !attributed.has(i));
}

/** Most ends of a pattern added to the candidate pool (more: the pattern says little). */
const MAX_ADDED_ENDS = 1000;

/** Share of a relation's edges a type needs at an end to count for {@link symmetricEnds}. */
const END_SHARE = 0.02;
const symmetricMemo = new WeakMap<RelationIndex, Map<number, boolean>>();

/** True when the catalog finds the same types at both ends of `rel` (each on ≥ 2 % of its edges): a relation read either way ("borders", "collaborates with"). */
function symmetricEnds(index: RelationIndex, rel: number): boolean {
  let memo = symmetricMemo.get(index);
  if (!memo) symmetricMemo.set(index, (memo = new Map()));
  const known = memo.get(rel);
  if (known !== undefined) return known;
  const ends = index.relationEnds();
  const total = Math.max(ends.edges(rel), 1);
  const at = (object: boolean) => new Set(ends.types(rel, object).filter((e) => e.count / total >= END_SHARE).map((e) => e.type));
  const [s, o] = [at(false), at(true)];
  const same = s.size > 0 && s.size === o.size && [...s].every((t) => o.has(t));
  memo.set(rel, same);
  return same;
}

/**
 * The pattern check of one question: a function giving a candidate's factor from the
 * clues' relation-path patterns, or undefined when no pattern applies. Per clue with 1 to
 * `chainMaxSteps` steps: the candidates at the end of the directed pattern get 1, those at
 * the end of the undirected one `chainLoose`, the rest `chainMiss` — only when some
 * eligible candidate is at the end of the directed pattern (else the undirected one takes
 * its place; when neither reaches a candidate the pattern is wrong for this catalog and is
 * ignored). When a type noun names an intermediate node, the typed directed pattern comes
 * first and the untyped directed one counts as loose. The clues' factors are combined like their scores (weighted geometric mean).
 */
function chainFitOf(
  chains: readonly CueChain[],
  clues: readonly Clue[],
  weights: readonly number[],
  index: RelationIndex,
  eligible: ReadonlySet<number>,
  options: RankOptions,
  selected?: Map<number, NodeSet | null>,
  ends?: Map<number, { set: NodeSet | null; selected: boolean }>,
): { fit: (v: number) => number; misses: (v: number) => number[]; ignored: number; patterns: readonly (RankedPattern | undefined)[]; exact: readonly NodeSet[] } | undefined {
  const miss = options.chainMiss ?? DEFAULTS.chainMiss;
  const loose = options.chainLoose ?? DEFAULTS.chainLoose;
  const maxSteps = options.chainMaxSteps ?? DEFAULTS.chainMaxSteps;
  if (miss >= 1) return undefined;
  const hits = (set: NodeSet | null) => set !== null && set.some((v) => eligible.has(v));
  const checks: { exact: NodeSet; loose: NodeSet | null; weight: number; group: number; clue: number }[] = [];
  const patterns: (RankedPattern | undefined)[] = [];
  // coordinated clues ("both A and B") share one pattern that must hold from each: one group
  // (named by its first clue present here), whose factor is its members' minimum
  const present = new Set(chains.map((ch) => ch.clue));
  const groupOf = (ch: CueChain, c: number): number => {
    const members = (ch.conjuncts ?? []).filter((x) => present.has(x));
    if (members.length < 2) return -1 - c;
    return chains.findIndex((x) => x.clue === members[0]);
  };
  const empty: { group: number; clue: number }[] = [];
  let ignored = 0;
  chains.forEach((ch, c) => {
    const group = groupOf(ch, c);
    const clue = clues[c]!;
    if (ch.steps.length === 0 || ch.steps.length > maxSteps || !(clue.node >= 0 && clue.node < index.nodeCount)) return;
    const hops = ch.steps.map((st) => st.options);
    // intermediate types (a type noun between two relation words); the last hop's node is the answer
    const typeSets = ch.steps.map((st, h) => (h < ch.steps.length - 1 && st.types.length > 0 ? new Set(st.types) : undefined));
    // a count on a hop ("whose only neighbour is C": ChainStep.only): the node it reaches has exactly that many edges of the hop's relations back towards the clue
    const counts = ch.steps.map((st) => st.only);
    // conditions on an inner node ("the *largest* country in R"): the frontier there is selected (node-select.ts)
    const conds = ch.steps.map((st, h) => (h < ch.steps.length - 1 && st.conditions && st.conditions.length > 0 && options.attributes ? st.conditions : undefined));
    const typed = typeSets.some((t) => t !== undefined) || counts.some((n) => n !== undefined) || conds.some((x) => x !== undefined);
    // the partners counted are v's neighbours over the hop's relations back towards the clue;
    // a relation with the same types at both ends ("borders") counts them either way, once each
    const countOk = (h: number, v: number): boolean => {
      const n = counts[h];
      if (n === undefined) return true;
      const partners = new Set<number>();
      index.forEach(v, (w, rel, inverse) => {
        if (hops[h]!.some((o) => o.relation === rel && (o.inverse !== inverse || symmetricEnds(index, rel)))) partners.add(w);
      });
      return partners.size === n;
    };
    const keep = (h: number, v: number) => (typeSets[h] === undefined || index.isA(v, typeSets[h]!)) && countOk(h, v);
    const base = { ...options.chainReach };
    // the end sets are the same in every ranking of this question (its re-rankings without a
    // clue included): searched once per clue, pattern and variant; a selection on an inner
    // node (conditions) is searched each time
    const memo = options.reachMemo;
    const hopsKey = `${clue.node}|${JSON.stringify(hops)}|${base.maxVisits ?? ""}`;
    const reach = (variant: string, run: () => NodeSet | null): NodeSet | null => {
      if (!memo) return run();
      const key = `${variant}|${hopsKey}`;
      if (memo.has(key)) return memo.get(key)!;
      const r = run();
      memo.set(key, r);
      return r;
    };
    const select = conds.some((x) => x !== undefined) ? (h: number, frontier: Set<number>) => (conds[h] ? selectAt(frontier, conds[h]!, options.attributes!, index, new Set(ch.steps[h]!.types)) : frontier) : undefined;
    // coordinated clues ("the largest country that borders both A and B") share the inner
    // nodes: a condition there is evaluated on the set where their first hops meet, not per clue
    const meet = select && group >= 0 ? (ch.conjuncts ?? []).filter((x) => x !== ch.clue && present.has(x)).map((x) => clues[chains.findIndex((y) => y.clue === x)]!.node).filter((n) => n >= 0 && n < index.nodeCount) : [];
    const typedRun = () => chainReach(index, clue.node, hops, { ...base, directed: true, keep, ...(select ? { select } : {}), ...(meet.length > 0 ? { meet } : {}) });
    const selectedRun = () => {
      if (!selected) return typedRun();
      if (!selected.has(c)) selected.set(c, typedRun());
      return selected.get(c)!;
    };
    const typedExact = !typed ? null : select ? selectedRun() : reach(`typed ${JSON.stringify(ch.steps.map((st) => [st.types, st.only ?? null]))}`, typedRun);
    const exact = reach("directed", () => chainReach(index, clue.node, hops, { ...base, directed: true }));
    const undirected = reach("undirected", () => chainReach(index, clue.node, hops, { ...base, directed: false }));
    ends?.set(c, { set: typedExact ?? exact, selected: select !== undefined });
    const pattern = (withTypes: boolean, directed: boolean): RankedPattern => ({ hops, types: ch.steps.map((st, h) => (withTypes && typeSets[h] ? st.types : [])), directed });
    if (hits(typedExact)) checks.push({ exact: typedExact!, loose: exact, weight: weights[c]!, group, clue: c });
    else if (hits(exact)) checks.push({ exact: exact!, loose: undirected, weight: weights[c]!, group, clue: c });
    else if (hits(undirected)) checks.push({ exact: undirected!, loose: null, weight: weights[c]!, group, clue: c });
    if (checks[checks.length - 1]?.clue === c) patterns[c] = pattern(hits(typedExact), hits(typedExact) || hits(exact));
    else if (group >= 0) empty.push({ group, clue: c });
    else ignored++;
  });
  if (checks.length === 0) return ignored > 0 ? { fit: () => 1, misses: () => [], ignored, patterns, exact: [] } : undefined;
  const total = checks.reduce((a, ch) => a + ch.weight, 0);
  // a coordinated clue whose shared pattern reaches no candidate at all, while another
  // member's does ("borders A, B and C" with C's only neighbours among the clues): it
  // supports no answer — a miss for every candidate, told to the verdict, not in the score
  const emptyMembers = empty.filter((e) => checks.some((ch) => ch.group === e.group)).map((e) => e.clue);
  const misses = (v: number): number[] =>
    [...checks.filter((ch) => !ch.exact.has(v) && !ch.loose?.has(v)).map((ch) => ch.clue), ...emptyMembers].sort((a, b) => a - b);
  // groups (a clue standing alone is a group of one): weight = the members' total, factor = the members' minimum
  const groups = new Map<number, typeof checks>();
  for (const ch of checks) groups.set(ch.group, [...(groups.get(ch.group) ?? []), ch]);
  const list = [...groups.values()].map((members) => ({ members, weight: members.reduce((a, ch) => a + ch.weight, 0) }));
  const fit = (v: number): number => {
    let log = 0;
    for (const g of list) {
      let f = 1;
      for (const ch of g.members) f = Math.min(f, ch.exact.has(v) ? 1 : ch.loose?.has(v) ? loose : miss);
      log += (g.weight / total) * Math.log(f);
    }
    return Math.exp(log);
  };
  return { fit, misses, ignored, patterns, exact: checks.map((ch) => ch.exact) };
}

/**
 * The `k` best of the items 0 … n − 1 by `before` (a strict total order: true when i comes
 * before j), best first: a bounded binary heap holding the k best so far, its worst at the
 * root (n log k comparisons instead of sorting all n).
 */
function topOf(n: number, k: number, before: (i: number, j: number) => boolean): number[] {
  const heap: number[] = [];
  // the heap's order: a parent is worse than (after) its children
  const down = (at: number): void => {
    for (;;) {
      const l = 2 * at + 1;
      const r = l + 1;
      let worst = at;
      if (l < heap.length && before(heap[worst]!, heap[l]!)) worst = l;
      if (r < heap.length && before(heap[worst]!, heap[r]!)) worst = r;
      if (worst === at) return;
      [heap[at], heap[worst]] = [heap[worst]!, heap[at]!];
      at = worst;
    }
  };
  for (let i = 0; i < n; i++) {
    if (heap.length < k) {
      heap.push(i);
      for (let at = heap.length - 1; at > 0; ) {
        const parent = (at - 1) >> 1;
        if (!before(heap[parent]!, heap[at]!)) break;
        [heap[at], heap[parent]] = [heap[parent]!, heap[at]!];
        at = parent;
      }
    } else if (k > 0 && before(i, heap[0]!)) {
      heap[0] = i;
      down(0);
    }
  }
  return heap.sort((i, j) => (before(i, j) ? -1 : before(j, i) ? 1 : 0));
}

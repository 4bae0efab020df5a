/**
 * The ranking stage: the compact relation index and its snapshot, the walk (transition
 * matrix), personalized PageRank (exact, push, fast), and the clue combination.
 */
export { RelationIndex } from "./relation-index.js";
export { mulberry32 } from "./prng.js";
export { grown, NodeBits, nodeBitsFor, Stamped, stampedFor } from "./stamped.js";
export type { Random } from "./prng.js";
export type { IndexProgress, IndexProgressFn, RelationEndTable } from "./relation-index.js";
export { openIndex, snapshotPath, readSnapshot, writeSnapshot, writeSnapshotTemp, SNAPSHOT } from "./snapshot.js";
export { IndexBuilder } from "./index-builder.js";
export type { OpenIndexOptions, SnapshotRead, SnapshotRejection } from "./snapshot.js";
export { linkInverse, linkRelation, packLink, transition, DEFAULTS as TRANSITION_DEFAULTS } from "./transition.js";
export type { Transition, TransitionOptions, TransitionRows } from "./transition.js";
export { PPR_DEFAULTS } from "./ppr-options.js";
export type { Seed, PprOptions, SparseScores } from "./ppr-options.js";
export { pprPower, DEFAULTS as POWER_DEFAULTS } from "./ppr-power.js";
export { pprPush, DEFAULTS as PUSH_DEFAULTS } from "./ppr-push.js";
export type { PushOptions, PushResult } from "./ppr-push.js";
export { pprFast, DEFAULTS as FAST_DEFAULTS } from "./ppr-fast.js";
export type { FastOptions, FastScores, FastStats } from "./ppr-fast.js";
export { rank, relationWeightsOf, clueSeeds, DEFAULTS as RANK_DEFAULTS } from "./rank.js";
export type { Ranked, RankedCandidate, RankedPattern, RankOptions, RankReading, ReachMemo } from "./rank.js";
export { combineClueScores, DEFAULTS as COMBINE_DEFAULTS } from "./combine.js";
export type { Combined, CombineOptions } from "./combine.js";
export { cueReach, MAX_CUES, DEFAULTS as CUE_PATH_DEFAULTS } from "./cue-paths.js";
export type { CuePathOptions } from "./cue-paths.js";
export { chainReach, DEFAULTS as CHAIN_REACH_DEFAULTS } from "./chain-reach.js";
export type { ChainHop, ChainReachOptions, NodeSet } from "./chain-reach.js";
export { applyConditions, satisfies, DEFAULTS as CONDITIONS_DEFAULTS } from "./conditions.js";
export type { ApplyConditionsOptions, AttributeLookup, ConditionCheck, AppliedCondition, ConditionOutcome } from "./conditions.js";
export { salienceOf, DEFAULTS as SALIENCE_DEFAULTS } from "./salience.js";
export type { Salience, SalienceOptions } from "./salience.js";

/**
 * The explain stage: why an answer was chosen (paths from every clue), whether it is the only
 * one (the verdict), what each clue contributes (ablation), why another entity lost
 * (why-not), and which clue to add when the answer is not unique (suggestions).
 */
export { explain, DEFAULTS as EXPLAIN_DEFAULTS } from "./explain.js";
export type { Explanation, ExplainOptions } from "./explain.js";
export type { ExplainAnalysis, ExplainRanked, ExplainClue, ExplainCandidate, ExplainRelationCue, WalkGraph } from "./types.js";
export { yenKShortestPaths, DEFAULTS as YEN_DEFAULTS } from "./yen.js";
export type { YenOptions, WeightedPath } from "./yen.js";
export { PathCostModel, DEFAULTS as PATH_COST_DEFAULTS } from "./path-cost.js";
export type { PathCostOptions, TransitionLike } from "./path-cost.js";
export { buildEvidenceGraph, bfsDistances, DEFAULTS as EVIDENCE_DEFAULTS } from "./evidence-graph.js";
export type { EvidenceOptions, EvidenceEdge } from "./evidence-graph.js";
export { bidirectionalBfs, cheapestStep, DEFAULTS as BFS_DEFAULTS } from "./bidirectional-bfs.js";
export type { BfsOptions, NumStep } from "./bidirectional-bfs.js";
export { findPaths, DEFAULTS as PATH_DEFAULTS } from "./paths.js";
export type { PathOptions, NumPath, AnswerPaths, PathSet, ClueSeed } from "./paths.js";
export { matchPattern, DEFAULTS as PATTERN_DEFAULTS } from "./relation-pattern.js";
export type { PatternOptions, PatternStep } from "./relation-pattern.js";
export { coverageTable } from "./coverage.js";
export type { CoverageTable, CoverageRow, CoverageCell, CellRelation } from "./coverage.js";
export { decideVerdict, notFoundText, DEFAULTS as VERDICT_DEFAULTS } from "./verdict.js";
export type { VerdictOptions, VerdictInput, VerdictCandidate, VerdictContext, SenseDoubt, MentionFacts } from "./verdict.js";
export { clueRole, preferredByClue, DEFAULTS as ABLATION_DEFAULTS } from "./ablation.js";
export type { AblationEntry, AblationOptions, ClueRole } from "./ablation.js";
export { whyNotFigures, whyNotReasons, DEFAULTS as WHY_NOT_DEFAULTS } from "./why-not.js";
export type { WhyNot, WhyNotClue, WhyNotOptions, WhyNotSource } from "./why-not.js";
export { suggestClues, appendClue, relationPhrase, factPhrase, attributePhrase, DEFAULTS as SUGGEST_DEFAULTS } from "./suggest.js";
export { clueCost, givesAway, DIFFICULTIES, DEFAULTS as CLUE_COST_DEFAULTS } from "./clue-cost.js";
export type { ClueCostOptions, ClueShape } from "./clue-cost.js";
export type { SuggestedClue, SuggestOptions, FactTriple, FactLookup } from "./suggest.js";
export { conditionDocs, conditionExplanation, conditionSteps, countDoc, formatValue } from "./conditions.js";

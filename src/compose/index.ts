/**
 * The compose stage: from an intended answer to questions that single it out
 * (referring-expression generation: Dale & Reiter 1995; Krahmer, van Erk & Verleg 2003),
 * each checked by asking it back through the pipeline.
 */
export { Composer, resolveTarget, parseDifficulty, DEFAULTS as COMPOSE_DEFAULTS } from "./compose.js";
export type { ComposeOptions, Composition, Proposal, ComposedClue, ComposeStep, ComposeTimings } from "./compose.js";
export { candidateFacts, extensionOf, intersectSorted, DEFAULTS as FACT_DEFAULTS } from "./facts.js";
export type { Fact, FactOptions, FactSource, SearchSpace } from "./facts.js";
export { cheapestSets, isMinimal, DEFAULTS as SEARCH_DEFAULTS } from "./cost-search.js";
export type { ClueSet, SearchOptions } from "./cost-search.js";
export { incrementalSet, minimalSubset } from "./incremental.js";
export { greedySet } from "./greedy.js";
export { clauseOf, questionOf, spokenOrder } from "./wording.js";
export type { Clause, WordSource } from "./wording.js";
export { readAnswerFile, composeBatch, DEFAULTS as BATCH_DEFAULTS } from "./batch.js";
export type { AnswerLine } from "./batch.js";

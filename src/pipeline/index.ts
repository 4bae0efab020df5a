/**
 * The pipeline: a Session (one loaded catalog, index, linker, question model) answering
 * questions, and the batch check over a question file.
 */
export { Session, DEFAULTS as ASK_DEFAULTS } from "./session.js";
export type { SessionOptions, SessionProgress, AskOptions, AskOutcome, AskTimings } from "./session.js";
export { LoadPreparation, DEFAULTS as PREPARE_DEFAULTS } from "./prepare.js";
export type { PrepareProgressFn } from "./prepare.js";
export { parseQuestionFile, parseQuestionText, questionLayout, DEFAULTS as QUESTION_FILE_DEFAULTS } from "./questions.js";
export type { QuestionItem, QuestionLayout } from "./questions.js";
export { runCheck, rankOfExpected, summarise, unknownExpected } from "./check.js";
export type { CheckOptions } from "./check.js";
export { linkFacts, codeMismatch, writtenWord, DEFAULTS as LINK_FACTS_DEFAULTS } from "./link-facts.js";
export { attachStore, existingBinding, inGraph } from "./attach.js";
export type { AttachOptions, AttachReport } from "./attach.js";
export { StoreEdges, DEFAULTS as STORE_EDGES_DEFAULTS } from "./store-edges.js";
export { LocalEdges } from "./edge-access.js";
export type { EdgeAccess, EdgeContext, EdgeCounts, StoreDescription } from "./edge-access.js";
export type { StoreOptions, PullFigures } from "./store-edges.js";

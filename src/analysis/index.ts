/**
 * Question analysis: expected answer types, relation cues and clues of one linked question.
 */
export { analyze, DEFAULTS as ANALYZE_DEFAULTS } from "./analyze.js";
export type { Analysis, AnalyzeOptions, AnswerType, Clue, NoteFacts } from "./analyze.js";
export { buildQuestionModel } from "./question-model.js";
export type { QuestionModel, QuestionModelOptions, ModelType, ModelRelation } from "./question-model.js";
export { relationalAnswerType, DEFAULTS as RELATION_RANGE_DEFAULTS } from "./relation-range.js";
export type { RelationalType, RelationRangeOptions } from "./relation-range.js";
export { detectAnswerType, DEFAULTS as ANSWER_TYPE_DEFAULTS } from "./answer-type.js";
export type { AnswerTypeOptions, AnswerTypeResult, AnswerTypeSource } from "./answer-type.js";
export { relationCues, expectedInverse, DEFAULTS as RELATION_CUE_DEFAULTS } from "./relation-cues.js";
export type { RelationCue, RelationCueOptions, CueOccurrence } from "./relation-cues.js";
export { cueChains, DEFAULTS as CUE_CHAIN_DEFAULTS } from "./cue-chains.js";
export type { CueChain, ChainStep, StepOption, CueChainOptions } from "./cue-chains.js";
export { findTypeWords } from "./type-words.js";
export type { TypeWord } from "./type-words.js";
export { words, FUNCTION_WORDS, isFunctionWord } from "./words.js";
export type { Word } from "./words.js";
export { findQuantities, parseNumber, parseIsoDate, yearFraction, DEFAULTS as QUANTITY_DEFAULTS } from "./quantity.js";
export type { Quantity, QuantityKind, QuantityOptions } from "./quantity.js";
export { detectConditions, buildAttributeModel, DEFAULTS as CONDITION_DEFAULTS } from "./conditions.js";
export type {
  Condition,
  ComparisonCondition,
  ComparisonOperator,
  SuperlativeCondition,
  ExclusionCondition,
  AbsenceCondition,
  LiteralCondition,
  CountCondition,
  ConditionAnalysis,
  ConditionOptions,
  AttributeModel,
  ModelAttribute,
  AttributeRef,
  AttributeChoice,
} from "./conditions.js";
export type { ValueQuestion, EntityComparison, IdentityQuestion } from "./conditions.js";
export { readQuestion, readingText, readingDoc, constraintTexts } from "./query-graph.js";
export type { QueryGraph, QueryNode, QueryEdge, ReadOptions } from "./query-graph.js";
export { DIMENSIONS, TEMPORAL, ORDINALS, gradable, isComparativeForm, isPluralNoun } from "./lexicon.js";
export type { Dimension } from "./lexicon.js";

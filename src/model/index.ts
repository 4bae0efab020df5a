export { TiepointError, USAGE_CODES } from "./errors.js";
export type {
  EntityRef,
  Alternative,
  Mention,
  MatchKind,
  Derivation,
  NotFoundDoc,
  PathStep,
  AnswerPath,
  Answer,
  VerdictStatus,
  Verdict,
  VerdictMention,
  SenseAnswer,
  AskResult,
  SuggestionDoc,
  CheckItem,
  CheckSummary,
  VerdictCheck,
  CheckReport,
  ConditionDoc,
  ConditionStepDoc,
  CountDoc,
  ValueDoc,
  ReadingDoc,
  ReadingNodeDoc,
  ReadingEdgeDoc,
  BudgetDoc,
} from "./answer.js";
export { DISCLAIMER } from "./answer.js";
export type { RelationEnd, RelationEnds } from "./relation-ends.js";
export { LIMITS, checkQuestionLength, checkTop } from "./limits.js";
export { Deadline, DEFAULTS as DEADLINE_DEFAULTS } from "./deadline.js";
export type { CutStage } from "./deadline.js";

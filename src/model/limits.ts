/**
 * Limits that protect the machine
 * ===============================
 *
 * Every input a user controls is bounded, so one question or one question file cannot take
 * unbounded time or memory. Over-limit input gets a one-line {@link TiepointError}: code
 * `pipeline/limit` for input (exit status 1), `cli/usage` for a flag value (exit status 2).
 * The README section "Failure modes" lists the same figures.
 *
 * The path search of the explain stage is bounded by its own DEFAULTS (src/explain/paths.ts:
 * `maxHops` 6, `evidenceHops` 4, `nodeBudget` 50,000 visited nodes per search, `hubLimit`
 * 2,000; src/explain/bidirectional-bfs.ts: `nodeBudget` 200,000): work budgets rather than
 * a wall clock, so that answers stay deterministic. Together with {@link LIMITS}.maxMentions
 * (at most that many clues, hence that many searches) they bound its time per question.
 * test/reliability-limits.test.ts checks that these figures and the explain DEFAULTS agree.
 *
 * The figures are common practice for an interactive tool (generous for a real question,
 * small enough to answer within seconds); none is tuned to a catalog.
 */
import { TiepointError } from "./errors.js";

/** The documented limits (README "Failure modes"). */
export const LIMITS = {
  /** Longest question, in UTF-16 code units (JavaScript string length). */
  maxQuestionChars: 2000,
  /** Linked mentions used as clues per question; further ones (least confident first) are dropped with a note. */
  maxMentions: 16,
  /** Largest `--top` (answers returned per question). */
  maxTop: 1000,
  /** Largest question file for `check`, in bytes. */
  maxQuestionFileBytes: 16 * 1024 * 1024,
  /** Most questions in one question file. */
  maxQuestions: 100_000,
  /** Longest walk an explanation path may have (src/explain/paths.ts DEFAULTS.maxHops). */
  maxPathHops: 6,
  /** Visited nodes per path search (src/explain/paths.ts DEFAULTS.nodeBudget). */
  pathNodeBudget: 50_000,
} as const;

/** Throws a `pipeline/limit` error when the question is longer than {@link LIMITS}.maxQuestionChars. */
export function checkQuestionLength(question: string, where: { file?: string; line?: number } = {}): void {
  if (question.length > LIMITS.maxQuestionChars)
    throw new TiepointError(
      "pipeline/limit",
      `the question is ${question.length} characters long; the limit is ${LIMITS.maxQuestionChars} (ask a shorter question)`,
      where,
    );
}

/** Throws when `top` is not a whole number in 1…{@link LIMITS}.maxTop; `code` decides the exit status. */
export function checkTop(top: number, code = "pipeline/options", flag = "top"): void {
  if (!Number.isInteger(top) || top < 1) throw new TiepointError(code, `${flag} must be a positive whole number, got ${String(top)}`);
  if (top > LIMITS.maxTop) throw new TiepointError(code, `${flag} ${top} is over the limit of ${LIMITS.maxTop} answers per question`);
}

/**
 * `check`: a batch of questions through one session, scored against their expected answers.
 *
 * Metrics over the questions that carry expected answers (Manning, Raghavan & Schütze 2008,
 * "Introduction to Information Retrieval", §8.4): Hits@k = share of questions with an
 * expected answer among the first k; MRR = mean of 1/rank of the best-ranked expected answer
 * (0 when none is returned; Voorhees 1999, TREC-8 QA track). An expected value matches an
 * answer by id or by exact label, or (value questions) a value of `values` as written.
 */
import { DEADLINE_DEFAULTS, type AskResult, type CheckItem, type CheckReport, type VerdictCheck, type VerdictStatus } from "../model/index.js";
import type { QuestionItem } from "./questions.js";
import type { AskOptions, Session } from "./session.js";

/** Options of {@link runCheck}; all optional. */
export interface CheckOptions {
  /** Answers per question. @default 10 */
  readonly top?: number;
  /** Time budget per question in milliseconds (0: none). @default 3000 (Session.ask) */
  readonly timeLimitMs?: number;
  /** Called after each question with its result. */
  readonly onProgress?: (done: number, total: number, item: CheckItem) => void;
}

/** The 1-based rank of the best-ranked expected answer, or null. */
export function rankOfExpected(result: AskResult, expected: readonly string[]): number | null {
  if (expected.length === 0) return null;
  const want = new Set(expected);
  const i = result.answers.findIndex((a) => want.has(a.id) || want.has(a.label));
  if (i >= 0) return i + 1;
  // a value question: an expected value as written matches a value of `values` (README "Reading")
  const v = (result.values ?? []).findIndex((x) => want.has(x.value));
  return v < 0 ? null : v + 1;
}

/** The expected values of an item that name no entity (neither an id nor an exact label of the catalog): they can never match an answer. */
export function unknownExpected(session: Session, item: QuestionItem): string[] {
  return item.expected.filter((x) => session.catalog.byLabelOrId(x).length === 0);
}

/** Runs every question and summarises (contract.md, `check --json`), on any catalog (an attached one pulls each question's neighbourhood from its store). */
export async function runCheck(session: Session, items: readonly QuestionItem[], options: CheckOptions = {}): Promise<CheckReport> {
  const t0 = performance.now();
  const ask = askOptionsOf(options);
  const results: CheckItem[] = [];
  for (const item of items) results.push(checkItem(session, item, (await session.askAsync(item.question, ask)).result, items.length, results.length, options));
  return { results, summary: summarise(results, (performance.now() - t0) / 1000, options.timeLimitMs ?? DEADLINE_DEFAULTS.timeLimitMs) };
}

function askOptionsOf(options: CheckOptions): AskOptions {
  // check prints no ablation: its re-rankings are not run
  return { ablation: false, ...(options.top !== undefined ? { top: options.top } : {}), ...(options.timeLimitMs !== undefined ? { timeLimitMs: options.timeLimitMs } : {}) };
}

/** One question's result, scored. */
function checkItem(session: Session, item: QuestionItem, answer: AskResult, total: number, before: number, options: CheckOptions): CheckItem {
  const rank = rankOfExpected(answer, item.expected);
  const unknown = unknownExpected(session, item);
  const r: CheckItem = {
    line: item.line,
    question: item.question,
    expected: item.expected,
    rank,
    hit: rank === 1,
    answer,
    ...(unknown.length > 0 ? { unknownExpected: unknown } : {}),
    ...(item.verdict ? { expectedVerdict: item.verdict, verdictMatch: item.verdict === answer.verdict.status } : {}),
  };
  options.onProgress?.(before + 1, total, r);
  return r;
}

/** The summary of a list of results. */
export function summarise(results: readonly CheckItem[], seconds: number, timeLimitMs: number = DEADLINE_DEFAULTS.timeLimitMs): CheckReport["summary"] {
  const verdicts: Record<VerdictStatus, number> = { unique: 0, tied: 0, weak: 0, none: 0 };
  let withExpected = 0;
  let h1 = 0;
  let h5 = 0;
  let rr = 0;
  for (const r of results) {
    verdicts[r.answer.verdict.status]++;
    if (r.expected.length === 0) continue;
    withExpected++;
    if (r.rank !== null) {
      if (r.rank === 1) h1++;
      if (r.rank <= 5) h5++;
      rr += 1 / r.rank;
    }
  }
  const share = (x: number) => (withExpected === 0 ? 0 : x / withExpected);
  const verdictCheck = verdictCheckOf(results);
  const budgetHit = results.filter((r) => r.answer.budget !== undefined).length;
  return { questions: results.length, withExpected, hits1: share(h1), hits5: share(h5), mrr: share(rr), verdicts, seconds, budgetHit, timeLimitMs, ...(verdictCheck ? { verdictCheck } : {}) };
}

const STATUSES: readonly VerdictStatus[] = ["unique", "tied", "weak", "none"];

/**
 * Verdict accuracy and the confusion matrix (expected × given; Stehman 1997, "Selecting and
 * interpreting measures of thematic classification accuracy") over the results that carry an
 * expected verdict; undefined when none does.
 */
export function verdictCheckOf(results: readonly CheckItem[]): VerdictCheck | undefined {
  const rows = results.filter((r) => r.expectedVerdict !== undefined);
  if (rows.length === 0) return undefined;
  const confusion = Object.fromEntries(STATUSES.map((e) => [e, Object.fromEntries(STATUSES.map((g) => [g, 0]))])) as Record<VerdictStatus, Record<VerdictStatus, number>>;
  let right = 0;
  for (const r of rows) {
    confusion[r.expectedVerdict!][r.answer.verdict.status]++;
    if (r.expectedVerdict === r.answer.verdict.status) right++;
  }
  return { questions: rows.length, accuracy: right / rows.length, confusion };
}

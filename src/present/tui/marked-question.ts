/**
 * Splits a question into plain runs and linked-mention runs, for marking mentions on screen.
 *
 * Method: a left-to-right sweep over the mentions sorted by start offset (UTF-16, as in
 * the contract); overlapping or out-of-range spans are skipped so the text is shown once.
 */
import type { Mention } from "../../model/index.js";

/** One run of the question text. */
export interface QuestionRun {
  /** The text of the run. */
  readonly text: string;
  /** Index into the mentions array when the run is a linked mention. */
  readonly mention?: number;
}

/** The question as runs, mentions marked by their index in `mentions`. */
export function markQuestion(question: string, mentions: readonly Mention[]): QuestionRun[] {
  const order = mentions
    .map((m, i) => ({ m, i }))
    .filter(({ m }) => m.start >= 0 && m.end <= question.length && m.start < m.end)
    .sort((a, b) => a.m.start - b.m.start || b.m.end - a.m.end || a.i - b.i);
  const runs: QuestionRun[] = [];
  let at = 0;
  for (const { m, i } of order) {
    if (m.start < at) continue;
    if (m.start > at) runs.push({ text: question.slice(at, m.start) });
    runs.push({ text: question.slice(m.start, m.end), mention: i });
    at = m.end;
  }
  if (at < question.length) runs.push({ text: question.slice(at) });
  return runs;
}

/** A confidence as a whole percentage, e.g. `93%` (`<1%` for tiny non-zero values). */
export function percent(confidence: number): string {
  if (!Number.isFinite(confidence)) return "?%";
  const p = Math.round(confidence * 100);
  if (p === 0 && confidence > 0) return "<1%";
  return `${p}%`;
}

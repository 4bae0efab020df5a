/**
 * The check report as tab-separated values for spreadsheets: a header row, then one row per
 * question. Tabs and line breaks inside a value become spaces; a text value that a spreadsheet
 * would read as a formula (starting with `=`, `+`, `-`, `@`) gets a leading `'`
 * (OWASP, "CSV Injection", from memory). Lists inside a cell are `|`-separated, as in the
 * question file. Numbers are plain decimals; an absent rank is an empty cell. `expected_verdict`
 * and `verdict_match` (yes/no) are empty when the question file gives no expected verdict.
 */
import type { CheckItem, CheckReport } from "../model/index.js";
import { outcomeWord, reviewItem, weakestLink, type ReviewOptions } from "./report-review.js";

/** Options of {@link renderCheckTsv}; all optional. */
export interface TsvOptions extends ReviewOptions {
  /** Answer ids listed in the `answers` column. @default 5 */
  readonly answers?: number;
}

/** Defaults of {@link TsvOptions}. */
export const TSV_DEFAULTS = { answers: 5 } as const;

/** The columns, in order. */
export const TSV_COLUMNS = [
  "line",
  "question",
  "expected",
  "outcome",
  "rank",
  "verdict",
  "margin",
  "top_id",
  "top_label",
  "top_score",
  "answers",
  "tied_with",
  "weakest_link",
  "needs_look",
  "expected_verdict",
  "verdict_match",
] as const;

/** A text cell: one line, no tabs, no formula start. */
export function tsvText(s: string): string {
  const flat = s.replace(/[\t\r\n\u0000-\u001f\u2028\u2029]+/g, " ");
  return /^[=+\-@]/.test(flat) ? `'${flat}` : flat;
}

function num(x: number | null, digits: number): string {
  return x === null || !Number.isFinite(x) ? "" : x.toFixed(digits);
}

function row(item: CheckItem, options: TsvOptions): string[] {
  const n = options.answers ?? TSV_DEFAULTS.answers;
  const a = item.answer;
  const best = a.answers[0];
  return [
    String(item.line),
    tsvText(item.question),
    tsvText(item.expected.join("|")),
    outcomeWord(item),
    item.rank === null ? "" : String(item.rank),
    a.verdict.status,
    num(a.verdict.margin, 4),
    tsvText(best?.id ?? ""),
    tsvText(best?.label ?? ""),
    best ? num(best.score, 6) : "",
    tsvText(a.answers.slice(0, n).map((x) => x.id).join("|")),
    tsvText(a.verdict.tiedWith.join("|")),
    num(weakestLink(item), 3),
    tsvText(reviewItem(item, options).map((f) => f.kind).join("|")),
    item.expectedVerdict ?? "",
    item.expectedVerdict === undefined ? "" : item.expectedVerdict === a.verdict.status ? "yes" : "no",
  ];
}

/** The TSV document (header + one row per question), ending with a newline. */
export function renderCheckTsv(report: CheckReport, options: TsvOptions = {}): string {
  const lines = [TSV_COLUMNS.join("\t"), ...report.results.map((it) => row(it, options).join("\t"))];
  return lines.join("\n") + "\n";
}

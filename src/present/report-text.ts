/**
 * The plain-text check report: one block per question (outcome, verdict, margin, top answers),
 * then the summary (Hits@1, Hits@5, MRR, verdict counts, timing), the questions that need a
 * look, and, with `--compare`, what changed since the earlier run.
 */
import type { CheckItem, CheckReport } from "../model/index.js";
import { DISCLAIMER } from "../model/index.js";
import type { ReportComparison } from "./compare.js";
import { confusionRows, outcomeWord, reviewReport, verdictMismatch, type ReviewOptions } from "./report-review.js";

/** Options of the text, Markdown and HTML check reports; all optional. */
export interface ReportOptions extends ReviewOptions {
  /** Answers listed per question. @default 3 */
  readonly answers?: number;
  /** Differences from an earlier run, shown after the summary. */
  readonly comparison?: ReportComparison;
}

/** Defaults of {@link ReportOptions}. */
export const REPORT_DEFAULTS = { answers: 3 } as const;

/** `0.667` style for rates. */
export function rate(x: number): string {
  return Number.isFinite(x) ? x.toFixed(3) : "-";
}

/** `hit (rank 1)`, `miss (rank 4)`, `miss (not found)` or `no expected answer`. */
export function outcomePhrase(item: CheckItem): string {
  const w = outcomeWord(item);
  if (w === "-") return "no expected answer";
  return `${w} (${item.rank === null ? "not found" : `rank ${item.rank}`})`;
}

/** Seconds as `1.23 s`, and per question as `12.3 ms`. */
export function timing(report: CheckReport): string {
  const s = report.summary.seconds;
  const n = report.summary.questions;
  const per = n > 0 ? `, ${((s * 1000) / n).toFixed(1)} ms per question` : "";
  return `${s.toFixed(2)} s for ${n} question${n === 1 ? "" : "s"}${per}`;
}

/** One question as text lines (no trailing newline). */
export function renderItemText(item: CheckItem, options: ReportOptions = {}): string {
  const n = options.answers ?? REPORT_DEFAULTS.answers;
  const v = item.answer.verdict;
  const lines = [`line ${item.line}: ${item.question}`];
  lines.push(`  ${outcomePhrase(item)} · ${v.status} · margin ${v.margin.toFixed(2)}${v.tiedWith.length ? ` · tied with ${v.tiedWith.join(", ")}` : ""}`);
  const shown = item.answer.answers.slice(0, n);
  if (shown.length === 0) lines.push("  no answers");
  shown.forEach((a, i) => lines.push(`  ${i + 1}. ${a.label} (${a.id})  ${a.score.toFixed(3)}`));
  if (item.expected.length > 0 && !item.hit) lines.push(`  expected: ${item.expected.join(" | ")}`);
  const mismatch = verdictMismatch(item);
  if (mismatch !== null) lines.push(`  verdict mismatch: ${mismatch}`);
  return lines.join("\n");
}

/** The summary block as text lines (no trailing newline). */
export function renderSummaryText(report: CheckReport): string {
  const s = report.summary;
  const v = s.verdicts;
  return [
    "Summary",
    `  questions   ${s.questions} (${s.withExpected} with expected answers)`,
    `  Hits@1 ${rate(s.hits1)}   Hits@5 ${rate(s.hits5)}   MRR ${rate(s.mrr)}`,
    `  verdicts    unique ${v.unique}   tied ${v.tied}   weak ${v.weak}   none ${v.none}`,
    ...verdictCheckText(report),
    `  time        ${timing(report)}`,
    ...(s.budgetHit !== undefined ? [`  time limit  ${s.budgetHit} of ${s.questions} question${s.questions === 1 ? "" : "s"} hit the ${s.timeLimitMs ? `${s.timeLimitMs} ms` : "time"} budget${s.budgetHit > 0 ? " (stages cut: see their notes)" : ""}`] : []),
  ].join("\n");
}

/** The verdict accuracy line and confusion matrix (none when no question expects a verdict). */
function verdictCheckText(report: CheckReport): string[] {
  const vc = report.summary.verdictCheck;
  if (!vc) return [];
  const rows = confusionRows(vc);
  const widths = rows[0]!.map((_, i) => Math.max(...rows.map((r) => r[i]!.length)));
  return [
    `  verdict accuracy ${rate(vc.accuracy)} (${vc.questions} questions with an expected verdict); expected × got:`,
    ...rows.map((r) => `    ${r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  ")}`),
  ];
}

/** The differences from an earlier run as text lines (no trailing newline). */
export function renderComparisonText(c: ReportComparison): string {
  const d = (a: number, b: number) => `${rate(a)} → ${rate(b)} (${b - a >= 0 ? "+" : ""}${(b - a).toFixed(3)})`;
  const ref = (r: { id: string; label: string } | null) => (r ? `${r.label} (${r.id})` : "nothing");
  const rk = (r: number | null) => (r === null ? "-" : String(r));
  const lines = [
    `Changes since the earlier run (${c.matched} questions in both)`,
    `  Hits@1 ${d(c.before.hits1, c.after.hits1)}   Hits@5 ${d(c.before.hits5, c.after.hits5)}   MRR ${d(c.before.mrr, c.after.mrr)}`,
  ];
  const section = <T>(title: string, list: readonly T[], line: (x: T) => string) => {
    lines.push(`  ${title}: ${list.length}`);
    for (const x of list) lines.push(`    ${line(x)}`);
  };
  section("new misses", c.newMisses, (x) => `line ${x.line}: rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}  ${x.question}`);
  section("fixed misses", c.fixedMisses, (x) => `line ${x.line}: rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}  ${x.question}`);
  section("answers that moved", c.moved, (x) => `line ${x.line}: ${ref(x.before)} → ${ref(x.after)}, expected rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}`);
  section("verdicts that changed", c.verdictChanges, (x) => `line ${x.line}: ${x.before} → ${x.after}  ${x.question}`);
  if (c.added.length) section("new questions", c.added, (x) => `line ${x.line}: ${x.question}`);
  if (c.removed.length) section("questions no longer asked", c.removed, (x) => `old line ${x.line}: ${x.question}`);
  return lines.join("\n");
}

/** The whole text report, ending with a newline. */
export function renderCheckText(report: CheckReport, options: ReportOptions = {}): string {
  const parts = report.results.map((it) => renderItemText(it, options));
  parts.push(renderSummaryText(report));
  const review = reviewReport(report, options);
  const look = [`Needs a look: ${review.length}`];
  for (const e of review) look.push(`  line ${e.item.line}: ${e.flags.map((f) => `${f.kind}: ${f.detail}`).join("; ")}`);
  parts.push(look.join("\n"));
  if (options.comparison) parts.push(renderComparisonText(options.comparison));
  parts.push(DISCLAIMER);
  return parts.join("\n\n") + "\n";
}

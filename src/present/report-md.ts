/**
 * The check report as Markdown (GitHub-flavoured tables): the summary, the questions that need
 * a look, a table of all questions, and with `--compare` the changes since an earlier run.
 * Every value from the catalog or the question file is escaped so it cannot open markup,
 * links or HTML, or break a table cell.
 */
import type { CheckReport } from "../model/index.js";
import { DISCLAIMER } from "../model/index.js";
import type { ReportComparison } from "./compare.js";
import { confusionRows, outcomeWord, reviewReport } from "./report-review.js";
import { rate, REPORT_DEFAULTS, timing, type ReportOptions } from "./report-text.js";

/** Escapes text for a Markdown paragraph or table cell (one line, no markup). */
export function mdText(s: string): string {
  return (
    s
      .replace(/[\r\n\t\u0000-\u001f\u2028\u2029]+/g, " ")
      .replace(/&/g, "&amp;")
      .replace(/</g, "&lt;")
      .replace(/>/g, "&gt;")
      .replace(/[\\`*_[\]|~]/g, (c) => `\\${c}`)
  );
}

function table(head: readonly string[], rows: readonly (readonly string[])[]): string {
  return [`| ${head.join(" | ")} |`, `| ${head.map(() => "---").join(" | ")} |`, ...rows.map((r) => `| ${r.join(" | ")} |`)].join("\n");
}

function comparisonMd(c: ReportComparison): string {
  const rk = (r: number | null) => (r === null ? "–" : String(r));
  const ref = (r: { id: string; label: string } | null) => (r ? `${mdText(r.label)} (${mdText(r.id)})` : "nothing");
  const parts = [
    `## Changes since the earlier run`,
    `${c.matched} questions in both runs.`,
    table(
      ["figure", "before", "after"],
      [
        ["Hits@1", rate(c.before.hits1), rate(c.after.hits1)],
        ["Hits@5", rate(c.before.hits5), rate(c.after.hits5)],
        ["MRR", rate(c.before.mrr), rate(c.after.mrr)],
      ],
    ),
  ];
  const changes: string[][] = [
    ...c.newMisses.map((x) => [String(x.line), "new miss", `rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}`, mdText(x.question)]),
    ...c.fixedMisses.map((x) => [String(x.line), "fixed miss", `rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}`, mdText(x.question)]),
    ...c.moved.map((x) => [String(x.line), "answer moved", `${ref(x.before)} → ${ref(x.after)}`, mdText(x.question)]),
    ...c.verdictChanges.map((x) => [String(x.line), "verdict changed", `${x.before} → ${x.after}`, mdText(x.question)]),
    ...c.added.map((x) => [String(x.line), "new question", "", mdText(x.question)]),
    ...c.removed.map((x) => [`(old ${x.line})`, "no longer asked", "", mdText(x.question)]),
  ];
  parts.push(changes.length ? table(["line", "change", "what", "question"], changes) : "No question changed.");
  return parts.join("\n\n");
}

/** The whole Markdown report, ending with a newline. */
export function renderCheckMd(report: CheckReport, options: ReportOptions = {}): string {
  const s = report.summary;
  const n = options.answers ?? REPORT_DEFAULTS.answers;
  const parts: string[] = ["# tiepoint check report", `> ${DISCLAIMER}`, "## Summary"];
  parts.push(
    table(
      ["questions", "with expected", "Hits@1", "Hits@5", "MRR", "unique", "tied", "weak", "none", "time"],
      [[String(s.questions), String(s.withExpected), rate(s.hits1), rate(s.hits5), rate(s.mrr), String(s.verdicts.unique), String(s.verdicts.tied), String(s.verdicts.weak), String(s.verdicts.none), timing(report)]],
    ),
  );
  const vc = s.verdictCheck;
  if (vc) {
    const [head, ...rows] = confusionRows(vc);
    parts.push(`Verdict accuracy **${rate(vc.accuracy)}** over ${vc.questions} questions with an expected verdict (rows: expected, columns: got):`);
    parts.push(table(head!.map(mdText), rows.map((r) => r.map(mdText))));
  }
  const review = reviewReport(report, options);
  parts.push(`## Needs a look (${review.length})`);
  parts.push(review.length ? review.map((e) => `- line ${e.item.line}: ${mdText(e.item.question)} — ${e.flags.map((f) => `**${f.kind}**: ${mdText(f.detail)}`).join("; ")}`).join("\n") : "Nothing to look at.");
  if (options.comparison) parts.push(comparisonMd(options.comparison));
  parts.push("## Questions");
  parts.push(
    table(
      ["line", "question", "outcome", "rank", "verdict", "margin", "top answers"],
      report.results.map((it) => [
        String(it.line),
        mdText(it.question),
        outcomeWord(it) === "-" ? "–" : outcomeWord(it),
        it.rank === null ? "–" : String(it.rank),
        it.expectedVerdict !== undefined && it.expectedVerdict !== it.answer.verdict.status ? `${it.answer.verdict.status} (expected ${it.expectedVerdict})` : it.answer.verdict.status,
        it.answer.verdict.margin.toFixed(2),
        it.answer.answers.slice(0, n).map((a) => `${mdText(a.label)} ${a.score.toFixed(3)}`).join("; ") || "–",
      ]),
    ),
  );
  return parts.join("\n\n") + "\n";
}

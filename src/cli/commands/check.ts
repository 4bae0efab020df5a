/**
 * `tiepoint check FILE [--db PATH] [--json] [--top N] [--format text|json|tsv|md|html] [--out FILE]
 * [--compare OLD.json]`: every question of a question file
 * through one loaded session; one result per question and the summary (Hits@1, Hits@5, MRR,
 * verdict counts, seconds; verdict accuracy and the confusion matrix when the file gives
 * expected verdicts).
 */
import type { Command } from "commander";
import { parseQuestionFile, QUESTION_FILE_DEFAULTS, runCheck, Session, unknownExpected, type QuestionItem } from "../../pipeline/index.js";
import { STORE_TIMEOUT_HELP, storeSessionOptions } from "./attach.js";
import { guarded } from "../run.js";
import { checkOutTarget, emit, progressReporter, readEarlierReport, renderReport, reportFormat, suggestionsBySession } from "../report-output.js";
import { parseTimeLimit, parseTop, TIME_LIMIT_HELP } from "./ask.js";

/** The options of `check`, in one place. */
export interface CheckCommandOptions {
  readonly db?: string;
  readonly json?: boolean;
  readonly top?: string;
  /** text | json | tsv | md | html (reports helper). */
  readonly format?: string;
  /** Write the report to this file (atomically) instead of stdout. */
  readonly out?: string;
  /** An earlier `check --json` document to compare with. */
  readonly compare?: string;
  /** Time budget per question, milliseconds (0: none). */
  readonly timeLimit?: string;
  /** On an attached catalog: milliseconds per store request. */
  readonly timeout?: string;
}

/**
 * Warns (stderr, `FILE:LINE: warning: …`) about every expected value that names no entity of
 * the catalog: such a question can never be a hit, which is most often a typo in the file.
 * At most {@link QUESTION_FILE_DEFAULTS}.maxErrors lines, then a count.
 */
function warnUnknownExpected(session: Session, items: readonly QuestionItem[], file: string): void {
  const lines: string[] = [];
  let total = 0;
  for (const item of items) {
    for (const x of unknownExpected(session, item)) {
      total++;
      if (lines.length < QUESTION_FILE_DEFAULTS.maxErrors) lines.push(`${file}:${item.line}: warning: expected ${JSON.stringify(x)} is neither an entity id nor an exact label in the catalog, so it can never match (a typo?)`);
    }
  }
  if (total > lines.length) lines.push(`${file}: warning: … and ${total - lines.length} more expected values not in the catalog`);
  if (lines.length > 0) process.stderr.write(lines.join("\n") + "\n");
}

/** Registers `check`. */
export function registerCheck(program: Command): void {
  program
    .command("check")
    .description("run a question file (question, or question<TAB>id1|id2|…) and score it: Hits@1, Hits@5, MRR")
    .argument("<file>", "the question file (see below)")
    .option("--db <path>", "the catalog file (default: the bundled demo catalog)")
    .option("--json", "print the contract JSON document on stdout")
    .option("--top <n>", "how many answers to return per question", "10")
    .option("--format <kind>", "report format: text, json, tsv, md or html")
    .option("--out <file>", "write the report to FILE instead of stdout")
    .option("--compare <old.json>", "show what changed since an earlier `check --json` report")
    .option("--time-limit <ms>", TIME_LIMIT_HELP)
    .option("--timeout <ms>", STORE_TIMEOUT_HELP)
    .addHelpText(
      "after",
      `
Question file:
  one question per line, or question<TAB>expected with expected = id1|id2|… (entity ids or
  exact labels; any of them at rank 1 is a hit), optionally question<TAB>expected<TAB>verdict
  (unique, tied, weak or none; an empty expected with none: no answer expected; the summary
  then adds verdict accuracy and the confusion matrix, expected × got). Blank lines and lines starting with # are
  skipped. A file named *.csv is read as CSV (RFC 4180) with a header row naming its columns:
  question (required), expected (optional, id1|id2|…), verdict (optional: unique, tied, weak
  or none). Every bad line is reported (up to ${QUESTION_FILE_DEFAULTS.maxErrors}) and nothing is run; an expected
  value that is not in the catalog gets a warning (FILE:LINE) and can never match.`,
    )
    .action((file: string, opts: CheckCommandOptions) =>
      guarded(async () => {
        const top = parseTop(opts.top);
        const timeLimitMs = parseTimeLimit(opts.timeLimit);
        const format = reportFormat(opts.format, opts.json);
        const earlier = opts.compare !== undefined ? readEarlierReport(opts.compare) : undefined;
        if (opts.out !== undefined) checkOutTarget(opts.out);
        const items = parseQuestionFile(file);
        const session = Session.open({ ...(opts.db !== undefined ? { db: opts.db } : {}), ...storeSessionOptions(opts.timeout) });
        try {
          warnUnknownExpected(session, items, file);
          const progress = progressReporter();
          const report = await runCheck(session, items, { top, timeLimitMs, ...(progress.onProgress ? { onProgress: progress.onProgress } : {}) });
          progress.finish();
          const doc = await renderReport(report, {
            format,
            labels: session.catalog,
            subtitle: `${file} · ${opts.db ?? "demo catalog"}`,
            ...(format === "html" ? { suggestions: await suggestionsBySession(session, top, report.results) } : {}),
            ...(earlier ? { earlier } : {}),
          });
          emit(doc.text, opts.out);
          if (doc.aside) process.stderr.write(doc.aside);
        } finally {
          session.close();
        }
      }),
    );
}

/**
 * `tiepoint check FILE [--db PATH] [--json] [--top N] [--format text|json|tsv|md|html] [--out FILE]
 * [--compare OLD.json]`: every question of a question file
 * through one loaded session; one result per question and the summary (Hits@1, Hits@5, MRR,
 * verdict counts, seconds).
 */
import type { Command } from "commander";
import { parseQuestionFile, runCheck, Session } from "../../pipeline/index.js";
import { guarded } from "../run.js";
import { checkOutTarget, emit, progressReporter, readEarlierReport, renderReport, reportFormat, suggestionsBySession } from "../report-output.js";
import { parseTop } from "./ask.js";

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
}

/** Registers `check`. */
export function registerCheck(program: Command): void {
  program
    .command("check")
    .description("run a question file (question, or question<TAB>id1|id2|…) and score it: Hits@1, Hits@5, MRR")
    .argument("<file>", "the question file")
    .option("--db <path>", "the catalog file (default: the bundled demo catalog)")
    .option("--json", "print the contract JSON document on stdout")
    .option("--top <n>", "how many answers to return per question", "10")
    .option("--format <kind>", "report format: text, json, tsv, md or html")
    .option("--out <file>", "write the report to FILE instead of stdout")
    .option("--compare <old.json>", "show what changed since an earlier `check --json` report")
    .action((file: string, opts: CheckCommandOptions) =>
      guarded(async () => {
        const top = parseTop(opts.top);
        const format = reportFormat(opts.format, opts.json);
        const earlier = opts.compare !== undefined ? readEarlierReport(opts.compare) : undefined;
        if (opts.out !== undefined) checkOutTarget(opts.out);
        const items = parseQuestionFile(file);
        const session = Session.open(opts.db !== undefined ? { db: opts.db } : {});
        try {
          const progress = progressReporter();
          const report = runCheck(session, items, { top, ...(progress.onProgress ? { onProgress: progress.onProgress } : {}) });
          progress.finish();
          const doc = await renderReport(report, {
            format,
            labels: session.catalog,
            subtitle: `${file} · ${opts.db ?? "demo catalog"}`,
            ...(format === "html" ? { suggestions: suggestionsBySession(session, top) } : {}),
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

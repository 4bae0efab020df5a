/**
 * The output side of `check` (and `ask --dot`): choosing the report format, reading an
 * earlier report for `--compare`, the stderr progress bar, and writing stdout or `--out FILE`.
 */
import { readFileSync } from "node:fs";
import type { CheckItem, CheckReport } from "../model/index.js";
import type { Session } from "../pipeline/index.js";
import { DISCLAIMER, TiepointError } from "../model/index.js";
import {
  catalogLabels,
  checkHtml,
  checkJson,
  compareReports,
  parseCheckReport,
  progressLine,
  renderCheckMd,
  renderCheckText,
  renderCheckTsv,
  renderComparisonText,
  type LabelSource,
  type ReportComparison,
} from "../present/index.js";
import { checkOutTarget, writeFileAtomic } from "./out-file.js";

export { checkOutTarget };

/** The report formats of `check --format`. */
export const REPORT_FORMATS = ["text", "json", "tsv", "md", "html"] as const;

/** One of {@link REPORT_FORMATS}. */
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** Resolves `--format` and `--json` into one format; a usage error when they disagree or the name is unknown. */
export function reportFormat(format: string | undefined, json: boolean | undefined): ReportFormat {
  if (format === undefined) return json ? "json" : "text";
  const f = format.trim().toLowerCase();
  if (!(REPORT_FORMATS as readonly string[]).includes(f)) {
    throw new TiepointError("cli/usage", `--format "${format}": expected one of ${REPORT_FORMATS.join(", ")}`);
  }
  if (json && f !== "json") throw new TiepointError("cli/usage", `--json and --format ${f} disagree; use one of them`);
  return f as ReportFormat;
}

/** Reads the earlier report of `--compare FILE` (a one-line error naming the file when it cannot). */
export function readEarlierReport(path: string): CheckReport {
  let text: string;
  try {
    text = readFileSync(path, "utf8");
  } catch (e) {
    const code = (e as { code?: string }).code;
    const why = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a folder" : code === "EACCES" ? "permission denied" : (e as Error).message;
    throw new TiepointError("cli/compare", `cannot read the earlier report: ${why}`, { file: path });
  }
  return parseCheckReport(text, path);
}

/** A progress reporter for runCheck's onProgress: draws on stderr when it is a terminal, else does nothing. */
export function progressReporter(stream: NodeJS.WriteStream = process.stderr): { onProgress?: (done: number, total: number) => void; finish(): void } {
  if (!stream.isTTY) return { finish() {} };
  const t0 = performance.now();
  let last = -Infinity;
  let drawn = false;
  return {
    onProgress(done, total) {
      const now = performance.now();
      if (done < total && now - last < 80) return;
      last = now;
      drawn = true;
      const width = Math.max(10, Math.min(30, (stream.columns ?? 80) - 50));
      stream.write(`\r\x1b[2K${progressLine(done, total, now - t0, { width })}`);
    },
    finish() {
      if (drawn) stream.write("\r\x1b[2K");
    },
  };
}

/** What {@link renderReport} needs besides the report. */
export interface RenderReportOptions {
  readonly format: ReportFormat;
  /** The earlier report of `--compare`. */
  readonly earlier?: CheckReport;
  /** Where labels of path entities and relations come from (the session's catalog). */
  readonly labels?: LabelSource;
  /** Shown under the HTML title. */
  readonly subtitle?: string;
  /** Suggested clues per question (HTML only); see {@link suggestionsBySession}. */
  readonly suggestions?: (item: CheckItem) => readonly string[];
}

/**
 * Suggested clues for the HTML report: the tied and weak questions of `items` are asked once
 * more in the same session (answers are deterministic; an attached catalog pulls from its
 * store again) to read the explanation's suggestions, which the contract document does not carry.
 */
export async function suggestionsBySession(session: Session, top: number, items: readonly CheckItem[]): Promise<(item: CheckItem) => readonly string[]> {
  const by = new Map<CheckItem, readonly string[]>();
  for (const item of items) {
    const st = item.answer.verdict.status;
    if (st !== "tied" && st !== "weak") continue;
    const sg = (await session.askAsync(item.question, { top })).explanation?.suggestions ?? [];
    by.set(item, sg.map((x) => (x.rulesOut.length > 0 ? `${x.text} (rules out ${x.rulesOut.length} rival${x.rulesOut.length === 1 ? "" : "s"})` : x.text)));
  }
  return (item) => by.get(item) ?? [];
}

/** The report document in the chosen format, and the comparison text for stderr when the format has no place for it. */
export async function renderReport(report: CheckReport, options: RenderReportOptions): Promise<{ text: string; aside?: string }> {
  const comparison: ReportComparison | undefined = options.earlier ? compareReports(options.earlier, report) : undefined;
  switch (options.format) {
    case "json":
      return { text: comparison ? JSON.stringify({ ...report, disclaimer: DISCLAIMER, comparison }, null, 2) + "\n" : checkJson(report) };
    case "tsv":
      return { text: renderCheckTsv(report), ...(comparison ? { aside: renderComparisonText(comparison) + "\n" } : {}) };
    case "md":
      return { text: renderCheckMd(report, comparison ? { comparison } : {}) };
    case "html":
      return {
        text: await checkHtml(report, {
          ...(comparison ? { comparison } : {}),
          ...(options.labels ? { labels: catalogLabels(options.labels) } : {}),
          ...(options.subtitle ? { subtitle: options.subtitle } : {}),
          ...(options.suggestions ? { suggestions: options.suggestions } : {}),
        }),
      };
    default:
      return { text: renderCheckText(report, comparison ? { comparison } : {}) };
  }
}

/** Writes a document to `--out FILE` (atomically) or to stdout. */
export function emit(text: string, out: string | undefined): void {
  if (out !== undefined) writeFileAtomic(out, text);
  else process.stdout.write(text);
}

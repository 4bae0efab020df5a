/**
 * Which checked questions need a look, and why: misses of the expected answer, ties, weak or
 * empty verdicts, and mentions linked with low confidence. Shared by every report format.
 *
 * The rules read only the check document (contract fields), so a report written earlier can
 * be reviewed again. The low-confidence threshold is a choice of ours (an even-odds link,
 * 0.5), configurable.
 */
import type { CheckItem, CheckReport, VerdictCheck, VerdictStatus } from "../model/index.js";

/** Options of {@link reviewItem}; all optional. */
export interface ReviewOptions {
  /** A mention whose confidence is below this is flagged. @default 0.5 */
  readonly lowConfidence?: number;
}

/** Defaults of {@link ReviewOptions}. */
export const REVIEW_DEFAULTS = { lowConfidence: 0.5 } as const;

/** Why a question needs a look. */
export type ReviewKind = "miss" | "tied" | "weak" | "none" | "low-confidence" | "verdict";

/** One reason a question needs a look. */
export interface ReviewFlag {
  readonly kind: ReviewKind;
  /** A short phrase for people, e.g. `expected v:heron at rank 3`. */
  readonly detail: string;
}

/** A question with its reasons, for the "needs a look" list. */
export interface ReviewEntry {
  readonly item: CheckItem;
  readonly flags: readonly ReviewFlag[];
}

/** The reasons one checked question needs a look (empty when it does not). */
export function reviewItem(item: CheckItem, options: ReviewOptions = {}): readonly ReviewFlag[] {
  const low = options.lowConfidence ?? REVIEW_DEFAULTS.lowConfidence;
  const flags: ReviewFlag[] = [];
  const a = item.answer;
  if (item.expected.length > 0 && !item.hit) {
    const exp = item.expected.join(" | ");
    const absent = item.unknownExpected && item.unknownExpected.length > 0 ? ` (not in the catalog: ${item.unknownExpected.join(", ")})` : "";
    flags.push({
      kind: "miss",
      detail: (item.rank === null ? `expected ${exp}, not among the ${a.answers.length} answers` : `expected ${exp} at rank ${item.rank}`) + absent,
    });
  }
  const v = a.verdict;
  const mismatch = verdictMismatch(item);
  if (mismatch !== null) flags.push({ kind: "verdict", detail: mismatch });
  if (v.status === "tied") {
    const named = v.tiedWith.map((id) => {
      const x = a.answers.find((y) => y.id === id);
      return x ? `${x.label} (${id})` : id;
    });
    flags.push({ kind: "tied", detail: named.length > 0 ? `tied with ${named.join(", ")}` : "several answers fit as well" });
  }
  if (v.status === "weak") flags.push({ kind: "weak", detail: v.reason ?? `small lead (margin ${v.margin.toFixed(2)})` });
  if (v.status === "none") flags.push({ kind: "none", detail: v.reason ?? (a.mentions.length === 0 ? "nothing linked" : "no answer reached") });
  for (const m of a.mentions) {
    if (m.confidence < low) flags.push({ kind: "low-confidence", detail: `"${m.text}" → ${m.entity.label} (${m.confidence.toFixed(2)})` });
  }
  return flags;
}

/** Every question of a report that needs a look, in file order. */
export function reviewReport(report: CheckReport, options: ReviewOptions = {}): readonly ReviewEntry[] {
  const out: ReviewEntry[] = [];
  for (const item of report.results) {
    const flags = reviewItem(item, options);
    if (flags.length > 0) out.push({ item, flags });
  }
  return out;
}

/** The lowest mention confidence of a question (null when nothing linked). */
export function weakestLink(item: CheckItem): number | null {
  let min: number | null = null;
  for (const m of item.answer.mentions) if (min === null || m.confidence < min) min = m.confidence;
  return min;
}

/** `hit`, `miss`, or `-` when the question carries no expected answer. */
export function outcomeWord(item: CheckItem): "hit" | "miss" | "-" {
  if (item.expected.length === 0) return "-";
  return item.hit ? "hit" : "miss";
}

/**
 * The verdict mismatch of a question in words ("verdict unique, but 2 answers were
 * expected"), or null when the file expects no verdict or the verdict is the expected one.
 */
export function verdictMismatch(item: CheckItem): string | null {
  const want = item.expectedVerdict;
  const got = item.answer.verdict.status;
  if (want === undefined || want === got) return null;
  const n = item.expected.length;
  const expectation =
    want === "tied" ? (n >= 2 ? `${n} answers were expected` : "a tie was expected") : want === "unique" ? "one answer was expected" : want === "none" ? "no answer was expected" : "a weak verdict was expected";
  return `verdict ${got}, but ${expectation}`;
}

/** The verdict statuses in report order (rows and columns of the confusion matrix). */
export const VERDICT_ORDER: readonly VerdictStatus[] = ["unique", "tied", "weak", "none"];

/** The confusion matrix as rows of cells: a header row (`expected \ got`, the statuses, `total`), then one row per expected status. */
export function confusionRows(vc: VerdictCheck): string[][] {
  const rows = [["expected \\ got", ...VERDICT_ORDER, "total"]];
  for (const e of VERDICT_ORDER) {
    const r = vc.confusion[e];
    rows.push([e, ...VERDICT_ORDER.map((g) => String(r[g])), String(VERDICT_ORDER.reduce((a, g) => a + r[g], 0))]);
  }
  return rows;
}

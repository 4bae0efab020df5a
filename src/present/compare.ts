/**
 * What changed between two runs of `check`: answers that moved, verdicts that changed, new
 * and fixed misses, questions added or removed, and the summary figures before and after.
 *
 * A pure function on two check documents (contract JSON of `check --json`). Questions are
 * matched by their text (whitespace collapsed); a text that occurs several times is matched
 * occurrence by occurrence, in file order.
 */
import type { CheckItem, CheckReport, CheckSummary, EntityRef, VerdictStatus } from "../model/index.js";
import { TiepointError } from "../model/index.js";

/** A question present in both runs. */
export interface ComparedQuestion {
  readonly question: string;
  /** Line in the new run's file. */
  readonly line: number;
  /** Line in the old run's file. */
  readonly oldLine: number;
}

/** A question whose best answer or expected-answer rank changed. */
export interface AnswerMove extends ComparedQuestion {
  readonly before: EntityRef | null;
  readonly after: EntityRef | null;
  readonly rankBefore: number | null;
  readonly rankAfter: number | null;
}

/** A question whose verdict changed. */
export interface VerdictChange extends ComparedQuestion {
  readonly before: VerdictStatus;
  readonly after: VerdictStatus;
}

/** A question whose hit/miss outcome changed. */
export interface OutcomeChange extends ComparedQuestion {
  readonly rankBefore: number | null;
  readonly rankAfter: number | null;
}

/** The differences between an old and a new check report. */
export interface ReportComparison {
  /** Questions found in both runs. */
  readonly matched: number;
  readonly moved: readonly AnswerMove[];
  readonly verdictChanges: readonly VerdictChange[];
  /** Hit before, miss now. */
  readonly newMisses: readonly OutcomeChange[];
  /** Miss before, hit now. */
  readonly fixedMisses: readonly OutcomeChange[];
  /** Questions only in the new run (with their lines). */
  readonly added: readonly { readonly line: number; readonly question: string }[];
  /** Questions only in the old run (with their old lines). */
  readonly removed: readonly { readonly line: number; readonly question: string }[];
  readonly before: CheckSummary;
  readonly after: CheckSummary;
}

function key(q: string): string {
  return q.trim().replace(/\s+/g, " ");
}

function top(item: CheckItem): EntityRef | null {
  const a = item.answer.answers[0];
  return a ? { id: a.id, label: a.label } : null;
}

/** Compares an old check report with a new one (see the file header). */
export function compareReports(old: CheckReport, now: CheckReport): ReportComparison {
  const pool = new Map<string, CheckItem[]>();
  for (const it of old.results) {
    const list = pool.get(key(it.question)) ?? [];
    list.push(it);
    pool.set(key(it.question), list);
  }
  const moved: AnswerMove[] = [];
  const verdictChanges: VerdictChange[] = [];
  const newMisses: OutcomeChange[] = [];
  const fixedMisses: OutcomeChange[] = [];
  const added: { line: number; question: string }[] = [];
  let matched = 0;
  for (const it of now.results) {
    const prev = pool.get(key(it.question))?.shift();
    if (!prev) {
      added.push({ line: it.line, question: it.question });
      continue;
    }
    matched++;
    const base = { question: it.question, line: it.line, oldLine: prev.line };
    const b = top(prev);
    const a = top(it);
    if ((b?.id ?? null) !== (a?.id ?? null) || prev.rank !== it.rank) moved.push({ ...base, before: b, after: a, rankBefore: prev.rank, rankAfter: it.rank });
    if (prev.answer.verdict.status !== it.answer.verdict.status) verdictChanges.push({ ...base, before: prev.answer.verdict.status, after: it.answer.verdict.status });
    const counted = it.expected.length > 0 && prev.expected.length > 0;
    if (counted && prev.hit && !it.hit) newMisses.push({ ...base, rankBefore: prev.rank, rankAfter: it.rank });
    if (counted && !prev.hit && it.hit) fixedMisses.push({ ...base, rankBefore: prev.rank, rankAfter: it.rank });
  }
  const removed = [...pool.values()].flat().map((it) => ({ line: it.line, question: it.question })).sort((x, y) => x.line - y.line);
  return { matched, moved, verdictChanges, newMisses, fixedMisses, added, removed, before: old.summary, after: now.summary };
}

const STATUSES: readonly VerdictStatus[] = ["unique", "tied", "weak", "none"];

/**
 * Reads and checks a saved `check --json` document. Throws a `report/compare` TiepointError
 * naming the file and the first field that is wrong.
 */
export function parseCheckReport(text: string, file: string): CheckReport {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new TiepointError("report/compare", `not a JSON document (${(e as Error).message})`, { file });
  }
  const fail = (field: string, want: string): never => {
    throw new TiepointError("report/compare", `not a check report: ${field} should be ${want} (write one with: tiepoint check FILE --json)`, { file });
  };
  const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
  if (!isObj(doc)) return fail("the document", "an object");
  if (!Array.isArray(doc.results)) return fail("results", "an array");
  doc.results.forEach((r: unknown, i: number) => {
    const at = `results[${i}]`;
    if (!isObj(r)) return fail(at, "an object");
    if (typeof r.line !== "number") fail(`${at}.line`, "a number");
    if (typeof r.question !== "string") fail(`${at}.question`, "a string");
    if (!Array.isArray(r.expected)) fail(`${at}.expected`, "an array");
    if (r.rank !== null && typeof r.rank !== "number") fail(`${at}.rank`, "a number or null");
    if (typeof r.hit !== "boolean") fail(`${at}.hit`, "true or false");
    const a = r.answer;
    if (!isObj(a)) return fail(`${at}.answer`, "an object");
    if (!Array.isArray(a.answers)) fail(`${at}.answer.answers`, "an array");
    if (!Array.isArray(a.mentions)) fail(`${at}.answer.mentions`, "an array");
    const v = a.verdict;
    if (!isObj(v) || !STATUSES.includes(v.status as VerdictStatus)) fail(`${at}.answer.verdict.status`, `one of ${STATUSES.join(", ")}`);
    return undefined;
  });
  const s = doc.summary;
  if (!isObj(s)) return fail("summary", "an object");
  for (const f of ["questions", "withExpected", "hits1", "hits5", "mrr", "seconds"] as const) if (typeof s[f] !== "number") fail(`summary.${f}`, "a number");
  if (!isObj(s.verdicts)) fail("summary.verdicts", "an object");
  return doc as unknown as CheckReport;
}

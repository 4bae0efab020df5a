/**
 * Question files (contract.md, `check`), in two layouts chosen by the file name:
 *
 * - **lines** (any name but `*.csv`): one question per line, or TSV `question<TAB>expected`
 *   with expected `id1|id2|…` (entity ids or exact labels), optionally a third field, the
 *   expected verdict (`question<TAB>expected<TAB>verdict`; an empty expected field with verdict
 *   `none` means "no answer expected"). Blank lines and lines whose first non-blank character
 *   is `#` are skipped.
 * - **CSV** (`*.csv`, RFC 4180 via csv-parse): a header row naming the columns `question`
 *   (required), `expected` (optional, `id1|id2|…` as above) and `verdict` (optional: unique,
 *   tied, weak or none, the verdict the question should get); other columns are refused.
 *   Blank lines and lines starting with `#` are skipped.
 *
 * Each question keeps its 1-based line number. Every bad line is reported (up to
 * {@link DEFAULTS}.maxErrors), as `FILE:LINE: message`; a file with no question is an error.
 */
import { readFileSync, statSync } from "node:fs";
import { extname } from "node:path";
import { createRequire } from "node:module";
import type { parse as csvParseSync } from "csv-parse/sync";
import { LIMITS, TiepointError, checkQuestionLength, type VerdictStatus } from "../model/index.js";

/** Limits of question-file parsing. */
export const DEFAULTS = {
  /** Bad lines reported before parsing stops (the same figure as `load`'s). */
  maxErrors: 50,
};

/** One question of a question file. */
export interface QuestionItem {
  /** 1-based line in the file. */
  readonly line: number;
  readonly question: string;
  /** Expected ids or labels (empty when the line gives none). */
  readonly expected: readonly string[];
  /** The verdict the question should get (CSV `verdict` column), when given. */
  readonly verdict?: VerdictStatus;
}

/** The layouts of a question file. */
export type QuestionLayout = "lines" | "csv";

const VERDICTS: readonly VerdictStatus[] = ["unique", "tied", "weak", "none"];
const CSV_COLUMNS = ["question", "expected", "verdict"] as const;

/** The layout of a question file by its name: `*.csv` is CSV, anything else lines. */
export function questionLayout(file: string): QuestionLayout {
  return extname(file).toLowerCase() === ".csv" ? "csv" : "lines";
}

/** Collects the errors of one file; stops (throws) at the limit. */
class Problems {
  readonly list: TiepointError[] = [];
  constructor(readonly file: string) {}
  add(line: number, message: string, code = "pipeline/questions"): void {
    this.list.push(new TiepointError(code, message, { file: this.file, line }));
    if (this.list.length >= DEFAULTS.maxErrors) this.fail(`stopped after ${DEFAULTS.maxErrors} errors; no question was run`);
  }
  /** Throws the collected errors (the first, with the others and `last` in `more`). */
  fail(last: string): never {
    const [first, ...rest] = this.list;
    const tail = new TiepointError("pipeline/questions", last, { file: this.file });
    if (!first) throw tail;
    throw new TiepointError(first.code, first.message, { file: first.file, line: first.line, more: [...rest, tail] });
  }
}

const splitExpected = (cell: string): string[] =>
  cell
    .split("|")
    .map((s) => s.trim())
    .filter((s) => s !== "");

/** An expected-verdict cell: the status, undefined when empty, null (reported) when not a status. */
function verdictCell(cell: string, line: number, problems: Problems): VerdictStatus | undefined | null {
  const v = cell.trim().toLowerCase();
  if (v === "") return undefined;
  if ((VERDICTS as readonly string[]).includes(v)) return v as VerdictStatus;
  problems.add(line, `verdict ${JSON.stringify(cell)}: expected one of ${VERDICTS.join(", ")} (or an empty cell)`);
  return null;
}

/** Checks one question and adds it (or its problem). */
function take(items: QuestionItem[], problems: Problems, line: number, question: string, expected: readonly string[], empty: string, verdict?: VerdictStatus): void {
  if (question === "") {
    problems.add(line, empty);
    return;
  }
  if (question.length > LIMITS.maxQuestionChars) {
    try {
      checkQuestionLength(question);
    } catch (e) {
      problems.add(line, (e as Error).message, "pipeline/limit");
    }
    return;
  }
  if (items.length >= LIMITS.maxQuestions)
    throw new TiepointError("pipeline/limit", `more than ${LIMITS.maxQuestions} questions in one file (split it into smaller files)`, { file: problems.file, line });
  items.push({ line, question, expected, ...(verdict ? { verdict } : {}) });
}

function parseLines(text: string, problems: Problems): QuestionItem[] {
  const items: QuestionItem[] = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = i + 1;
    if (raw.trim() === "" || raw.trimStart().startsWith("#")) return;
    const fields = raw.split("\t");
    if (fields.length > 3) {
      problems.add(line, "more than three tab-separated fields (expected: question<TAB>id1|id2|…<TAB>verdict)");
      return;
    }
    const v = verdictCell(fields[2] ?? "", line, problems);
    if (v === null) return;
    take(items, problems, line, fields[0]!.trim(), splitExpected(fields[1] ?? ""), "empty question before the tab", v);
  });
  return items;
}

function parseCsvText(text: string, problems: Problems): QuestionItem[] {
  // csv-parse is loaded here, on the first CSV question file, not with every command (its CommonJS build: the same parser)
  const parseCsv = (createRequire(import.meta.url)("csv-parse/sync") as { parse: typeof csvParseSync }).parse;
  // records are kept as they come (on_record), so the rows before a syntax error are still checked
  const records: { record: string[]; info: { lines: number } }[] = [];
  let syntax: { line: number; message: string } | undefined;
  try {
    parseCsv(text, {
      relax_column_count: true,
      skip_empty_lines: true,
      comment: "#",
      comment_no_infix: true,
      on_record: (record: string[], context: { lines: number }) => {
        records.push({ record, info: { lines: context.lines } });
        return null;
      },
    });
  } catch (e) {
    const err = e as Error & { lines?: number };
    const last = records.at(-1)?.info.lines ?? 0;
    syntax = { line: Math.min(last + 1, err.lines ?? last + 1), message: `CSV syntax error in the record starting here: ${err.message.replace(/^Invalid [A-Za-z ]+: /, "")}` };
  }
  const lineOf = (r: { record: string[]; info: { lines: number } }) => r.info.lines - r.record.reduce((n, c) => n + (c.match(/\n/g)?.length ?? 0), 0);
  const items = csvRows(records, lineOf, problems);
  if (syntax) problems.add(syntax.line, syntax.message);
  return items;
}

function csvRows(records: readonly { record: string[]; info: { lines: number } }[], lineOf: (r: { record: string[]; info: { lines: number } }) => number, problems: Problems): QuestionItem[] {
  const head = records[0];
  if (!head) return [];
  const names = head.record.map((c) => c.trim().toLowerCase());
  const headLine = lineOf(head);
  const col = new Map<string, number>();
  names.forEach((n, i) => {
    if (!(CSV_COLUMNS as readonly string[]).includes(n))
      problems.add(headLine, `CSV header: column ${i + 1} is ${JSON.stringify(head.record[i])}; a question file's columns are question, expected and verdict (the first row must name them)`);
    else if (col.has(n)) problems.add(headLine, `CSV header: column "${n}" appears twice`);
    else col.set(n, i);
  });
  if (!col.has("question") && problems.list.length === 0) problems.add(headLine, "CSV header: no question column (the first row must name the columns: question, expected, verdict)");
  if (problems.list.length > 0) return [];
  const q = col.get("question")!;
  const ex = col.get("expected");
  const vd = col.get("verdict");
  const items: QuestionItem[] = [];
  for (const r of records.slice(1)) {
    const line = lineOf(r);
    if (r.record.length > names.length) {
      problems.add(line, `${r.record.length} cells, but the header names ${names.length} columns (quote a cell that holds a comma: "…, …")`);
      continue;
    }
    const v = verdictCell(vd !== undefined ? (r.record[vd] ?? "") : "", line, problems);
    if (v === null) continue;
    take(items, problems, line, (r.record[q] ?? "").trim(), splitExpected(ex !== undefined ? (r.record[ex] ?? "") : ""), "the question cell is empty", v);
  }
  return items;
}

/** Parses question-file text; `file` names it in error messages, `layout` defaults to the one of its name. */
export function parseQuestionText(text: string, file: string, layout: QuestionLayout = questionLayout(file)): QuestionItem[] {
  const problems = new Problems(file);
  const body = text.replace(/^\uFEFF/, "");
  const items = layout === "csv" ? parseCsvText(body, problems) : parseLines(body, problems);
  const n = problems.list.length;
  // one bad line is one line of output; several get a count after them
  if (n === 1) throw problems.list[0]!;
  if (n > 1) problems.fail(`${n} bad lines; no question was run`);
  if (items.length === 0)
    throw new TiepointError(
      "pipeline/questions",
      layout === "csv" ? "no questions: the file has a header row at most (question,expected,verdict) and no question rows" : "no questions: the file has only blank lines and # comments",
      { file },
    );
  return items;
}

/** Reads and parses a question file. */
export function parseQuestionFile(path: string): QuestionItem[] {
  let text: string;
  try {
    const size = statSync(path).size;
    if (size > LIMITS.maxQuestionFileBytes)
      throw new TiepointError("pipeline/limit", `the question file is ${size} bytes; the limit is ${LIMITS.maxQuestionFileBytes} bytes (split it into smaller files)`, { file: path });
    text = readFileSync(path, "utf8");
  } catch (e) {
    if (e instanceof TiepointError) throw e;
    const code = (e as { code?: string }).code;
    const why = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a directory, not a question file" : `cannot read (${(e as Error).message})`;
    throw new TiepointError("pipeline/questions", why, { file: path });
  }
  if (text.includes("\u0000")) throw new TiepointError("pipeline/questions", "not a text file", { file: path });
  return parseQuestionText(text, path);
}

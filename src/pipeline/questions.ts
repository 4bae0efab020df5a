/**
 * Question files (contract.md, `check`): one question per line, or TSV
 * `question<TAB>expected` with expected `id1|id2|…` (entity ids or exact labels). Blank lines
 * and lines starting with `#` are skipped; each question keeps its 1-based line number.
 */
import { readFileSync, statSync } from "node:fs";
import { LIMITS, TiepointError, checkQuestionLength } from "../model/index.js";

/** One question of a question file. */
export interface QuestionItem {
  /** 1-based line in the file. */
  readonly line: number;
  readonly question: string;
  /** Expected ids or labels (empty when the line gives none). */
  readonly expected: readonly string[];
}

/** Parses question-file text; `file` names it in error messages. */
export function parseQuestionText(text: string, file: string): QuestionItem[] {
  const items: QuestionItem[] = [];
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  lines.forEach((raw, i) => {
    const line = i + 1;
    if (raw.trim() === "" || raw.trimStart().startsWith("#")) return;
    const tab = raw.indexOf("\t");
    const question = (tab < 0 ? raw : raw.slice(0, tab)).trim();
    const rest = tab < 0 ? "" : raw.slice(tab + 1);
    if (question === "") throw new TiepointError("pipeline/questions", "empty question before the tab", { file, line });
    checkQuestionLength(question, { file, line });
    if (items.length >= LIMITS.maxQuestions) throw new TiepointError("pipeline/limit", `more than ${LIMITS.maxQuestions} questions in one file (split it into smaller files)`, { file, line });
    if (rest.includes("\t")) throw new TiepointError("pipeline/questions", "more than two tab-separated fields (expected: question<TAB>id1|id2|…)", { file, line });
    const expected = rest
      .split("|")
      .map((s) => s.trim())
      .filter((s) => s !== "");
    items.push({ line, question, expected });
  });
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

/**
 * The reading of a question in one line, shared by the text output and the terminal screen:
 * the query graph's own rendering (analysis `readingText`, carried in `ask --json` as
 * `reading.text`), how many entities satisfy it, and the question words it does not use.
 */
import type { ReadingDoc } from "../model/index.js";

/** How the ranking fared with the reading: "  [2 fit]", "  [no entity fits it all: PageRank order]", or "" when not evaluated. */
export function readingState(rd: ReadingDoc): string {
  if (rd.matched === undefined || rd.matched === null) return "";
  if (rd.fallback) return "  [no entity fits it all: PageRank order]";
  return `  [${rd.matched} fit${rd.matched === 1 ? "s" : ""}]`;
}

/** The reading's text with its state. */
export function readingLine(rd: ReadingDoc): string {
  return `${rd.text}${readingState(rd)}`;
}

/** The words the reading does not use, quoted ("'exactly', 'one'"); "" when none. */
export function ignoredLine(rd: ReadingDoc): string {
  return rd.ignored.map((w) => `'${w}'`).join(", ");
}

/**
 * How the screen's rows and columns are shared out, as a pure function of the terminal
 * size and what there is to show. At 80×24 everything stacks; from 120 columns the answers
 * and the detail area sit side by side; extra rows go to the answers and the detail.
 */

/** Options of {@link layoutFor}. */
export const DEFAULTS = {
  /** Narrowest width laid out; below it lines are cut. */
  minColumns: 40,
  /** Fewest rows laid out. */
  minRows: 12,
  /** Width from which answers and detail sit side by side. */
  sideBySideColumns: 120,
  /** Share of the width given to the answers when side by side. */
  answersShare: 0.42,
} as const;

/** What the layout must make room for. */
export interface LayoutNeeds {
  /** Linked mentions of the shown question. */
  readonly mentions: number;
  /** Candidate rows to show under the selected mention (0 when the links pane is not focused). */
  readonly candidates: number;
  /** Answers of the shown question. */
  readonly answers: number;
  /** Rows of the marked question (1 or 2). @default 1 */
  readonly questionRows?: number;
  /** Rows of the reading (0: none; 1; 2 with the words it ignores). @default 0 */
  readonly readingRows?: number;
}

/** Rows and columns for each part of the main view. */
export interface Layout {
  readonly columns: number;
  readonly rows: number;
  /** Answers and detail side by side. */
  readonly sideBySide: boolean;
  /** Rows of the links list (mentions plus candidates). */
  readonly mentionRows: number;
  /** Rows of the answer list. */
  readonly answerRows: number;
  /** Rows of the detail area, its tab bar included. */
  readonly detailRows: number;
  /** Columns of the answer list. */
  readonly answersWidth: number;
  /** Columns of the detail area. */
  readonly detailWidth: number;
  /** Rows for a full-area view (entity card, help) between the question line and the hint. */
  readonly bodyRows: number;
}

/** Fixed rows: title, question line, verdict, message, key hint (the marked question adds 1 or 2, the reading 0 to 2). */
const FIXED = 5;

/** Lays out the main view for a terminal of `columns` × `rows`. */
export function layoutFor(columns: number, rows: number, needs: LayoutNeeds): Layout {
  const cols = Math.max(DEFAULTS.minColumns, Math.floor(columns));
  const rws = Math.max(DEFAULTS.minRows, Math.floor(rows));
  const bodyRows = rws - 3; // title, question line, hint
  const mentionCap = rws >= 40 ? 6 : 3;
  const candidateCap = rws >= 40 ? 8 : 4;
  const mentionRows = Math.min(needs.mentions, mentionCap) + Math.min(needs.candidates, candidateCap);
  const questionRows = Math.min(2, Math.max(1, needs.questionRows ?? 1));
  const readingRows = Math.min(2, Math.max(0, needs.readingRows ?? 0));
  const rest = Math.max(4, rws - FIXED - questionRows - mentionRows - readingRows);
  const sideBySide = cols >= DEFAULTS.sideBySideColumns;
  if (sideBySide) {
    const answersWidth = Math.floor(cols * DEFAULTS.answersShare);
    return { columns: cols, rows: rws, sideBySide, mentionRows, answerRows: rest, detailRows: rest, answersWidth, detailWidth: cols - answersWidth - 1, bodyRows };
  }
  const wanted = Math.max(1, needs.answers);
  const answerRows = Math.min(wanted, Math.max(3, Math.min(10, Math.floor(rest * 0.4))));
  return { columns: cols, rows: rws, sideBySide, mentionRows, answerRows, detailRows: rest - answerRows, answersWidth: cols, detailWidth: cols, bodyRows };
}

/**
 * Presenters: the same AskResult / CheckReport rendered as text, JSON and reports.
 */
export { renderAskText, ASK_TEXT_DEFAULTS } from "./text.js";
export { readingLine, readingState, ignoredLine } from "./reading-line.js";
export type { AskTextOptions } from "./text.js";
export { askJson, checkJson } from "./json.js";
export { renderCheckText } from "./report-text.js";
export type { ReportOptions } from "./report-text.js";
export { renderItemText, renderSummaryText, renderComparisonText, REPORT_DEFAULTS } from "./report-text.js";
export { reviewItem, reviewReport, weakestLink, REVIEW_DEFAULTS } from "./report-review.js";
export type { ReviewOptions, ReviewFlag, ReviewKind, ReviewEntry } from "./report-review.js";
export { renderCheckTsv, TSV_COLUMNS, TSV_DEFAULTS } from "./report-tsv.js";
export type { TsvOptions } from "./report-tsv.js";
export { renderCheckMd } from "./report-md.js";
export { checkHtml, renderCheckHtml, evidenceDrawings, escapeHtml, HTML_DEFAULTS } from "./report-html.js";
export type { HtmlOptions } from "./report-html.js";
export { compareReports, parseCheckReport } from "./compare.js";
export type { ReportComparison, AnswerMove, VerdictChange, OutcomeChange, ComparedQuestion } from "./compare.js";
export { evidenceDot, evidenceGraph, graphToDot, dotUnescape, catalogLabels, NO_LABELS, DOT_DEFAULTS } from "./dot.js";
export type { EvidenceDotOptions, EvidenceGraph, EvidenceNode, EvidenceEdge, EvidenceRole, LabelBook, LabelSource } from "./dot.js";
export { dotToSvg, dotsToSvg, parseDot, SVG_DEFAULTS } from "./graph-svg.js";
export type { SvgOptions, ParsedDot, ParsedDotNode, ParsedDotEdge } from "./graph-svg.js";
export { progressLine, PROGRESS_DEFAULTS } from "./report-progress.js";
export type { ProgressOptions } from "./report-progress.js";
export { renderExplanationText, renderCoverageText, renderAblationText, renderSuggestionsText, renderWhyNotText, pathChain, EXPLAIN_TEXT_DEFAULTS } from "./explain-text.js";
export type { ExplainTextOptions } from "./explain-text.js";
export { renderCompositionText, renderProposalText, compositionDoc, compositionJson, renderComposeTsv } from "./compose-text.js";

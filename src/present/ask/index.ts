/**
 * The presenters one `ask` prints with (text, JSON, DOT), without the report writers of
 * `check` and `compose` (HTML, Markdown, TSV, review, comparison, drawings): the `ask`
 * command imports this index instead of ../index.ts, so its process reads 124 JavaScript
 * modules instead of 133 at start-up (issue 19: a single `ask` on a small catalog). Each
 * export is the same function ../index.ts exports.
 */
export { renderAskText } from "../text.js";
export { askJson } from "../json.js";
export { evidenceDot, catalogLabels } from "../dot.js";
export { renderExplanationText } from "../explain-text.js";

/**
 * The check report as ONE self-contained HTML page: summary, questions that need a look,
 * changes since an earlier run, a sortable table of questions, and per question its linked
 * mentions, answers with their paths, verdict, suggested clues and a drawing of its evidence
 * graph (DOT written by ./dot.ts, laid out by Graphviz in ./graph-svg.ts, inlined as SVG).
 *
 * No network: no external scripts, styles, fonts or images; a Content-Security-Policy that
 * allows only the page's own inline style and its one inline script, pinned by its SHA-256
 * "hash-source" (W3C Content Security Policy Level 2, https://www.w3.org/TR/CSP2/, from
 * memory), so even a label that slipped through escaping could not run. Every value from
 * the catalog or the question file is HTML-escaped (`& < > " '`); the SVG text is escaped by
 * Graphviz itself.
 */
import { createHash } from "node:crypto";
import type { Answer, AnswerPath, AskResult, CheckItem, CheckReport, VerdictStatus } from "../model/index.js";
import { DISCLAIMER } from "../model/index.js";
import { labelFromId } from "../catalog/index.js";
import type { ReportComparison } from "./compare.js";
import { evidenceDot, NO_LABELS, type LabelBook } from "./dot.js";
import { dotToSvg } from "./graph-svg.js";
import { confusionRows, outcomeWord, reviewItem, reviewReport, weakestLink } from "./report-review.js";
import { outcomePhrase, rate, REPORT_DEFAULTS, timing, type ReportOptions } from "./report-text.js";

/** Options of {@link renderCheckHtml} and {@link checkHtml}; all optional. */
export interface HtmlOptions extends ReportOptions {
  /** Page title. @default "tiepoint check report" */
  readonly title?: string;
  /** Label lookups for path entities and relations. */
  readonly labels?: LabelBook;
  /** Answers drawn in each evidence graph (more when the verdict ties more). @default 3 */
  readonly drawAnswers?: number;
  /** Drawings up to this many points wide sit beside the text; wider ones go below it. @default 540 */
  readonly sideBySideWidth?: number;
  /** A line under the title, e.g. the question file and catalog. */
  readonly subtitle?: string;
  /**
   * Suggested clues of a question (phrases a writer could add), used when its answer document
   * carries none itself (the explanation stage keeps them beside the contract document).
   */
  readonly suggestions?: (item: CheckItem) => readonly string[];
}

/** Defaults of {@link HtmlOptions}. */
export const HTML_DEFAULTS = {
  title: "tiepoint check report",
  drawAnswers: 3,
  sideBySideWidth: 540,
  /** The verdict bar's full width (CSS max-width), in CSS pixels. */
  barWidthPx: 760,
  /** Width allowed per label character in the bar (12 px sans-serif: ~7 px, common practice, with room). */
  barCharPx: 7.5,
  /** Horizontal padding of a bar segment, each side. */
  barPaddingPx: 6,
} as const;

/** Escapes text for HTML content and quoted attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

const h = escapeHtml;

/** A suggested clue's text, from an answer document that carries suggestions (additive field). */
export function suggestionTexts(answer: AskResult): string[] {
  const raw = (answer as AskResult & { readonly suggestions?: unknown }).suggestions;
  if (!Array.isArray(raw)) return [];
  const out: string[] = [];
  for (const s of raw as unknown[]) {
    if (typeof s === "string") out.push(s);
    else if (typeof s === "object" && s !== null) {
      const o = s as Record<string, unknown>;
      const t = [o.clue, o.text, o.phrase, o.label].find((x) => typeof x === "string");
      if (typeof t === "string") out.push(t);
    }
  }
  return out;
}

/** How many answers a question's drawing shows: the option, or every tied one. */
function drawCount(a: AskResult, n: number): number {
  return Math.max(n, a.verdict.status === "tied" ? 1 + a.verdict.tiedWith.length : 1);
}

/** Renders each question's evidence graph to SVG (null when there is nothing to draw). */
export async function evidenceDrawings(report: CheckReport, options: HtmlOptions = {}): Promise<(string | null)[]> {
  const out: (string | null)[] = [];
  for (const it of report.results) {
    const a = it.answer;
    if (a.mentions.length === 0 && a.answers.length === 0) {
      out.push(null);
      continue;
    }
    const dot = evidenceDot(a, { answers: drawCount(a, options.drawAnswers ?? HTML_DEFAULTS.drawAnswers), labels: options.labels, name: `q${it.line}` });
    out.push(await dotToSvg(dot));
  }
  return out;
}

/** Builds the page: draws every evidence graph with Graphviz, then renders the HTML. */
export async function checkHtml(report: CheckReport, options: HtmlOptions = {}): Promise<string> {
  return renderCheckHtml(report, await evidenceDrawings(report, options), options);
}

const VERDICT_NAMES: readonly VerdictStatus[] = ["unique", "tied", "weak", "none"];

/** A path as a chain `A —rel→ B ←rel— C` (labels; ids in the title attribute). */
function pathHtml(p: AnswerPath, entity: (id: string) => string, relation: (id: string) => string): string {
  const parts = [`<span class="ent" title="${h(p.from)}">${h(entity(p.from))}</span>`];
  for (const s of p.steps) {
    const rel = `<span class="rel" title="${h(s.relation)}">${h(relation(s.relation))}</span>`;
    parts.push(s.inverse ? `<span class="arrow">←</span>${rel}<span class="arrow">—</span>` : `<span class="arrow">—</span>${rel}<span class="arrow">→</span>`);
    parts.push(`<span class="ent" title="${h(s.to)}">${h(entity(s.to))}</span>`);
  }
  return `<li class="path">${parts.join(" ")} <span class="hops">${p.steps.length} hop${p.steps.length === 1 ? "" : "s"}</span></li>`;
}

function badge(status: VerdictStatus): string {
  return `<span class="badge v-${status}">${status}</span>`;
}

function outcomeBadge(item: CheckItem): string {
  const w = outcomeWord(item);
  return w === "-" ? `<span class="badge o-none">no expected</span>` : `<span class="badge o-${w}">${w}</span>`;
}

function answerHtml(a: Answer, i: number, expected: ReadonlySet<string>, entity: (id: string) => string, relation: (id: string) => string): string {
  const paths = a.paths.length ? `<ul class="paths">${a.paths.map((p) => pathHtml(p, entity, relation)).join("")}</ul>` : `<p class="muted">no path shown</p>`;
  const exp = expected.has(a.id) || expected.has(a.label) ? ` <span class="badge o-hit">expected</span>` : "";
  return (
    `<li class="answer"><div class="answer-head"><span class="rank">${i + 1}</span> <strong>${h(a.label)}</strong> <code>${h(a.id)}</code>` +
    ` <span class="score">${a.score.toFixed(3)}</span>${exp}` +
    `${a.types.length ? ` <span class="types">${a.types.map((t) => h(entity(t))).join(", ")}</span>` : ""}</div>${paths}</li>`
  );
}

function questionHtml(item: CheckItem, svg: string | null, options: HtmlOptions): string {
  const a = item.answer;
  const book = options.labels ?? NO_LABELS;
  const known = new Map<string, string>();
  for (const x of a.answers) known.set(x.id, x.label);
  for (const m of a.mentions) {
    known.set(m.entity.id, m.entity.label);
    for (const alt of m.alternatives) if (!known.has(alt.id)) known.set(alt.id, alt.label);
  }
  for (const t of a.answerTypes) if (!known.has(t.id)) known.set(t.id, t.label);
  const entity = (id: string) => known.get(id) ?? book.entity(id) ?? labelFromId(id);
  const relation = (id: string) => book.relation(id) ?? labelFromId(id);
  const n = options.answers ?? REPORT_DEFAULTS.answers;
  const expected = new Set(item.expected);
  const flags = reviewItem(item, options);

  const mentions = a.mentions.length
    ? `<table class="mentions"><thead><tr><th>words</th><th>linked to</th><th>confidence</th><th>other readings</th></tr></thead><tbody>${a.mentions
        .map(
          (m) =>
            `<tr${flags.some((f) => f.kind === "low-confidence" && f.detail.startsWith(`"${m.text}"`)) ? ' class="low"' : ""}><td>“${h(m.text)}”</td><td><strong>${h(m.entity.label)}</strong> <code>${h(m.entity.id)}</code></td>` +
            `<td class="num">${m.confidence.toFixed(2)}</td><td>${m.alternatives.slice(0, 3).map((x) => `${h(x.label)} <code>${h(x.id)}</code> ${x.confidence.toFixed(2)}`).join("<br>") || "–"}</td></tr>`,
        )
        .join("")}</tbody></table>`
    : `<p class="muted">No words of the question were linked to the catalog.</p>`;
  const answers = a.answers.length ? `<ol class="answers">${a.answers.slice(0, n).map((x, i) => answerHtml(x, i, expected, entity, relation)).join("")}</ol>` : `<p class="muted">No answers.</p>`;
  const v = a.verdict;
  const tied = v.tiedWith.length ? ` · tied with ${v.tiedWith.map((id) => `<strong>${h(entity(id))}</strong>`).join(", ")}` : "";
  const own = suggestionTexts(a);
  const sugg = own.length > 0 ? own : (options.suggestions?.(item) ?? []);
  const suggestions = sugg.length ? `<h4>Suggested clues</h4><ul class="suggestions">${sugg.map((s) => `<li>${h(s)}</li>`).join("")}</ul>` : "";
  const notes = a.notes?.length ? `<ul class="notes">${a.notes.map((x) => `<li>${h(x)}</li>`).join("")}</ul>` : "";
  // a drawing wider than about half the page goes under the text, at full width
  const svgWidth = svg ? Number(/<svg[^>]*\swidth="([\d.]+)pt"/.exec(svg)?.[1] ?? 0) : 0;
  const wide = svgWidth > (options.sideBySideWidth ?? HTML_DEFAULTS.sideBySideWidth);
  const drawing = svg
    ? `<figure class="evidence"><div class="drawing">${svg}</div><figcaption><span class="key k-clue">clue</span><span class="key k-answer">answer</span><span class="key k-rival">rival</span><span class="key k-path">on a path</span> arrows follow the stored relation direction</figcaption></figure>`
    : `<p class="muted">Nothing to draw.</p>`;
  // the verdict's reason is printed once, above the flags; a flag that only repeats it is left out
  const shownFlags = flags.filter((f) => !(v.reason !== undefined && (f.kind === "weak" || f.kind === "none") && f.detail === v.reason));
  return (
    `<article class="question" id="q-${item.line}">` +
    `<h3><span class="line">line ${item.line}</span> ${h(item.question)}</h3>` +
    `<p class="facts">${outcomeBadge(item)} ${h(outcomePhrase(item))} · ${badge(v.status)} margin ${v.margin.toFixed(2)}${tied}` +
    `${item.expected.length ? ` · expected <code>${h(item.expected.join(" | "))}</code>` : ""}</p>` +
    `${v.reason ? `<p class="reason">${h(v.reason)}</p>` : ""}${shownFlags.length ? `<p class="flags">${shownFlags.map((f) => `<span class="flag">${h(f.kind)}: ${h(f.detail)}</span>`).join(" ")}</p>` : ""}` +
    `<div class="cols${wide ? " wide" : ""}"><div class="col-text"><h4>Linked mentions</h4>${mentions}${a.answerTypes.length ? `<p>Expected type: ${a.answerTypes.map((t) => `<strong>${h(t.label)}</strong>`).join(", ")}</p>` : ""}` +
    `<h4>Answers and paths</h4>${answers}${suggestions}${notes}</div>` +
    `<div class="col-draw"><h4>Evidence graph</h4>${drawing}</div></div></article>`
  );
}

function summaryHtml(report: CheckReport): string {
  const s = report.summary;
  const tile = (name: string, value: string, note = "") => `<div class="tile"><div class="tile-value">${value}</div><div class="tile-name">${name}</div>${note ? `<div class="tile-note">${note}</div>` : ""}</div>`;
  const total = Math.max(1, VERDICT_NAMES.reduce((x, k) => x + s.verdicts[k], 0));
  // a segment holds its label only when the label fits its width at the bar's full width;
  // the counts below the bar name every verdict, so a narrow segment stays a plain colour
  // (flex-shrink 0 and min-width 0: segments keep exactly their share and never push or overlap)
  const bar = VERDICT_NAMES.filter((k) => s.verdicts[k] > 0)
    .map((k) => {
      const share = s.verdicts[k] / total;
      const label = `${k} ${s.verdicts[k]}`;
      const fits = share * HTML_DEFAULTS.barWidthPx >= label.length * HTML_DEFAULTS.barCharPx + 2 * HTML_DEFAULTS.barPaddingPx;
      return `<span class="seg v-${k}${fits ? "" : " bare"}" style="width:${(100 * share).toFixed(2)}%" title="${k}: ${s.verdicts[k]}">${fits ? label : ""}</span>`;
    })
    .join("");
  return (
    `<section id="summary"><h2>Summary</h2><div class="tiles">` +
    tile("Hits@1", rate(s.hits1)) +
    tile("Hits@5", rate(s.hits5)) +
    tile("MRR", rate(s.mrr)) +
    tile("questions", String(s.questions), `${s.withExpected} with expected answers`) +
    (s.verdictCheck ? tile("verdict accuracy", rate(s.verdictCheck.accuracy), `${s.verdictCheck.questions} with an expected verdict`) : "") +
    tile("time", `${s.seconds.toFixed(2)} s`, h(timing(report))) +
    `</div><div class="verdicts"><div class="bar">${bar}</div><p>${VERDICT_NAMES.map((k) => `${badge(k)} ${s.verdicts[k]}`).join(" ")}</p></div>${confusionHtml(report)}</section>`
  );
}

/** The confusion matrix of expected × given verdicts (empty when no question expects one). */
function confusionHtml(report: CheckReport): string {
  const vc = report.summary.verdictCheck;
  if (!vc) return "";
  const [head, ...rows] = confusionRows(vc);
  return (
    `<table class="confusion"><caption>Verdicts: expected (rows) × got (columns)</caption><thead><tr>${head!.map((c) => `<th>${h(c)}</th>`).join("")}</tr></thead>` +
    `<tbody>${rows.map((r) => `<tr><th>${h(r[0]!)}</th>${r.slice(1).map((c) => `<td class="num">${h(c)}</td>`).join("")}</tr>`).join("")}</tbody></table>`
  );
}

function reviewHtml(report: CheckReport, options: HtmlOptions): string {
  const review = reviewReport(report, options);
  const items = review
    .map((e) => `<li><a href="#q-${e.item.line}">line ${e.item.line}</a> ${h(e.item.question)} ${e.flags.map((f) => `<span class="flag">${h(f.kind)}: ${h(f.detail)}</span>`).join(" ")}</li>`)
    .join("");
  return `<section id="review"><h2>Needs a look (${review.length})</h2>${review.length ? `<ul class="review">${items}</ul>` : `<p class="muted">Nothing to look at.</p>`}</section>`;
}

function comparisonHtml(c: ReportComparison): string {
  const rk = (r: number | null) => (r === null ? "–" : String(r));
  const ref = (r: { id: string; label: string } | null) => (r ? `${h(r.label)} <code>${h(r.id)}</code>` : "nothing");
  const delta = (a: number, b: number) => `${rate(a)} → ${rate(b)} <span class="${b > a ? "up" : b < a ? "down" : "same"}">(${b - a >= 0 ? "+" : ""}${(b - a).toFixed(3)})</span>`;
  const row = (line: string, kind: string, what: string, q: string) => `<tr><td class="num">${line}</td><td>${kind}</td><td>${what}</td><td>${h(q)}</td></tr>`;
  const rows = [
    ...c.newMisses.map((x) => row(`<a href="#q-${x.line}">${x.line}</a>`, "new miss", `rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}`, x.question)),
    ...c.fixedMisses.map((x) => row(`<a href="#q-${x.line}">${x.line}</a>`, "fixed miss", `rank ${rk(x.rankBefore)} → ${rk(x.rankAfter)}`, x.question)),
    ...c.moved.map((x) => row(`<a href="#q-${x.line}">${x.line}</a>`, "answer moved", `${ref(x.before)} → ${ref(x.after)}`, x.question)),
    ...c.verdictChanges.map((x) => row(`<a href="#q-${x.line}">${x.line}</a>`, "verdict changed", `${badge(x.before)} → ${badge(x.after)}`, x.question)),
    ...c.added.map((x) => row(`<a href="#q-${x.line}">${x.line}</a>`, "new question", "", x.question)),
    ...c.removed.map((x) => row(`old ${x.line}`, "no longer asked", "", x.question)),
  ].join("");
  return (
    `<section id="changes"><h2>Changes since the earlier run</h2><p>${c.matched} questions in both runs. Hits@1 ${delta(c.before.hits1, c.after.hits1)} · Hits@5 ${delta(c.before.hits5, c.after.hits5)} · MRR ${delta(c.before.mrr, c.after.mrr)}</p>` +
    `<p>${c.newMisses.length} new misses · ${c.fixedMisses.length} fixed · ${c.moved.length} answers moved · ${c.verdictChanges.length} verdicts changed</p>` +
    (rows ? `<table class="changes"><thead><tr><th>line</th><th>change</th><th>what</th><th>question</th></tr></thead><tbody>${rows}</tbody></table>` : `<p class="muted">No question changed.</p>`) +
    `</section>`
  );
}

function tableHtml(report: CheckReport, options: HtmlOptions): string {
  const order: Record<VerdictStatus, number> = { unique: 0, tied: 1, weak: 2, none: 3 };
  const rows = report.results
    .map((it) => {
      const a = it.answer;
      const top = a.answers[0];
      const w = outcomeWord(it);
      const low = weakestLink(it);
      const flags = reviewItem(it, options);
      return (
        `<tr><td class="num" data-key="${it.line}">${it.line}</td><td data-key="${h(it.question.toLowerCase())}"><a href="#q-${it.line}">${h(it.question)}</a></td>` +
        `<td data-key="${w === "hit" ? 0 : w === "miss" ? 1 : 2}">${outcomeBadge(it)}</td>` +
        `<td class="num" data-key="${it.rank ?? 1e9}">${it.rank ?? "–"}</td>` +
        `<td data-key="${order[a.verdict.status]}">${badge(a.verdict.status)}${it.expectedVerdict !== undefined && it.expectedVerdict !== a.verdict.status ? ` <span class="flag">expected ${h(it.expectedVerdict)}</span>` : ""}</td>` +
        `<td class="num" data-key="${a.verdict.margin}">${a.verdict.margin.toFixed(2)}</td>` +
        `<td data-key="${h((top?.label ?? "").toLowerCase())}">${top ? h(top.label) : "–"}</td>` +
        `<td class="num" data-key="${top?.score ?? -1}">${top ? top.score.toFixed(3) : "–"}</td>` +
        `<td class="num" data-key="${low ?? 2}">${low === null ? "–" : low.toFixed(2)}</td>` +
        `<td class="num" data-key="${flags.length}">${flags.length || ""}</td></tr>`
      );
    })
    .join("");
  const cols: [string, "num" | "text"][] = [
    ["line", "num"],
    ["question", "text"],
    ["outcome", "num"],
    ["rank", "num"],
    ["verdict", "num"],
    ["margin", "num"],
    ["top answer", "text"],
    ["score", "num"],
    ["weakest link", "num"],
    ["flags", "num"],
  ];
  const head = cols.map(([name, kind]) => `<th data-kind="${kind}" aria-sort="none"><button type="button">${name}</button></th>`).join("");
  return `<section id="questions"><h2>Questions</h2><p class="muted">Click a column heading to sort; click again to reverse.</p><table class="sortable" id="question-table"><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table></section>`;
}

/** The page's one script: sorts a table by a clicked column (numbers by data-key, text by locale). */
const SCRIPT = `
document.querySelectorAll("table.sortable").forEach(function (table) {
  var heads = table.querySelectorAll("thead th");
  heads.forEach(function (th, col) {
    th.querySelector("button").addEventListener("click", function () {
      var up = th.getAttribute("aria-sort") !== "ascending";
      heads.forEach(function (o) { o.setAttribute("aria-sort", "none"); });
      th.setAttribute("aria-sort", up ? "ascending" : "descending");
      var num = th.getAttribute("data-kind") === "num";
      var body = table.tBodies[0];
      var rows = Array.prototype.slice.call(body.rows).map(function (r, i) { return { r: r, i: i, k: r.cells[col].getAttribute("data-key") || "" }; });
      rows.sort(function (a, b) {
        var d = num ? Number(a.k) - Number(b.k) : a.k.localeCompare(b.k);
        if (!up) d = -d;
        return d || Number(a.r.cells[0].getAttribute("data-key")) - Number(b.r.cells[0].getAttribute("data-key"));
      });
      rows.forEach(function (x) { body.appendChild(x.r); });
    });
  });
});
`;

const STYLE = `
:root { --ink:#22262e; --muted:#6b6f78; --paper:#fbfaf7; --card:#ffffff; --rule:#e2dfd8; --accent:#1f6f5c;
  --clue:#fde7b0; --rival:#e4ecf7; --path:#f3f3f1; --unique:#1f6f5c; --tied:#b7791f; --weak:#b4465a; --none:#7d7f86; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink); font: 15px/1.45 system-ui, -apple-system, "Segoe UI", sans-serif; }
header { padding: 22px 32px 14px; border-bottom: 3px solid var(--accent); background: var(--card); }
header h1 { margin: 0 0 4px; font-size: 24px; letter-spacing: .01em; }
header .sub { color: var(--muted); margin: 0; }
.disclaimer { margin: 10px 0 0; padding: 8px 12px; border-left: 4px solid var(--tied); background: #fff7e6; }
main { padding: 8px 32px 40px; max-width: 1500px; }
h2 { font-size: 19px; margin: 26px 0 10px; border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
h3 { font-size: 16px; margin: 0 0 6px; }
h4 { font-size: 13px; text-transform: uppercase; letter-spacing: .06em; color: var(--muted); margin: 14px 0 6px; }
code { font: 12px ui-monospace, Menlo, Consolas, monospace; color: #4d5360; background: #f1efe9; padding: 0 3px; border-radius: 3px; }
a { color: var(--accent); }
.muted { color: var(--muted); }
.tiles { display: flex; flex-wrap: wrap; gap: 12px; }
.tile { background: var(--card); border: 1px solid var(--rule); border-radius: 8px; padding: 10px 16px; min-width: 130px; }
.tile-value { font-size: 26px; font-weight: 650; font-variant-numeric: tabular-nums; }
.tile-name { font-size: 13px; color: var(--muted); }
.tile-note { font-size: 12px; color: var(--muted); }
.verdicts { margin-top: 12px; }
.confusion { margin-top: 12px; border-collapse: collapse; }
.confusion th, .confusion td { padding: 2px 8px; border: 1px solid var(--rule); }
.bar { display: flex; height: 22px; border-radius: 5px; overflow: hidden; border: 1px solid var(--rule); max-width: ${HTML_DEFAULTS.barWidthPx}px; }
.seg { flex: 0 0 auto; min-width: 0; box-sizing: border-box; color: #fff; font-size: 12px; line-height: 22px; padding: 0 6px; white-space: nowrap; overflow: hidden; }
.seg.bare { padding: 0; }
.seg.v-unique, .badge.v-unique { background: var(--unique); }
.seg.v-tied, .badge.v-tied { background: var(--tied); }
.seg.v-weak, .badge.v-weak { background: var(--weak); }
.seg.v-none, .badge.v-none { background: var(--none); }
.badge { display: inline-block; white-space: nowrap; color: #fff; font-size: 12px; padding: 0 7px; border-radius: 9px; line-height: 18px; }
.badge.o-hit { background: #2f7d46; } .badge.o-miss { background: #a5362f; } .badge.o-none { background: #9a9ca3; }
.flag { display: inline-block; font-size: 12px; background: #fbeaea; color: #7c2a25; border-radius: 4px; padding: 0 6px; margin: 1px 2px; }
ul.review { padding-left: 18px; } ul.review li { margin: 3px 0; }
table { border-collapse: collapse; background: var(--card); }
th, td { border-bottom: 1px solid var(--rule); padding: 4px 8px; text-align: left; vertical-align: top; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
table.sortable th button { font: inherit; font-weight: 600; background: none; border: 0; padding: 0; cursor: pointer; color: var(--ink); }
table.sortable th[aria-sort="ascending"] button::after { content: " ▲"; font-size: 10px; }
table.sortable th[aria-sort="descending"] button::after { content: " ▼"; font-size: 10px; }
table.sortable tbody tr:hover { background: #f6f4ee; }
article.question { background: var(--card); border: 1px solid var(--rule); border-radius: 8px; padding: 14px 18px; margin: 16px 0; }
.line { color: var(--muted); font-weight: 500; margin-right: 6px; }
.facts, .reason, .flags { margin: 4px 0; }
.reason { color: var(--muted); font-style: italic; }
.cols { display: flex; flex-wrap: wrap; gap: 20px; }
.col-text { flex: 1 1 460px; min-width: 0; }
.col-draw { flex: 1 1 420px; min-width: 0; }
.cols.wide .col-draw { flex-basis: 100%; }
table.mentions tr.low td { background: #fff3f3; }
ol.answers { padding-left: 0; list-style: none; margin: 0; }
li.answer { margin: 0 0 8px; }
.answer-head .rank { display: inline-block; width: 22px; height: 22px; line-height: 22px; text-align: center; border-radius: 50%; background: var(--accent); color: #fff; font-size: 12px; }
.score { font-variant-numeric: tabular-nums; color: var(--muted); }
.types { font-size: 12px; color: var(--muted); }
ul.paths { margin: 4px 0 0 28px; padding: 0; list-style: none; }
li.path { margin: 2px 0; font-size: 14px; }
.ent { background: var(--path); border-radius: 3px; padding: 0 4px; }
.rel { font-style: italic; color: #4f6d95; }
.arrow { color: var(--muted); }
.hops { font-size: 11px; color: var(--muted); margin-left: 4px; }
figure.evidence { margin: 0; }
.drawing { overflow: auto; border: 1px solid var(--rule); border-radius: 6px; background: #fff; padding: 6px; }
.drawing svg { max-width: 100%; height: auto; display: block; margin: 0 auto; }
figcaption { font-size: 12px; color: var(--muted); margin-top: 4px; }
.key { display: inline-block; padding: 0 6px; margin-right: 4px; border-radius: 3px; border: 1px solid #bbb; color: var(--ink); }
.k-clue { background: var(--clue); } .k-answer { background: #1f6f5c; color: #fff; } .k-rival { background: var(--rival); } .k-path { background: var(--path); }
.up { color: #2f7d46; } .down { color: #a5362f; } .same { color: var(--muted); }
@media print { body { background: #fff; } table.sortable th button::after { content: none; } article.question { break-inside: avoid; } }
`;

/** The page, from a check report and its pre-rendered drawings (one SVG or null per question). */
export function renderCheckHtml(report: CheckReport, drawings: readonly (string | null)[], options: HtmlOptions = {}): string {
  if (drawings.length !== report.results.length) throw new RangeError(`present/report-html: ${drawings.length} drawings for ${report.results.length} questions`);
  const title = options.title ?? HTML_DEFAULTS.title;
  const hash = createHash("sha256").update(SCRIPT, "utf8").digest("base64");
  const csp = `default-src 'none'; style-src 'unsafe-inline'; img-src data:; script-src 'sha256-${hash}'`;
  const questions = report.results.map((it, i) => questionHtml(it, drawings[i] ?? null, options)).join("\n");
  return (
    `<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">` +
    `<meta http-equiv="Content-Security-Policy" content="${csp}">` +
    `<meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<title>${h(title)}</title><style>${STYLE}</style></head>\n<body>` +
    `<header><h1>${h(title)}</h1>${options.subtitle ? `<p class="sub">${h(options.subtitle)}</p>` : ""}<p class="disclaimer">${h(DISCLAIMER)}</p></header>\n<main>` +
    summaryHtml(report) +
    reviewHtml(report, options) +
    (options.comparison ? comparisonHtml(options.comparison) : "") +
    tableHtml(report, options) +
    `<section id="details"><h2>Each question</h2>\n${questions}\n</section>` +
    `</main>\n<script>${SCRIPT}</script>\n</body></html>\n`
  );
}

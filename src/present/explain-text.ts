/**
 * Plain-text rendering of an explanation (explain stage): relation chains such as
 * `Brackwell ←moored at— Kestrel —built by→ Ferrand Yards`, the clue-coverage table, the
 * clue ablation, the suggested clues and why-not reports. Pure functions over the
 * explanation; the CLI and the reports print what they return.
 */
import type { AnswerPath } from "../model/index.js";
import type { AblationEntry, CoverageTable, Explanation, SuggestedClue, WhyNot } from "../explain/index.js";

/** Options of the explanation renderers; all optional. */
export interface ExplainTextOptions {
  /** Paths shown per answer. @default 3 */
  readonly paths?: number;
  /** Answers whose paths are shown. @default 3 */
  readonly answers?: number;
  /** Widest coverage-table column, in characters. @default 28 */
  readonly columnWidth?: number;
  /** Use `-[rel]->` / `<-[rel]-` instead of `—rel→` / `←rel—`. @default false */
  readonly ascii?: boolean;
}

/** Defaults of {@link ExplainTextOptions}. */
export const EXPLAIN_TEXT_DEFAULTS = { paths: 3, answers: 3, columnWidth: 28, ascii: false } as const;

type Labels = Readonly<Record<string, string>>;

const name = (labels: Labels, id: string): string => labels[id] ?? id;

function cut(s: string, width: number): string {
  const chars = [...s];
  return chars.length <= width ? s : chars.slice(0, Math.max(1, width - 1)).join("") + "…";
}

/** One path as a chain: `A —relation→ B ←relation— C` (labels when known, else ids). */
export function pathChain(path: AnswerPath, labels: Labels = {}, ascii = false): string {
  let s = name(labels, path.from);
  for (const st of path.steps) {
    const rel = name(labels, st.relation);
    if (ascii) s += st.inverse ? ` <-[${rel}]- ` : ` -[${rel}]-> `;
    else s += st.inverse ? ` ←${rel}— ` : ` —${rel}→ `;
    s += name(labels, st.to);
  }
  return s;
}

/** The coverage table as fixed-width text. */
export function renderCoverageText(table: CoverageTable, options: ExplainTextOptions = {}): string {
  const width = options.columnWidth ?? EXPLAIN_TEXT_DEFAULTS.columnWidth;
  const ascii = options.ascii ?? EXPLAIN_TEXT_DEFAULTS.ascii;
  if (table.rows.length === 0 || table.clues.length === 0) return "";
  const head = ["answer", ...table.clues.map((c) => c.label)];
  const body = table.rows.map((r) => [
    r.answer.label,
    ...r.cells.map((c) =>
      c.reached
        ? `${c.hops} hop${c.hops === 1 ? "" : "s"}: ${c.relations.map((x) => (x.inverse ? (ascii ? `<${x.label}` : `←${x.label}`) : ascii ? `${x.label}>` : `${x.label}→`)).join(" ")}`
        : `not within ${table.maxHops} hops`,
    ),
  ]);
  const widths = head.map((h, i) => Math.min(width, Math.max([...h].length, ...body.map((b) => [...b[i]!].length))));
  const line = (cells: readonly string[]) => cells.map((c, i) => cut(c, widths[i]!).padEnd(widths[i]!)).join("  ").trimEnd();
  return [line(head), line(widths.map((w) => "-".repeat(w))), ...body.map(line)].join("\n") + "\n";
}

const ROLE_TEXT: Record<AblationEntry["role"], string> = {
  necessary: "necessary: without it the best answer changes",
  narrowing: "narrowing: without it the same answer, but no longer singled out",
  redundant: "redundant: same answer and verdict without it",
  conflicting: "conflicting: the verdict is clearer without it",
};

/** The clue ablation, one line per clue. */
export function renderAblationText(entries: readonly AblationEntry[]): string {
  return entries
    .map((e) => {
      const without = e.topWithout ? `${e.topWithout.label}, ${e.verdictWithout.status}` : "nothing";
      const pull = e.pullsTowards ? `; alone it points to ${e.pullsTowards.label}` : "";
      return `  "${e.clue.label}": ${ROLE_TEXT[e.role]} (without it: ${without})${pull}`;
    })
    .join("\n") + (entries.length > 0 ? "\n" : "");
}

/** The suggested clues, best first, each with the fact behind it. */
export function renderSuggestionsText(suggestions: readonly SuggestedClue[], labels: Labels = {}): string {
  return suggestions
    .map((s) => {
      const ruled = s.rulesOut.map((id) => name(labels, id)).join(", ");
      const fact = `${s.triple.subject} ${s.triple.predicate} ${s.triple.literal ? JSON.stringify(s.triple.object) : s.triple.object}`;
      const check = s.verified === true ? " (checked: unique)" : s.verified === false ? " (checked: not enough alone)" : "";
      return `  + "…${s.text}" rules out ${s.rulesOut.length} (${ruled})${check}\n      fact: ${fact}`;
    })
    .join("\n") + (suggestions.length > 0 ? "\n" : "");
}

/** One why-not report. */
export function renderWhyNotText(w: WhyNot, options: ExplainTextOptions = {}): string {
  const ascii = options.ascii ?? EXPLAIN_TEXT_DEFAULTS.ascii;
  const out = [`why not ${w.entity.label} [${w.entity.id}]?`];
  for (const r of w.reasons) out.push(`  - ${r}`);
  for (const c of w.perClue) {
    if (c.clue.id === w.entity.id) {
      out.push(`  "${c.clue.label}": this entity itself (a clue of the question)`);
      continue;
    }
    const part = c.score === null ? "not scored" : `score part ${c.score.toFixed(3)}${c.bestScore !== null ? ` (best answer ${c.bestScore.toFixed(3)})` : ""}`;
    const how = c.cell.reached
      ? `${c.cell.hops} hop${c.cell.hops === 1 ? "" : "s"} via ${c.cell.relations.map((x) => (x.inverse ? (ascii ? `<${x.label}` : `←${x.label}`) : ascii ? `${x.label}>` : `${x.label}→`)).join(" ")}`
      : "not reached";
    out.push(`  "${c.clue.label}"${c.clue.label === w.entity.label ? ` [${c.clue.id}]` : ""}: ${part}; ${how}`);
  }
  return out.join("\n") + "\n";
}

/** All sections of an explanation: paths, coverage, ablation, suggestions, why-not. */
export function renderExplanationText(ex: Explanation, options: ExplainTextOptions = {}): string {
  const nPaths = options.paths ?? EXPLAIN_TEXT_DEFAULTS.paths;
  const nAnswers = options.answers ?? EXPLAIN_TEXT_DEFAULTS.answers;
  const ascii = options.ascii ?? EXPLAIN_TEXT_DEFAULTS.ascii;
  const out: string[] = [];
  const withPaths = ex.answers.slice(0, nAnswers).filter((a) => a.paths.length > 0);
  if (withPaths.length > 0) {
    out.push("why (paths from the clues):");
    for (const a of withPaths) {
      out.push(`  ${a.label}:`);
      for (const p of a.paths.slice(0, nPaths)) out.push(`    ${pathChain(p, ex.labels, ascii)}`);
      if (a.paths.length > nPaths) out.push(`    … ${a.paths.length - nPaths} more`);
    }
    out.push("");
  }
  const cov = renderCoverageText(ex.coverage, options);
  if (cov !== "") out.push("clue coverage:", cov.replace(/^/gm, "  ").trimEnd(), "");
  if (ex.ablation.length > 0) out.push("clue ablation:", renderAblationText(ex.ablation).trimEnd(), "");
  if (ex.suggestions.length > 0) out.push("to single out the best answer, add a clue:", renderSuggestionsText(ex.suggestions, ex.labels).trimEnd(), "");
  for (const w of ex.whyNot) out.push(renderWhyNotText(w, options).trimEnd(), "");
  return out.length > 0 ? out.join("\n") + "\n" : "";
}

/**
 * Plain-text rendering of one answered question (`tiepoint ask`): the linked mentions with
 * their confidence, the expected answer type, the ranked answers with scores and types, the
 * paths when there are any, the verdict, notes and the disclaimer.
 */
import { DISCLAIMER, type AskResult, type AnswerPath, type ConditionDoc } from "../model/index.js";
import { ignoredLine, readingLine } from "./reading-line.js";

/** Extra context for {@link renderAskText}; all optional. */
export interface AskTextOptions {
  /** Labels of the relations the question's words cued ("borders (0.9)"). */
  readonly relationCues?: readonly string[];
  /** Milliseconds the question took. */
  readonly millis?: number;
  /** Paths shown per answer. @default 2 */
  readonly paths?: number;
  /**
   * The label of a catalog entity (an answer's type, a tied answer) by id; the text then shows
   * the label where it would show a bare id ("(vessel)" for "(t:Vessel)"). Unknown ids stay ids.
   */
  readonly labelOf?: (id: string) => string | undefined;
}

/** Defaults of {@link AskTextOptions}. */
export const ASK_TEXT_DEFAULTS = { paths: 2 } as const;

function pct(x: number): string {
  return `${Math.round(x * 100)}%`;
}

function pathText(p: AnswerPath): string {
  let s = p.from;
  for (const st of p.steps) s += st.inverse ? ` <-[${st.relation}]- ${st.to}` : ` -[${st.relation}]-> ${st.to}`;
  return s;
}

/** One recognised condition as a line (README "Conditions"). */
function conditionText(c: ConditionDoc): string {
  const attr = c.attribute ? `${c.attribute.label}${c.attribute.unit !== undefined ? ` (${c.attribute.unit})` : ""}` : "no matching attribute: not applied";
  switch (c.kind) {
    case "comparison":
      return `${c.attribute ? attr : "(" + attr + ")"} ${c.operator} ${(c.values ?? []).join(" and ")}  ["${c.words}"]`;
    case "superlative":
      return `${c.position !== undefined && c.position > 1 ? `place ${c.position} ` : ""}${c.order === "min" ? "smallest" : "largest"} ${c.attribute ? attr : "(" + attr + ")"}  ["${c.words}"]`;
    case "literal":
      return `${c.attribute?.label ?? ""} ${c.operator ?? "="} ${(c.values ?? []).join(", ")}  ["${c.words}"]`;
    case "exclusion":
      return `not ${c.entity?.label ?? ""} [${c.entity?.id ?? ""}]${c.mode === "not" ? " nor what is linked to it" : ""}  ["${c.words}"]`;
    case "absence":
      return `no such link  ["${c.words}"]`;
    default:
      return `count the answers  ["${c.words}"]`;
  }
}

/** Renders an ask result as plain text, ending with the disclaimer. */
export function renderAskText(r: AskResult, options: AskTextOptions = {}): string {
  const out: string[] = [];
  const labelOf = (id: string): string => options.labelOf?.(id) ?? id;
  out.push(`question: ${r.question}`);
  if (r.mentions.length === 0) out.push("linked:   (nothing)");
  r.mentions.forEach((m, i) => {
    const alts = m.alternatives.length > 0 ? `; or ${m.alternatives.slice(0, 2).map((a) => `${a.label} [${a.id}] ${pct(a.confidence)}`).join(", ")}` : "";
    out.push(`${i === 0 ? "linked:  " : "         "} "${m.text}" -> ${m.entity.label} [${m.entity.id}] ${pct(m.confidence)}${m.pinned ? " (pinned)" : ""}${alts}`);
  });
  out.push(`expects:  ${r.answerTypes.length > 0 ? r.answerTypes.map((t) => `${t.label} [${t.id}]`).join(" or ") : "any type"}`);
  if (options.relationCues && options.relationCues.length > 0) out.push(`cues:     ${options.relationCues.join(", ")}`);
  if (r.reading) {
    out.push(`reading:  ${readingLine(r.reading)}`);
    if (r.reading.ignored.length > 0) out.push(`ignored:  ${ignoredLine(r.reading)}`);
  }
  (r.conditions ?? []).forEach((c, i) => out.push(`${i === 0 ? "if:      " : "         "} ${conditionText(c)}`));
  if (r.count) out.push(`count:    ${r.count.value}`);
  (r.values ?? []).forEach((x, i) =>
    out.push(`${i === 0 ? "value:   " : "         "} ${x.entity.label}: ${x.attribute.label} = ${x.value}${x.attribute.unit !== undefined ? ` ${x.attribute.unit}` : ""}  (${x.triple.subject} ${x.triple.predicate} "${x.triple.object}")`),
  );
  out.push("");
  if (r.answers.length === 0) out.push("answers:  none");
  else {
    out.push("answers (ranked suggestions):");
    const w = String(r.answers.length).length;
    const lw = Math.min(40, Math.max(...r.answers.map((a) => a.label.length)));
    r.answers.forEach((a, i) => {
      const types = a.types.length > 0 ? `  (${a.types.map(labelOf).join(", ")})` : "";
      out.push(`  ${String(i + 1).padStart(w)}. ${a.label.padEnd(lw)}  ${formatScore(a.score)}  [${a.id}]${types}`);
      for (const p of a.paths.slice(0, options.paths ?? ASK_TEXT_DEFAULTS.paths)) out.push(`  ${" ".repeat(w)}    via ${pathText(p)}`);
      for (const st of a.values ?? []) out.push(`  ${" ".repeat(w)}    ${st.satisfied ? "meets" : "fails"} ${st.text}`);
    });
  }
  const v = r.verdict;
  const tied = v.tiedWith.length > 0 ? `; tied with ${v.tiedWith.map(labelOf).join(", ")}` : "";
  out.push("");
  out.push(`verdict:  ${v.status} (margin ${v.margin.toFixed(2)}${tied})${v.reason ? ` - ${v.reason}` : ""}`);
  for (const n of r.notes ?? []) out.push(`note:     ${n}`);
  if (options.millis !== undefined) out.push(`time:     ${options.millis.toFixed(1)} ms`);
  out.push("");
  out.push(r.disclaimer ?? DISCLAIMER);
  return out.join("\n") + "\n";
}

/** A score for people: four decimals, or two significant digits in scientific form when it would print as 0.0000. */
function formatScore(x: number): string {
  if (x !== 0 && Math.abs(x) < 0.00005) return x.toExponential(1);
  return x.toFixed(4);
}

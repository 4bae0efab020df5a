/**
 * Which node of the query graph a condition belongs to: a superlative or an ordinal modifies
 * the noun it stands before ("the capital of the *largest country* in R": the countries are
 * ordered, not the capitals); an exclusion, a post-modifier, the nearest noun before it ("the
 * capital of the *country* that shares X *with Y*", "a *country* other than Y"; right
 * association, Kimball 1973); and that noun names a node of the graph by its type. When the
 * noun is the answer-type phrase, or names no inner node, the condition stays on the answer.
 *
 * Method: phrase attachment by syntactic head — a pre-modifying adjective belongs to the head
 * noun of its noun phrase (Quirk et al. 1985, "A Comprehensive Grammar of the English
 * Language", §17.3 ff. and §7.2 on the superlative's noun phrase) — mapped onto the query graph
 * of staged query-graph generation (Yih et al. 2015, ACL), where constraints and aggregations
 * attach to the node they restrict, an inner variable included. The head noun is the first
 * type noun (type-words.ts, or the answer-type phrase) within `MAX_GAP` words after the
 * modifier (before it, for an exclusion), no punctuation between; the inner node it names is one whose types (the catalog's
 * hierarchy included) meet the noun's.
 */
import type { Analysis } from "./analyze.js";
import type { Condition } from "./conditions.js";
import type { CueChain } from "./cue-chains.js";
import type { QuestionModel } from "./question-model.js";
import { words } from "./words.js";

/** Most words between a superlative and its head noun ("the largest *Baltic* research vessel"). */
export const MAX_GAP = 2;

/** The chains with each inner-node condition on its hop (`ChainStep.conditions`), and the conditions left on the answer. */
export function attachConditions(chains: readonly CueChain[], conditions: readonly Condition[], analysis: Analysis, model: QuestionModel): { chains: CueChain[]; answer: Condition[] } {
  const out = chains.map((ch) => ({ ...ch, steps: [...ch.steps] }));
  const answer: Condition[] = [];
  if (!conditions.some((c) => c.kind === "superlative" || c.kind === "exclusion")) return { chains: [...chains], answer: [...conditions] };
  const ws = words(analysis.question);
  const answerSpans = analysis.answerTypeWords ?? [];
  const typeWords = analysis.typeWords ?? [];
  const expand = (ts: readonly number[]) => new Set(ts.flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
  for (const c of conditions) {
    if (c.kind !== "superlative" && c.kind !== "exclusion") {
      answer.push(c);
      continue;
    }
    let head: { start: number; types?: readonly number[] } | undefined;
    // the noun a word at k is: the answer-type phrase, a type noun, or neither
    const nounAt = (k: number): { start: number; types?: readonly number[] } | undefined => {
      const at = ws[k]!.start;
      if (answerSpans.some((s) => s.start <= at && at < s.end)) return { start: at };
      const t = typeWords.find((x) => x.start === at);
      return t ? { start: at, types: t.types } : undefined;
    };
    if (c.kind === "superlative") {
      const first = ws.findIndex((w) => w.start >= c.end);
      for (let k = first; k >= 0 && k < ws.length && k <= first + MAX_GAP && !head; k++) {
        if (/[,;:.!?]/.test(analysis.question.slice(c.end, ws[k]!.start))) break;
        head = nounAt(k);
      }
    } else {
      // a post-modifier ("other than X", "that shares … with X") belongs to the nearest noun before it
      for (let k = ws.findIndex((w) => w.start >= c.start) - 1; k >= 0 && !head; k--) {
        if (/[,;:.!?]/.test(analysis.question.slice(ws[k]!.end, c.start))) break;
        head = nounAt(k);
      }
    }
    if (!head?.types) {
      answer.push(c);
      continue;
    }
    const named = expand(head.types);
    let attached = false;
    for (const ch of out) {
      ch.steps.forEach((st, h) => {
        if (h === ch.steps.length - 1 || st.types.length === 0) return;
        if (![...expand(st.types)].some((t) => named.has(t))) return;
        ch.steps[h] = { ...st, conditions: [...(st.conditions ?? []), c] };
        attached = true;
      });
    }
    if (!attached) answer.push(c);
  }
  return { chains: out, answer };
}

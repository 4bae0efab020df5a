/**
 * Which node of the query graph a condition belongs to: every condition but a count modifies
 * the noun phrase it stands in, and that noun names a node of the graph by its type. A
 * superlative or an ordinal, and a literal used as an adjective, pre-modify the noun after
 * them ("the capital of the *largest country* in R", "the capital of the *landlocked
 * country* that …": the countries are ordered or filtered, not the capitals); a comparison,
 * a literal value, an exclusion or an absence post-modifies the nearest noun before it ("the
 * capital of the *country with an area above* N", "the *country* that borders X *and has* …",
 * "a *country* other than Y"; right association, Kimball 1973) — unless a finite verb of the
 * main clause stands between, outside any relative clause ("countries bordering a landlocked
 * country *have an area above* N"): then the condition is predicated of the main clause's
 * subject, the answer. When the noun is the answer-type phrase, or names no inner node, the
 * condition stays on the answer.
 *
 * Method: phrase attachment by syntactic head — a pre-modifying adjective belongs to the head
 * noun of its noun phrase, a post-modifier (prepositional phrase, relative clause) to the
 * noun it follows (Quirk et al. 1985, "A Comprehensive Grammar of the English Language",
 * §17.3 ff., §17.9 ff. on relative clauses, §7.2 on the superlative's noun phrase) — mapped
 * onto the query graph of staged query-graph generation (Yih et al. 2015, ACL), where
 * constraints and aggregations attach to the node they restrict, an inner variable included.
 * The head noun is the first type noun (type-words.ts, or the answer-type phrase) within
 * `MAX_GAP` words after a pre-modifier, or the nearest one before a post-modifier, no
 * punctuation between; the relative words and finite operators are lexicon.ts
 * `RELATIVE_WORDS` and `FINITE_OPERATORS`. The inner node a noun names is one whose types
 * (the catalog's hierarchy included) meet the noun's; when chains of coordinated clues share
 * that node, the ranking evaluates the condition once on their meeting set (rank.ts).
 */
import type { Analysis } from "./analyze.js";
import type { Condition } from "./conditions.js";
import type { CueChain } from "./cue-chains.js";
import { FINITE_OPERATORS, RELATIVE_WORDS } from "./lexicon.js";
import type { QuestionModel } from "./question-model.js";
import { words } from "./words.js";

/** Most words between a superlative and its head noun ("the largest *Baltic* research vessel"). */
export const MAX_GAP = 2;

/** The chains with each inner-node condition on its hop (`ChainStep.conditions`), and the conditions left on the answer. */
export function attachConditions(chains: readonly CueChain[], conditions: readonly Condition[], analysis: Analysis, model: QuestionModel): { chains: CueChain[]; answer: Condition[] } {
  const out = chains.map((ch) => ({ ...ch, steps: [...ch.steps] }));
  const answer: Condition[] = [];
  // only a chain with an inner node can take a condition
  if (!conditions.some((c) => c.kind !== "count") || !chains.some((ch) => ch.steps.length > 1)) return { chains: [...chains], answer: [...conditions] };
  const ws = words(analysis.question);
  const answerSpans = analysis.answerTypeWords ?? [];
  const typeWords = analysis.typeWords ?? [];
  const expand = (ts: readonly number[]) => new Set(ts.flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
  type Head = { start: number; types?: readonly number[] };
  // the noun a word at k is: the answer-type phrase, a type noun, or neither
  const nounAt = (k: number): Head | undefined => {
    const at = ws[k]!.start;
    if (answerSpans.some((s) => s.start <= at && at < s.end)) return { start: at };
    const t = typeWords.find((x) => x.start === at);
    return t ? { start: at, types: t.types } : undefined;
  };
  // a pre-modifier's head: the first noun within MAX_GAP words after it
  const after = (c: Condition): Head | undefined => {
    const first = ws.findIndex((w) => w.start >= c.end);
    for (let k = first; k >= 0 && k < ws.length && k <= first + MAX_GAP; k++) {
      if (/[,;:.!?]/.test(analysis.question.slice(c.end, ws[k]!.start))) return undefined;
      const h = nounAt(k);
      if (h) return h;
    }
    return undefined;
  };
  // a post-modifier's head: the nearest noun before it; a finite verb of the main clause in
  // between (no relative word before it) makes it the answer's
  const before = (c: Condition): Head | undefined => {
    let mainVerb = false;
    for (let k = ws.findIndex((w) => w.start >= c.start) - 1; k >= 0; k--) {
      if (/[,;:.!?]/.test(analysis.question.slice(ws[k]!.end, c.start))) return undefined;
      const h = nounAt(k);
      if (h) return mainVerb ? undefined : h;
      if (FINITE_OPERATORS.has(ws[k]!.norm)) mainVerb = true;
      else if (RELATIVE_WORDS.has(ws[k]!.norm)) mainVerb = false;
    }
    return undefined;
  };
  for (const c of conditions) {
    if (c.kind === "count") {
      answer.push(c);
      continue;
    }
    const head = c.kind === "superlative" ? after(c) : c.kind === "literal" ? (after(c) ?? before(c)) : before(c);
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

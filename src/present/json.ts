/**
 * JSON rendering of `ask --json` and `check --json`: the contract documents
 * (../shared/contract.md), one per call, always carrying the disclaimer field. `ask --json`
 * adds what the text output shows beside the contract (README "JSON (additive to
 * ../shared/contract.md)"): relation cues, clue coverage, clue ablation, why-not reports and
 * the time per stage.
 */
import { DISCLAIMER, type AskResult, type CheckReport, type EntityRef } from "../model/index.js";
import type { CoverageCell, Explanation, WhyNot } from "../explain/index.js";
import type { AskOutcome } from "../pipeline/index.js";

/** The `ask --json` document (pretty-printed, newline-terminated); given the whole outcome, with the additive explanation fields. */
export function askJson(result: AskResult, outcome?: AskOutcome): string {
  const extra = outcome ? askExtras(outcome) : {};
  return JSON.stringify({ ...result, disclaimer: result.disclaimer ?? DISCLAIMER, ...extra }, null, 2) + "\n";
}

/** The `check --json` document (pretty-printed, newline-terminated). */
export function checkJson(report: CheckReport): string {
  return JSON.stringify({ ...report, disclaimer: DISCLAIMER }, null, 2) + "\n";
}

const ref = (r: EntityRef): EntityRef => ({ id: r.id, label: r.label });

function cellDoc(c: CoverageCell) {
  return { reached: c.reached, hops: c.hops, relations: c.relations.map((x) => ({ id: x.id, label: x.label, inverse: x.inverse })) };
}

function whyNotDoc(w: WhyNot) {
  return {
    entity: ref(w.entity),
    rank: w.rank,
    candidates: w.candidates,
    score: w.score,
    best: w.best ? ref(w.best) : null,
    bestScore: w.bestScore,
    types: w.types.map(ref),
    expectedTypes: w.expectedTypes.map(ref),
    excludedByType: w.excludedByType,
    isClue: w.isClue,
    reasons: w.reasons,
    perClue: w.perClue.map((c) => ({ clue: ref(c.clue), score: c.score, bestScore: c.bestScore, ...cellDoc(c.cell), weak: c.weak })),
  };
}

function explanationDocs(ex: Explanation) {
  return {
    coverage: {
      maxHops: ex.coverage.maxHops,
      clues: ex.coverage.clues.map(ref),
      rows: ex.coverage.rows.map((r) => ({ answer: ref(r.answer), cells: r.cells.map(cellDoc) })),
    },
    ablation: ex.ablation.map((a) => ({
      clue: ref(a.clue),
      role: a.role,
      topWithout: a.topWithout ? ref(a.topWithout) : null,
      verdictWithout: { status: a.verdictWithout.status, margin: a.verdictWithout.margin },
      pullsTowards: a.pullsTowards ? ref(a.pullsTowards) : null,
    })),
    whyNot: ex.whyNot.map(whyNotDoc),
  };
}

/** The additive fields of `ask --json` (see the file header). */
function askExtras(o: AskOutcome) {
  const t = o.timings;
  return {
    relationCues: o.analysis.relationCues.map((c) => ({ id: c.id, label: c.label, words: c.words, weight: c.weight, score: c.score })),
    ...(o.explanation ? explanationDocs(o.explanation) : { coverage: null, ablation: [], whyNot: [] }),
    timing: { link: t.link, analyze: t.analyze, rank: t.rank, explain: t.explain, total: t.total },
  };
}

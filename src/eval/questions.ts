/**
 * `npm run eval:questions -- [--set world|debian|all] [--split dev|holdout|both] [--json]
 * [--holdout-misses]`: the natural-question evaluation of issue 16.
 *
 * For each set: builds (or reuses) the catalog, computes every question's gold with oxigraph
 * over the same N-Triples (question-set.ts), asks every question through the real `Session`
 * and scores it:
 * - Hits@1: the first answer is a gold entity; a count question is a hit when `count.value`
 *   equals the gold number; a question with no gold answer is a hit when the verdict is `none`.
 * - MRR: mean of 1/rank of the first gold entity among the answers (top 10; 0 when absent);
 *   count and no-answer questions score 1 for a hit, 0 otherwise.
 * - verdict accuracy: the verdict status equals the expected one (question-set.ts
 *   `expectedVerdict`).
 * - set match (questions with 2+ gold answers): the tied group, the first answer plus
 *   `verdict.tiedWith`, is exactly the gold set.
 * Figures per split and per phenomenon (a question counts for each of its phenomena). Misses
 * are listed for `dev` only, unless `--holdout-misses` is given (so that whoever tunes on dev
 * does not see the holdout questions' failures by accident). Progress goes to stderr.
 */
import { Session } from "../pipeline/index.js";
import { TiepointError, type AskResult } from "../model/index.js";
import { SETS, builtCatalog, questionsOf, readSplit, setByName, type SetSpec, runTool } from "./eval-sets.js";
import { PHENOMENA, expectedVerdict, goldOf, goldStore, oxigraphVersion, type EvalQuestion, type ExpectedVerdict, type Gold } from "./question-set.js";

/** Runner options. */
export const DEFAULTS = {
  /** Answers asked for per question (ranks beyond it score 0 in MRR). */
  top: 10,
};

/** One scored question. */
export interface Scored {
  readonly set: string;
  readonly split: "dev" | "holdout";
  readonly id: string;
  readonly question: string;
  readonly phenomena: readonly string[];
  readonly gold: Gold;
  readonly expected: ExpectedVerdict;
  readonly got: { readonly status: string; readonly top: readonly string[]; readonly count?: number; readonly error?: string };
  readonly hit: boolean;
  readonly rr: number;
  readonly verdictRight: boolean;
  /** For 2+ gold answers: the tied group is exactly the gold set. */
  readonly setMatch?: boolean;
}

/** Figures of a group of scored questions. */
export interface Figures {
  readonly n: number;
  readonly hits1: number;
  readonly mrr: number;
  readonly verdict: number;
  readonly setMatch: { readonly n: number; readonly rate: number };
  readonly perPhenomenon: Readonly<Record<string, { readonly n: number; readonly hits1: number; readonly verdict: number }>>;
}

/** Scores one answer document against its gold. */
export function score(q: EvalQuestion, split: "dev" | "holdout", gold: Gold, result: AskResult | undefined, error?: string): Scored {
  const expected = expectedVerdict(gold);
  const ids = result?.answers.map((a) => a.id) ?? [];
  const status = result?.verdict.status ?? "error";
  const count = result?.count?.value;
  let hit = false;
  let rr = 0;
  let setMatch: boolean | undefined;
  if (gold.kind === "count") {
    hit = count === gold.value;
    rr = hit ? 1 : 0;
  } else if (gold.ids.length === 0) {
    hit = status === "none";
    rr = hit ? 1 : 0;
  } else {
    const want = new Set(gold.ids);
    const rank = ids.findIndex((id) => want.has(id));
    hit = rank === 0;
    rr = rank >= 0 ? 1 / (rank + 1) : 0;
    if (gold.ids.length > 1) {
      const group = new Set(result && ids[0] !== undefined ? [ids[0], ...result.verdict.tiedWith] : []);
      setMatch = group.size === want.size && [...want].every((x) => group.has(x));
    }
  }
  return {
    set: q.set,
    split,
    id: q.id,
    question: q.question,
    phenomena: q.phenomena,
    gold,
    expected,
    got: { status, top: ids.slice(0, 3), ...(count !== undefined ? { count } : {}), ...(error !== undefined ? { error } : {}) },
    hit,
    rr,
    verdictRight: status === expected,
    ...(setMatch !== undefined ? { setMatch } : {}),
  };
}

/** Figures of `scored`. */
export function figures(scored: readonly Scored[]): Figures {
  const mean = (xs: readonly number[]) => (xs.length === 0 ? 0 : xs.reduce((a, b) => a + b, 0) / xs.length);
  const perPhenomenon: Record<string, { n: number; hits1: number; verdict: number }> = {};
  for (const p of PHENOMENA) {
    const g = scored.filter((s) => s.phenomena.includes(p.key));
    if (g.length > 0) perPhenomenon[p.key] = { n: g.length, hits1: mean(g.map((s) => (s.hit ? 1 : 0))), verdict: mean(g.map((s) => (s.verdictRight ? 1 : 0))) };
  }
  const sets = scored.filter((s) => s.setMatch !== undefined);
  return {
    n: scored.length,
    hits1: mean(scored.map((s) => (s.hit ? 1 : 0))),
    mrr: mean(scored.map((s) => s.rr)),
    verdict: mean(scored.map((s) => (s.verdictRight ? 1 : 0))),
    setMatch: { n: sets.length, rate: mean(sets.map((s) => (s.setMatch ? 1 : 0))) },
    perPhenomenon,
  };
}

/** Asks and scores every question of a set (progress on stderr). */
export async function evaluateSet(spec: SetSpec, splits: readonly ("dev" | "holdout")[], progress: (s: string) => void = () => {}): Promise<{ scored: Scored[]; labels: Map<string, string> }> {
  const split = readSplit().sets[spec.name];
  if (!split) throw new TiepointError("eval/split", `the ${spec.name} set has no committed split (npm run eval:split -- --set ${spec.name})`);
  const splitOf = new Map<string, "dev" | "holdout">([...split.dev.map((id) => [id, "dev"] as const), ...split.holdout.map((id) => [id, "holdout"] as const)]);
  progress(`${spec.name}: building the catalog (${spec.source()})`);
  const built = builtCatalog(spec);
  const store = goldStore(built.triples);
  const questions = questionsOf(spec).filter((q) => splits.includes(splitOf.get(q.id) ?? "dev"));
  const golds = questions.map((q) => goldOf(store, q, spec.prefixes));
  const labels = new Map<string, string>();
  const session = Session.open({ db: built.db });
  const scored: Scored[] = [];
  try {
    for (const [i, q] of questions.entries()) {
      const sp = splitOf.get(q.id);
      if (!sp) throw new TiepointError("eval/split", `${q.id} is in neither half of the split`, { file: q.file, line: q.line });
      let result: AskResult | undefined;
      let error: string | undefined;
      try {
        result = (await session.askAsync(q.question, { top: DEFAULTS.top })).result;
        for (const a of result.answers) labels.set(a.id, a.label);
      } catch (e) {
        if (!(e instanceof TiepointError)) throw e;
        error = e.message;
      }
      scored.push(score(q, sp, golds[i]!, result, error));
      if ((i + 1) % 25 === 0) progress(`${spec.name}: ${i + 1}/${questions.length} questions`);
    }
    for (const g of golds)
      if (g.kind === "entities")
        for (const id of g.ids) {
          const num = session.catalog.numOf(id);
          if (!labels.has(id) && num !== undefined) labels.set(id, session.catalog.ref(num).label);
        }
  } finally {
    session.close();
  }
  return { scored, labels };
}

const pct = (x: number) => x.toFixed(2);

function table(title: string, f: Figures): string[] {
  const out = [`${title}: ${f.n} questions  Hits@1 ${pct(f.hits1)}  MRR ${pct(f.mrr)}  verdict ${pct(f.verdict)}  set match ${pct(f.setMatch.rate)} (${f.setMatch.n} with 2+ answers)`];
  for (const p of PHENOMENA) {
    const x = f.perPhenomenon[p.key];
    if (x) out.push(`  ${p.title.padEnd(52)} ${String(x.n).padStart(4)}  Hits@1 ${pct(x.hits1)}  verdict ${pct(x.verdict)}`);
  }
  return out;
}

function missLine(s: Scored, labels: Map<string, string>): string {
  const name = (id: string) => labels.get(id) ?? id;
  const want = s.gold.kind === "count" ? `count ${s.gold.value}` : s.gold.ids.length === 0 ? "no answer" : s.gold.ids.slice(0, 4).map(name).join(", ") + (s.gold.ids.length > 4 ? ` (+${s.gold.ids.length - 4})` : "");
  const got = s.got.error ? `error: ${s.got.error}` : `${s.got.count !== undefined ? `count ${s.got.count}, ` : ""}${s.got.top.map(name).join(", ") || "no answer"}`;
  const flags = [s.hit ? "" : "answer", s.verdictRight ? "" : `verdict ${s.got.status} (expected ${s.expected})`].filter((x) => x !== "").join("; ");
  return `  ${s.set}/${s.id} [${s.phenomena.join(",")}] ${s.question}\n      expected: ${want}\n      got: ${got} — ${flags}`;
}

async function main(argv: readonly string[]): Promise<void> {
  const opt = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  for (const a of argv) if (a.startsWith("--") && !["--set", "--split", "--json", "--holdout-misses"].includes(a)) throw new TiepointError("cli/usage", `unknown option ${a}`);
  const setName = opt("--set") ?? "all";
  const splitName = opt("--split") ?? "both";
  if (!["dev", "holdout", "both"].includes(splitName)) throw new TiepointError("cli/usage", `--split must be dev, holdout or both, got "${splitName}"`);
  const specs = setName === "all" ? SETS : [setByName(setName)];
  const splits: ("dev" | "holdout")[] = splitName === "both" ? ["dev", "holdout"] : [splitName as "dev" | "holdout"];
  const showHoldout = argv.includes("--holdout-misses");
  const t0 = Date.now();
  const all: Scored[] = [];
  const labels = new Map<string, string>();
  for (const spec of specs) {
    const r = await evaluateSet(spec, splits, (s) => process.stderr.write(`${s}\n`));
    all.push(...r.scored);
    for (const [k, v] of r.labels) labels.set(k, v);
  }
  const groups: { set: string; split: string; figures: Figures }[] = [];
  for (const set of [...specs.map((s) => s.name), ...(specs.length > 1 ? ["all"] : [])])
    for (const split of splits) {
      const g = all.filter((s) => (set === "all" || s.set === set) && s.split === split);
      groups.push({ set, split, figures: figures(g) });
    }
  const misses = all.filter((s) => (!s.hit || !s.verdictRight) && (s.split === "dev" || showHoldout));
  if (argv.includes("--json")) {
    const doc = {
      engine: `oxigraph ${oxigraphVersion()}`,
      sources: Object.fromEntries(specs.map((s) => [s.name, s.source()])),
      results: groups,
      misses: misses.map((s) => ({ set: s.set, split: s.split, id: s.id, question: s.question, phenomena: s.phenomena, gold: s.gold, expected: s.expected, got: s.got, hit: s.hit, verdictRight: s.verdictRight })),
    };
    process.stdout.write(JSON.stringify(doc, null, 1) + "\n");
    return;
  }
  const lines: string[] = [`gold: SPARQL over the same triples in oxigraph ${oxigraphVersion()}; ${specs.map((s) => `${s.name}: ${s.source()}`).join("; ")}`, ""];
  for (const g of groups) lines.push(...table(`${g.set} ${g.split}`, g.figures), "");
  lines.push(`misses (${misses.length}${showHoldout ? "" : ", dev only; --holdout-misses shows holdout's"}):`);
  for (const s of misses) lines.push(missLine(s, labels));
  lines.push("", `${((Date.now() - t0) / 1000).toFixed(1)} s`, "");
  process.stdout.write(lines.join("\n"));
}

runTool(() => main(process.argv.slice(2)));

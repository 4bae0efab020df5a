/**
 * `npm run eval:verdicts -- [--split dev|holdout|both] [--json] [--list] [--write DIR]`: the verdict set
 * of issue 17 (verdict-sets.ts) through the real `check` (pipeline `runCheck`): each question
 * with its gold answers as expected values and the verdict the gold calls for; prints per split
 * the verdict accuracy and the confusion matrix (expected × got) of `check`'s summary, the
 * accuracy per kind, and the share of questions answered `unique` whose gold has two or more
 * answers (issue 17's target: at most 1 in 20). `--write DIR` also writes each set and split as
 * a `check` question file (`question<TAB>expected<TAB>verdict`), to run `tiepoint check`
 * by hand. Progress on stderr.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { TiepointError, type CheckItem } from "../model/index.js";
import { Session, runCheck, summarise, type QuestionItem } from "../pipeline/index.js";
import { readSplit, runTool } from "./eval-sets.js";
import { expectedVerdict, goldOf, goldStore, oxigraphVersion } from "./question-set.js";
import { VERDICT_KINDS, VERDICT_SETS, VERDICT_SPLIT_FILE, verdictQuestionsOf } from "./verdict-sets.js";

/** One question's check result with its set, split and kind. */
interface Row {
  readonly set: string;
  readonly split: "dev" | "holdout";
  readonly kind: string;
  readonly gold: number;
  readonly item: CheckItem;
}

async function main(argv: readonly string[]): Promise<void> {
  const opt = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  for (const a of argv) if (a.startsWith("--") && !["--split", "--json", "--write", "--list"].includes(a)) throw new TiepointError("cli/usage", `unknown option ${a}`);
  const splitName = opt("--split") ?? "both";
  if (!["dev", "holdout", "both"].includes(splitName)) throw new TiepointError("cli/usage", `--split must be dev, holdout or both, got "${splitName}"`);
  const splits = splitName === "both" ? (["dev", "holdout"] as const) : ([splitName] as ["dev" | "holdout"]);
  const write = opt("--write");
  const committed = readSplit(VERDICT_SPLIT_FILE);
  const rows: Row[] = [];
  for (const spec of VERDICT_SETS) {
    const split = committed.sets[spec.name];
    if (!split) throw new TiepointError("eval/split", `the ${spec.name} verdict set has no committed split (npm run eval:split -- --verdicts --set ${spec.name})`);
    const half = new Map<string, "dev" | "holdout">([...split.dev.map((id) => [id, "dev"] as const), ...split.holdout.map((id) => [id, "holdout"] as const)]);
    process.stderr.write(`${spec.name}: ${spec.source()}\n`);
    const built = spec.catalog();
    const store = goldStore(built.triples);
    const session = Session.open({ db: built.db });
    try {
      for (const sp of splits) {
        const qs = verdictQuestionsOf(spec).filter((q) => half.get(q.id) === sp);
        const golds = qs.map((q) => goldOf(store, q, spec.prefixes));
        const items: QuestionItem[] = qs.map((q, i) => {
          const g = golds[i]!;
          return { line: q.line, question: q.question, expected: g.kind === "entities" ? g.ids : [], verdict: expectedVerdict(g) };
        });
        if (write !== undefined) {
          mkdirSync(write, { recursive: true });
          writeFileSync(join(write, `${spec.name}-${sp}.tsv`), items.map((it) => `${it.question}\t${it.expected.join("|")}\t${it.verdict!}`).join("\n") + "\n");
        }
        const report = await runCheck(session, items);
        report.results.forEach((item, i) => {
          const g = golds[i]!;
          rows.push({ set: spec.name, split: sp, kind: qs[i]!.phenomena[0]!, gold: g.kind === "entities" ? g.ids.length : 1, item });
        });
      }
    } finally {
      session.close();
    }
  }
  const groups = splits.map((sp) => {
    const mine = rows.filter((r) => r.split === sp);
    const summary = summarise(mine.map((r) => r.item), 0);
    const perKind = Object.fromEntries(
      VERDICT_KINDS.map((k) => {
        const g = mine.filter((r) => r.kind === k.key);
        return [k.key, { n: g.length, accuracy: g.length === 0 ? 0 : g.filter((r) => r.item.verdictMatch).length / g.length }];
      }),
    );
    const several = mine.filter((r) => r.gold >= 2);
    const wrongUnique = several.filter((r) => r.item.answer.verdict.status === "unique").length;
    return { split: sp, questions: mine.length, verdictCheck: summary.verdictCheck!, perKind, uniqueOnSeveral: { questions: several.length, unique: wrongUnique, share: several.length === 0 ? 0 : wrongUnique / several.length } };
  });
  if (argv.includes("--json")) {
    process.stdout.write(JSON.stringify({ engine: `oxigraph ${oxigraphVersion()}`, sets: Object.fromEntries(VERDICT_SETS.map((s) => [s.name, s.source()])), results: groups }, null, 1) + "\n");
    return;
  }
  const lines: string[] = [`gold: SPARQL in oxigraph ${oxigraphVersion()}; expected verdict from the gold (none 0, unique 1, tied 2+); verdicts by tiepoint check`, ""];
  for (const g of groups) {
    const vc = g.verdictCheck;
    lines.push(`${g.split}: ${g.questions} questions  verdict accuracy ${vc.accuracy.toFixed(2)}  unique with 2+ gold answers: ${g.uniqueOnSeveral.unique} of ${g.uniqueOnSeveral.questions}`);
    lines.push(`  expected \\ got   unique   tied   weak   none`);
    for (const e of ["unique", "tied", "weak", "none"] as const) lines.push(`  ${e.padEnd(15)}${(["unique", "tied", "weak", "none"] as const).map((x) => String(vc.confusion[e][x]).padStart(7)).join("")}`);
    for (const k of VERDICT_KINDS) lines.push(`  ${k.title.padEnd(62)} ${String(g.perKind[k.key]!.n).padStart(3)}  ${g.perKind[k.key]!.accuracy.toFixed(2)}`);
    lines.push("");
  }
  if (argv.includes("--list")) {
    // per-question lines of the dev half only (the holdout is measured, never looked into)
    for (const r of rows.filter((x) => x.split === "dev")) {
      const it = r.item;
      const v = it.answer.verdict;
      lines.push(`${it.verdictMatch ? " " : "x"} ${r.set} ${r.kind.padEnd(13)} expected ${it.expectedVerdict!.padEnd(6)} got ${v.status.padEnd(6)} ${it.question}  [${v.reason ?? ""}]`);
    }
  }
  process.stdout.write(lines.join("\n"));
}

runTool(() => main(process.argv.slice(2)));

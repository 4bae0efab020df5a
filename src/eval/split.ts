/**
 * `npm run eval:split -- [--verdicts] --set NAME`: splits one evaluation set ONCE into `dev` and
 * `holdout` (question-set.ts `splitIds`, seed `SPLIT_SEED`) and adds it to
 * test/fixtures/eval/split.json (with `--verdicts`: a verdict set, test/fixtures/verdict/split.json).
 * A set already in the file is never split again (the split is fixed before anyone tunes);
 * test/eval-questions.test.ts checks that the file matches the seeded shuffle.
 */
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { TiepointError } from "../model/index.js";
import { SPLIT_FILE, SPLIT_SEED, questionsOf, repoRoot, setByName, runTool, type SetSpec } from "./eval-sets.js";
import { VERDICT_SETS, VERDICT_SPLIT_FILE, verdictQuestionsOf, type VerdictSetSpec } from "./verdict-sets.js";
import { splitIds, type SplitFile } from "./question-set.js";

const METHOD = "Fisher–Yates shuffle per stratum (first phenomenon), Lehmer generator x ← 48271·x mod (2^31 − 1); first ceil(n/2) of each stratum → dev";

function main(argv: readonly string[]): void {
  const i = argv.indexOf("--set");
  const name = i >= 0 ? argv[i + 1] : undefined;
  if (!name) throw new TiepointError("cli/usage", "usage: npm run eval:split -- [--verdicts] --set NAME");
  const verdicts = argv.includes("--verdicts");
  const spec = verdicts ? VERDICT_SETS.find((s) => s.name === name) : setByName(name);
  if (!spec) throw new TiepointError("cli/usage", `unknown verdict set "${name}" (sets: ${VERDICT_SETS.map((s) => s.name).join(", ")})`);
  const questions = verdicts ? verdictQuestionsOf(spec as VerdictSetSpec) : questionsOf(spec as SetSpec);
  const path = join(repoRoot(), verdicts ? VERDICT_SPLIT_FILE : SPLIT_FILE);
  const current: SplitFile = existsSync(path) ? (JSON.parse(readFileSync(path, "utf8")) as SplitFile) : { method: METHOD, seed: SPLIT_SEED, sets: {} };
  if (current.sets[name]) throw new TiepointError("eval/split", `the ${name} set is already split; a split is made once, before tuning`, { file: path });
  const split = splitIds(questions, current.seed);
  const next: SplitFile = { method: current.method, seed: current.seed, sets: { ...current.sets, [name]: split } };
  writeFileSync(path, JSON.stringify(next, null, 1) + "\n");
  process.stderr.write(`${name}: ${split.dev.length} dev, ${split.holdout.length} holdout → ${verdicts ? VERDICT_SPLIT_FILE : SPLIT_FILE}\n`);
}

runTool(() => main(process.argv.slice(2)));

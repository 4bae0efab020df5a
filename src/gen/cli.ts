#!/usr/bin/env node
/**
 * `npm run gen -- --entities N --edges M --seed S --out DIR [--questions Q]`: writes a
 * synthetic catalog (N-Triples) and its question file; prints what it wrote.
 */
import { Command, CommanderError, InvalidArgumentError } from "commander";
import { TiepointError } from "../model/index.js";
import { generateCatalog, GENERATE_DEFAULTS } from "./index.js";

function int(value: string): number {
  const v = value.replace(/_/g, "");
  if (!/^\d+$/.test(v)) throw new InvalidArgumentError("expected a non-negative integer");
  return Number(v);
}

const program = new Command()
  .name("gen")
  .description("Writes a synthetic tiepoint catalog (schema.nt, entities.nt, edges.nt) questions.tsv and conditions.tsv.")
  .option("--entities <n>", "number of entities", int, GENERATE_DEFAULTS.entities)
  .option("--edges <m>", "number of relation edges", int, GENERATE_DEFAULTS.edges)
  .option("--seed <s>", "random seed", int, GENERATE_DEFAULTS.seed)
  .option("--questions <q>", "number of questions with known answers", int, GENERATE_DEFAULTS.questions)
  .option("--out <dir>", "output folder", "gen-out")
  .option("--quiet", "no progress on stderr")
  .exitOverride();

try {
  program.parse(process.argv);
  const o = program.opts<{ entities: number; edges: number; seed: number; questions: number; out: string; quiet?: boolean }>();
  let last = "";
  const r = generateCatalog({
    out: o.out,
    entities: o.entities,
    edges: o.edges,
    seed: o.seed,
    questions: o.questions,
    onProgress: o.quiet
      ? undefined
      : (phase, done) => {
          const line = `gen: ${phase} ${Math.round(done * 100)}%`;
          if (line !== last) process.stderr.write(line + "\n");
          last = line;
        },
  });
  process.stdout.write(
    [
      `entities       ${r.entities}`,
      `edge lines     ${r.edges}`,
      `max degree     ${r.maxDegree}`,
      `shared labels  ${r.sharedLabels}`,
      `questions      ${r.questionCount}  (${r.questions})`,
      `conditions     ${r.conditionQuestionCount}  (${r.conditionQuestions}: superlatives, comparisons, counts over sets of 100 to 5,000)`,
      `files          ${r.files.join(" ")}`,
      `seconds        ${r.seconds.toFixed(1)}`,
      `load with:     tiepoint load ${r.files.join(" ")} --db ${o.out}/catalog.db`,
    ].join("\n") + "\n",
  );
} catch (e) {
  if (e instanceof CommanderError) process.exitCode = e.exitCode === 0 ? 0 : 2;
  else if (e instanceof TiepointError) {
    process.stderr.write(`gen: ${e.format()}\n`);
    process.exitCode = 1;
  } else if (e instanceof Error && "code" in e && typeof e.code === "string" && /^E[A-Z]+$/.test(e.code)) {
    process.stderr.write(`gen: ${e.message}\n`);
    process.exitCode = 1;
  } else throw e;
}

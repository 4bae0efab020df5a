/**
 * `npm run bench:check`: one `tiepoint check` call over 1,000 generated questions on a
 * generated 100,000-entity catalog (src/gen; 500,000 edges), run as the real CLI in a child
 * process and timed from spawn to exit. Target (issue 8): ≤ 30 s.
 *
 * Reported: the cold call (first use of the catalog: builds the relation-index snapshot and
 * whatever the linker persists), a warm second call, the check's own `summary.seconds`, the
 * quality figures of the generated set, an HTML report of the same run (`--format html`), and a
 * check of the generated condition questions (conditions.tsv: superlatives, comparisons and
 * counts over sets of 100 to 5,000, gold from the generated values).
 *
 * Options: --entities N --edges N --questions N --seed N --keep (keep the temp folder),
 * --cold-only (only the cold call: no warm call, no HTML).
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, statSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { Catalog, loadFiles } from "../catalog/index.js";
import { generateCatalog } from "../gen/index.js";
import type { CheckReport } from "../model/index.js";

/** Benchmark sizes and target. */
export const DEFAULTS = {
  entities: 100_000,
  edges: 500_000,
  questions: 1_000,
  seed: 11,
  /** Target from issue 8, seconds for one check call. */
  targetSeconds: 30,
};

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const v = Number(process.argv[i + 1]);
  if (!Number.isFinite(v) || v <= 0) {
    process.stderr.write(`bench:check: --${name} needs a positive number\n`);
    process.exit(2);
  }
  return v;
}

const MAIN = resolve(dirname(fileURLToPath(import.meta.url)), "../cli/main.js");

function timedCheck(args: readonly string[]): { seconds: number; stdout: string } {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [MAIN, "check", ...args], { encoding: "utf8", maxBuffer: 1 << 30 });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) {
    process.stderr.write(`bench:check: tiepoint check failed (status ${r.status}):\n${r.stderr}\n`);
    process.exit(1);
  }
  return { seconds, stdout: r.stdout };
}

const entities = arg("entities", DEFAULTS.entities);
const edges = arg("edges", DEFAULTS.edges);
const questions = arg("questions", DEFAULTS.questions);
const seed = arg("seed", DEFAULTS.seed);
const dir = mkdtempSync(join(tmpdir(), "tp-bench-check-"));
const say = (s: string) => process.stderr.write(`bench:check: ${s}\n`);
try {
  say(`generating ${entities} entities, ${edges} edges, ${questions} questions`);
  const gen = generateCatalog({ out: join(dir, "gen"), entities, edges, seed, questions });
  say(`loading ${gen.files.length} files`);
  const db = join(dir, "bench.db");
  const cat = Catalog.open(db, { create: true });
  const load = loadFiles(cat, gen.files);
  cat.close();
  say(`check, cold`);
  const cold = timedCheck([gen.questions, "--db", db, "--json"]);
  const quick = process.argv.includes("--cold-only");
  say(quick ? `done (${cold.seconds.toFixed(1)} s cold)` : `check, warm (${cold.seconds.toFixed(1)} s cold)`);
  const warm = quick ? cold : timedCheck([gen.questions, "--db", db, "--json"]);
  const html = join(dir, "report.html");
  if (!quick) say(`check --format html (${warm.seconds.toFixed(1)} s warm)`);
  const page = quick ? null : timedCheck([gen.questions, "--db", db, "--format", "html", "--out", html]);
  // the condition questions (superlatives, comparisons, counts over sets of 100 to 5,000), one warm call
  say(`check of ${gen.conditionQuestionCount} condition questions`);
  const conds = timedCheck([gen.conditionQuestions, "--db", db, "--json"]);
  const cs = (JSON.parse(conds.stdout) as CheckReport).summary;
  const report = JSON.parse(warm.stdout) as CheckReport;
  const s = report.summary;
  const result = {
    bench: "check",
    catalog: { entities: gen.entities, edgeLines: gen.edges, maxDegree: gen.maxDegree, loadSeconds: +load.seconds.toFixed(2) },
    questions: s.questions,
    coldCallSeconds: +cold.seconds.toFixed(2),
    warmCallSeconds: quick ? null : +warm.seconds.toFixed(2),
    checkSummarySeconds: +s.seconds.toFixed(2),
    millisPerQuestion: +((s.seconds * 1000) / Math.max(1, s.questions)).toFixed(2),
    htmlCallSeconds: page ? +page.seconds.toFixed(2) : null,
    htmlMebibytes: page ? +(statSync(html).size / 2 ** 20).toFixed(1) : null,
    conditions: { questions: cs.questions, seconds: +conds.seconds.toFixed(2), millisPerQuestion: +((cs.seconds * 1000) / Math.max(1, cs.questions)).toFixed(2), hits1: +cs.hits1.toFixed(3), budgetHit: cs.budgetHit },
    quality: { withExpected: s.withExpected, hits1: +s.hits1.toFixed(3), hits5: +s.hits5.toFixed(3), mrr: +s.mrr.toFixed(3), verdicts: s.verdicts },
    loadAverage: loadavg().map((x) => +x.toFixed(1)),
    target: DEFAULTS.targetSeconds,
    meetsTarget: cold.seconds <= DEFAULTS.targetSeconds,
  };
  process.stdout.write(JSON.stringify(result, null, 2) + "\n");
  process.stderr.write(
    `check: ${s.questions} questions on ${gen.entities.toLocaleString("en-US")} entities: cold call ${cold.seconds.toFixed(1)} s${quick ? "" : `, warm ${warm.seconds.toFixed(1)} s`} ` +
      `(target ${DEFAULTS.targetSeconds} s: ${result.meetsTarget ? "met" : "NOT met"})${page ? `; html report ${page.seconds.toFixed(1)} s` : ""}\n`,
  );
} finally {
  if (!process.argv.includes("--keep")) rmSync(dir, { recursive: true, force: true });
  else process.stderr.write(`kept ${dir}\n`);
}

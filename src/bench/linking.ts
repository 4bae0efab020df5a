/**
 * `npm run bench:linking`: mention detection + candidate scoring throughput on a generated
 * catalog (default 100,000 entities, 500,000 edges, via src/gen), one core, no timed asserts.
 * Reports: linker start-up with the lexical snapshot absent (built and saved) and present
 * (loaded), questions per second over the generated question file (repeated to `--questions`
 * runs after one warm-up pass), and the share of questions with at least one mention.
 * Target (issue 4): ≥ 2,000 questions/s on one core; start-up ≤ 2 s on 1,000,000 entities
 * (run with --entities 1000000 --edges 3000000).
 *
 * Options: --entities N --edges N --seed N --questions N (linking runs) --keep (keep the folder).
 */
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../catalog/index.js";
import { generateCatalog } from "../gen/index.js";
import { Linker, linkQuestion } from "../linking/index.js";

/** Benchmark sizes and target. */
export const DEFAULTS = {
  entities: 100_000,
  edges: 500_000,
  seed: 11,
  /** Distinct generated questions. */
  generated: 2_000,
  /** Linking runs timed (the generated questions repeated). */
  questions: 20_000,
  targetPerSecond: 2_000,
};

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const v = Number(process.argv[i + 1]);
  if (!Number.isFinite(v) || v <= 0) {
    process.stderr.write(`bench:linking: --${name} needs a positive number\n`);
    process.exit(2);
  }
  return v;
}

const entities = arg("entities", DEFAULTS.entities);
const edges = arg("edges", DEFAULTS.edges);
const seed = arg("seed", DEFAULTS.seed);
const runs = arg("questions", DEFAULTS.questions);
const dir = mkdtempSync(join(tmpdir(), "tp-bench-linking-"));
try {
  const step = (what: string) => process.stderr.write(`bench:linking: ${what}\n`);
  step("generating");
  const gen = generateCatalog({ out: join(dir, "gen"), entities, edges, seed, questions: DEFAULTS.generated });
  const db = join(dir, "bench.db");
  const w = Catalog.open(db, { create: true });
  step("loading");
  loadFiles(w, gen.files);
  w.close();
  step("linking");
  const cat = Catalog.open(db, { readonly: true });
  let t = process.hrtime.bigint();
  const ms = () => {
    const now = process.hrtime.bigint();
    const d = Number(now - t) / 1e6;
    t = now;
    return d;
  };
  Linker.fromCatalog(cat);
  const coldMs = ms();
  const linker = Linker.fromCatalog(cat);
  const warmMs = ms();
  const questions = readFileSync(gen.questions, "utf8").split("\n").filter((l) => l !== "").map((l) => l.split("\t")[0]!);
  let withMention = 0;
  let mentions = 0;
  for (const q of questions) {
    const r = linkQuestion(q, linker);
    if (r.mentions.length > 0) withMention++;
    mentions += r.mentions.length;
  }
  const warmupMs = ms();
  for (let i = 0; i < runs; i++) linkQuestion(questions[i % questions.length]!, linker);
  const runMs = ms();
  const perSecond = runs / (runMs / 1000);
  cat.close();
  process.stdout.write(
    `${JSON.stringify(
      {
        bench: "linking",
        catalog: { entities, edges, seed },
        startup: { snapshotBuiltMs: Math.round(coldMs), snapshotLoadedMs: Math.round(warmMs) },
        questions: { distinct: questions.length, withMention, mentionsPerQuestion: +(mentions / questions.length).toFixed(2), firstPassMs: Math.round(warmupMs) },
        throughput: { runs, seconds: +(runMs / 1000).toFixed(2), questionsPerSecond: Math.round(perSecond), target: DEFAULTS.targetPerSecond, met: perSecond >= DEFAULTS.targetPerSecond },
        peakRssMiB: Math.round(process.resourceUsage().maxRSS / 1024),
      },
      null,
      2,
    )}\n`,
  );
} finally {
  if (!process.argv.includes("--keep")) rmSync(dir, { recursive: true, force: true });
  else process.stderr.write(`kept ${dir}\n`);
}

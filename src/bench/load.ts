/**
 * `npm run bench:load`: generates a synthetic catalog (default 100,000 entities and 500,000
 * edges, N-Triples, via src/gen) and loads it into a fresh catalog file, then loads a second,
 * smaller generated catalog into that now non-empty catalog. Reports statements per second
 * and the peak resident set size (getrusage maxrss). Target (issue 2): ≥ 150,000 triples/s.
 *
 * Options: --entities N --edges N --seed N --keep (keep the temp folder).
 */
import { mkdtempSync, rmSync, statSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../catalog/index.js";
import { generateCatalog } from "../gen/index.js";

/** Benchmark sizes. */
export const DEFAULTS = {
  entities: 100_000,
  edges: 500_000,
  seed: 7,
  /** Target from issue 2. */
  targetPerSecond: 150_000,
};

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const v = Number(process.argv[i + 1]);
  if (!Number.isFinite(v) || v <= 0) {
    process.stderr.write(`bench:load: --${name} needs a positive number\n`);
    process.exit(2);
  }
  return v;
}

const entities = arg("entities", DEFAULTS.entities);
const edges = arg("edges", DEFAULTS.edges);
const seed = arg("seed", DEFAULTS.seed);
const dir = mkdtempSync(join(tmpdir(), "tp-bench-load-"));
try {
  const t0 = Date.now();
  const gen = generateCatalog({ out: join(dir, "big"), entities, edges, seed, questions: 1 });
  const genSeconds = (Date.now() - t0) / 1000;
  const bytes = gen.files.reduce((s, f) => s + statSync(f).size, 0);
  const db = join(dir, "bench.db");
  const cat = Catalog.open(db, { create: true });
  const cpu0 = process.cpuUsage();
  const first = loadFiles(cat, gen.files);
  const cpu1 = process.cpuUsage(cpu0);
  const firstCpu = (cpu1.user + cpu1.system) / 1e6;
  const more = generateCatalog({ out: join(dir, "more"), entities: Math.max(100, Math.round(entities / 10)), edges: Math.round(edges / 10), seed: seed + 1, questions: 1 });
  const cpu2 = process.cpuUsage();
  const second = loadFiles(cat, more.files);
  const cpu3 = process.cpuUsage(cpu2);
  const secondCpu = (cpu3.user + cpu3.system) / 1e6;
  const counts = cat.counts();
  cat.close();
  const rssMiB = process.resourceUsage().maxRSS / 1024;
  const rate1 = first.statements / first.seconds;
  const rate2 = second.statements / second.seconds;
  const result = {
    bench: "load",
    generated: { entities, edges, seed, files: gen.files.length, mebibytes: +(bytes / 2 ** 20).toFixed(1), seconds: genSeconds },
    freshLoad: { statements: first.statements, seconds: first.seconds, statementsPerSecond: Math.round(rate1), cpuSeconds: +firstCpu.toFixed(2), statementsPerCpuSecond: Math.round(first.statements / firstCpu) },
    loadIntoExisting: { statements: second.statements, seconds: second.seconds, statementsPerSecond: Math.round(rate2), cpuSeconds: +secondCpu.toFixed(2), statementsPerCpuSecond: Math.round(second.statements / secondCpu) },
    /** 1-minute load average of the machine at the end (other processes competing for the 2 cores distort wall-clock rates). */
    loadAverage: +loadavg()[0]!.toFixed(2),
    catalog: { entities: counts.entities, edges: counts.edges, attributes: counts.attributes, aliases: counts.aliases, mebibytes: +(statSync(db).size / 2 ** 20).toFixed(1) },
    peakRssMiB: Math.round(rssMiB),
    target: DEFAULTS.targetPerSecond,
    meetsTarget: rate1 >= DEFAULTS.targetPerSecond,
  };
  process.stdout.write(JSON.stringify(result, null, 2) + "\n");
  process.stderr.write(
    `load: ${first.statements.toLocaleString("en-US")} statements in ${first.seconds.toFixed(2)} s = ${Math.round(rate1).toLocaleString("en-US")}/s ` +
      `(target ${DEFAULTS.targetPerSecond.toLocaleString("en-US")}/s: ${result.meetsTarget ? "met" : "NOT met"}; ${result.freshLoad.statementsPerCpuSecond.toLocaleString("en-US")} per CPU second); ` +
      `into existing: ${Math.round(rate2).toLocaleString("en-US")}/s (${result.loadIntoExisting.statementsPerCpuSecond.toLocaleString("en-US")} per CPU second); peak RSS ${Math.round(rssMiB)} MiB; load average ${result.loadAverage}\n`,
  );
} finally {
  if (!process.argv.includes("--keep")) rmSync(dir, { recursive: true, force: true });
  else process.stderr.write(`kept ${dir}\n`);
}

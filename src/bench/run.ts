/**
 * `npm run bench [-- --size S|M|L …]`: the scale benchmark suite (issue 9).
 *
 * On generated catalogs (src/gen) of three sizes — S 10,000 entities / 50,000 edges,
 * M 100,000 / 500,000, L 1,000,000 / 5,000,000 (default: S and M; L only on request) — it
 * measures, each phase in its own child process so peak memory is the phase's own:
 * load throughput and peak memory (loadFiles), index build, snapshot save and load,
 * process start to first answer (the real CLI, spawned), per-question latency median/p95
 * over ≥ 200 generated questions and peak memory while answering (one Session), Hits@1, and
 * the query-time PageRank against exact PageRank — our power iteration and, side by side,
 * python3-igraph's PRPACK on the same graph, transition weights and seeds (time per query,
 * top-20 agreement; the column is skipped with a note when igraph is absent).
 *
 * Writes bench-results/bench-SIZES-TIME.json and .md, and bench-results/latest.md.
 * Options: --size S|M|L|H (repeatable or comma-separated; H: the hub case over the catalog of
 * --hubs-db, src/bench/hubs.ts), --questions N (default 200),
 * --phases generate,load,index,ready,ask,ppr,compose,graph (a subset, in that order; default all but
 * graph; `compose` times `tiepoint compose` per target (src/bench/compose.ts, issue 22); later phases reuse the catalog the earlier ones left in the work folder; `graph`
 * repeats the PageRank comparison on a seeded power-law graph of the size's node and edge
 * counts without any catalog, src/bench/graph.ts),
 * --work DIR (generated catalogs; default $TMPDIR/tiepoint-bench), --out DIR.
 *
 * Conditions over a real catalog (issue 23): `--case conditions` runs only the Debian
 * superlative, comparison and count questions (src/eval/debian-conditions.ts: 30 questions,
 * median and max per question, checked against SQL; builds its catalog once, a few minutes);
 * the default run adds that table at the end when its catalog is already built (about 15 s),
 * and says how to build it otherwise.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, writeFileSync } from "node:fs";
import { cpus, totalmem, tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { phaseAsk, phaseGenerate, phaseGraph, phaseIndex, phaseLoad, phasePpr, phaseReady } from "./phases.js";
import { findIgraph } from "./igraph.js";
import { phaseCompose } from "./compose.js";
import { phaseHubs } from "./hubs.js";
import { renderMarkdown, type SizeResult } from "./report.js";

/** The three catalog sizes of issue 9, and per-size query counts. */
export const SIZES = {
  S: { entities: 10_000, edges: 50_000, exact: 100, igraph: 20 },
  M: { entities: 100_000, edges: 500_000, exact: 100, igraph: 20 },
  L: { entities: 1_000_000, edges: 5_000_000, exact: 30, igraph: 10 },
} as const;

/** The hub-catalog case (hubs.ts): a real catalog given by --hubs-db, not generated. */
const HUB_SIZE = "H";

type SizeName = keyof typeof SIZES | typeof HUB_SIZE;

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, "../..");
const CLI = join(ROOT, "dist/cli/main.js");
const CONDITIONS = join(ROOT, "dist/eval/debian-conditions.js");
/** Where `npm run bench:conditions` keeps its catalog (its default `--dir`). */
const CONDITIONS_DB = join(tmpdir(), "tiepoint-bench-debian", "debian.db");

const USAGE = `usage: npm run bench -- [--size S|M|L]… [--questions N] [--work DIR] [--out DIR] [--phases LIST]
       npm run bench -- --case conditions

  --size S|M|L|H   catalog size(s), repeatable or comma-separated (default S,M):
                   S 10,000 entities / 50,000 edges, M 100,000 / 500,000, L 1,000,000 / 5,000,000;
                   H the hub case: questions written from the catalog of --hubs-db around its
                   entities of 20,000+ edges, timed like the ask phase (src/bench/hubs.ts)
  --hubs-db PATH   the catalog of the hub case (default $TMPDIR/tiepoint-bench-debian/debian.db,
                   the Debian package index that npm run bench:conditions builds)
  --questions N    generated questions asked per size (default 200)
  --work DIR       where generated catalogs, snapshots and igraph files go (default $TMPDIR/tiepoint-bench)
  --out DIR        where the JSON and Markdown results go (default bench-results/)
  --phases LIST    comma-separated subset of generate,load,index,ready,ask,ppr,compose,graph
                   (default all but graph; later phases reuse the work folder of earlier runs)
  --case conditions  only the 30 Debian superlative, comparison and count questions (issue 23):
                   per-question wall and CPU time, median and max, answers against SQL
                   (builds the catalog once, a few minutes); the default run adds this table
                   when that catalog is already built

The igraph columns need python3-igraph (apt-get install python3-igraph, or pip install igraph);
they are skipped, and say so, when it is absent.
`;

function usage(msg: string): never {
  process.stderr.write(`bench: ${msg}\n${USAGE}`);
  process.exit(1);
}

function args(argv: readonly string[]) {
  const sizes: SizeName[] = [];
  let questions = 200;
  let work = join(tmpdir(), "tiepoint-bench");
  let hubsDb = join(tmpdir(), "tiepoint-bench-debian", "debian.db");
  let out = join(ROOT, "bench-results");
  let phase: string | undefined;
  let phases = ["generate", "load", "index", "ready", "ask", "ppr", "compose"];
  let only: "conditions" | undefined;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--help" || a === "-h") {
      process.stdout.write(USAGE);
      process.exit(0);
    }
    const next = () => argv[++i] ?? usage(`${a} needs a value`);
    if (a === "--size") for (const s of next().split(",")) {
      const u = s.trim().toUpperCase();
      if (!(u in SIZES) && u !== HUB_SIZE) usage(`unknown size "${s}" (use S, M, L or H)`);
      sizes.push(u as SizeName);
    }
    else if (a === "--questions") {
      questions = Number(next());
      if (!Number.isInteger(questions) || questions < 1) usage("--questions needs a positive whole number");
    } else if (a === "--work") work = resolve(next());
    else if (a === "--hubs-db") hubsDb = resolve(next());
    else if (a === "--out") out = resolve(next());
    else if (a === "--phase") phase = next();
    else if (a === "--case") {
      const c = next();
      if (c !== "conditions") usage(`unknown case "${c}" (conditions)`);
      only = c;
    }
    else if (a === "--phases") {
      phases = next().split(",").map((x) => x.trim());
      for (const x of phases) if (!["generate", "load", "index", "ready", "ask", "ppr", "compose", "graph"].includes(x)) usage(`unknown phase "${x}" (generate, load, index, ready, ask, ppr, compose, graph)`);
    }
    else usage(`unknown option ${a}`);
  }
  return { sizes: sizes.length > 0 ? sizes : (["S", "M"] as SizeName[]), questions, work, out, phase, phases, hubsDb, only };
}

/** Runs one phase in a child process; returns its JSON record. */
function child(phase: string, size: SizeName, workBase: string, questions: number, hubsDb: string): Record<string, unknown> {
  const r = spawnSync(process.execPath, ["--max-old-space-size=4096", fileURLToPath(import.meta.url), "--phase", phase, "--size", size, "--work", workBase, "--questions", String(questions), "--hubs-db", hubsDb], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
    maxBuffer: 1 << 26,
  });
  const last = (r.stdout ?? "").trim().split("\n").pop() ?? "";
  if (r.status !== 0) return { error: `phase ${phase} exited with ${r.status}` };
  try {
    return JSON.parse(last) as Record<string, unknown>;
  } catch {
    return { error: `phase ${phase} printed no result` };
  }
}

function runPhase(phase: string, size: SizeName, work: string, questions: number, hubsDb: string): Record<string, unknown> | Promise<Record<string, unknown>> {
  if (phase === "hubs") return phaseHubs(hubsDb);
  if (size === HUB_SIZE) usage(`size ${HUB_SIZE} has only the hubs phase`);
  const s = SIZES[size];
  switch (phase) {
    case "generate":
      return phaseGenerate(work, s.entities, s.edges, Math.max(questions + 50, 250));
    case "load":
      return phaseLoad(work);
    case "index":
      return phaseIndex(work);
    case "ask":
      return phaseAsk(work, questions);
    case "ppr":
      return phasePpr(work, questions, s.exact, s.igraph);
    case "compose":
      return phaseCompose(work, questions);
    case "graph":
      return phaseGraph(work, s.entities, s.edges, questions, s.exact, s.igraph);
    default:
      usage(`unknown phase ${phase}`);
  }
}

/** Runs the conditions case (its own process: its figures are a fresh process's, first question included); its table, or null when it failed. */
function conditionsCase(): string | null {
  const r = spawnSync(process.execPath, [CONDITIONS], { encoding: "utf8", stdio: ["ignore", "pipe", "inherit"], maxBuffer: 1 << 24 });
  return r.status === 0 ? r.stdout : null;
}

function main(): void {
  const o = args(process.argv.slice(2));
  if (o.only === "conditions") {
    const table = conditionsCase();
    if (table === null) process.exit(1);
    process.stdout.write(table);
    return;
  }
  if (o.phase !== undefined) {
    const size = o.sizes[0]!;
    const work = join(o.work, size);
    mkdirSync(work, { recursive: true });
    void Promise.resolve(runPhase(o.phase, size, work, o.questions, o.hubsDb)).then((r) => process.stdout.write("\n" + JSON.stringify(r) + "\n"));
    return;
  }
  const machine = {
    cpus: cpus().length,
    cpuModel: cpus()[0]?.model ?? "unknown",
    memoryGiB: Math.round((totalmem() / 2 ** 30) * 10) / 10,
    node: process.version,
    platform: `${process.platform} ${process.arch}`,
    igraph: findIgraph()?.version ?? null,
    date: new Date().toISOString(),
  };
  const results: SizeResult[] = [];
  for (const size of o.sizes) {
    if (size === HUB_SIZE) {
      // the hub case: one child process, its record in the ask phase's place (same table rows)
      process.stderr.write(`bench H: the hub case over ${o.hubsDb}…\n`);
      const t = performance.now();
      const ask = child("hubs", size, o.work, o.questions, o.hubsDb);
      process.stderr.write(`bench H: done in ${((performance.now() - t) / 1000).toFixed(1)} s\n`);
      results.push({ size, entities: Number(ask.entities ?? 0), edges: Number(ask.edges ?? 0), phases: { ask } });
      continue;
    }
    const work = join(o.work, size);
    mkdirSync(work, { recursive: true });
    const s = SIZES[size];
    process.stderr.write(`bench ${size}: ${s.entities} entities, ${s.edges} edges (work folder ${work})\n`);
    const r: SizeResult = { size, entities: s.entities, edges: s.edges, phases: {} };
    for (const phase of ["generate", "load", "index", "ready", "ask", "ppr", "compose", "graph"]) {
      if (!o.phases.includes(phase)) continue;
      process.stderr.write(`bench ${size}: ${phase}…\n`);
      if (phase === "ready") {
        r.phases.ready = phaseReady(work, CLI);
        continue;
      }
      const t = performance.now();
      r.phases[phase] = child(phase, size, o.work, o.questions, o.hubsDb);
      process.stderr.write(`bench ${size}: ${phase} done in ${((performance.now() - t) / 1000).toFixed(1)} s\n`);
    }
    results.push(r);
  }
  mkdirSync(o.out, { recursive: true });
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const base = join(o.out, `bench-${o.sizes.join("")}-${stamp}`);
  const doc = { machine, results };
  writeFileSync(base + ".json", JSON.stringify(doc, null, 2) + "\n");
  let md = renderMarkdown(doc);
  // the conditions case over the real catalog, when its catalog is built (else how to build it)
  if (o.phase === undefined && existsSync(CONDITIONS_DB)) {
    process.stderr.write("bench: conditions over the Debian catalog…\n");
    const table = conditionsCase();
    md += `\nConditions over a real catalog (issue 23, \`npm run bench -- --case conditions\`):\n\n\`\`\`\n${table ?? "failed (see stderr)\n"}\`\`\`\n`;
  } else md += "\nConditions over a real catalog (issue 23): not run, its catalog is not built; `npm run bench -- --case conditions` builds it (a few minutes) and runs it.\n";
  writeFileSync(base + ".md", md);
  writeFileSync(join(o.out, "latest.md"), md);
  process.stdout.write(md);
  process.stderr.write(`bench: wrote ${base}.json and .md\n`);
}

main();

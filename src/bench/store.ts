/**
 * `npm run bench:store -- --endpoint URL --nt FILE [--graph IRI] [--questions FILE]…
 * [--local DB] [--attached DB] [--json FILE]`: the store case beside the local case in one run. The store must
 * already hold FILE's triples (in `--graph` when given; test/helpers/virtuoso.ts starts and
 * loads a Virtuoso, README "Attaching a SPARQL store" the commands for a large file).
 *
 * Questions: every `--questions FILE` (a question file: the column named `question` of a TSV
 * with a header, else the first column; `npm run bench:conditions -- --questions-out FILE`
 * writes its 30 questions made from this machine's apt lists as such a file).
 *
 * Reported: attach time and throughput (labels per second, and the pull alone), the same
 * triples loaded locally (or `--local DB`, a catalog loaded from FILE; `--attached DB` skips the
 * attach and asks a copy of a catalog attached to the same store), then every question
 * asked of both catalogs: per-question median and p95 (nearest rank, phases.ts `quantiles`) and
 * CPU time, requests, rows and milliseconds of pulling per question, the share of questions
 * with the same verdict and first answer (under a tie: each first answer in the other's tied
 * group, as test/store-attach.test.ts), the questions that differ, and resident memory of the
 * store session alone (before the local catalog is opened) and after both. The load average
 * is printed beside the figures. Both sides are asked without the time budget (`timeLimitMs` 0),
 * so that a loaded machine cannot cut one side's stages. Never asserted; figures only.
 */
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../catalog/index.js";
import { LoadPreparation, Session, attachStore } from "../pipeline/index.js";
import type { AskResult } from "../model/index.js";
import { quantiles } from "./phases.js";

function opt(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i < 0 ? undefined : process.argv[i + 1];
}

function opts(name: string): string[] {
  const out: string[] = [];
  process.argv.forEach((a, i) => {
    if (a === `--${name}` && process.argv[i + 1] !== undefined) out.push(process.argv[i + 1]!);
  });
  return out;
}

/** The questions of a question file: the `question` column of a TSV with a header, else the first column. */
export function questionsOfFile(file: string): string[] {
  const lines = readFileSync(file, "utf8").split("\n");
  const head = lines[0]!.split("\t");
  const col = head.indexOf("question");
  return lines
    .slice(col >= 0 ? 1 : 0)
    .map((l) => (l.split("\t")[Math.max(col, 0)] ?? "").trim())
    .filter((l) => l !== "" && !l.startsWith("#"));
}

/** Same verdict and first answer; under a tie each first answer in the other's tied group (the order inside a tie is no claim). */
export function agree(x: AskResult, y: AskResult): boolean {
  const group = (d: AskResult) => new Set([d.answers[0]?.id, ...(d.verdict.tiedWith ?? [])]);
  if (x.verdict.status !== y.verdict.status) return false;
  if (x.count !== undefined || y.count !== undefined) return x.count?.value === y.count?.value;
  return x.answers[0]?.id === y.answers[0]?.id || (x.verdict.status === "tied" && group(y).has(x.answers[0]?.id) && group(x).has(y.answers[0]?.id));
}

/** Both catalogs are asked without the time budget (a loaded machine must not cut one side's stages and not the other's). */
const NO_BUDGET = { timeLimitMs: 0 };

const mib = () => Math.round(process.memoryUsage().rss / 2 ** 20);
const cpuMs = (since: NodeJS.CpuUsage) => {
  const d = process.cpuUsage(since);
  return (d.user + d.system) / 1000;
};
const fix = (x: number) => Math.round(x * 10) / 10;

async function main(): Promise<void> {
  const endpoint = opt("endpoint");
  const nt = opt("nt");
  if (!endpoint || !nt) {
    process.stderr.write("bench:store: needs --endpoint URL and --nt FILE (the triples the store holds)\n");
    process.exit(2);
  }
  const graph = opt("graph");
  const questions = opts("questions").flatMap(questionsOfFile);
  const dir = mkdtempSync(join(tmpdir(), "tiepoint-bench-store-"));
  const say = (s: string) => process.stdout.write(s + "\n");
  try {
    const attached = join(dir, "attached.db");
    const copyCatalog = (from: string, to: string) => {
      for (const suffix of ["", ".idx", ".link", ".num", ".store"]) if (existsSync(from + suffix)) copyFileSync(from + suffix, to + suffix);
    };
    const reuse = opt("attached");
    if (reuse) copyCatalog(reuse, attached);
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    let pullS = 0;
    const rep = reuse
      ? undefined
      : await attachStore(endpoint, attached, {
          ...(graph ? { graph } : {}),
          onProgress: (line) => {
            if (line.startsWith("attach: writing")) pullS = (performance.now() - t0) / 1000;
          },
        });
    const attachS = (performance.now() - t0) / 1000;
    const attachCpu = cpuMs(c0) / 1000;
    if (!rep) say(`attach: skipped (a copy of ${reuse})`);
    else say(
      `attach: ${rep.entities.toLocaleString("en-US")} entities, ${rep.labels.toLocaleString("en-US")} labels, ${rep.edges.toLocaleString("en-US")} edges left in the store; ` +
        `${attachS.toFixed(2)} s (${attachCpu.toFixed(1)} s CPU in tiepoint), ${Math.round(rep.labels / attachS).toLocaleString("en-US")} labels/s; ` +
        `the pull alone ${pullS.toFixed(2)} s, ${Math.round(rep.labels / pullS).toLocaleString("en-US")} labels/s; ${rep.requests} requests, ${rep.rows.toLocaleString("en-US")} rows; load average ${loadavg()[0]!.toFixed(1)}`,
    );
    if (questions.length === 0) return;
    // the store case alone first (its memory), then the local case
    const a = Session.open({ db: attached });
    for (const q of questions.slice(0, 3)) await a.askAsync(q, NO_BUDGET); // warm-up, not counted
    const store: { ms: number; cpu: number; requests: number; rows: number; cached: number; pullMs: number; hubs: number; result: AskResult }[] = [];
    const la0 = loadavg()[0]!;
    for (const q of questions) {
      const c = process.cpuUsage();
      const s0 = performance.now();
      const x = await a.askAsync(q, NO_BUDGET);
      const ms = performance.now() - s0;
      const f = a.pullFigures()!;
      store.push({ ms, cpu: cpuMs(c), requests: f.requests, rows: f.rows, cached: f.cached ?? 0, pullMs: f.ms, hubs: f.hubs, result: x.result });
    }
    const rssStore = mib();
    a.close();
    let local = opt("local");
    let loadS = NaN;
    if (local) {
      const copy = join(dir, "local.db");
      copyCatalog(local, copy);
      local = copy;
    } else {
      local = join(dir, "local.db");
      const t1 = performance.now();
      const cat = Catalog.open(local, { create: true });
      loadFiles(cat, [nt], { sink: new LoadPreparation() });
      cat.close();
      loadS = (performance.now() - t1) / 1000;
    }
    const l = Session.open({ db: local });
    for (const q of questions.slice(0, 3)) await l.askAsync(q, NO_BUDGET);
    const loc: { ms: number; cpu: number; result: AskResult }[] = [];
    for (const q of questions) {
      const c = process.cpuUsage();
      const s0 = performance.now();
      const y = await l.askAsync(q, NO_BUDGET);
      loc.push({ ms: performance.now() - s0, cpu: cpuMs(c), result: y.result });
    }
    const rssBoth = mib();
    l.close();
    const la1 = loadavg()[0]!;
    const differ = questions.map((q, i) => ({ q, i })).filter(({ i }) => !agree(store[i]!.result, loc[i]!.result));
    const qs = quantiles(store.map((x) => x.ms));
    const qsc = quantiles(store.map((x) => x.cpu));
    const ql = quantiles(loc.map((x) => x.ms));
    const qlc = quantiles(loc.map((x) => x.cpu));
    const r = quantiles(store.map((x) => x.requests));
    const w = quantiles(store.map((x) => x.rows));
    const p = quantiles(store.map((x) => x.pullMs));
    const k = quantiles(store.map((x) => x.cached));
    say(
      `questions: ${questions.length}${Number.isNaN(loadS) ? "" : ` (local load of the same triples ${loadS.toFixed(1)} s)`}; load average ${la0.toFixed(1)} → ${la1.toFixed(1)}\n` +
        `  store: median ${fix(qs.median)} ms, p95 ${fix(qs.p95)} ms (CPU ${fix(qsc.median)} / ${fix(qsc.p95)} ms); pulling ${fix(p.median)} / ${fix(p.p95)} ms; requests median ${r.median}, p95 ${r.p95}, max ${Math.max(...store.map((x) => x.requests))}; rows median ${w.median}, p95 ${w.p95}; entity rows from the session's cache median ${k.median}, p95 ${k.p95}\n` +
        `  local: median ${fix(ql.median)} ms, p95 ${fix(ql.p95)} ms (CPU ${fix(qlc.median)} / ${fix(qlc.p95)} ms)\n` +
        `  same verdict and first answer: ${questions.length - differ.length}/${questions.length} (${(((questions.length - differ.length) / questions.length) * 100).toFixed(1)} %)\n` +
        `  resident memory: ${rssStore} MiB with the attached catalog alone, ${rssBoth} MiB after the local one too`,
    );
    for (const { q, i } of differ) {
      const d = (x: AskResult) => `${x.verdict.status} ${x.count !== undefined ? `count ${x.count.value}` : (x.answers[0]?.id ?? "-")}`;
      say(`  differs: ${JSON.stringify(q)}: store ${d(store[i]!.result)} (hubs left unexpanded ${store[i]!.hubs}${store[i]!.result.notes?.some((n) => n.includes("not pulled")) ? ", an entity over maxRow" : ""}) | local ${d(loc[i]!.result)}`);
    }
    const json = opt("json");
    if (json) writeFileSync(json, JSON.stringify({ questions: questions.map((q, i) => ({ q, store: { ms: store[i]!.ms, cpu: store[i]!.cpu, requests: store[i]!.requests, rows: store[i]!.rows, pullMs: store[i]!.pullMs }, local: { ms: loc[i]!.ms }, agree: agree(store[i]!.result, loc[i]!.result) })) }, null, 1));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e: Error) => {
  process.stderr.write(`bench:store: ${e.message}\n`);
  process.exit(1);
});

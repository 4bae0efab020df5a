/**
 * `npm run bench:store -- --endpoint URL --nt FILE [--graph IRI] [--questions FILE]`: the store
 * case beside the local case in one run. The store must already hold FILE's triples (in
 * `--graph` when given; test/helpers/virtuoso.ts starts and loads a Virtuoso for this).
 *
 * Reported: attach time and throughput (labels per second), the same triples loaded locally,
 * then every question asked of both catalogs in one process each, interleaved: per-question
 * median and p95 (nearest rank, phases.ts `quantiles`), requests and rows pulled per question,
 * the share of questions with the same first answer and verdict, and resident memory after the
 * questions (process RSS). Never asserted; figures only.
 */
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../catalog/index.js";
import { LoadPreparation, Session, attachStore } from "../pipeline/index.js";
import { quantiles } from "./phases.js";

function opt(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i < 0 ? undefined : process.argv[i + 1];
}

async function main(): Promise<void> {
  const endpoint = opt("endpoint");
  const nt = opt("nt");
  if (!endpoint || !nt) {
    process.stderr.write("bench:store: needs --endpoint URL and --nt FILE (the triples the store holds)\n");
    process.exit(2);
  }
  const graph = opt("graph");
  const qfile = opt("questions");
  const questions = qfile
    ? readFileSync(qfile, "utf8")
        .split("\n")
        .map((l) => l.split("\t")[0]!.trim())
        .filter((l) => l !== "" && !l.startsWith("#"))
    : [];
  const dir = mkdtempSync(join(tmpdir(), "tiepoint-bench-store-"));
  try {
    const attached = join(dir, "attached.db");
    const t0 = performance.now();
    const rep = await attachStore(endpoint, attached, graph ? { graph } : {});
    const attachS = (performance.now() - t0) / 1000;
    const local = join(dir, "local.db");
    const t1 = performance.now();
    const cat = Catalog.open(local, { create: true });
    loadFiles(cat, [nt], { sink: new LoadPreparation() });
    cat.close();
    const loadS = (performance.now() - t1) / 1000;
    process.stdout.write(
      `attach: ${rep.entities.toLocaleString("en-US")} entities, ${rep.labels.toLocaleString("en-US")} labels, ${rep.edges.toLocaleString("en-US")} edges left in the store; ${attachS.toFixed(2)} s, ` +
        `${Math.round(rep.labels / attachS).toLocaleString("en-US")} labels/s, ${rep.requests} requests (local load of the same triples: ${loadS.toFixed(2)} s)\n`,
    );
    if (questions.length === 0) return;
    const a = Session.open({ db: attached });
    const l = Session.open({ db: local });
    const ta: number[] = [];
    const tl: number[] = [];
    const req: number[] = [];
    const rows: number[] = [];
    let same = 0;
    for (const q of questions) {
      const s0 = performance.now();
      const x = await a.askAsync(q);
      ta.push(performance.now() - s0);
      req.push(a.pullFigures()!.requests);
      rows.push(a.pullFigures()!.rows);
      const s1 = performance.now();
      const y = l.ask(q);
      tl.push(performance.now() - s1);
      if (x.result.answers[0]?.id === y.result.answers[0]?.id && x.result.verdict.status === y.result.verdict.status) same++;
    }
    const qa = quantiles(ta);
    const ql = quantiles(tl);
    const r = quantiles(req);
    const w = quantiles(rows);
    process.stdout.write(
      `questions: ${questions.length}; store median ${qa.median.toFixed(1)} ms, p95 ${qa.p95.toFixed(1)} ms; local median ${ql.median.toFixed(1)} ms, p95 ${ql.p95.toFixed(1)} ms (store/local ${(qa.median / ql.median).toFixed(1)}×)\n` +
        `requests per question median ${r.median}, max ${Math.max(...req)}; rows pulled median ${w.median}, p95 ${w.p95}; same first answer and verdict ${same}/${questions.length}\n` +
        `rss after the questions (both sessions, one process): ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB; load average ${loadavg()[0]!.toFixed(1)}\n`,
    );
    a.close();
    l.close();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e: Error) => {
  process.stderr.write(`bench:store: ${e.message}\n`);
  process.exit(1);
});

/**
 * The benchmark's Markdown table: one row per figure, one column per catalog size, and the
 * target from issues 5, 9 and 19 where there is one.
 */

/** One size's phase records (JSON-shaped, as the phases return them). */
export interface SizeResult {
  readonly size: string;
  readonly entities: number;
  readonly edges: number;
  readonly phases: Record<string, Record<string, unknown>>;
}

/** The whole benchmark document. */
export interface BenchDocument {
  readonly machine: Record<string, unknown>;
  readonly results: readonly SizeResult[];
}

type Row = { label: string; target: string; value: (r: SizeResult) => string };

function get(r: SizeResult, path: string): unknown {
  let x: unknown = r.phases;
  for (const k of path.split(".")) {
    if (x === null || typeof x !== "object") return undefined;
    x = (x as Record<string, unknown>)[k];
  }
  return x;
}

function num(r: SizeResult, path: string, digits: number, scale = 1): string {
  const x = get(r, path);
  if (typeof x !== "number" || !Number.isFinite(x)) {
    const err = get(r, path.split(".")[0] + ".error") ?? get(r, path.split(".")[0] + ".skipped") ?? get(r, "ppr.igraph.skipped");
    return typeof err === "string" && path.startsWith("ppr.igraph") ? "skipped" : "–";
  }
  return (x * scale).toLocaleString("en-US", { maximumFractionDigits: digits, minimumFractionDigits: digits });
}

function ratio(r: SizeResult, a: string, b: string): string {
  const x = get(r, a);
  const y = get(r, b);
  return typeof x === "number" && typeof y === "number" && y > 0 ? (x / y).toLocaleString("en-US", { maximumFractionDigits: 0 }) : "–";
}

const ROWS: Row[] = [
  { label: "import throughput, question indexes included (triples/s)", target: "≥ 150,000 (L)", value: (r) => num(r, "load.triplesPerSecond", 0) },
  { label: "  import time / after the last row / of which waiting for the question indexes (s)", target: "", value: (r) => `${num(r, "load.seconds", 1)} / ${num(r, "load.secondsAfterLastRow", 1)} / ${num(r, "load.prepareWaitSeconds", 2)}` },
  { label: "  import CPU time, both threads / the load's thread (s)", target: "", value: (r) => `${num(r, "load.cpuSeconds", 1)} / ${num(r, "load.mainThreadCpuSeconds", 1)}` },
  { label: "  question indexes built in the second thread (s; ahead = from the last row, beside the commit)", target: "", value: (r) => `${num(r, "load.prepareFinishSeconds", 1)}${get(r, "load.builtAhead") === true ? " ahead" : ""}` },
  { label: "  load average during import (1 min, start / end)", target: "", value: (r) => `${num(r, "load.loadAverageStart", 1)} / ${num(r, "load.loadAverage", 1)}` },
  { label: "  old way: preparing by reading the catalog back (s)", target: "", value: (r) => num(r, "index.readBackSeconds", 1) },
  { label: "load peak memory (MiB)", target: "", value: (r) => num(r, "load.peakMiB", 0) },
  { label: "index build from SQLite (s)", target: "", value: (r) => num(r, "index.buildSeconds", 2) },
  { label: "snapshot load (ms)", target: "", value: (r) => num(r, "index.snapshotLoadSeconds", 1, 1000) },
  { label: "snapshot size (MiB)", target: "", value: (r) => num(r, "index.snapshotMiB", 1) },
  { label: "process start → first answer (s)", target: "≤ 1.0 (L)", value: (r) => num(r, "ready.seconds", 2) },
  { label: "start-up: `show` of one entity (s)", target: "≤ 1.0 (L)", value: (r) => num(r, "ready.show.seconds", 2) },
  { label: "  CPU time of that process (s) / load average (1 min)", target: "", value: (r) => `${num(r, "ready.show.cpuSeconds", 2)} / ${num(r, "ready.loadAverage.0", 1)}` },
  { label: "session open in process (s)", target: "", value: (r) => num(r, "ask.openSeconds", 2) },
  { label: "whole question, median (ms)", target: "≤ 8 (M), ≤ 15 (L)", value: (r) => num(r, "ask.latencyMs.median", 1) },
  { label: "whole question, p95 (ms)", target: "≤ 50 (L)", value: (r) => num(r, "ask.latencyMs.p95", 1) },
  { label: "whole question, CPU time median / p95 (ms)", target: "", value: (r) => `${num(r, "ask.cpuMs.median", 1)} / ${num(r, "ask.cpuMs.p95", 1)}` },
  ...(["link", "analyze", "rank", "explain", "paths", "verdict", "ablation", "suggestions", "serialise"] as const).map((k) => ({
    label: `  ${["paths", "verdict", "ablation", "suggestions"].includes(k) ? "  of which " : ""}${k === "analyze" ? "read (analyze)" : k === "explain" ? "explain" : k === "serialise" ? "serialise (JSON)" : k}, median / p95 (ms)`,
    target: "",
    value: (r: SizeResult) => `${num(r, `ask.stageMedianMs.${k}`, 2)} / ${num(r, `ask.stageP95Ms.${k}`, 2)}`,
  })),
  { label: "answer digest (answers, scores to 1e-9, paths, verdicts)", target: "same before/after a speed change", value: (r) => String(get(r, "ask.digest") ?? "–") },
  { label: "peak memory while answering (MiB)", target: "≤ 1,024 (L)", value: (r) => num(r, "ask.peakMiB", 0) },
  { label: "load average during questions (1 min, start / end)", target: "", value: (r) => { const x = get(r, "ask.loadAverage"); return Array.isArray(x) ? x.join(" / ") : "–"; } },
  { label: "Hits@1 on generated questions", target: "", value: (r) => num(r, "ask.hits1", 3) },
  { label: "compose per target, before the round trips, median / p95 (ms)", target: "≤ 200 median (M)", value: (r) => `${num(r, "compose.beforeRoundTripMs.median", 1)} / ${num(r, "compose.beforeRoundTripMs.p95", 1)}` },
  { label: "compose per target, round trips included, median / p95 (ms)", target: "", value: (r) => `${num(r, "compose.totalMs.median", 1)} / ${num(r, "compose.totalMs.p95", 1)}` },
  { label: "compose: targets with a verified question", target: "", value: (r) => num(r, "compose.withVerified", 3) },
  { label: "query-time PPR per clue, median / p95 (ms)", target: "", value: (r) => `${num(r, "ppr.fastMs.median", 2)} / ${num(r, "ppr.fastMs.p95", 2)}` },
  { label: "  CPU time, median / p95 (ms)", target: "", value: (r) => `${num(r, "ppr.fastCpuMs.median", 2)} / ${num(r, "ppr.fastCpuMs.p95", 2)}` },
  { label: "  with the question's cue weights (ms)", target: "", value: (r) => `${num(r, "ppr.fastCueMs.median", 2)} / ${num(r, "ppr.fastCueMs.p95", 2)}` },
  { label: "top-20 agreement with exact PPR (power iteration)", target: "≥ 0.95", value: (r) => num(r, "ppr.agreementTop20", 3) },
  { label: "  with cue weights", target: "≥ 0.95", value: (r) => num(r, "ppr.agreementTop20Cues", 3) },
  { label: "igraph exact PPR per query, median (ms)", target: "", value: (r) => num(r, "ppr.igraph.ms.median", 0) },
  { label: "top-20 agreement with igraph", target: "≥ 0.95", value: (r) => num(r, "ppr.igraph.agreementTop20", 3) },
  { label: "  with power iteration on igraph's queries / power iteration vs igraph", target: "", value: (r) => `${num(r, "ppr.igraph.agreementTop20PowerSameQueries", 3)} / ${num(r, "ppr.igraph.agreementPowerVsIgraph", 3)}` },
  { label: "speed-up over igraph (median)", target: "≥ 100× (L)", value: (r) => num(r, "ppr.igraph.speedup", 0) },
  { label: "igraph's one PPR vector ÷ whole question (median)", target: "≥ 500× (L)", value: (r) => ratio(r, "ppr.igraph.ms.median", "ask.latencyMs.median") },
  { label: "power-law graph (no catalog): PPR median / p95 (ms)", target: "", value: (r) => `${num(r, "graph.fastMs.median", 2)} / ${num(r, "graph.fastMs.p95", 2)}` },
  { label: "  CPU time, median / p95 (ms)", target: "", value: (r) => `${num(r, "graph.fastCpuMs.median", 2)} / ${num(r, "graph.fastCpuMs.p95", 2)}` },
  { label: "  top-20 agreement with exact PPR / with igraph", target: "≥ 0.95", value: (r) => `${num(r, "graph.agreementTop20", 3)} / ${num(r, "graph.igraph.agreementTop20", 3)}` },
  { label: "  igraph per query, median (ms) / speed-up", target: "≥ 100× (L)", value: (r) => `${num(r, "graph.igraph.ms.median", 0)} / ${num(r, "graph.igraph.speedup", 0)}` },
];

/** Renders the document as a Markdown table with the machine line. */
export function renderMarkdown(doc: BenchDocument): string {
  const m = doc.machine;
  const head = `| figure | ${doc.results.map((r) => `${r.size} (${r.entities.toLocaleString("en-US")} / ${r.edges.toLocaleString("en-US")})`).join(" | ")} | target |`;
  const sep = `|---|${doc.results.map(() => "---:").join("|")}|---|`;
  const rows = ROWS.map((row) => `| ${row.label} | ${doc.results.map((r) => row.value(r)).join(" | ")} | ${row.target} |`);
  const ppr = doc.results[0]?.phases.ppr as Record<string, unknown> | undefined;
  const lines = [
    `Machine: ${String(m.cpus)} CPUs (${String(m.cpuModel)}), ${String(m.memoryGiB)} GiB RAM, Node ${String(m.node)}, ${String(m.platform)}; python3-igraph ${m.igraph === null ? "not installed (igraph rows skipped)" : String(m.igraph)}; ${String(m.date)}.`,
    `Questions: generated with known answers, each asked once through one Session after ${String((doc.results[0]?.phases.ask as Record<string, unknown> | undefined)?.warmUp ?? "?")} other generated questions (warm-up, not counted).`,
    `PPR: restart α = ${String(ppr?.alpha ?? "?")}, hub exponent β = ${String(ppr?.hubExponent ?? "?")}; seeds = the clue seeds of the generated questions; agreement = |top-20 ∩ exact top-20| / 20, seeds excluded, ties at the 20th exact score counted as agreeing.`,
    "",
    head,
    sep,
    ...rows,
    "",
  ];
  return lines.join("\n");
}

/**
 * `npm run bench:conditions`: superlative, comparison and count questions over a real open
 * catalog — the Debian 12 binary package index of this machine's apt lists (1.03M triples,
 * an installed size on 63k packages; src/eval/debian-packages.ts) — timed one whole question
 * at a time in one session (as `ask` runs it: suggestion checks on, the default time budget),
 * and checked against a SQL reference computed separately (src/eval/debian-reference.ts: the
 * stanzas parsed into plain tables of an in-memory SQLite, not through tiepoint's importer).
 *
 * The sets are chosen by their size from the data, not by hand: for each target size of
 * 2 … 5,000 members, the package whose reverse dependencies ("packages that depend on X") are
 * nearest that size (ties by name; each kind takes the next nearest, so the kinds use different
 * packages). 10 sizes × 3 kinds = 30 questions. The catalog is built once into a cache folder
 * (`--dir`, default the system temp folder) and reused. No timing is asserted: figures are
 * printed with the 200 ms target beside them, with each question's CPU time (process.cpuUsage),
 * its main thread's CPU time and wait for a core (/proc schedstat: the load's share of the wall
 * time), its minor page faults (first touches of fresh memory, which cost tens of microseconds each
 * on a virtual machine) and the machine's load average, since wall time on a shared machine is
 * inflated. The session's open is start-up and is printed apart from the question times; no
 * question is asked before the timed ones, so the first question's one-time costs are counted.
 */
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { Catalog, loadFiles } from "../catalog/index.js";
import { debianReference } from "./debian-reference.js";
import { defaultPackagesFile, readPackagesText, stanzasToNTriples } from "./debian-packages.js";
import { Session } from "../pipeline/index.js";

/** Options; all optional. */
export const DEFAULTS = {
  /** Set sizes the questions are chosen for (reverse-dependency counts). */
  sizes: [2, 5, 10, 25, 50, 100, 250, 500, 1500, 5000],
  /** The per-question target of issue 23, in milliseconds. */
  targetMs: 200,
};

/** One benchmark question and its gold from the SQL reference. */
export interface BenchQuestion {
  readonly kind: "superlative" | "comparison" | "count";
  readonly question: string;
  /** Members of the set the question is over. */
  readonly setSize: number;
  /** superlative: the names holding the extreme value; comparison and count: the count. */
  readonly gold: readonly string[] | number;
}

/** The 30 questions with their SQL gold (see the header). */
export function benchQuestions(ref: ReturnType<typeof debianReference>, sizes: readonly number[] = DEFAULTS.sizes): BenchQuestion[] {
  const counts = ref.prepare("SELECT r.dst AS name, count(*) AS n FROM rel r JOIN pkg p ON p.name = r.src WHERE r.field = 'Depends' AND p.size IS NOT NULL AND EXISTS (SELECT 1 FROM pkg q WHERE q.name = r.dst) GROUP BY r.dst").all() as { name: string; n: number }[];
  const sizesOf = ref.prepare("SELECT p.name, p.size FROM rel r JOIN pkg p ON p.name = r.src WHERE r.field = 'Depends' AND r.dst = ? AND p.size IS NOT NULL");
  const out: BenchQuestion[] = [];
  const kinds = ["superlative", "comparison", "count"] as const;
  sizes.forEach((size, si) => {
    const near = [...counts].sort((a, b) => Math.abs(a.n - size) - Math.abs(b.n - size) || (a.name < b.name ? -1 : 1));
    kinds.forEach((kind, k) => {
      const x = near[k]!;
      const rows = sizesOf.all(x.name) as { name: string; size: number }[];
      if (kind === "superlative") {
        const largest = si % 2 === 0;
        const best = largest ? Math.max(...rows.map((r) => r.size)) : Math.min(...rows.map((r) => r.size));
        out.push({
          kind,
          question: `Which package that depends on ${x.name} has the ${largest ? "largest" : "smallest"} installed size?`,
          setSize: rows.length,
          gold: rows.filter((r) => r.size === best).map((r) => r.name).sort(),
        });
      } else if (kind === "comparison") {
        // the threshold: the set's median size (from the data), so about half the set passes
        const sorted = rows.map((r) => r.size).sort((a, b) => a - b);
        const n = sorted[Math.floor(sorted.length / 2)]!;
        out.push({ kind, question: `How many packages depend on ${x.name} and have an installed size above ${n} kibibytes?`, setSize: rows.length, gold: rows.filter((r) => r.size > n).length });
      } else {
        out.push({ kind, question: `How many packages depend on ${x.name}?`, setSize: rows.length, gold: rows.length });
      }
    });
  });
  return out;
}

/**
 * Superlatives over one package's own dependencies, asked with the relation noun ("Which
 * dependency of X has the smallest installed size?": X is the subject of Depends), gold by
 * SQL: the `count` packages with the most Depends entries that name a package with a size
 * (ties by name), smallest and largest alternating.
 */
export function dependencyQuestions(ref: ReturnType<typeof debianReference>, count: number): BenchQuestion[] {
  const srcs = ref.prepare("SELECT r.src AS name, count(*) AS n FROM rel r JOIN pkg p ON p.name = r.dst WHERE r.field = 'Depends' AND p.size IS NOT NULL GROUP BY r.src ORDER BY n DESC, r.src LIMIT ?").all(count) as { name: string; n: number }[];
  const sizesOf = ref.prepare("SELECT p.name, p.size FROM rel r JOIN pkg p ON p.name = r.dst WHERE r.field = 'Depends' AND r.src = ? AND p.size IS NOT NULL");
  return srcs.map((x, i) => {
    const rows = sizesOf.all(x.name) as { name: string; size: number }[];
    const largest = i % 2 === 1;
    const best = largest ? Math.max(...rows.map((r) => r.size)) : Math.min(...rows.map((r) => r.size));
    return {
      kind: "superlative" as const,
      question: `Which dependency of ${x.name} has the ${largest ? "largest" : "smallest"} installed size?`,
      setSize: rows.length,
      gold: rows.filter((r) => r.size === best).map((r) => r.name).sort(),
    };
  });
}

/** True when tiepoint's result agrees with the gold. */
export function agrees(q: BenchQuestion, result: { answers: readonly { label: string }[]; count?: { value: number } }): boolean {
  if (typeof q.gold === "number") return result.count?.value === q.gold;
  return result.answers[0] !== undefined && q.gold.includes(result.answers[0].label);
}

/** Builds (or reuses) the Debian catalog in `dir`; returns its path. */
export function debianCatalog(dir: string, packagesText: string): string {
  const db = join(dir, "debian.db");
  if (existsSync(db)) return db;
  mkdirSync(dir, { recursive: true });
  const c = stanzasToNTriples(packagesText);
  writeFileSync(join(dir, "debian-packages.nt"), c.nt);
  writeFileSync(join(dir, "debian-declarations.jsonl"), c.declarations);
  const cat = Catalog.open(db, { create: true });
  try {
    loadFiles(cat, [join(dir, "debian-packages.nt"), join(dir, "debian-declarations.jsonl")]);
  } catch (e) {
    cat.close();
    rmSync(db, { force: true });
    throw e;
  }
  cat.close();
  return db;
}

/** Minor page faults of this process so far (Linux /proc/self/stat field 10); NaN elsewhere. */
function minorFaults(): number {
  try {
    return Number(readFileSync("/proc/self/stat", "utf8").split(") ")[1]!.split(" ")[7]);
  } catch {
    return NaN;
  }
}

/**
 * The main thread's CPU time and its wait for a core so far, in ms (Linux
 * /proc/self/task/PID/schedstat: nanoseconds on the CPU, nanoseconds runnable but waiting in
 * the run queue); NaN elsewhere. On a shared machine wall time ≈ main-thread CPU + wait (+ I/O):
 * the wait is the load's share of a question's wall time.
 */
function mainThread(): { cpuMs: number; waitMs: number } {
  try {
    const [run, wait] = readFileSync(`/proc/self/task/${process.pid}/schedstat`, "utf8").split(" ");
    return { cpuMs: Number(run) / 1e6, waitMs: Number(wait) / 1e6 };
  } catch {
    return { cpuMs: NaN, waitMs: NaN };
  }
}

function fmtMs(n: number): string {
  return Number.isNaN(n) ? "-" : n.toFixed(1);
}

function fmtFaults(n: number): string {
  return Number.isNaN(n) ? "-" : String(n);
}

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) >> 1]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
}

async function main(argv: readonly string[]): Promise<void> {
  const at = (name: string) => (argv.indexOf(name) >= 0 ? argv[argv.indexOf(name) + 1] : undefined);
  const file = at("--in") ?? defaultPackagesFile();
  if (file === null) throw new Error("no Debian Packages file in /var/lib/apt/lists (run apt-get update, or give --in FILE)");
  const dir = at("--dir") ?? join(tmpdir(), "tiepoint-bench-debian");
  const text = readPackagesText(file);
  const out = at("--questions-out");
  if (out !== undefined) {
    // the questions alone, one a line (for bench:store, which asks them through a SPARQL store)
    writeFileSync(out, benchQuestions(debianReference(text)).map((q) => q.question).join("\n") + "\n");
    return;
  }
  const t0 = performance.now();
  if (!existsSync(join(dir, "debian.db"))) process.stderr.write(`building the Debian catalog in ${dir} …\n`);
  const db = debianCatalog(dir, text);
  const ref = debianReference(text);
  const questions = benchQuestions(ref);
  const tOpen = performance.now();
  const cOpen = process.cpuUsage();
  const f0 = minorFaults();
  const session = Session.open({ db });
  const openMs = performance.now() - tOpen;
  const openCpu = process.cpuUsage(cOpen);
  const openFaults = minorFaults() - f0;
  const rows: { q: BenchQuestion; ms: number; cpuMs: number; mainMs: number; waitMs: number; faults: number; ok: boolean; got: string; budget: string }[] = [];
  try {
    for (const q of questions) {
      const t = performance.now();
      const c0 = process.cpuUsage();
      const m0 = mainThread();
      const fq = minorFaults();
      const r = (await session.askAsync(q.question, { verifySuggestions: true })).result;
      const ms = performance.now() - t;
      const c = process.cpuUsage(c0);
      const m = mainThread();
      rows.push({ q, ms, cpuMs: (c.user + c.system) / 1000, mainMs: m.cpuMs - m0.cpuMs, waitMs: m.waitMs - m0.waitMs, faults: minorFaults() - fq, ok: agrees(q, r), got: r.count !== undefined ? String(r.count.value) : (r.answers[0]?.label ?? "-"), budget: r.budget ? r.budget.cut.join("+") : "" });
    }
  } finally {
    session.close();
  }
  const lines = [
    `Debian package index (${file}): ${questions.length} questions, catalog ${db}`,
    `start-up, not counted in the question times: SQL reference and questions ${((tOpen - t0) / 1000).toFixed(1)} s; session open ${openMs.toFixed(0)} ms wall, ${((openCpu.user + openCpu.system) / 1000).toFixed(0)} ms CPU, ${fmtFaults(openFaults)} page faults`,
    "",
  ];
  lines.push(`${"ms".padStart(8)}  ${"cpu ms".padStart(8)}  ${"main ms".padStart(8)}  ${"waited".padStart(8)}  ${"faults".padStart(6)}  ${"set".padStart(5)}  ${"kind".padEnd(11)}  same  ${"budget cut".padEnd(22)}  question → tiepoint | SQL`);
  for (const r of rows) {
    const gold = typeof r.q.gold === "number" ? String(r.q.gold) : r.q.gold.slice(0, 3).join(",") + (r.q.gold.length > 3 ? ",…" : "");
    lines.push(`${r.ms.toFixed(1).padStart(8)}  ${r.cpuMs.toFixed(1).padStart(8)}  ${fmtMs(r.mainMs).padStart(8)}  ${fmtMs(r.waitMs).padStart(8)}  ${fmtFaults(r.faults).padStart(6)}  ${String(r.q.setSize).padStart(5)}  ${r.q.kind.padEnd(11)}  ${r.ok ? "yes " : "NO  "}  ${(r.budget || "-").padEnd(22)}  ${r.q.question} → ${r.got} | ${gold}`);
  }
  const ms = rows.map((r) => r.ms);
  const med = median(ms);
  const max = Math.max(...ms);
  const cpu = rows.map((r) => r.cpuMs);
  const load = loadavg().map((x) => x.toFixed(2)).join(", ");
  lines.push("");
  lines.push(`CPU time (process.cpuUsage, all threads): median ${median(cpu).toFixed(1)} ms   max ${Math.max(...cpu).toFixed(1)} ms   load average at the end: ${load}`);
  const main = rows.map((r) => r.mainMs);
  const waited = rows.map((r) => r.waitMs);
  const unloaded = rows.map((r) => r.ms - r.waitMs);
  lines.push(`main thread (schedstat): CPU median ${fmtMs(median(main))} ms   max ${fmtMs(Math.max(...main))} ms; waited for a core median ${fmtMs(median(waited))} ms   max ${fmtMs(Math.max(...waited))} ms; wall less that wait: median ${fmtMs(median(unloaded))} ms   max ${fmtMs(Math.max(...unloaded))} ms`);
  // the first question of a process pays what later ones share: first use of code (V8 compiles
  // it as it runs), the per-session scratch arrays' first touch (page faults), lazily read parts
  lines.push(`first question (counted above): ${rows[0]!.ms.toFixed(1)} ms wall, ${rows[0]!.cpuMs.toFixed(1)} ms CPU (main thread ${fmtMs(rows[0]!.mainMs)}, waited ${fmtMs(rows[0]!.waitMs)}), ${fmtFaults(rows[0]!.faults)} page faults; the others: max ${Math.max(...ms.slice(1)).toFixed(1)} ms wall`);
  lines.push(`median ${med.toFixed(1)} ms (${(med / DEFAULTS.targetMs).toFixed(2)} × the ${DEFAULTS.targetMs} ms target)   max ${max.toFixed(1)} ms (${(max / DEFAULTS.targetMs).toFixed(2)} ×)   identical to SQL: ${rows.filter((r) => r.ok).length} of ${rows.length}   hit the time budget: ${rows.filter((r) => r.budget).length}`);
  process.stdout.write(lines.join("\n") + "\n");
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main(process.argv.slice(2)).catch((e: unknown) => {
    process.stderr.write(`bench:conditions: ${(e as Error).message}\n`);
    process.exit(1);
  });
}

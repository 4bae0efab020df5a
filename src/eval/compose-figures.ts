/**
 * The compose evaluation's parts (the tool is compose.ts, `npm run eval:compose`): issue 22's
 * measurement of `compose` on the demo catalog and two real open datasets (the
 * world-countries npm package and the committed Debian package slice, eval-sets.ts): N target
 * entities (default 200) drawn by a seeded shuffle among the entities with at least three
 * relation edges, each composed twice — with the salience-aware cost search (the default) and
 * with the baseline that takes the most discriminating clue first and ignores salience
 * (compose/greedy.ts) — and every printed proposal asked back through the same Session as
 * `ask`. Per data set and strategy: the share of targets with at least one verified proposal
 * (issue target ≥ 0.9), the median number of clues (besides the head type), the median
 * salience percentile of the clue entities, the round-trip rate of the printed proposals
 * (issue target ≥ 0.95 come back unique with the target first) and the time per target
 * (median and p95, with and without the round trips).
 */
import { Composer, type Composition } from "../compose/index.js";
import { Session } from "../pipeline/index.js";
import { seededShuffle } from "./question-set.js";

/** Defaults of the evaluation. */
export const DEFAULTS = Object.freeze({
  targets: 200,
  /** The shuffle's seed (the date the evaluation was written, 4 December 2026). */
  seed: 20261204,
  /** Relation edges a target needs (the "at least three relations"). */
  minRelations: 3,
  sets: ["demo", "world", "debian"] as readonly string[],
});

/** Figures of one data set and strategy. */
export interface ComposeFigures {
  readonly set: string;
  readonly strategy: "cost" | "greedy";
  readonly targets: number;
  /** Share of targets with at least one verified proposal. */
  readonly withVerified: number;
  /** Printed proposals, and the share of them verified (the round-trip rate). */
  readonly printed: number;
  readonly roundTrip: number;
  /** Median clues per printed proposal (besides the type). */
  readonly medianClues: number;
  /** Median salience percentile of the clue entities of printed proposals. */
  readonly medianSalience: number;
  /** Milliseconds per target: median and p95, whole and without the round trips. */
  readonly msMedian: number;
  readonly msP95: number;
  readonly msNoRoundTripMedian: number;
  readonly msNoRoundTripP95: number;
}

/** Nearest-rank quantile (common practice). */
function quantile(xs: readonly number[], q: number): number {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1))]!;
}

/** The seeded sample of targets: entities with at least `minRelations` edges, shuffled, the first `n`. */
export function sampleTargets(session: Session, n: number, seed: number, minRelations: number = DEFAULTS.minRelations): number[] {
  const pool: number[] = [];
  const ids = session.catalog.db.prepare("SELECT num FROM entity ORDER BY num").pluck().all() as number[];
  for (const u of ids) if (session.index.degree(u) >= minRelations) pool.push(u);
  return seededShuffle(pool, seed).slice(0, n);
}

/** The figures of a list of compositions. */
export function figuresOf(set: string, strategy: "cost" | "greedy", runs: readonly Composition[]): ComposeFigures {
  const printed = runs.flatMap((c) => c.proposals);
  const clueCounts = printed.map((p) => p.clues.filter((k) => k.kind !== "type").length);
  const saliences = printed.flatMap((p) => p.clues.filter((k) => k.salience !== undefined).map((k) => k.salience!));
  const ms = runs.map((c) => c.timings.total);
  const pre = runs.map((c) => c.timings.total - c.timings.roundTrip);
  return {
    set,
    strategy,
    targets: runs.length,
    withVerified: runs.filter((c) => c.proposals.some((p) => p.verified)).length / Math.max(runs.length, 1),
    printed: printed.length,
    roundTrip: printed.filter((p) => p.verified).length / Math.max(printed.length, 1),
    medianClues: quantile(clueCounts, 0.5),
    medianSalience: quantile(saliences, 0.5),
    msMedian: quantile(ms, 0.5),
    msP95: quantile(ms, 0.95),
    msNoRoundTripMedian: quantile(pre, 0.5),
    msNoRoundTripP95: quantile(pre, 0.95),
  };
}

/** Composes every target with both strategies. */
export async function evaluateCompose(set: string, db: string, n: number, seed: number, progress: (s: string) => void = () => {}): Promise<ComposeFigures[]> {
  const session = Session.open({ db });
  try {
    const composer = new Composer(session);
    const targets = sampleTargets(session, n, seed);
    const out: ComposeFigures[] = [];
    for (const strategy of ["cost", "greedy"] as const) {
      const runs: Composition[] = [];
      for (const [i, t] of targets.entries()) {
        runs.push(await composer.compose(t, { strategy }));
        if ((i + 1) % 20 === 0 || i + 1 === targets.length) progress(`${set} ${strategy}: ${i + 1}/${targets.length}`);
      }
      out.push(figuresOf(set, strategy, runs));
    }
    return out;
  } finally {
    session.close();
  }
}

const f2 = (x: number) => (Number.isNaN(x) ? "–" : x.toFixed(2));
const f0 = (x: number) => (Number.isNaN(x) ? "–" : x.toFixed(0));

/** The figures as a Markdown table. */
export function renderFigures(rows: readonly ComposeFigures[]): string {
  const out = [
    "| data set | strategy | targets | ≥ 1 verified | printed | round trip | median clues | median clue salience | ms/target median (p95) | without round trip median (p95) |",
    "| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |",
  ];
  for (const r of rows)
    out.push(`| ${r.set} | ${r.strategy === "cost" ? "salience cost (default)" : "most discriminating first"} | ${r.targets} | ${f2(r.withVerified)} | ${r.printed} | ${f2(r.roundTrip)} | ${r.medianClues} | ${f2(r.medianSalience)} | ${f0(r.msMedian)} (${f0(r.msP95)}) | ${f0(r.msNoRoundTripMedian)} (${f0(r.msNoRoundTripP95)}) |`);
  return out.join("\n") + "\n";
}


/**
 * The compose phase of `npm run bench` (issue 22): per-target time of `compose` on the
 * generated catalog, for N targets drawn by a seeded shuffle among the entities with at least
 * three relation edges (Fisher–Yates with ranking's mulberry32 generator), after five
 * warm-up targets not counted. Reported: the whole composition with its round trips (median,
 * p95), the part before the round trips (candidate facts and the search), the round trips
 * alone, the share of targets with a verified proposal, and the Session's open time. Timings
 * are printed as figures, never asserted.
 */
import { Composer } from "../compose/index.js";
import { Session } from "../pipeline/index.js";
import { mulberry32 } from "../ranking/index.js";
import { workPaths } from "./phases.js";

/** Defaults of {@link phaseCompose}. */
export const DEFAULTS = Object.freeze({ targets: 200, warmUp: 5, seed: 20261204 });

const quantile = (xs: readonly number[], q: number): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? NaN : s[Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1))]!;
};
const round = (x: number) => Math.round(x * 10) / 10;

/** `n` entities with at least three relation edges, by a seeded Fisher–Yates shuffle (Knuth, TAOCP vol. 2, Algorithm P). */
function sampleTargets(session: Session, n: number, seed: number): number[] {
  const pool = (session.catalog.db.prepare("SELECT num FROM entity ORDER BY num").pluck().all() as number[]).filter((u) => session.index.degree(u) >= 3);
  const rnd = mulberry32(seed);
  for (let i = pool.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1));
    [pool[i], pool[j]] = [pool[j]!, pool[i]!];
  }
  return pool.slice(0, n);
}

/** Composes for `targets` seeded targets of the work folder's catalog and times each. */
export async function phaseCompose(work: string, targets: number = DEFAULTS.targets): Promise<Record<string, unknown>> {
  const t0 = performance.now();
  const session = Session.open({ db: workPaths(work).db });
  try {
    const openSeconds = (performance.now() - t0) / 1000;
    const composer = new Composer(session);
    const all = sampleTargets(session, targets + DEFAULTS.warmUp, DEFAULTS.seed);
    for (const t of all.slice(targets)) await composer.compose(t);
    const total: number[] = [];
    const before: number[] = [];
    const roundTrip: number[] = [];
    let verified = 0;
    for (const t of all.slice(0, targets)) {
      const c = await composer.compose(t);
      total.push(c.timings.total);
      before.push(c.timings.total - c.timings.roundTrip);
      roundTrip.push(c.timings.roundTrip);
      if (c.proposals.some((p) => p.verified)) verified++;
    }
    const fig = (xs: number[]) => ({ median: round(quantile(xs, 0.5)), p95: round(quantile(xs, 0.95)) });
    return { targets: total.length, openSeconds: round(openSeconds), totalMs: fig(total), beforeRoundTripMs: fig(before), roundTripMs: fig(roundTrip), withVerified: total.length > 0 ? verified / total.length : 0 };
  } finally {
    session.close();
  }
}

/**
 * Cost-driven search for distinguishing clue sets
 * ===============================================
 *
 * Finds the K cheapest sets of facts whose extensions (already cut to the target's type)
 * intersect in the target alone, each set minimal (no fact can be dropped). Branch and bound
 * over subsets in cost order: facts are tried cheapest first; a branch stops when adding a
 * fact no longer rules anyone out (a redundant clue; a fact true of exactly the same entities
 * as a cheaper one is never tried), when its cost — plus the cheapest next
 * fact while it is not yet distinguishing — reaches the bound, or at `maxClues`. The bound is
 * the K-th best cost found so far, and never more than the best cost plus `slack` (a set
 * dearer than that by more than about one clue is not worth offering). `maxNodes` bounds the
 * work; the incremental algorithm's answer (incremental.ts, made minimal) is added first, so
 * the bound is tight from the start and a search cut short still has one.
 *
 * [Reference] Krahmer, van Erk & Verleg, "Graph-based generation of referring expressions",
 * Computational Linguistics 29(1), 2003, §4: the cheapest distinguishing subgraph by branch
 * and bound, with the cost of the best solution so far as the bound and properties tried in
 * cost order; they show Dale & Reiter's incremental algorithm is the special case that never
 * backtracks.
 */
import { intersectSorted, type SearchSpace } from "./facts.js";
import { incrementalSet, minimalSubset } from "./incremental.js";

/** Defaults of {@link cheapestSets}. */
export const DEFAULTS = Object.freeze({
  /** Sets returned. */
  k: 12,
  /** Most facts in one set (the type comes on top). */
  maxClues: 4,
  /** Search nodes (fact additions tried) before the search stops. */
  maxNodes: 30_000,
  /** Sets dearer than the best by this much are not searched for. */
  slack: 2,
});

/** Options of {@link cheapestSets}; all optional. */
export interface SearchOptions {
  readonly k?: number;
  readonly maxClues?: number;
  readonly maxNodes?: number;
  readonly slack?: number;
}

/** A distinguishing set: fact indexes in the order they were added, and its total cost. */
export interface ClueSet {
  readonly facts: readonly number[];
  readonly cost: number;
}

/** True when no fact of `set` can be dropped with the rest still singling out one entity. */
export function isMinimal(space: SearchSpace, set: readonly number[]): boolean {
  if (set.length <= 1) return true;
  for (let skip = 0; skip < set.length; skip++) {
    let cur: Int32Array | null = null;
    for (let j = 0; j < set.length; j++) if (j !== skip) cur = cur ? intersectSorted(cur, space.ext(set[j]!)) : space.ext(set[j]!);
    if (cur!.length <= 1) return false;
  }
  return true;
}

/** The K cheapest minimal distinguishing sets, cheapest first (ties: earlier facts first). */
export function cheapestSets(space: SearchSpace, options: SearchOptions = {}): ClueSet[] {
  const o = { ...DEFAULTS, ...options };
  const F = space.costs.length;
  const found: ClueSet[] = [];
  const seen = new Set<string>();
  const worst = () => Math.min(found.length >= o.k ? found[found.length - 1]!.cost : Infinity, found.length > 0 ? found[0]!.cost + o.slack : Infinity);
  const add = (facts: readonly number[], cost: number) => {
    const key = [...facts].sort((a, b) => a - b).join(",");
    if (seen.has(key) || !isMinimal(space, facts)) return;
    seen.add(key);
    found.push({ facts: [...facts], cost });
    found.sort((a, b) => a.cost - b.cost || cmpLex(a.facts, b.facts));
    if (found.length > o.k) found.pop();
  };
  const seed = incrementalSet(space);
  if (seed) {
    const first = minimalSubset(space, seed);
    add(first, first.reduce((s, i) => s + space.costs[i]!, 0));
  }
  // facts that rule nobody out are never useful, nor a dearer fact true of the same entities as a cheaper one
  const useful: number[] = [];
  const seenExt = new Set<string>();
  for (let i = 0; i < F; i++) {
    const e = space.ext(i);
    if (e.length >= space.start) continue;
    const key = e.length <= 64 ? e.join(",") : `${e.length}:${e[0]}:${e[e.length >> 1]}:${e[e.length - 1]}:${hashOf(e)}`;
    if (seenExt.has(key)) continue;
    seenExt.add(key);
    useful.push(i);
  }
  let nodes = 0;
  const chosen: number[] = [];
  const dfs = (from: number, cur: Int32Array | null, cost: number): void => {
    for (let u = from; u < useful.length; u++) {
      if (nodes >= o.maxNodes) return;
      const i = useful[u]!;
      const c = cost + space.costs[i]!;
      if (c >= worst()) return; // costs ascend: every later fact is as dear
      nodes++;
      const next = cur ? intersectSorted(cur, space.ext(i)) : space.ext(i);
      if (cur && next.length === cur.length) continue;
      chosen.push(i);
      if (next.length <= 1) add(chosen, c);
      else if (chosen.length < o.maxClues && u + 1 < useful.length && c + space.costs[useful[u + 1]!]! < worst()) dfs(u + 1, next, c);
      chosen.pop();
    }
  };
  dfs(0, null, 0);
  return found.filter((x) => x.cost <= found[0]!.cost + o.slack);
}

function cmpLex(a: readonly number[], b: readonly number[]): number {
  for (let i = 0; i < Math.min(a.length, b.length); i++) if (a[i] !== b[i]) return a[i]! - b[i]!;
  return a.length - b.length;
}

/** FNV-1a over the values (a set key for long extensions; common practice). */
function hashOf(e: Int32Array): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < e.length; i++) h = Math.imul(h ^ e[i]!, 0x01000193) >>> 0;
  return h;
}

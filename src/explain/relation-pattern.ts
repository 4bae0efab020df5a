/**
 * Relation-pattern matching (structural equivalence of evidence)
 * ==============================================================
 *
 * Reads the best path from a clue to the top answer as a pattern — the sequence of
 * (relation, direction) steps — and finds every node that the same pattern reaches from the
 * same clue, by following the steps frontier by frontier. A rival that the pattern of every
 * clue reaches fits the clues in exactly the way the top answer does (through possibly
 * different intermediate entities), so its evidence is structurally equivalent; the verdict
 * uses this to call a tie even when the walk scores differ (e.g. by hub damping).
 *
 * [Reference]
 * Evaluating a path of (relation, direction) steps is a regular path query restricted to one
 * word, as in SPARQL 1.1 property paths (W3C Recommendation 2013, §9: sequence paths and
 * inverse paths `^p`); the frontier-by-frontier evaluation is common practice.
 */
import type { FlatRows } from "./path-cost.js";
import { scratch } from "./scratch.js";
import type { WalkGraph } from "./types.js";

/** Options of {@link matchPattern}; all optional. */
export interface PatternOptions {
  /** Give up (return null) when a frontier grows beyond this many nodes. @default 100000 */
  readonly frontierLimit?: number;
  /** The walk's flat rows (PathCostModel.flatWalk), read directly instead of through `graph.forEach`; same result. */
  readonly rows?: FlatRows;
}

/** The defaults of {@link PatternOptions}. */
export const DEFAULTS = { frontierLimit: 100000 } as const;

/** One step of a pattern. */
export interface PatternStep {
  readonly rel: number;
  readonly inverse: boolean;
}

/**
 * All nodes reached from `start` by walking `pattern` (loopless walks are not required:
 * any node sequence following the steps counts, except that the end node must differ from
 * `start`). Returns null when a frontier exceeds `frontierLimit`.
 */
export function matchPattern(graph: WalkGraph, start: number, pattern: readonly PatternStep[], options: PatternOptions = {}): Set<number> | null {
  const limit = options.frontierLimit ?? DEFAULTS.frontierLimit;
  const rows = options.rows;
  if (rows !== undefined) {
    // the same frontiers in the same order, kept in arrays with a stamped seen-mark per step
    const { offsets, targets, links } = rows;
    let front: number[] = start >= 0 && start < graph.nodeCount ? [start] : [];
    for (const step of pattern) {
      const want = step.rel * 2 + (step.inverse ? 1 : 0);
      const seen = scratch(graph, 5);
      const next: number[] = [];
      for (const u of front) {
        for (let e = offsets[u]!, end = offsets[u + 1]!; e < end; e++) {
          if (links[e] !== want) continue;
          const v = targets[e]!;
          if (seen.has(v)) continue;
          seen.set(v, 1);
          next.push(v);
        }
        if (next.length > limit) return null;
      }
      front = next;
      if (front.length === 0) break;
    }
    const out = new Set(front);
    out.delete(start);
    return out;
  }
  let frontier = new Set<number>([start]);
  for (const step of pattern) {
    const next = new Set<number>();
    for (const u of frontier) {
      graph.forEach(u, (v, rel, inverse) => {
        if (rel === step.rel && inverse === step.inverse) next.add(v);
      });
      if (next.size > limit) return null;
    }
    frontier = next;
    if (frontier.size === 0) break;
  }
  frontier.delete(start);
  return frontier;
}

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
import { packLink } from "../ranking/index.js";
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
 *
 * With `targets`, only the targets the pattern reaches are returned, and the last step is
 * checked backwards from each target (an entry of the target's row with the step's
 * relation, the other way round, into the frontier before it), so the last frontier — the
 * largest one through a hub — is never built; null then means that a frontier before the
 * last step exceeded the limit.
 */
export function matchPattern(graph: WalkGraph, start: number, pattern: readonly PatternStep[], options: PatternOptions & { readonly targets?: Iterable<number> } = {}): Set<number> | null {
  const limit = options.frontierLimit ?? DEFAULTS.frontierLimit;
  const rows = options.rows;
  // calls hit(v) for every entry of u whose packed relation and direction (rel · 2 + inverse)
  // is `want`, in index order: straight from the flat rows when given
  const scan =
    rows !== undefined
      ? (u: number, want: number, hit: (v: number) => boolean | void): void => {
          const { offsets, targets, links } = rows;
          for (let e = offsets[u]!, end = offsets[u + 1]!; e < end; e++) if (links[e] === want && hit(targets[e]!) === true) return;
        }
      : (u: number, want: number, hit: (v: number) => boolean | void): void => {
          let done = false;
          graph.forEach(u, (v, rel, inverse) => {
            if (!done && packLink(rel, inverse) === want && hit(v) === true) done = true;
          });
        };
  const targets = options.targets;
  const forward = targets === undefined ? pattern.length : pattern.length - 1;
  let front: number[] = start >= 0 && start < graph.nodeCount ? [start] : [];
  for (let i = 0; i < forward && front.length > 0; i++) {
    const step = pattern[i]!;
    const want = packLink(step.rel, step.inverse);
    const seen = scratch(graph, 5);
    const next: number[] = [];
    for (const u of front) {
      scan(u, want, (v) => {
        if (seen.has(v)) return;
        seen.set(v, 1);
        next.push(v);
      });
      if (next.length > limit) return null;
    }
    front = next;
  }
  if (targets === undefined) {
    const out = new Set(front);
    out.delete(start);
    return out;
  }
  const out = new Set<number>();
  const last = pattern[pattern.length - 1];
  if (last === undefined || front.length === 0) return out;
  const before = scratch(graph, 6);
  for (const u of front) before.set(u, 1);
  // the stored edge of a step u → v appears in v's row with the same relation, the other way
  const back = last.rel * 2 + (last.inverse ? 0 : 1);
  for (const t of targets) {
    if (t === start || out.has(t) || !(t >= 0 && t < graph.nodeCount)) continue;
    scan(t, back, (u) => {
      if (!before.has(u)) return false;
      out.add(t);
      return true;
    });
  }
  return out;
}

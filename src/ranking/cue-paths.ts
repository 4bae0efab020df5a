/**
 * Cue-constrained reachability: which of the question's cued relations a short path from a
 * clue to each node can use.
 *
 * Method: breadth-first search over product states (node, set of cued relations used so
 * far), the standard evaluation of label-constrained reachability / regular path queries
 * (Mendelzon & Wood 1995, "Finding regular simple paths in graph databases", SIAM J.
 * Comput. 24(6)), here with the label set as the automaton state. Both directions of every
 * edge are walked (as in the ranking walk), but never straight back along the entry just
 * taken (non-backtracking walks), so "X → leader → X's supervisor → leader" does not credit
 * the leader with "supervises". A state (node, relations) is skipped when the node was
 * already reached with a superset of its relations; a state entered from a second
 * neighbour is expanded once more (now stepping back to the first one is no backtrack). The search stops at
 * `maxHops` hops or after `maxVisits` adjacency entries; an interrupted search returns
 * null so that the caller does not penalise nodes it never looked at. `within` restricts the
 * search to a node set (rank passes the nodes its walks reached: paths through nodes the
 * walk never got to are too weak to count).
 *
 * Each cue can carry the direction the question implies (analysis `expectedInverse`); a use
 * in the other direction sets a separate bit, so the caller can credit it less.
 *
 * Rank uses it to prefer answers whose connection to the clues runs through the relations
 * the question names ("who supervised the leader of X": the supervisor, reached through
 * "leads" then "supervises", over the leader, reached through "leads" alone).
 */
import type { RelationIndex } from "./relation-index.js";

/** Options of {@link cueReach}; all optional. */
export interface CuePathOptions {
  /** Longest path, in hops. @default 3 */
  readonly maxHops?: number;
  /** Budget of adjacency entries scanned. @default 300000 */
  readonly maxVisits?: number;
  /** Only nodes passing this test are entered (e.g. the nodes the walk reached). @default all */
  readonly within?: (node: number) => boolean;
  /**
   * Per cue: true when the question wants it walked against the stored direction from this
   * clue, false for along it. @default no preference (both directions count as expected)
   */
  readonly expectInverse?: readonly boolean[];
}

/** Defaults of {@link CuePathOptions}. */
export const DEFAULTS = { maxHops: 3, maxVisits: 300_000 } as const;

/** Most cued relations tracked (the state is a bit set). */
export const MAX_CUES = 8;

/**
 * For every node within `maxHops` of `source`: the relation sets with which some path
 * reaches it, as a list of non-dominated bit masks — bit 2i: `cues[i]` walked in the
 * expected direction, bit 2i + 1: walked the other way. Null when the budget ran out.
 */
export function cueReach(index: RelationIndex, source: number, cues: readonly number[], options: CuePathOptions = {}): Map<number, number[]> | null {
  const maxHops = options.maxHops ?? DEFAULTS.maxHops;
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  const within = options.within;
  if (cues.length > MAX_CUES) throw new RangeError(`ranking/cue-paths: at most ${MAX_CUES} cued relations, got ${cues.length}`);
  if (!Number.isInteger(maxHops) || maxHops < 1) throw new RangeError(`ranking/cue-paths: maxHops must be a positive integer, got ${maxHops}`);
  // per relation: [bits when walked forwards, bits when walked against the stored triple]
  const expect = options.expectInverse;
  const bit = new Map<number, [number, number]>();
  cues.forEach((r, i) => {
    const b = bit.get(r) ?? [0, 0];
    const good = 1 << (2 * i);
    const other = 1 << (2 * i + 1);
    const e = expect?.[i];
    b[0] |= e === true ? other : good;
    b[1] |= e === false ? other : good;
    bit.set(r, b);
  });
  // per node: non-dominated masks, each with the node it was entered from (−2: from two
  // or more different nodes, so no step out of it is a step straight back)
  const states = new Map<number, { mask: number; prev: number }[]>();
  const MULTI = -2;
  /** Records state (v, m) entered from u; returns true when it must be expanded. */
  const enter = (v: number, m: number, u: number): boolean => {
    const list = states.get(v);
    if (!list) {
      states.set(v, [{ mask: m, prev: u }]);
      return true;
    }
    for (const e of list) {
      if ((e.mask & m) !== m) continue;
      if (e.mask !== m || e.prev === u || e.prev === MULTI) return false;
      // the same relations, entered from a second node: the step back to the first is now allowed
      e.prev = MULTI;
      return true;
    }
    const kept = list.filter((e) => (e.mask & m) !== e.mask);
    kept.push({ mask: m, prev: u });
    states.set(v, kept);
    return true;
  };
  const reached = new Map<number, number[]>();
  enter(source, 0, -1);
  let frontier: [number, number, number][] = [[source, 0, -1]];
  let visits = 0;
  for (let hop = 1; hop <= maxHops && frontier.length > 0; hop++) {
    const next: [number, number, number][] = [];
    for (const [u, m, prev] of frontier) {
      visits += index.degree(u);
      if (visits > maxVisits) return null;
      index.forEach(u, (v, rel, inverse) => {
        if (v === prev || (within !== undefined && !within(v))) return;
        const b = bit.get(rel);
        const m2 = b === undefined ? m : m | b[inverse ? 1 : 0];
        if (enter(v, m2, u)) next.push([v, m2, u]);
      });
    }
    frontier = next;
  }
  for (const [v, list] of states) reached.set(v, list.map((e) => e.mask));
  return reached;
}

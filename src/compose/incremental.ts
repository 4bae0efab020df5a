/**
 * The incremental algorithm
 * =========================
 *
 * Walks the facts in preference order (here: cost order) and keeps each one that rules out
 * at least one remaining distractor, until the target is the only entity left; never
 * backtracks, so the set may be longer than needed. Returns undefined when the facts run out
 * first (the target cannot be singled out with them). {@link minimalSubset} then drops the
 * facts the later ones made redundant (ours: Dale & Reiter leave them in, §4.4), earliest
 * first, so the set can seed a search for minimal sets.
 *
 * [Reference] Dale & Reiter, "Computational interpretations of the Gricean maxims in the
 * generation of referring expressions", Cognitive Science 19(2), 1995, §4 (the incremental
 * algorithm; the head noun — our type — is always included, as their algorithm adds the type).
 */
import { intersectSorted, type SearchSpace } from "./facts.js";

/** The incremental algorithm's set of fact indexes (in the order added), or undefined. */
export function incrementalSet(space: SearchSpace, maxClues = Infinity): number[] | undefined {
  let cur: Int32Array | null = null;
  const out: number[] = [];
  for (let i = 0; i < space.costs.length && out.length < maxClues; i++) {
    const e = space.ext(i);
    const next: Int32Array = cur ? intersectSorted(cur, e) : e;
    if (next.length < (cur ? cur.length : space.start)) {
      out.push(i);
      cur = next;
      if (cur.length <= 1) return out;
    }
  }
  return undefined;
}

/** Drops facts of a distinguishing set that the others make redundant, trying the earliest first; the rest keep their order. */
export function minimalSubset(space: SearchSpace, set: readonly number[]): number[] {
  const keep = [...set];
  for (let j = 0; j < keep.length && keep.length > 1; ) {
    let cur: Int32Array | null = null;
    for (let k = 0; k < keep.length; k++) if (k !== j) cur = cur ? intersectSorted(cur, space.ext(keep[k]!)) : space.ext(keep[k]!);
    if (cur!.length <= 1) keep.splice(j, 1);
    else j++;
  }
  return keep;
}

/**
 * The greedy baseline: most discriminating clue first
 * ===================================================
 *
 * At each step adds the fact that leaves the fewest candidates (ties: the earlier fact in
 * index order), ignoring what the fact costs a reader, until the target is alone or no fact
 * rules anyone out. The baseline the compose evaluation compares with (`npm run eval:compose`).
 *
 * [Reference] Dale, "Cooking up referring expressions", ACL 1989 (the greedy heuristic for the
 * full-brevity problem); discussed as such by Dale & Reiter 1995, §3.
 */
import { intersectSorted, type SearchSpace } from "./facts.js";

/** The greedy set of fact indexes (in the order added), or undefined when the target cannot be singled out. `banned` facts are skipped. */
export function greedySet(space: SearchSpace, banned: ReadonlySet<number> = new Set(), maxClues = Infinity): number[] | undefined {
  let cur: Int32Array | null = null;
  const out: number[] = [];
  while (out.length < maxClues) {
    let best = -1;
    let bestExt: Int32Array | null = null;
    for (let i = 0; i < space.costs.length; i++) {
      if (banned.has(i) || out.includes(i)) continue;
      const e = space.ext(i);
      const next: Int32Array = cur ? intersectSorted(cur, e) : e;
      if (next.length >= (cur ? cur.length : space.start)) continue;
      if (!bestExt || next.length < bestExt.length) {
        best = i;
        bestExt = next;
      }
    }
    if (best < 0) return undefined;
    out.push(best);
    cur = bestExt;
    if (cur!.length <= 1) return out;
  }
  return undefined;
}

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
 * Each cue can carry the direction the question implies (the reading's `cueDirections`); a use
 * in the other direction sets a separate bit, so the caller can credit it less.
 *
 * Rank uses it to prefer answers whose connection to the clues runs through the relations
 * the question names ("who supervised the leader of X": the supervisor, reached through
 * "leads" then "supervises", over the leader, reached through "leads" alone).
 */
import { csrOf, type RelationIndex } from "./relation-index.js";
import { grown, stampedFor } from "./stamped.js";

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
   * clue, false for along it, undefined for no preference (the reading's `cueDirections`).
   * @default no preference (both directions count as expected)
   */
  readonly expectInverse?: readonly (boolean | undefined)[];
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
export function cueReach(index: RelationIndex, source: number, cues: readonly number[], options: CuePathOptions = {}): CueReached | null {
  const maxHops = options.maxHops ?? DEFAULTS.maxHops;
  const maxVisits = options.maxVisits ?? DEFAULTS.maxVisits;
  const within = options.within;
  if (cues.length > MAX_CUES) throw new RangeError(`ranking/cue-paths: at most ${MAX_CUES} cued relations, got ${cues.length}`);
  if (!Number.isInteger(maxHops) || maxHops < 1) throw new RangeError(`ranking/cue-paths: maxHops must be a positive integer, got ${maxHops}`);
  const expect = options.expectInverse;
  // per relation r the cue bits it sets: relBits[2r] walked forwards, relBits[2r + 1] against the stored triple
  const relBits = new Int32Array(2 * Math.max(index.relationCount, 1));
  cues.forEach((r, i) => {
    if (!(r >= 0 && r < index.relationCount)) return;
    const good = 1 << (2 * i);
    const other = 1 << (2 * i + 1);
    const e = expect?.[i];
    relBits[2 * r] |= e === true ? other : good;
    relBits[2 * r + 1] |= e === false ? other : good;
  });
  // per node: its non-dominated masks as a linked list of entries (flat arrays), each with
  // the node it was entered from (−2: from two or more different nodes, so no step out of
  // it is a step straight back); the node → first entry map is a stamped scratch array
  // a source outside the index reaches nothing but itself
  if (!(Number.isInteger(source) && source >= 0 && source < index.nodeCount)) return CueReached.of([source], [[0]]);
  const head = stampedFor(index, "cue-paths/heads", index.nodeCount);
  const st = new StateList();
  const order: number[] = [];
  const MULTI = -2;
  /** Records state (v, m) entered from u; returns true when it must be expanded. */
  const enter = (v: number, m: number, u: number): boolean => {
    const h = head.get(v);
    if (h < 0) {
      head.set(v, st.add(m, u, -1));
      order.push(v);
      return true;
    }
    for (let e = h; e >= 0; e = st.next[e]!) {
      const em = st.mask[e]!;
      if ((em & m) !== m) continue;
      const ep = st.prev[e]!;
      if (em !== m || ep === u || ep === MULTI) return false;
      // the same relations, entered from a second node: the step back to the first is now allowed
      st.prev[e] = MULTI;
      return true;
    }
    // drop the entries m dominates (keeping the others' order), then append (m, u)
    let first = -1;
    let last = -1;
    for (let e = h; e >= 0; e = st.next[e]!) {
      const em = st.mask[e]!;
      if ((em & m) === em) continue;
      if (last < 0) first = e;
      else st.next[last] = e;
      last = e;
    }
    const added = st.add(m, u, -1);
    if (last < 0) first = added;
    else st.next[last] = added;
    head.set(v, first);
    return true;
  };
  enter(source, 0, -1);
  // the frontier as flat (node, mask, previous node) triples
  let frontier: number[] = [source, 0, -1];
  let visits = 0;
  const { offsets, targets, links } = csrOf(index);
  for (let hop = 1; hop <= maxHops && frontier.length > 0; hop++) {
    const next: number[] = [];
    for (let f = 0; f < frontier.length; f += 3) {
      const u = frontier[f]!;
      const m = frontier[f + 1]!;
      const prev = frontier[f + 2]!;
      const startE = offsets[u]!;
      const endE = offsets[u + 1]!;
      visits += endE - startE;
      if (visits > maxVisits) return null;
      for (let e = startE; e < endE; e++) {
        const v = targets[e]!;
        if (v === prev || (within !== undefined && !within(v))) continue;
        const l = links[e]!;
        const m2 = m | relBits[2 * (l >>> 1) + (l & 1)]!;
        if (enter(v, m2, u)) next.push(v, m2, u);
      }
    }
    frontier = next;
  }
  // flat: per reached node (in first-reach order) its masks in list order, found through an open-addressing table
  const reached = new CueReached(order.length);
  for (const v of order) {
    reached.begin(v);
    for (let e = head.get(v); e >= 0; e = st.next[e]!) reached.mask(st.mask[e]!);
  }
  return reached;
}

/**
 * What {@link cueReach} found: per reached node its non-dominated masks, in flat arrays (no
 * object per node): `find(v)` gives v's entry i (or −1), whose masks are
 * `masks[start(i)] … masks[end(i) − 1]`; `get(v)` copies them into an array.
 */
export class CueReached {
  /** Open-addressing table: node per slot (−1 empty) and its entry. */
  private readonly slotNode: Int32Array;
  private readonly slotEntry: Int32Array;
  private readonly shift: number;
  private readonly starts: Int32Array;
  masks: Int32Array;
  private entries = 0;
  private maskCount = 0;

  constructor(nodes: number) {
    let bits = 4;
    while (1 << bits < 2 * nodes + 2) bits++;
    this.slotNode = new Int32Array(1 << bits).fill(-1);
    this.slotEntry = new Int32Array(1 << bits);
    this.shift = 32 - bits;
    this.starts = new Int32Array(nodes + 1);
    this.masks = new Int32Array(Math.max(4, nodes * 2));
  }

  /** A table from explicit lists (one node per list). */
  static of(nodes: readonly number[], masks: readonly (readonly number[])[]): CueReached {
    const r = new CueReached(nodes.length);
    nodes.forEach((v, i) => {
      r.begin(v);
      for (const m of masks[i]!) r.mask(m);
    });
    return r;
  }

  private slot(v: number): number {
    // Fibonacci hashing (Knuth, TAOCP vol. 3, 6.4), linear probing
    let h = Math.imul(v, 0x9e3779b1) >>> this.shift;
    const size = this.slotNode.length;
    while (this.slotNode[h] !== -1 && this.slotNode[h] !== v) h = (h + 1) & (size - 1);
    return h;
  }

  /** Starts node v's entry (each node once); its masks follow through {@link mask}. @internal */
  begin(v: number): void {
    const h = this.slot(v);
    this.slotNode[h] = v;
    this.slotEntry[h] = this.entries;
    this.starts[this.entries++] = this.maskCount;
    this.starts[this.entries] = this.maskCount;
  }

  /** Appends a mask to the entry begun last. @internal */
  mask(m: number): void {
    if (this.maskCount === this.masks.length) this.masks = grown(this.masks);
    this.masks[this.maskCount++] = m;
    this.starts[this.entries] = this.maskCount;
  }

  /** v's entry, or −1 when v was not reached. */
  find(v: number): number {
    const h = this.slot(v);
    return this.slotNode[h] === v ? this.slotEntry[h]! : -1;
  }

  start(i: number): number {
    return this.starts[i]!;
  }

  end(i: number): number {
    return this.starts[i + 1]!;
  }

  has(v: number): boolean {
    return this.find(v) >= 0;
  }

  /** v's masks (a copy), or undefined when v was not reached. */
  get(v: number): number[] | undefined {
    const i = this.find(v);
    return i < 0 ? undefined : Array.from(this.masks.subarray(this.starts[i]!, this.starts[i + 1]!));
  }

  /** Reached nodes. */
  get size(): number {
    return this.entries;
  }
}

/** Growable flat storage of (mask, previous node, next entry) state entries. */
class StateList {
  mask = new Int32Array(1024);
  prev = new Int32Array(1024);
  next = new Int32Array(1024);
  private count = 0;
  add(mask: number, prev: number, next: number): number {
    if (this.count === this.mask.length) {
      this.mask = grown(this.mask);
      this.prev = grown(this.prev);
      this.next = grown(this.next);
    }
    const e = this.count++;
    this.mask[e] = mask;
    this.prev[e] = prev;
    this.next[e] = next;
    return e;
  }
}

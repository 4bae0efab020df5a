/**
 * The edges pulled from a store for one question, held in memory for the catalog's edge reads
 * ============================================================================================
 *
 * An attached catalog's linker and entity card read edges through the catalog's edge methods
 * (`neighbourNums`, `neighbourTexts`, `hasRelationEdge`, `neighbours`, `hasEdge`, `edges`).
 * For a loaded catalog those are SQL reads of the `edge` table (PRIMARY KEY (src, rel, dst),
 * index `edge_by_dst` (dst, rel)). For the pulled edges of a question the same reads are
 * answered here from per-entity adjacency lists, in the order SQLite returns them from that
 * table (out: by (rel, dst), in: by (rel, src), the key and index order; `neighbours` sorted
 * by relation id then entity id, as its `ORDER BY` says), so the answers are those of the
 * edge table these edges would make — without writing each pulled edge into SQLite (that
 * insert was a third of an attached question's CPU time).
 *
 * Each list is flat pairs (rel, other), appended as edges arrive and sorted on the first read
 * after a change.
 */

/** Flat (rel, other) pairs of one entity's edges in one direction. */
interface Side {
  pairs: number[];
  sorted: boolean;
}

function sortPairs(side: Side): number[] {
  if (!side.sorted) {
    const p = side.pairs;
    const idx = Array.from({ length: p.length / 2 }, (_, i) => i);
    idx.sort((a, b) => p[2 * a]! - p[2 * b]! || p[2 * a + 1]! - p[2 * b + 1]!);
    const out: number[] = new Array(p.length);
    idx.forEach((k, i) => {
      out[2 * i] = p[2 * k]!;
      out[2 * i + 1] = p[2 * k + 1]!;
    });
    side.pairs = out;
    side.sorted = true;
  }
  return side.pairs;
}

/** Pulled edges by entity, both directions (each edge added once by the caller). */
export class PulledEdges {
  private readonly out = new Map<number, Side>();
  private readonly inn = new Map<number, Side>();
  private count = 0;

  clear(): void {
    this.out.clear();
    this.inn.clear();
    this.count = 0;
  }

  get size(): number {
    return this.count;
  }

  add(s: number, p: number, o: number): void {
    const push = (m: Map<number, Side>, at: number, other: number) => {
      let side = m.get(at);
      if (!side) m.set(at, (side = { pairs: [], sorted: true }));
      side.pairs.push(p, other);
      side.sorted = false;
    };
    push(this.out, s, o);
    push(this.inn, o, s);
    this.count++;
  }

  /** (rel, dst) pairs of `num`'s outgoing edges, by (rel, dst). */
  outPairs(num: number): readonly number[] {
    const s = this.out.get(num);
    return s ? sortPairs(s) : [];
  }

  /** (rel, src) pairs of `num`'s incoming edges, by (rel, src). */
  inPairs(num: number): readonly number[] {
    const s = this.inn.get(num);
    return s ? sortPairs(s) : [];
  }

  /** Nums joined to `num`, at most `limit` each way (out first), as `Catalog.neighbourNums`. */
  neighbourNums(num: number, limit: number): number[] {
    const res: number[] = [];
    for (const pairs of [this.outPairs(num), this.inPairs(num)]) {
      for (let i = 0; i < pairs.length && i < 2 * limit; i += 2) res.push(pairs[i + 1]!);
    }
    return res;
  }

  /** True when `num` has an edge of relation `rel`, either direction. */
  hasRelation(num: number, rel: number): boolean {
    for (const pairs of [this.out.get(num)?.pairs, this.inn.get(num)?.pairs]) {
      if (pairs) for (let i = 0; i < pairs.length; i += 2) if (pairs[i] === rel) return true;
    }
    return false;
  }

  /** True when the edge `s p o` was pulled. */
  has(s: number, p: number, o: number): boolean {
    const pairs = this.out.get(s)?.pairs;
    if (pairs) for (let i = 0; i < pairs.length; i += 2) if (pairs[i] === p && pairs[i + 1] === o) return true;
    return false;
  }

  /** Every edge as [src, rel, dst], by (dst, rel, src), as `Catalog.edges`. */
  *ordered(): IterableIterator<[number, number, number]> {
    for (const dst of [...this.inn.keys()].sort((a, b) => a - b)) {
      const pairs = this.inPairs(dst);
      for (let i = 0; i < pairs.length; i += 2) yield [pairs[i + 1]!, pairs[i]!, dst];
    }
  }
}

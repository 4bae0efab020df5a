/**
 * IndexBuilder: sorting ahead of the removals (`presort`, done by a load's second thread while
 * SQLite builds its indexes) gives the same index as sorting at `build`, array for array,
 * whatever rows, duplicates and removed entities (fast-check); rows added after a presort
 * are not lost. The expected index is the builder's own build without a presort.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { IndexBuilder } from "./index-builder.js";
import { csrOf, type RelationIndex } from "./relation-index.js";

type Rows = { edges: [number, number, number][]; types: [number, number][]; subs: [number, number][]; removed: number[]; late: [number, number, number][] };

function arrays(index: RelationIndex): string {
  const c = csrOf(index);
  return JSON.stringify([c.offsets, c.targets, c.links, c.typeOffsets, c.typeList, c.superOffsets, c.superList].map((a) => Array.from(a)));
}

function built(rows: Rows, presort: boolean): { index: string; edges: number } {
  const b = new IndexBuilder();
  for (const [s, r, d] of rows.edges) b.edge(s, r, d);
  for (const [e, t] of rows.types) b.type(e, t);
  for (const [s, t] of rows.subs) b.subclass(s, t);
  if (presort) b.presort();
  for (const [s, r, d] of rows.late) b.edge(s, r, d);
  for (const e of rows.removed) b.remove(e);
  const { index, edges } = b.build(9, 3);
  return { index: arrays(index), edges };
}

describe("IndexBuilder.presort", () => {
  const node = fc.integer({ min: 1, max: 9 });
  const rel = fc.integer({ min: 1, max: 3 });
  const rows = fc.record({
    edges: fc.array(fc.tuple(node, rel, node), { maxLength: 40 }),
    types: fc.array(fc.tuple(node, node), { maxLength: 10 }),
    subs: fc.array(fc.tuple(node, node), { maxLength: 5 }),
    removed: fc.array(node, { maxLength: 3 }),
    late: fc.array(fc.tuple(node, rel, node), { maxLength: 2 }),
  });

  it("builds the same index with or without sorting before the removals (fast-check)", () => {
    fc.assert(
      fc.property(rows, (r) => {
        expect(built(r, true)).toEqual(built(r, false));
      }),
      { numRuns: 300, seed: 23 },
    );
  });

  it("drops a removed entity's edges and types after a presort", () => {
    const r: Rows = { edges: [[1, 1, 2], [2, 1, 3], [1, 1, 2]], types: [[2, 5], [3, 5]], subs: [], removed: [2], late: [] };
    const b = new IndexBuilder();
    for (const [s, rl, d] of r.edges) b.edge(s, rl, d);
    for (const [e, t] of r.types) b.type(e, t);
    b.presort();
    b.remove(2);
    const { index, edges } = b.build(9, 3);
    expect(edges).toBe(0); // both distinct edges touch entity 2
    expect(index.typesOf(3)).toEqual([5]);
    expect(index.typesOf(2)).toEqual([]);
  });
});

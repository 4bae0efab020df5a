/**
 * The compact relation index: layout, both directions, types and subtypes, and the build
 * from a real SQLite catalog loaded through the JSONL importer. Expected values are
 * hand-computed from the fixtures written here.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { RelationIndex } from "./index.js";

/** Fixture shorthand: "a knows b; b bornIn c" → nodes and relations numbered by first appearance (from 1). */
function fixture(text: string) {
  const nodes = new Map<string, number>();
  const rels = new Map<string, number>();
  const id = (m: Map<string, number>, k: string) => m.get(k) ?? (m.set(k, m.size + 1), m.size);
  const edges = text.split(";").map((t) => {
    const [s, r, d] = t.trim().split(/\s+/) as [string, string, string];
    return [id(nodes, s), id(rels, r), id(nodes, d)] as const;
  });
  return { nodes, rels, edges, index: RelationIndex.fromEdges(nodes.size + 1, rels.size + 1, edges) };
}

function entries(index: RelationIndex, u: number): string[] {
  const out: string[] = [];
  index.forEach(u, (v, rel, inverse) => out.push(`${v}/${rel}${inverse ? "^" : ""}`));
  return out;
}

describe("RelationIndex.fromEdges", () => {
  it("rejects bad arguments with RangeError", () => {
    expect(() => RelationIndex.fromEdges(-1, 1, [])).toThrow(RangeError);
    expect(() => RelationIndex.fromEdges(3, 2, [[1, 1, 3]])).toThrow(/edge target 3/);
    expect(() => RelationIndex.fromEdges(3, 2, [[1, 2, 2]])).toThrow(/relation 2/);
    expect(() => RelationIndex.fromEdges(3, 2, [], [[1, 7]])).toThrow(RangeError);
  });

  it("stores every edge in both directions with its relation and inverse flag", () => {
    const { index } = fixture("a knows b; b bornIn c; a knows c");
    // hand-computed: a=1 b=2 c=3, knows=1 bornIn=2
    expect(index.nodeCount).toBe(4);
    expect(index.edgeCount).toBe(3);
    expect(entries(index, 1)).toEqual(["2/1", "3/1"]);
    expect(entries(index, 2)).toEqual(["1/1^", "3/2"]);
    expect(entries(index, 3)).toEqual(["2/2^", "1/1^"]);
    expect([0, 1, 2, 3].map((u) => index.degree(u))).toEqual([0, 2, 2, 2]);
    expect(index.degree(99)).toBe(0);
    expect(entries(index, 99)).toEqual([]);
  });

  it("counts edges per relation the same from the adjacency and from the relation-end table", () => {
    const { index } = fixture("a knows b; b bornIn c; a knows c; c likes c");
    // hand-computed: knows=1 (2 edges), bornIn=2 (1), likes=3 (1, a self-loop counted once)
    expect([...index.relationEdgeCounts()]).toEqual([0, 2, 1, 1]);
    index.endTable(); // now read from the table's totals
    expect([...index.relationEdgeCounts()]).toEqual([0, 2, 1, 1]);
  });

  it("keeps a self-loop as two entries, one per direction", () => {
    const { index } = fixture("a likes a");
    expect(entries(index, 1)).toEqual(["1/1", "1/1^"]);
  });

  it("answers type questions through the subtype closure, tolerating cycles", () => {
    // nodes 1..3 entities, 4 = Researcher, 5 = Person, 6 = Agent; 7 <-> 8 a cycle
    const index = RelationIndex.fromEdges(9, 1, [], [[1, 4], [2, 5], [3, 7]], [[4, 5], [5, 6], [7, 8], [8, 7]]);
    expect(index.typesOf(1)).toEqual([4]);
    expect(index.supertypesClosure(4)).toEqual([4, 5, 6]);
    expect(index.supertypesClosure(7)).toEqual([7, 8]);
    expect(index.isA(1, new Set([6]))).toBe(true);
    expect(index.isA(2, new Set([4]))).toBe(false); // a Person is not necessarily a Researcher
    expect(index.isA(3, new Set([8]))).toBe(true);
    expect(index.typesOf(42)).toEqual([]);
  });

  it("lists the members of a set of types as isA judges every node, and stops when asked", () => {
    // a random typed graph: membersOf equals the nodes (other than the types) isA accepts, for every set of one or two types
    let seed = 7;
    const rnd = (n: number) => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed % n);
    const N = 5000;
    const types: [number, number][] = [];
    for (let u = 20; u < N; u++) for (let k = rnd(3); k > 0; k--) types.push([u, 1 + rnd(15)]);
    const subs: [number, number][] = [[2, 1], [3, 1], [4, 2], [5, 4], [6, 6], [7, 8], [8, 7], [9, 3]];
    const index = RelationIndex.fromEdges(N, 1, [], types, subs);
    for (const set of [[1], [2], [4], [7], [9, 12], [6, 14]]) {
      const ts = new Set(set);
      const want: number[] = [];
      for (let u = 0; u < N; u++) if (!ts.has(u) && index.isA(u, ts)) want.push(u);
      expect(index.membersOf(ts).nodes).toEqual(want);
      expect(want.length).toBeGreaterThan(0);
    }
    // a stop after the first check: only nodes below 4,096 are listed, and the cut says where
    const cut = index.membersOf(new Set([1]), () => true);
    expect(cut.cut).toBe(4096);
    expect(cut.nodes.every((u) => u < 4096)).toBe(true);
  });
});

describe("RelationIndex.fromCatalog", () => {
  const dir = mkdtempSync(join(tmpdir(), "tiepoint-ri-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("builds the same adjacency as the catalog's edges, with types and subtypes", () => {
    const file = join(dir, "c.jsonl");
    writeFileSync(
      file,
      [
        { kind: "type", id: "t:Researcher", label: "researcher", subClassOf: ["t:Person"] },
        { kind: "type", id: "t:Person", label: "person" },
        { kind: "relation", id: "r:memberOf", label: "member of" },
        { id: "o:lab", label: "Lab" },
        { id: "p:ada", label: "Ada", types: ["t:Researcher"], relations: { "r:memberOf": ["o:lab"] } },
        { id: "p:bo", label: "Bo", types: ["t:Person"], relations: { "r:memberOf": ["o:lab"], "r:knows": ["p:ada"] } },
      ]
        .map((o) => JSON.stringify(o))
        .join("\n") + "\n",
    );
    const cat = Catalog.open(join(dir, "c.db"), { create: true });
    try {
      loadFiles(cat, [file]);
      const index = RelationIndex.fromCatalog(cat);
      const n = (id: string) => cat.numOf(id)!;
      const rel = (id: string) => cat.predicates().find((p) => p.id === id)!.num;
      expect(index.edgeCount).toBe(3);
      const seen: string[] = [];
      for (const [s, r, d] of cat.edges()) {
        const fwd: string[] = [];
        index.forEach(s, (v, rr, inv) => !inv && fwd.push(`${v}/${rr}`));
        const back: string[] = [];
        index.forEach(d, (v, rr, inv) => inv && back.push(`${v}/${rr}`));
        expect(fwd).toContain(`${d}/${r}`);
        expect(back).toContain(`${s}/${r}`);
        seen.push(`${s}-${r}-${d}`);
      }
      expect(seen).toContain(`${n("p:bo")}-${rel("r:knows")}-${n("p:ada")}`);
      expect(index.degree(n("o:lab"))).toBe(2);
      expect(index.typesOf(n("p:ada"))).toEqual([n("t:Researcher")]);
      expect(index.isA(n("p:ada"), new Set([n("t:Person")]))).toBe(true);
      expect(index.isA(n("p:bo"), new Set([n("t:Researcher")]))).toBe(false);
      expect(index.relationCount).toBeGreaterThan(rel("r:knows"));
    } finally {
      cat.close();
    }
  });
});

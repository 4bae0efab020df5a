/**
 * The evidence graph in DOT: parsed back by Graphviz itself (@viz-js/viz, the same library that
 * draws it — the outside check), its edges are exactly the stored triples of the paths.
 */
import { describe, expect, it } from "vitest";
import { evidenceDot, dotUnescape } from "../src/present/dot.js";
import { dotToSvg, parseDot } from "../src/present/graph-svg.js";
import type { AskResult } from "../src/model/index.js";
import { ASK_HOSTILE, ASK_NONE, ASK_TWO_CLUES } from "./fixtures/report-fixtures.js";

/** The stored triples walked by the answers' paths (contract: inverse=true means `to rel from`). */
function pathTriples(r: AskResult, answers = Infinity): Set<string> {
  const set = new Set<string>();
  for (const a of r.answers.slice(0, answers))
    for (const p of a.paths) for (const s of p.steps) set.add(JSON.stringify(s.inverse ? [s.to, s.relation, s.from] : [s.from, s.relation, s.to]));
  return set;
}

async function dotTriples(dot: string): Promise<string[]> {
  const g = await parseDot(dot);
  const entity = new Map(g.nodes.map((n) => [n.name, dotUnescape(n.attributes.entity!)]));
  return g.edges.map((e) => JSON.stringify([entity.get(e.tail), dotUnescape(e.attributes.relation!), entity.get(e.head)]));
}

describe("evidence DOT", () => {
  it("Graphviz rejects broken DOT with a one-line present/graphviz error", async () => {
    await expect(parseDot("digraph { a -> ")).rejects.toThrow(/graph drawing failed: syntax error/);
  });

  it("contains exactly the path edges, each stored triple once, in stored direction", async () => {
    const dot = evidenceDot(ASK_TWO_CLUES);
    const got = await dotTriples(dot);
    // hand-derived from the fixture: o:lorn ←built— v:heron is stored `v:heron r:built o:lorn`;
    // kessel→h:9 is shared by two paths and drawn once
    expect(new Set(got).size).toBe(got.length);
    expect(new Set(got)).toEqual(pathTriples(ASK_TWO_CLUES));
    expect(got).toContain(JSON.stringify(["v:heron", "r:built", "o:lorn"]));
    expect(got).toHaveLength(4);
  });

  it("marks clue, answer, rival and path roles", async () => {
    const g = await parseDot(evidenceDot(ASK_TWO_CLUES, { answers: 2 }));
    const role = Object.fromEntries(g.nodes.map((n) => [dotUnescape(n.attributes.entity!), n.attributes.role]));
    expect(role).toEqual({ "o:lorn": "clue", "s:kessel": "clue", "v:heron": "answer", "v:tern": "rival", "h:9": "path" });
  });

  it("limits the drawing to the first N answers", async () => {
    const dot = evidenceDot(ASK_TWO_CLUES, { answers: 1 });
    expect(new Set(await dotTriples(dot))).toEqual(pathTriples(ASK_TWO_CLUES, 1));
    expect(dot).not.toContain("v:tern");
  });

  it("round-trips ids with quotes and backslashes, and labels with markup", async () => {
    const dot = evidenceDot(ASK_HOSTILE);
    const g = await parseDot(dot);
    expect(g.nodes.map((n) => dotUnescape(n.attributes.entity!)).sort()).toEqual(['e:"quoted"\\', "e:a\\b"].sort());
    expect(new Set(await dotTriples(dot))).toEqual(pathTriples(ASK_HOSTILE));
    const svg = await dotToSvg(dot);
    expect(svg.startsWith("<svg")).toBe(true);
    expect(svg).not.toMatch(/<script|<img/i);
    expect(svg).toContain("&lt;script&gt;");
  });

  it("draws an empty graph when nothing linked, and the clues alone when nothing was reached", async () => {
    const g = await parseDot(evidenceDot(ASK_NONE));
    expect(g.nodes).toHaveLength(0);
    expect(g.edges).toHaveLength(0);
    const lonely = await parseDot(evidenceDot({ ...ASK_TWO_CLUES, answers: [] }));
    expect(lonely.nodes.map((n) => n.attributes.role)).toEqual(["clue", "clue"]);
    expect(lonely.edges).toHaveLength(0);
  });

  it("uses relation labels from the label book", () => {
    const dot = evidenceDot(ASK_TWO_CLUES, { labels: { entity: () => undefined, relation: (id) => (id === "r:built" ? "built by" : undefined) } });
    expect(dot).toContain('label="built by"');
    expect(dot).toContain('label="moors"'); // fallback: the id's last segment (labelFromId)
  });
});

/**
 * Over every demo question (data/demo-questions.tsv through the real Session): the evidence
 * graph's DOT, parsed back by Graphviz (@viz-js/viz), has exactly the stored triples walked
 * by the answers' paths in the JSON document, and each of them is an edge of the catalog
 * (Catalog.hasEdge, an SQL lookup independent of the path search).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseQuestionFile, runCheck, Session } from "../src/pipeline/index.js";
import { catalogLabels, dotUnescape, evidenceDot } from "../src/present/dot.js";
import { parseDot } from "../src/present/graph-svg.js";
import type { AskResult, CheckReport } from "../src/model/index.js";

function pathTriples(r: AskResult): Set<string> {
  const set = new Set<string>();
  for (const a of r.answers) for (const p of a.paths) for (const s of p.steps) set.add(JSON.stringify(s.inverse ? [s.to, s.relation, s.from] : [s.from, s.relation, s.to]));
  return set;
}

describe("evidence DOT of the demo questions", () => {
  let session: Session;
  let report: CheckReport;
  beforeAll(async () => {
    session = Session.open();
    report = await runCheck(session, parseQuestionFile("data/demo-questions.tsv"));
  });
  afterAll(() => session?.close());

  it("parses with Graphviz and holds exactly the JSON's path edges, each a catalog edge", async () => {
    const labels = catalogLabels(session.catalog);
    let edges = 0;
    for (const item of report.results) {
      // the JSON document as `ask --json` prints it, read back
      const json = JSON.parse(JSON.stringify(item.answer)) as AskResult;
      const g = await parseDot(evidenceDot(json, { labels }));
      const entity = new Map(g.nodes.map((n) => [n.name, dotUnescape(n.attributes.entity!)]));
      const got = g.edges.map((e) => JSON.stringify([entity.get(e.tail)!, dotUnescape(e.attributes.relation!), entity.get(e.head)!]));
      expect(new Set(got).size, `line ${item.line}: an edge drawn twice`).toBe(got.length);
      expect(new Set(got), `line ${item.line}`).toEqual(pathTriples(json));
      for (const t of got) {
        const [s, r, o] = JSON.parse(t) as [string, string, string];
        expect(session.catalog.hasEdge(s, r, o), `line ${item.line}: ${t} is not in the catalog`).toBe(true);
      }
      edges += got.length;
    }
    expect(edges, "the demo answers carry paths").toBeGreaterThan(0);
  });
});

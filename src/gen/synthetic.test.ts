/**
 * The synthetic generator: bad options, byte-for-byte determinism, a heavy tail, and its
 * questions' expected answers recomputed independently: each question's text is parsed back
 * (relation verb phrases, type labels, entity labels) and answered by SQL over the catalog
 * that the real importer builds from the generated N-Triples.
 */
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { TiepointError } from "../model/index.js";
import { ATTRIBUTES, RELATIONS, TYPES } from "./schema.js";
import { generateCatalog, IRI } from "./synthetic.js";
import type { GenerateResult } from "./synthetic.js";

const dirs: string[] = [];
const tmp = () => {
  const d = mkdtempSync(join(tmpdir(), "tiepoint-gen-test-"));
  dirs.push(d);
  return d;
};
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

/** SHA-256 of each written file (comparing digests, not multi-megabyte buffers element by element). */
const bytes = (r: GenerateResult) => [...r.files, r.questions].map((f) => createHash("sha256").update(readFileSync(f)).digest("hex"));

describe("generateCatalog options", () => {
  it("refuses too few entities, negative edges and fractions with a gen/options error", () => {
    for (const bad of [{ entities: 50 }, { edges: -1 }, { seed: 1.5 }, { questions: -3 }]) {
      let err: unknown;
      try {
        generateCatalog({ out: tmp(), ...bad });
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(TiepointError);
      expect((err as TiepointError).code).toBe("gen/options");
      expect((err as TiepointError).message).toMatch(/--(entities|edges|seed|questions)/);
    }
  });
});

describe("generateCatalog output", () => {
  it("is the same bytes for the same seed, and different bytes for another seed", () => {
    const o = { entities: 3000, edges: 15000, questions: 40 };
    const a = generateCatalog({ out: tmp(), seed: 7, ...o });
    const b = generateCatalog({ out: tmp(), seed: 7, ...o });
    const c = generateCatalog({ out: tmp(), seed: 8, ...o });
    expect(bytes(b)).toEqual(bytes(a));
    expect(bytes(c)[2]).not.toEqual(bytes(a)[2]);
  });

  it("has a heavy-tailed degree distribution", () => {
    const r = generateCatalog({ out: tmp(), entities: 20000, edges: 100000, questions: 0 });
    // mean degree is 2·M/N = 10; a hub 50× the mean is far outside a uniform random graph
    // (whose maximum degree would be about 25 at this size; Poisson tail, common practice)
    expect(r.maxDegree).toBeGreaterThan(500);
  });
});

describe("generated questions", () => {
  let cat: Catalog;
  let result: GenerateResult;
  beforeAll(() => {
    const dir = tmp();
    result = generateCatalog({ out: dir, entities: 4000, edges: 24000, seed: 3, questions: 80 });
    cat = Catalog.open(join(dir, "catalog.db"), { create: true });
    loadFiles(cat, result.files);
  });
  afterAll(() => cat?.close());

  const one = (sql: string, ...a: unknown[]) => cat.db.prepare(sql).pluck().all(...a) as number[];

  function typeClosure(label: string): Set<number> {
    const t = TYPES.find((x) => x.label === label);
    if (!t) throw new Error(`unknown type label ${label}`);
    return new Set(
      one(
        "WITH RECURSIVE sub(t) AS (SELECT num FROM entity WHERE id = ? UNION SELECT s.sub FROM subclass s JOIN sub ON s.sup = sub.t) SELECT e.entity FROM entity_type e JOIN sub ON e.type = sub.t",
        IRI.type + t.key,
      ),
    );
  }
  function entity(label: string): number {
    const nums = one("SELECT num FROM entity WHERE label = ?", label);
    expect(nums, `clue label "${label}" names exactly one entity`).toHaveLength(1);
    return nums[0]!;
  }
  function relation(verb: string): number {
    const r = RELATIONS.find((x) => x.verb === verb)!;
    return one("SELECT num FROM predicate WHERE id = ?", IRI.relation + r.key)[0]!;
  }

  it("loads through the real importer with the expected counts", () => {
    const c = cat.counts();
    expect(c.entities).toBe(result.entities + TYPES.length);
    expect(c.edges).toBeLessThanOrEqual(result.edges);
    expect(c.edges).toBeGreaterThan(result.edges * 0.95); // a few repeated triples collapse
    expect(c.relations).toBe(RELATIONS.length);
  });

  it("has expected answers equal to an independent SQL evaluation of each question's text", () => {
    expect(new Set(RELATIONS.map((r) => r.verb)).size).toBe(RELATIONS.length);
    const esc = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
    const V = `(${[...RELATIONS].map((r) => r.verb).sort((a, b) => b.length - a.length).map(esc).join("|")})`;
    const T = `(${TYPES.map((t) => t.label).sort((a, b) => b.length - a.length).map(esc).join("|")})`;
    const W = `(?:Who|Which ${T})`;
    const twoHop = new RegExp(`^${W} ${V} a ${T} that ${V} (.+)\\?$`);
    const both = new RegExp(`^${W} ${V} both (.+) and (.+)\\?$`);
    const pair = new RegExp(`^${W} ${V} (.+) and ${V} (.+)\\?$`);
    const inverse = new RegExp(`^${W} ${V} (.+)\\?$`);
    const forward = new RegExp(`^(.+) ${V} which ${T}\\?$`);
    const lines = readFileSync(result.questions, "utf8").split("\n").filter((l) => l !== "");
    expect(lines.length).toBe(result.questionCount);
    expect(lines.length).toBeGreaterThanOrEqual(72); // at least 90 % of the 80 asked for
    const kinds = { twoHop: 0, both: 0, pair: 0, inverse: 0, forward: 0 };
    for (const line of lines) {
      const [q, exp] = line.split("\t") as [string, string];
      const expected = exp.split("|").map((id) => cat.numOf(id)!).sort((a, b) => a - b);
      let got: number[];
      let m: RegExpExecArray | null;
      const typed = (xs: number[], typeLabel: string | undefined) => {
        const ok = typeClosure(typeLabel ?? "person");
        return [...new Set(xs)].filter((x) => ok.has(x)).sort((a, b) => a - b);
      };
      if ((m = twoHop.exec(q))) {
        kinds.twoHop++;
        const b = entity(m[5]!);
        const mid = typeClosure(m[3]!);
        const rows = cat.db
          .prepare("SELECT e1.src AS x, e1.dst AS y FROM edge e1 JOIN edge e2 ON e1.dst = e2.src WHERE e1.rel = ? AND e2.rel = ? AND e2.dst = ?")
          .all(relation(m[2]!), relation(m[4]!), b) as { x: number; y: number }[];
        got = typed(rows.filter((r) => mid.has(r.y) && r.x !== b).map((r) => r.x), m[1]);
      } else if ((m = both.exec(q))) {
        kinds.both++;
        const [b, c] = [entity(m[3]!), entity(m[4]!)];
        const r = relation(m[2]!);
        got = typed(
          one("SELECT e1.src FROM edge e1 JOIN edge e2 ON e1.src = e2.src WHERE e1.rel = ? AND e1.dst = ? AND e2.rel = ? AND e2.dst = ?", r, b, r, c).filter((x) => x !== b && x !== c),
          m[1],
        );
      } else if ((m = pair.exec(q))) {
        kinds.pair++;
        const [b, c] = [entity(m[3]!), entity(m[5]!)];
        got = typed(
          one("SELECT e1.src FROM edge e1 JOIN edge e2 ON e1.src = e2.src WHERE e1.rel = ? AND e1.dst = ? AND e2.rel = ? AND e2.dst = ?", relation(m[2]!), b, relation(m[4]!), c).filter(
            (x) => x !== b && x !== c,
          ),
          m[1],
        );
      } else if ((m = inverse.exec(q))) {
        kinds.inverse++;
        got = typed(one("SELECT src FROM edge WHERE rel = ? AND dst = ?", relation(m[2]!), entity(m[3]!)), m[1]);
      } else if ((m = forward.exec(q))) {
        kinds.forward++;
        got = typed(one("SELECT dst FROM edge WHERE rel = ? AND src = ?", relation(m[2]!), entity(m[1]!)), m[3]);
      } else throw new Error(`unparsed generated question: ${q}`);
      expect(got, q).toEqual(expected);
    }
    // every template occurs (one- and two-hop, both kinds of intersection or at least one)
    expect(kinds.twoHop).toBeGreaterThan(0);
    expect(kinds.inverse).toBeGreaterThan(0);
    expect(kinds.forward).toBeGreaterThan(0);
    expect(kinds.both + kinds.pair).toBeGreaterThan(0);
  });

  it("gives some entities a label shared with an entity of another class", () => {
    const shared = one("SELECT count(*) FROM (SELECT label FROM entity GROUP BY label HAVING count(DISTINCT num) > 1)")[0]!;
    expect(shared).toBeGreaterThan(0);
    expect(result.sharedLabels).toBeGreaterThan(0);
  });
});

describe("generated condition questions (conditions.tsv)", () => {
  it("are over sets of 100 or more, and their expected answers equal SQL over the imported catalog", () => {
    const dir = tmp();
    const r = generateCatalog({ out: dir, entities: 20000, edges: 100000, seed: 1, questions: 30 });
    const cat = Catalog.open(join(dir, "catalog.db"), { create: true });
    try {
      loadFiles(cat, r.files);
      const esc = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
      const V = `(${[...RELATIONS].map((x) => x.verb).sort((a, b) => b.length - a.length).map(esc).join("|")})`;
      const A = `(${ATTRIBUTES.map((a) => a.label).sort((a, b) => b.length - a.length).map(esc).join("|")})`;
      const sup = new RegExp(`^Which .+? that ${V} (.+) has the (largest|smallest) ${A}\\?$`);
      const cmp = new RegExp(`^(?:Which|How many) .+? that ${V} (.+) have a ${A} above (\\d+)\\?$`);
      const lines = readFileSync(r.conditionQuestions, "utf8").split("\n").filter((l) => l !== "");
      expect(lines.length).toBe(r.conditionQuestionCount);
      expect(lines.length).toBeGreaterThanOrEqual(20);
      const one = (sql: string, ...a: unknown[]) => cat.db.prepare(sql).pluck().all(...a) as number[];
      const setOf = (verb: string, label: string, attr: string) => {
        const rel = one("SELECT num FROM predicate WHERE id = ?", IRI.relation + RELATIONS.find((x) => x.verb === verb)!.key)[0]!;
        const pred = one("SELECT num FROM predicate WHERE id = ?", IRI.attribute + ATTRIBUTES.find((a) => a.label === attr)!.key)[0]!;
        const b = one("SELECT num FROM entity WHERE label = ?", label);
        expect(b, label).toHaveLength(1);
        return cat.db.prepare("SELECT e.src AS x, a.num AS v FROM edge e JOIN attribute a ON a.entity = e.src AND a.predicate = ? WHERE e.rel = ? AND e.dst = ?").all(pred, rel, b[0]) as { x: number; v: number }[];
      };
      for (const line of lines) {
        const [q, exp] = line.split("\t") as [string, string];
        const expected = exp.split("|").map((id) => cat.numOf(id)!).sort((a, b) => a - b);
        let m: RegExpExecArray | null;
        let got: number[];
        let size: number;
        if ((m = sup.exec(q))) {
          const rows = setOf(m[1]!, m[2]!, m[4]!);
          const best = m[3] === "largest" ? Math.max(...rows.map((x) => x.v)) : Math.min(...rows.map((x) => x.v));
          got = rows.filter((x) => x.v === best).map((x) => x.x);
          size = rows.length;
        } else if ((m = cmp.exec(q))) {
          const rows = setOf(m[1]!, m[2]!, m[3]!);
          got = rows.filter((x) => x.v > Number(m![4])).map((x) => x.x);
          size = rows.length;
        } else throw new Error(`unparsed condition question: ${q}`);
        expect(size, q).toBeGreaterThanOrEqual(100);
        expect([...new Set(got)].sort((a, b) => a - b), q).toEqual(expected);
      }
    } finally {
      cat.close();
    }
  });
});

/**
 * The demo catalog (data/*.jsonl) and its question set (data/demo-questions.tsv), checked
 * through the real importer and the real SQLite file built by demoCatalogPath().
 *
 * Size and shape thresholds are the requirements of issue 3 (`issues show 3`). Every
 * question's expected answers are recomputed here, independently of the ranking stages, by
 * evaluating a small conjunctive query (triple patterns, as in a SPARQL basic graph pattern)
 * with SQL over the built catalog; the answer set must equal the TSV's expected column.
 */
import { execFile } from "node:child_process";
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, demoCatalogPath, demoSourceFiles } from "../src/catalog/index.js";
import { demoFillerJsonl } from "../src/gen/demo-filler.js";
import { conditionGold } from "./fixtures/condition-questions.js";

const ROOT = resolve(__dirname, "..");
const QUESTIONS = join(ROOT, "data", "demo-questions.tsv");

/** question → its meaning as triple patterns (`?v` variables, `?x` the answer; `a` = has type, with subtypes; `in` = one of). */
const PATTERNS = new Map<string, string>([
  ["Who leads the MICA project?", "?x r:leads proj:mica"],
  ["Which vessel carries the Deepeye sonar?", "ins:deepeye r:carriedAboard ?x"],
  ["where is the Hollin Marine Institute located", "lab:hollin r:locatedIn ?x"],
  ["who is the captain of the Skerrin Dawn?", "?x r:captains ves:skerrin"],
  ["What is the home port of the Caddrow?", "?x a t:Town; ves:caddrow r:homePort ?x"],
  ["which funding programme pays for SEDTRACE", "proj:sedtrace r:fundedBy ?x"],
  ["Who made the VK-7?", "ins:vk7 r:manufacturedBy ?x"],
  ["Who designed the Longreach corer?", "?x r:designed ins:longreach"],
  ["Which lab does Teodor Vask work at?", "p:teodor-vask r:memberOf ?x"],
  ["Which vessel carries the instrument used by the MICA project?", "proj:mica r:uses ?i; ?i r:carriedAboard ?x"],
  ["In which town is the lab of the engineer Ilse Varrick?", "p:ilse-varrick-o r:memberOf ?l; ?l r:locatedIn ?x"],
  ["Who administers the programme that funds the Shoal Chain Survey?", "proj:shoal r:fundedBy ?g; ?x r:administers ?g"],
  ["Where is the home port of the ship Bram Tulley captains?", "p:bram-tulley r:captains ?v; ?v r:homePort ?x"],
  ["Which company manufactured the sonar carried aboard the Lumen Ray?", "?i r:carriedAboard ves:lumen; ?i a t:Sonar; ?i r:manufacturedBy ?x"],
  ["Who supervised the leader of the Shoal Chain Survey?", "?l r:leads proj:shoal; ?x r:supervises ?l"],
  ["Which field site did the cruise aboard the Pellory visit?", "?c r:sailedAboard ves:pellory; ?c r:visited ?x"],
  ["which other instrument did the designer of the Halo multibeam design", "?p r:designed ins:halo; ?p r:designed ?x"],
  ["Where was the leader of Project Tern born?", "?l r:leads proj:tern; ?l r:bornIn ?x"],
  ["Which vessel carried the instrument used by the project that Jessa Moll leads?", "p:jessa-moll r:leads ?p; ?p r:uses ?i; ?i r:carriedAboard ?x"],
  ["What is the home port of the ship carrying the sonar used by the Shoal Chain Survey?", "proj:shoal r:uses ?i; ?i a t:Sonar; ?i r:carriedAboard ?v; ?v r:homePort ?x"],
  ["Who administers the programme funding the project Oren Salk leads?", "p:oren-salk r:leads ?p; ?p r:fundedBy ?g; ?x r:administers ?g"],
  ["Which company made the corer aboard the ship that Anouk Tresk captains?", "p:anouk-tresk r:captains ?v; ?i r:carriedAboard ?v; ?i a t:Sampler; ?i r:manufacturedBy ?x"],
  ["In which town was the person born who leads the project studying Ketter Shoal?", "?p r:studies site:ketter; ?l r:leads ?p; ?l r:bornIn ?x"],
  ["Which lab operates the vessel that carries the spectrometer Tomas Brenn designed?", "p:tomas-brenn r:designed ?i; ?i a t:Spectrometer; ?i r:carriedAboard ?v; ?v r:operatedBy ?x"],
  ["Who worked on both the Shoal Chain Survey and SEDTRACE?", "?x r:worksOn proj:shoal; ?x r:worksOn proj:sedtrace"],
  ["Which researcher at the Hollin Marine Institute attended the Velmouth Workshop 2019?", "?x r:memberOf lab:hollin; ?x r:participatedIn ws:velmouth19; ?x a t:Researcher"],
  ["Which project funded by the Deep Floor Programme studies Ketter Shoal?", "?x r:fundedBy prog:deepfloor; ?x r:studies site:ketter"],
  ["Which instrument made by Marrant Instruments is carried aboard the Pellory?", "?x r:manufacturedBy co:marrant; ?x r:carriedAboard ves:pellory"],
  ["which vessel operated by the Braeholt Acoustics Group sails from Velmouth", "?x r:operatedBy lab:braeholt; ?x r:homePort town:velmouth"],
  ["Which paper cites Mapping the Ketter Shoal and reports on Project Tern?", "?x r:cites pub:shoalmap; ?x r:reportsOn proj:tern"],
  ["Who lives in Harnesk, works at Braeholt and designed the Gullwing sampler?", "?x r:livesIn town:harnesk; ?x r:memberOf lab:braeholt; ?x r:designed ins:gullwing"],
  ["Which mariner lives in Tolvane and took part in the Basin Crossing 2018?", "?x r:livesIn town:tolvane; ?x r:participatedIn cr:bc18; ?x a t:Mariner"],
  ["Who works on MICA and lives in Saltkerry?", "?x r:worksOn proj:mica; ?x r:livesIn town:saltkerry"],
  ["Which project funded by the Coastal Futures Fund studies the Harnesk Sill?", "?x r:fundedBy prog:coastal; ?x r:studies site:sill"],
  ["Which instrument aboard the Skerrin Dawn did Tomas Brenn design?", "?x r:carriedAboard ves:skerrin; p:tomas-brenn r:designed ?x"],
  ["Which ship sailing from Tolvane is operated by the Tidewater Geophysics Lab?", "?x r:homePort town:tolvane; ?x r:operatedBy lab:tidewater"],
  ["Which sonar designed by Ilse Varrick is carried aboard the Lumen Ray?", "?x a t:Sonar; ?p r:designed ?x; ?x r:carriedAboard ves:lumen"],
  ["Who captains the Harnesk?", "?x r:captains ves:harnesk"],
  ["Which laboratory is located in Perrowick?", "?t in town:perrowick,town:perrowick-vorra; ?x r:locatedIn ?t; ?x a t:Lab"],
  ["Who designed the MICA?", "?x r:designed ins:mica"],
  ["Which cruise sailed aboard the Caddrow?", "?x r:sailedAboard ves:caddrow"],
  ["Which site near Caddrow does the Lisk Reef Watch study?", "?x r:near town:caddrow; proj:liskwatch r:studies ?x"],
  ["Who leads the Shoal Chian Survey?", "?x r:leads proj:shoal"],
  ["wich ship carries the Deepeye sonnar", "ins:deepeye r:carriedAboard ?x"],
  ["What project does Jesa Moll lead?", "p:jessa-moll r:leads ?x"],
  ["Who directs the Hollin Marine Insitute?", "?x r:directs lab:hollin"],
  ["Which company made the Longreech corer?", "ins:longreach r:manufacturedBy ?x"],
  ["who skippers the Lumen Rey", "?x r:captains ves:lumen"],
  ["Who works on the MICA project?", "?x r:worksOn proj:mica"],
  ["Which instruments are carried aboard the Skerrin Dawn?", "?x r:carriedAboard ves:skerrin"],
  ["Which projects does the Coastal Futures Fund pay for?", "?x r:fundedBy prog:coastal"],
  ["Who attended the Velmouth Workshop 2019?", "?x r:participatedIn ws:velmouth19"],
  ["Which vessels have Tolvane as their home port?", "?x r:homePort town:tolvane"],
  ["Which papers cite Mapping the Ketter Shoal?", "?x r:cites pub:shoalmap"],
  ["What did the Ostrel engineer Ilse Varrick design?", "p:ilse-varrick-o r:designed ?x"],
  ["Which projects are funded by the Deep Floor Programme?", "?x r:fundedBy prog:deepfloor"],
  ["Which ships did Edda Quill serve on?", "p:edda-quill r:crewOn ?x"],
]);

let cache: string;
let path: string;
let cat: Catalog;

beforeAll(() => {
  cache = mkdtempSync(join(tmpdir(), "tiepoint-demo-test-"));
  path = demoCatalogPath({ cacheDir: cache });
  cat = Catalog.open(path, { readonly: true });
});
afterAll(() => {
  cat?.close();
  rmSync(cache, { recursive: true, force: true });
});

const count = (sql: string, ...args: unknown[]) => (cat.db.prepare(sql).get(...args) as { n: number }).n;

function num(id: string): number {
  const n = cat.numOf(id);
  if (n === undefined) throw new Error(`pattern names unknown id ${id}`);
  return n;
}

function typeClosure(typeId: string): Set<number> {
  const rows = cat.db
    .prepare("WITH RECURSIVE sub(t) AS (SELECT num FROM entity WHERE id = ? UNION SELECT s.sub FROM subclass s JOIN sub ON s.sup = sub.t) SELECT t FROM sub")
    .all(typeId) as { t: number }[];
  return new Set(rows.map((r) => r.t));
}

/** Evaluates `?x`'s distinct values for a pattern; the constants it names are excluded (they are the clues). */
function answers(pattern: string): string[] {
  const triples = pattern.split(";").map((t) => t.trim().split(/\s+/) as [string, string, string]);
  let rows: Map<string, number>[] = [new Map()];
  const constants = new Set<number>();
  const isVar = (t: string) => t.startsWith("?");
  for (const [s, p, o] of triples) {
    if (!isVar(s)) constants.add(num(s));
    if (p !== "a" && p !== "in" && !isVar(o)) constants.add(num(o));
    const next: Map<string, number>[] = [];
    const bindOr = (b: Map<string, number>, v: string, value: number) => {
      const cur = isVar(v) ? b.get(v) : num(v);
      if (cur === undefined) next.push(new Map(b).set(v, value));
      else if (cur === value) next.push(b);
    };
    for (const b of rows) {
      const val = (t: string) => (isVar(t) ? b.get(t) : num(t));
      if (p === "in") {
        for (const id of o.split(",")) bindOr(b, s, num(id));
      } else if (p === "a") {
        const types = [...typeClosure(o)];
        const ents = cat.db.prepare(`SELECT DISTINCT entity AS e FROM entity_type WHERE type IN (${types.map(() => "?").join(",")})`).all(...types) as { e: number }[];
        for (const { e } of ents) bindOr(b, s, e);
      } else {
        const rel = (cat.db.prepare("SELECT num FROM predicate WHERE id = ?").get(p) as { num: number } | undefined)?.num;
        if (rel === undefined) throw new Error(`pattern names unknown relation ${p}`);
        const sv = val(s);
        const ov = val(o);
        const edges =
          sv !== undefined
            ? (cat.db.prepare("SELECT src, dst FROM edge WHERE src = ? AND rel = ?").all(sv, rel) as { src: number; dst: number }[])
            : ov !== undefined
              ? (cat.db.prepare("SELECT src, dst FROM edge WHERE dst = ? AND rel = ?").all(ov, rel) as { src: number; dst: number }[])
              : (cat.db.prepare("SELECT src, dst FROM edge WHERE rel = ?").all(rel) as { src: number; dst: number }[]);
        for (const e of edges) {
          if (sv !== undefined && e.src !== sv) continue;
          if (ov !== undefined && e.dst !== ov) continue;
          let nb = b;
          if (sv === undefined) nb = new Map(nb).set(s, e.src);
          if (ov === undefined) nb = new Map(nb).set(o, e.dst);
          next.push(nb);
        }
      }
    }
    rows = next;
  }
  const xs = new Set<number>();
  for (const b of rows) {
    const x = b.get("?x");
    if (x !== undefined && !constants.has(x)) xs.add(x);
  }
  return [...xs].map((x) => cat.ref(x).id).sort();
}

function questionLines(): { line: number; question: string; expected: string[] }[] {
  return readFileSync(QUESTIONS, "utf8")
    .split("\n")
    .map((text, i) => ({ text, line: i + 1 }))
    .filter((l) => l.text.trim() !== "")
    .map(({ text, line }) => {
      const cols = text.split("\t");
      return { line, question: cols[0]!, expected: (cols[1] ?? "").split("|").filter((x) => x !== ""), cols: cols.length };
    })
    .map((q) => {
      expect(q.cols, `line ${q.line}: question<TAB>expected`).toBe(2);
      return { line: q.line, question: q.question, expected: q.expected };
    });
}

describe("demo catalog build", () => {
  it("is built through the importer into the cache folder, outside the source tree", () => {
    expect(path.startsWith(cache)).toBe(true);
    expect(path.startsWith(ROOT + "/")).toBe(false);
    expect(existsSync(path + "-wal")).toBe(false); // one self-contained file
  });

  it("is reused while the sources are unchanged", () => {
    const before = statSync(path).mtimeMs;
    expect(demoCatalogPath({ cacheDir: cache })).toBe(path);
    expect(statSync(path).mtimeMs).toBe(before);
  });

  it("is rebuilt under a new name when a source changes, and the stale one is removed", () => {
    const dir = mkdtempSync(join(tmpdir(), "tiepoint-demo-src-"));
    const cache2 = join(dir, "cache");
    try {
      const files = demoSourceFiles().map((f) => {
        const copy = join(dir, f.slice(f.lastIndexOf("/") + 1));
        copyFileSync(f, copy);
        return copy;
      });
      const first = demoCatalogPath({ files, cacheDir: cache2 });
      writeFileSync(files[1]!, readFileSync(files[1]!, "utf8") + '{"id":"town:extra","label":"Extra Town","types":["t:Town"],"description":"an added town"}\n');
      const second = demoCatalogPath({ files, cacheDir: cache2 });
      expect(second).not.toBe(first);
      expect(existsSync(first)).toBe(false);
      const c = Catalog.open(second, { readonly: true });
      expect(c.numOf("town:extra")).toBeDefined();
      c.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it("survives two processes building it at the same moment (needs the build: npm test runs tsc first)", async () => {
    const dir = mkdtempSync(join(tmpdir(), "tiepoint-demo-race-"));
    const run = promisify(execFile);
    const script = `import(${JSON.stringify(join(ROOT, "dist/catalog/index.js"))}).then((m) => process.stdout.write(m.demoCatalogPath()))`;
    try {
      const env = { ...process.env, TIEPOINT_CACHE: dir };
      const [a, b] = await Promise.all([run(process.execPath, ["-e", script], { env }), run(process.execPath, ["-e", script], { env })]);
      expect(a.stdout).toBe(b.stdout);
      const c = Catalog.open(a.stdout, { readonly: true });
      expect(c.counts().edges).toBe(cat.counts().edges);
      c.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("demo catalog shape (issue 3 thresholds)", () => {
  it("has at least 600 entities besides its types, and 2,500 relation edges", () => {
    const types = count("SELECT count(*) AS n FROM (SELECT type FROM entity_type UNION SELECT sub FROM subclass UNION SELECT sup FROM subclass)");
    expect(count("SELECT count(*) AS n FROM entity") - types).toBeGreaterThanOrEqual(600);
    expect(count("SELECT count(*) AS n FROM edge")).toBeGreaterThanOrEqual(2500);
  });

  it("has at least 25 relation kinds in use, each with a label and an alias phrasing", () => {
    const rels = cat.db.prepare("SELECT DISTINCT p.num, p.id, p.label FROM edge e JOIN predicate p ON p.num = e.rel").all() as { num: number; id: string; label: string | null }[];
    expect(rels.length).toBeGreaterThanOrEqual(25);
    for (const r of rels) {
      expect(r.label, r.id).toBeTruthy();
      expect(count("SELECT count(*) AS n FROM predicate_alias WHERE predicate = ?", r.num), r.id).toBeGreaterThanOrEqual(1);
    }
  });

  it("has at least 15 types in a hierarchy at least 3 levels deep below the root", () => {
    expect(cat.types().length).toBeGreaterThanOrEqual(15);
    const depth = count(
      "WITH RECURSIVE up(t, d) AS (SELECT sub, 1 FROM subclass UNION ALL SELECT s.sup, up.d + 1 FROM subclass s JOIN up ON s.sub = up.t) SELECT max(d) AS n FROM up",
    );
    expect(depth).toBeGreaterThanOrEqual(3);
    // and every entity has a type
    expect(count("SELECT count(*) AS n FROM entity e WHERE NOT EXISTS (SELECT 1 FROM entity_type t WHERE t.entity = e.num) AND NOT EXISTS (SELECT 1 FROM subclass s WHERE s.sub = e.num OR s.sup = e.num)")).toBe(0);
  });

  it("gives every entity a label and a description", () => {
    expect(count("SELECT count(*) AS n FROM entity WHERE label IS NULL OR description IS NULL OR trim(description) = ''")).toBe(0);
  });

  it("has numeric literal attributes whose predicates carry labels", () => {
    expect(count("SELECT count(*) AS n FROM attribute WHERE num IS NOT NULL")).toBeGreaterThanOrEqual(600);
    for (const id of ["born", "built", "tonnage", "population", "depth", "founded"]) {
      const p = cat.db.prepare("SELECT num, label FROM predicate WHERE id = ?").get(id) as { num: number; label: string | null };
      expect(p.label, id).toBeTruthy();
      expect(count("SELECT count(*) AS n FROM predicate_alias WHERE predicate = ?", p.num), id).toBeGreaterThanOrEqual(1);
    }
  });

  it("has at least 20 labels shared by two or more entities", () => {
    const shared = cat.db.prepare("SELECT label, count(*) AS n FROM entity GROUP BY label HAVING n > 1").all() as { label: string; n: number }[];
    expect(shared.length).toBeGreaterThanOrEqual(20);
    const labels = shared.map((s) => s.label);
    // the hand-written cases the questions rely on: town/vessel, two towns, two people, project/instrument
    for (const l of ["Caddrow", "Harnesk", "Perrowick", "Ilse Varrick", "MICA"]) expect(labels).toContain(l);
  });

  it("ships data/filler.jsonl exactly as src/gen/demo-filler.ts writes it", () => {
    expect(readFileSync(join(ROOT, "data", "filler.jsonl"), "utf8")).toBe(demoFillerJsonl());
  });
});

describe("demo questions", () => {
  it("has at least 40 questions in the check format, with expected ids that exist", () => {
    const qs = questionLines();
    expect(qs.length).toBeGreaterThanOrEqual(40);
    for (const q of qs) {
      expect(q.expected.length, `line ${q.line}`).toBeGreaterThan(0);
      for (const id of q.expected) expect(cat.numOf(id), `line ${q.line}: ${id}`).toBeDefined();
    }
  });

  it("has at least 6 non-unique questions, each with a unique refinement naming one of its answers", () => {
    const qs = questionLines();
    const tied = qs.filter((q) => q.expected.length > 1);
    expect(tied.length).toBeGreaterThanOrEqual(6);
    const uniques = qs.filter((q) => q.expected.length === 1).map((q) => q.expected[0]!);
    for (const t of tied) expect(t.expected.some((a) => uniques.includes(a)), t.question).toBe(true);
  });

  it("every expected answer set equals the answer set of the question's triple pattern, computed by SQL", () => {
    const qs = questionLines();
    // questions with conditions (issue 11): their gold is computed by SQL in test/fixtures/condition-questions.ts
    const conditioned = conditionGold(cat);
    for (const q of qs) {
      const gold = conditioned.get(q.question);
      if (gold) {
        expect(gold.answers, `line ${q.line}: ${q.question}`).toEqual([...q.expected].sort());
        continue;
      }
      const pattern = PATTERNS.get(q.question);
      expect(pattern, `line ${q.line} has a pattern`).toBeDefined();
      expect(answers(pattern!), `line ${q.line}: ${q.question}`).toEqual([...q.expected].sort());
    }
    expect(PATTERNS.size + conditioned.size).toBe(qs.length);
  });
});

/**
 * Every SQL statement the question path prepares gets a good plan: recorded while a session
 * answers questions of every kind (links, relation cues, superlatives, comparisons, counts,
 * exclusions, value questions, why-not, verified suggestions) over the Debian package slice
 * (test/fixtures/debian; ~3,000 packages, loaded by tiepoint, so ANALYZE has run), each
 * statement is shown by SQLite's `EXPLAIN QUERY PLAN` (https://www.sqlite.org/eqp.html) and
 * fails when
 * - it SCANs (reads whole) a table that grows with the catalog — entity, alias, edge,
 *   attribute, entity_type — with or without an index (`SCAN t` / `SCAN t USING INDEX i`);
 *   the vocabulary tables (meta, predicate, predicate_alias, subclass) may be read whole;
 * - it SEARCHes through an index whose leading columns are not the ones the statement binds:
 *   some index of the table (the primary key included) starts with more of the columns the
 *   statement binds by `=` than the index used does (EXPLAIN QUERY PLAN names the used
 *   constraints in parentheses, "(entity=? AND predicate=?)").
 * A column counts as bound when compared by `=` or `IN` with a parameter, or by `=` with a
 * column of a table the plan visits earlier (the outer loop of a join).
 */
import Database from "better-sqlite3";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, NUMERIC_COLUMN_SQL } from "../src/catalog/index.js";
import { Session } from "../src/pipeline/index.js";
import { buildDebianSliceCatalog } from "./helpers/debian-catalog.js";

const GROWING = new Set(["entity", "alias", "edge", "attribute", "entity_type"]);

/** Questions that walk every stage of `ask` (their answers do not matter here). */
const QUESTIONS: readonly { q: string; whyNot?: string[] }[] = [
  { q: "Which dependency of wget has the smallest installed size?", whyNot: ["urn:x-debian:package:libc6"] },
  { q: "How many packages depend on libc6 and are bigger than 10000 kibibytes?" },
  { q: "Which package that wget depends on has an installed size above 1000 kibibytes?" },
  { q: "Which packages depend on zlib1g other than wget?" },
  { q: "What is the installed size of wget?" },
  { q: "Is wget bigger than libc6?" },
  { q: "Which maintainer maintains wget?" },
  { q: "Which packages are in section net and recommend ca-certificates?" },
  { q: "What are the largest packages of section games?" },
];

let dir: string;
let db: string;
const recorded = new Set<string>();

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "tp-plans-"));
  db = buildDebianSliceCatalog(dir);
  // record every statement prepared or fetched from the Catalog's cache while questions are answered
  const session = Session.open({ db });
  const stmt = Catalog.prototype.stmt;
  const prepare = Database.prototype.prepare;
  Catalog.prototype.stmt = function (this: Catalog, sql: string) {
    recorded.add(sql);
    return stmt.call(this, sql);
  };
  Database.prototype.prepare = function (this: Database.Database, sql: string) {
    recorded.add(sql);
    return prepare.call(this, sql);
  } as typeof prepare;
  try {
    for (const { q, whyNot } of QUESTIONS) session.ask(q, { verifySuggestions: true, ...(whyNot ? { whyNot } : {}) });
  } finally {
    Catalog.prototype.stmt = stmt;
    Database.prototype.prepare = prepare;
    session.close();
  }
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Tables named in FROM / JOIN, by alias (a table is its own alias too). */
function tablesOf(sql: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of sql.matchAll(/\b(?:FROM|JOIN)\s+(\w+)(?:\s+(?:AS\s+)?(?!WHERE|JOIN|ON|ORDER|GROUP|LIMIT|LEFT|INNER|CROSS|UNION)(\w+))?/gi)) {
    out.set(m[1]!, m[1]!);
    if (m[2]) out.set(m[2], m[1]!);
  }
  return out;
}

/** `col`/`alias.col` compared by `=`/`IN` with a parameter, or `=` with another alias's column. */
function boundColumns(sql: string, aliases: Map<string, string>, columnsOf: (t: string) => string[]): { table: string; column: string; other?: string }[] {
  const out: { table: string; column: string; other?: string }[] = [];
  const owner = (alias: string | undefined, col: string): string | undefined => {
    if (alias !== undefined) return aliases.get(alias);
    const hits = [...new Set(aliases.values())].filter((t) => columnsOf(t).includes(col));
    return hits.length === 1 ? hits[0] : undefined;
  };
  for (const m of sql.matchAll(/(?:\b(\w+)\.)?\b(\w+)\s*(?:=|\bIN\b)\s*(\?|@\w+|:\w+|\()/gi)) {
    const t = owner(m[1], m[2]!);
    if (t !== undefined) out.push({ table: t, column: m[2]! });
  }
  for (const m of sql.matchAll(/\b(\w+)\.(\w+)\s*=\s*(\w+)\.(\w+)/g)) {
    const [a, b] = [aliases.get(m[1]!), aliases.get(m[3]!)];
    if (a && b) {
      out.push({ table: a, column: m[2]!, other: b });
      out.push({ table: b, column: m[4]!, other: a });
    }
  }
  return out;
}

/** What is wrong with the plans of `statements` on the database `h` (see the header); empty when nothing. */
function planProblems(h: Database.Database, statements: Iterable<string>): string[] {
  const columns = new Map<string, string[]>();
  const columnsOf = (t: string) => {
    if (!columns.has(t)) columns.set(t, (h.prepare(`PRAGMA table_info(${t})`).all() as { name: string }[]).map((r) => r.name));
    return columns.get(t)!;
  };
  /** Leading columns of every index of `t`, its primary key and INTEGER PRIMARY KEY included. */
  const indexesOf = (t: string): string[][] => {
    const info = h.prepare(`PRAGMA table_info(${t})`).all() as { name: string; pk: number; type: string }[];
    const out: string[][] = [];
    const pk = info.filter((c) => c.pk > 0).sort((a, b) => a.pk - b.pk).map((c) => c.name);
    if (pk.length > 0) out.push(pk);
    for (const ix of h.prepare(`PRAGMA index_list(${t})`).all() as { name: string }[]) {
      out.push((h.prepare(`PRAGMA index_info(${ix.name})`).all() as { seqno: number; name: string }[]).sort((a, b) => a.seqno - b.seqno).map((c) => c.name));
    }
    return out;
  };
  const problems: string[] = [];
  for (const sql of statements) {
    if (/^\s*(PRAGMA|BEGIN|COMMIT|ROLLBACK|EXPLAIN)\b/i.test(sql)) continue;
    const params = [...new Set([...sql.matchAll(/@(\w+)/g)].map((m) => m[1]!))];
    const st = h.prepare(`EXPLAIN QUERY PLAN ${sql}`);
    const plan = (params.length > 0 ? st.all(Object.fromEntries(params.map((p) => [p, 1]))) : st.all(...Array((sql.match(/\?/g) ?? []).length).fill(1))) as { detail: string }[];
    const aliases = tablesOf(sql);
    const bound = boundColumns(sql, aliases, columnsOf);
    const visited: string[] = [];
    for (const { detail } of plan) {
      const scan = /^SCAN (\w+)/.exec(detail);
      if (scan) {
        const t = aliases.get(scan[1]!) ?? scan[1]!;
        if (GROWING.has(t)) problems.push(`${sql}\n    ${detail}: reads the whole ${t} table`);
        visited.push(t);
        continue;
      }
      const search = /^SEARCH (\w+) USING .*?\((.*)\)$/.exec(detail);
      if (!search) continue;
      const t = aliases.get(search[1]!) ?? search[1]!;
      const ipk = (h.prepare(`PRAGMA table_info(${t})`).all() as { name: string; pk: number; type: string }[]).find((c) => c.pk === 1 && /^INTEGER$/i.test(c.type))?.name;
      const used = search[2]!.split(" AND ").filter((c) => /=/.test(c) && !/[<>]/.test(c)).map((c) => c.split("=")[0]!.trim()).map((c) => (c === "rowid" && ipk ? ipk : c));
      const mine = new Set(bound.filter((b) => b.table === t && (b.other === undefined || visited.includes(b.other))).map((b) => b.column));
      const best = Math.max(0, ...indexesOf(t).map((cols) => {
        let k = 0;
        while (k < cols.length && mine.has(cols[k]!)) k++;
        return k;
      }));
      if (used.length < best) problems.push(`${sql}\n    ${detail}: uses ${used.length} bound column(s) of ${t}, an index starting with ${best} of the bound columns (${[...mine].join(", ")}) exists`);
      visited.push(t);
    }
  }
  return problems;
}

describe("query plans of the question path (SQLite EXPLAIN QUERY PLAN)", () => {
  it("records the statements of the question path", () => {
    expect(recorded.size).toBeGreaterThan(5);
    // the numeric columns of conditions come from the columns file (PATH.num, written when the
    // session opened the catalog): no question reads a column with SQL
    expect(recorded.has(NUMERIC_COLUMN_SQL)).toBe(false);
  });

  it("no statement scans a growing table or searches an index that does not lead with its bound columns", () => {
    const h = new Database(db, { readonly: true });
    // with the column read that a catalog changed since its columns file was written falls back to
    const problems = planProblems(h, [...recorded, NUMERIC_COLUMN_SQL]);
    h.close();
    expect(problems).toEqual([]);
  });

  it("the checks catch the plan that made superlatives slow (issue 23): an ORDER BY that picks the wrong index", () => {
    // the statement the question path used before: without statistics SQLite chose
    // attribute_by_predicate (predicate=? AND num>?) over the primary key (entity, predicate, …)
    const h = new Database(":memory:");
    h.exec("CREATE TABLE attribute (entity INTEGER NOT NULL, predicate INTEGER NOT NULL, value TEXT NOT NULL, num REAL, PRIMARY KEY (entity, predicate, value)) WITHOUT ROWID; CREATE INDEX attribute_by_predicate ON attribute(predicate, num);");
    const bad = "SELECT num FROM attribute WHERE entity = ? AND predicate = ? AND num IS NOT NULL ORDER BY num";
    const detail = (h.prepare(`EXPLAIN QUERY PLAN ${bad}`).all(1, 1) as { detail: string }[]).map((r) => r.detail);
    expect(detail.join("\n")).toMatch(/attribute_by_predicate \(predicate=\? AND num>\?\)/);
    expect(planProblems(h, [bad])).toHaveLength(1);
    // a whole-table read is caught; a read by the index's leading column is not
    expect(planProblems(h, ["SELECT count(*) FROM attribute WHERE num > ?"])).toHaveLength(1);
    expect(planProblems(h, ["SELECT entity, num FROM attribute WHERE predicate = ? AND num IS NOT NULL ORDER BY num"])).toEqual([]);
    h.close();
  });
});

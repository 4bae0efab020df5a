/**
 * The catalog store: one SQLite file (better-sqlite3, synchronous), opened read-write for
 * `load` and read-only (or read-write) for questions. WAL mode on disk; a busy timeout so a
 * reader never fails while a load writes.
 */
import Database from "better-sqlite3";
import { randomUUID } from "node:crypto";
import { accessSync, constants, existsSync, openSync, readSync, closeSync, statSync, readFileSync } from "node:fs";
import { dirname } from "node:path";
import { TiepointError } from "../model/index.js";
import { SCHEMA_SQL, SCHEMA_VERSION } from "./schema.js";
import { normalize } from "./normalize.js";

type DB = Database.Database;

/** The `meta` key of the stored attribute summary. */
const ATTRIBUTE_SUMMARY_KEY = "attribute_summary";

/** Options of {@link Catalog.open}; all optional. */
export interface OpenOptions {
  /** Create the file when it does not exist. @default false */
  readonly create?: boolean;
  /** Open read-only (also chosen automatically when the file is not writable). @default false */
  readonly readonly?: boolean;
  /** Milliseconds to wait on a lock held by another process. @default 10000 */
  readonly busyTimeout?: number;
}

/** A type (class) of the catalog with its direct parents. */
export interface TypeInfo {
  readonly num: number;
  readonly id: string;
  readonly label: string;
  readonly aliases: readonly string[];
  /** Direct supertypes (nums). */
  readonly parents: readonly number[];
}

/** A predicate: a relation (used between entities) or an attribute name (used with literals). */
export interface PredicateInfo {
  readonly num: number;
  readonly id: string;
  /** Its label, or a label derived from the IRI's last segment when none was given. */
  readonly label: string;
  readonly aliases: readonly string[];
}

/** A literal attribute of an entity. */
export interface AttributeInfo {
  readonly predicate: string;
  readonly label: string;
  readonly value: string;
  readonly datatype: string | null;
  readonly lang: string | null;
  /** The value read as a number (years and dates as a year with fraction), when it is one. */
  readonly num: number | null;
}

/** Use of one predicate with literal values (`Catalog.attributeSummary`). */
export interface AttributeSummary {
  /** Predicate num. */
  readonly num: number;
  /** Literal values stored. */
  readonly values: number;
  /** Values read as numbers. */
  readonly numeric: number;
  /** Numeric values written as a year or ISO date. */
  readonly dateLike: number;
}

/** One relation edge seen from an entity. */
export interface NeighbourInfo {
  readonly relation: string;
  readonly relationLabel: string;
  /** "out": entity → other; "in": other → entity. */
  readonly direction: "out" | "in";
  readonly id: string;
  readonly label: string;
}

/** Everything `show` prints about one entity. */
export interface EntityInfo {
  readonly num: number;
  readonly id: string;
  readonly label: string;
  readonly description: string | null;
  readonly aliases: readonly string[];
  readonly types: readonly { readonly id: string; readonly label: string }[];
  readonly attributes: readonly AttributeInfo[];
}

/** An alias hit: which entity a normalised surface form names. */
export interface AliasHit {
  readonly entity: number;
  readonly text: string;
  /** 0 = the entity's label, 1 = an alias. */
  readonly kind: number;
}

/** Counts for `stats`. */
export interface CatalogCounts {
  readonly entities: number;
  readonly predicates: number;
  readonly relations: number;
  readonly edges: number;
  readonly types: number;
  readonly aliases: number;
  readonly attributes: number;
}

/** A label derived from an IRI when the file gave none: its last path or fragment segment. */
export function labelFromId(id: string): string {
  const m = /([^/#:]+)[/#]?$/.exec(id);
  const seg = m ? m[1]! : id;
  try {
    return decodeURIComponent(seg).replace(/[_]+/g, " ");
  } catch {
    return seg.replace(/[_]+/g, " ");
  }
}

function isSqliteFile(path: string): boolean {
  const st = statSync(path);
  if (st.size === 0) return true; // an empty file is a fresh database
  const fd = openSync(path, "r");
  try {
    const buf = Buffer.alloc(16);
    readSync(fd, buf, 0, 16, 0);
    return buf.toString("latin1") === "SQLite format 3\u0000";
  } finally {
    closeSync(fd);
  }
}

/** Quotes a path for a POSIX shell when it holds anything beyond plain path characters. */
function shellWord(s: string): string {
  return /^[\w@%+=:,./-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

/**
 * The error for a catalog file that does not exist, with a load command that works as
 * given: when the folder is missing too, the command creates it first.
 */
export function missingCatalog(path: string): TiepointError {
  const dir = dirname(path);
  const load = `tiepoint load FILE… --db ${shellWord(path)}`;
  const hint = existsSync(dir) ? load : `mkdir -p ${shellWord(dir)} && ${load}`;
  const what = existsSync(dir) ? "catalog not found" : `catalog not found (the folder ${dir} does not exist either)`;
  return new TiepointError("catalog/missing", `${what}; make one from your data with: ${hint}`, { file: path });
}

/**
 * A handle on one catalog file. Read methods use statements prepared once per handle.
 */
export class Catalog {
  /** The underlying better-sqlite3 handle (for the catalog stage and its importers only). */
  readonly db: DB;
  /** The file path (":memory:" for an in-memory catalog). */
  readonly path: string;
  /** True when opened read-only. */
  readonly readonly: boolean;
  private readonly stmts = new Map<string, Database.Statement>();

  private constructor(db: DB, path: string, readonly: boolean) {
    this.db = db;
    this.path = path;
    this.readonly = readonly;
  }

  /** Opens (or, with `create`, creates) the catalog at `path`; checks the schema version. */
  static open(path: string, options: OpenOptions = {}): Catalog {
    const memory = path === ":memory:";
    if (!memory) {
      if (!existsSync(path)) {
        if (!options.create) {
          throw missingCatalog(path);
        }
      } else {
        if (statSync(path).isDirectory()) throw new TiepointError("catalog/not-sqlite", "is a directory, not a catalog file", { file: path });
        if (!isSqliteFile(path)) throw new TiepointError("catalog/not-sqlite", "not a tiepoint catalog (not an SQLite database file)", { file: path });
      }
    }
    let readonly = options.readonly ?? false;
    if (!memory && existsSync(path) && !readonly) {
      try {
        accessSync(path, constants.W_OK);
      } catch {
        readonly = true;
      }
    }
    let db: DB;
    try {
      db = new Database(path, { readonly, fileMustExist: !options.create && !memory });
    } catch (e) {
      throw new TiepointError("catalog/open", `cannot open catalog: ${(e as Error).message}`, { file: path });
    }
    db.pragma(`busy_timeout = ${options.busyTimeout ?? 10000}`);
    const cat = new Catalog(db, path, readonly);
    try {
      cat.initialise(!memory);
    } catch (e) {
      db.close();
      if (e instanceof TiepointError) throw e;
      // read-only storage (issue 10): SQLite cannot create the WAL index (PATH-shm) beside
      // the file, so read a private in-memory copy instead (https://www.sqlite.org/wal.html,
      // "Read-Only Databases"); only when no write-ahead log holds committed pages
      if (readonly && !memory && (e as { code?: string }).code === "SQLITE_CANTOPEN" && !(existsSync(`${path}-wal`) && statSync(`${path}-wal`).size > 0)) {
        const copy = readFileSync(path);
        if (copy[18] === 2 && copy[19] === 2) copy[18] = copy[19] = 1; // WAL → rollback journal in the header of the copy
        const mem = new Database(copy, { readonly: true });
        const roCat = new Catalog(mem, path, true);
        try {
          roCat.initialise(false);
        } catch (e2) {
          mem.close();
          throw e2 instanceof TiepointError ? e2 : new TiepointError("catalog/open", `cannot open catalog: ${(e2 as Error).message}`, { file: path });
        }
        return roCat;
      }
      const msg = (e as Error).message;
      if (/not a database|file is encrypted|malformed/i.test(msg)) {
        throw new TiepointError("catalog/not-sqlite", "not a tiepoint catalog (not an SQLite database file)", { file: path });
      }
      throw new TiepointError("catalog/open", `cannot open catalog: ${msg}`, { file: path });
    }
    return cat;
  }

  private initialise(onDisk: boolean): void {
    const hasMeta = this.db.prepare("SELECT 1 FROM sqlite_master WHERE type='table' AND name='meta'").get() !== undefined;
    if (!hasMeta) {
      const others = this.db.prepare("SELECT count(*) AS n FROM sqlite_master").get() as { n: number };
      if (others.n > 0) throw new TiepointError("catalog/schema", "an SQLite file, but not a tiepoint catalog (no meta table)", { file: this.path });
      if (this.readonly) throw new TiepointError("catalog/schema", "empty catalog file opened read-only", { file: this.path });
      if (onDisk) this.db.pragma("journal_mode = WAL");
      this.db.exec("BEGIN");
      this.db.exec(SCHEMA_SQL);
      const put = this.db.prepare("INSERT OR REPLACE INTO meta(key, value) VALUES (?, ?)");
      put.run("schema_version", String(SCHEMA_VERSION));
      put.run("uid", randomUUID());
      put.run("generation", "0");
      this.db.exec("COMMIT");
      return;
    }
    const v = this.db.prepare("SELECT value FROM meta WHERE key='schema_version'").get() as { value: string } | undefined;
    const version = v ? Number(v.value) : NaN;
    if (!Number.isInteger(version)) throw new TiepointError("catalog/schema", "catalog has no readable schema version", { file: this.path });
    if (version > SCHEMA_VERSION) {
      throw new TiepointError("catalog/schema", `catalog schema version ${version} is newer than this tiepoint understands (${SCHEMA_VERSION}); upgrade tiepoint`, { file: this.path });
    }
    if (version < SCHEMA_VERSION) {
      throw new TiepointError("catalog/schema", `catalog schema version ${version} is older than ${SCHEMA_VERSION}; rebuild it with tiepoint load --replace`, { file: this.path });
    }
    if (onDisk && !this.readonly) {
      const mode = this.db.pragma("journal_mode", { simple: true });
      if (mode !== "wal") this.db.pragma("journal_mode = WAL");
    }
  }

  /** @internal a statement prepared once per handle. */
  stmt(sql: string): Database.Statement {
    let s = this.stmts.get(sql);
    if (!s) {
      s = this.db.prepare(sql);
      this.stmts.set(sql, s);
    }
    return s;
  }

  /** Closes the handle. */
  close(): void {
    this.db.close();
  }

  /** A meta value. */
  meta(key: string): string | undefined {
    const r = this.stmt("SELECT value FROM meta WHERE key = ?").get(key) as { value: string } | undefined;
    return r?.value;
  }

  /** The catalog's uid (new for each file) and generation (bumped per committed load). */
  version(): { uid: string; generation: number } {
    return { uid: this.meta("uid") ?? "", generation: Number(this.meta("generation") ?? 0) };
  }

  /** Entity num of an id, or undefined. */
  numOf(id: string): number | undefined {
    const r = this.stmt("SELECT num FROM entity WHERE id = ?").get(id) as { num: number } | undefined;
    return r?.num;
  }

  /** Id and label of an entity num (label falls back to one derived from the id). */
  ref(num: number): { id: string; label: string } {
    const r = this.stmt("SELECT id, label FROM entity WHERE num = ?").get(num) as { id: string; label: string | null } | undefined;
    if (!r) throw new RangeError(`catalog: no entity with num ${num}`);
    return { id: r.id, label: r.label ?? labelFromId(r.id) };
  }

  /** Ids and labels of many entity nums with one statement, in the order given (a count's thousands of entities: no statement per entity). */
  refsOf(nums: readonly number[]): { id: string; label: string }[] {
    if (nums.length === 0) return [];
    const rows = this.stmt("SELECT num, id, label FROM entity WHERE num IN (SELECT value FROM json_each(?))").raw(true).all(JSON.stringify(nums)) as [number, string, string | null][];
    const byNum = new Map(rows.map((r) => [r[0], { id: r[1], label: r[2] ?? labelFromId(r[1]) }]));
    return nums.map((n) => {
      const r = byNum.get(n);
      if (!r) throw new RangeError(`catalog: no entity with num ${n}`);
      return r;
    });
  }

  /** Entities whose label or alias has normalised form `norm`. */
  byNorm(norm: string): AliasHit[] {
    return this.stmt("SELECT entity, text, kind FROM alias WHERE norm = ?").all(norm) as AliasHit[];
  }

  /** Entities whose label or alias has stemmed form `stem`. */
  byStem(stem: string): AliasHit[] {
    return this.stmt("SELECT entity, text, kind FROM alias WHERE stem = ?").all(stem) as AliasHit[];
  }

  /** Entities whose exact label (or id) is `text`. */
  byLabelOrId(text: string): number[] {
    const byId = this.numOf(text);
    if (byId !== undefined) return [byId];
    // through the label's alias row (kind 0, indexed by its normalised form): entity.label has
    // no index, and this is called once per neighbour when suggestions are made
    return this.stmt("SELECT e.num FROM alias a JOIN entity e ON e.num = a.entity WHERE a.norm = ? AND a.kind = 0 AND e.label = ? ORDER BY e.id")
      .pluck()
      .all(normalize(text), text) as number[];
  }

  /**
   * The entities a name refers to: by id, by exact label, then by normalised label, then by
   * normalised alias (each entity once, by num) — `show`'s and `compose`'s lookup of a name.
   */
  resolveName(name: string): number[] {
    const exact = this.byLabelOrId(name);
    if (exact.length > 0) return exact;
    const norm = normalize(name);
    if (norm === "") return [];
    const hits = this.byNorm(norm);
    const labels = [...new Set(hits.filter((h) => h.kind === 0).map((h) => h.entity))];
    if (labels.length > 0) return labels.sort((a, b) => a - b);
    return [...new Set(hits.map((h) => h.entity))].sort((a, b) => a - b);
  }

  /** All entity data that `show` needs. */
  entity(num: number): EntityInfo {
    const r = this.stmt("SELECT num, id, label, description FROM entity WHERE num = ?").get(num) as
      | { num: number; id: string; label: string | null; description: string | null }
      | undefined;
    if (!r) throw new RangeError(`catalog: no entity with num ${num}`);
    const aliases = (this.stmt("SELECT text FROM alias WHERE entity = ? AND kind = 1 ORDER BY text").all(num) as { text: string }[]).map((a) => a.text);
    return {
      num: r.num,
      id: r.id,
      label: r.label ?? labelFromId(r.id),
      description: r.description,
      aliases,
      types: this.typesOf(num).map((t) => this.ref(t)),
      attributes: this.attributes(num),
    };
  }

  /** Direct type nums of an entity. */
  typesOf(num: number): number[] {
    return (this.stmt("SELECT type FROM entity_type WHERE entity = ? ORDER BY type").all(num) as { type: number }[]).map((r) => r.type);
  }

  /** Literal attributes of an entity. */
  attributes(num: number): AttributeInfo[] {
    const rows = this.stmt(
      "SELECT p.id AS pid, p.label AS plabel, a.value, a.datatype, a.lang, a.num FROM attribute a JOIN predicate p ON p.num = a.predicate WHERE a.entity = ? ORDER BY p.id, a.value",
    ).all(num) as { pid: string; plabel: string | null; value: string; datatype: string | null; lang: string | null; num: number | null }[];
    return rows.map((a) => ({ predicate: a.pid, label: a.plabel ?? labelFromId(a.pid), value: a.value, datatype: a.datatype, lang: a.lang, num: a.num }));
  }

  /** Relation edges at an entity, both directions, at most `limit` of each. */
  neighbours(num: number, limit = 200): NeighbourInfo[] {
    const out = this.stmt(
      "SELECT p.id AS rel, p.label AS rlabel, e.id, e.label FROM edge x JOIN predicate p ON p.num = x.rel JOIN entity e ON e.num = x.dst WHERE x.src = ? ORDER BY p.id, e.id LIMIT ?",
    ).all(num, limit) as { rel: string; rlabel: string | null; id: string; label: string | null }[];
    const inn = this.stmt(
      "SELECT p.id AS rel, p.label AS rlabel, e.id, e.label FROM edge x JOIN predicate p ON p.num = x.rel JOIN entity e ON e.num = x.src WHERE x.dst = ? ORDER BY p.id, e.id LIMIT ?",
    ).all(num, limit) as { rel: string; rlabel: string | null; id: string; label: string | null }[];
    const map = (direction: "out" | "in") => (r: { rel: string; rlabel: string | null; id: string; label: string | null }): NeighbourInfo => ({
      relation: r.rel,
      relationLabel: r.rlabel ?? labelFromId(r.rel),
      direction,
      id: r.id,
      label: r.label ?? labelFromId(r.id),
    });
    return [...out.map(map("out")), ...inn.map(map("in"))];
  }

  /** True when the edge `src rel dst` is stored (by ids). */
  hasEdge(src: string, rel: string, dst: string): boolean {
    return (
      this.stmt(
        "SELECT 1 FROM edge x JOIN entity s ON s.num = x.src JOIN entity d ON d.num = x.dst JOIN predicate p ON p.num = x.rel WHERE s.id = ? AND p.id = ? AND d.id = ?",
      ).get(src, rel, dst) !== undefined
    );
  }

  /** All predicates with labels and aliases. */
  predicates(): PredicateInfo[] {
    const rows = this.stmt("SELECT num, id, label FROM predicate ORDER BY num").all() as { num: number; id: string; label: string | null }[];
    const al = this.stmt("SELECT predicate, text FROM predicate_alias ORDER BY predicate, text").all() as { predicate: number; text: string }[];
    const byP = new Map<number, string[]>();
    for (const a of al) {
      const list = byP.get(a.predicate) ?? [];
      list.push(a.text);
      byP.set(a.predicate, list);
    }
    return rows.map((r) => ({ num: r.num, id: r.id, label: r.label ?? labelFromId(r.id), aliases: byP.get(r.num) ?? [] }));
  }

  /** All types (entities used as an rdf:type object or in rdfs:subClassOf), with parents. */
  types(): TypeInfo[] {
    const nums = this.stmt("SELECT DISTINCT type AS n FROM entity_type UNION SELECT sub FROM subclass UNION SELECT sup FROM subclass").all() as { n: number }[];
    const parents = this.stmt("SELECT sub, sup FROM subclass").all() as { sub: number; sup: number }[];
    const byChild = new Map<number, number[]>();
    for (const p of parents) {
      const list = byChild.get(p.sub) ?? [];
      list.push(p.sup);
      byChild.set(p.sub, list);
    }
    const aliasStmt = this.stmt("SELECT text FROM alias WHERE entity = ? AND kind = 1 ORDER BY text");
    return nums
      .map(({ n }) => {
        const r = this.ref(n);
        const aliases = (aliasStmt.all(n) as { text: string }[]).map((a) => a.text);
        return { num: n, id: r.id, label: r.label, aliases, parents: (byChild.get(n) ?? []).sort((a, b) => a - b) };
      })
      .sort((a, b) => a.num - b.num);
  }

  /**
   * Iterates all relation edges as [src, rel, dst] nums, ordered by (dst, rel, src): the
   * relation index's canonical order (read straight from the `edge_by_dst` index, no sort).
   */
  *edges(): IterableIterator<[number, number, number]> {
    const s = this.db.prepare("SELECT src, rel, dst FROM edge ORDER BY dst, rel, src").raw(true);
    for (const row of s.iterate()) yield row as [number, number, number];
  }

  /** Iterates all aliases (labels included) as [entity, norm, stem] (for the linker's lexical snapshot). */
  *aliases(): IterableIterator<[number, string, string]> {
    const s = this.db.prepare("SELECT entity, norm, stem FROM alias").raw(true);
    for (const row of s.iterate()) yield row as [number, string, string];
  }

  /** Iterates all (entity, type) pairs as [entity, type] nums, ordered by entity then type (for the relation index). */
  *entityTypePairs(): IterableIterator<[number, number]> {
    const s = this.db.prepare("SELECT entity, type FROM entity_type ORDER BY entity, type").raw(true);
    for (const row of s.iterate()) yield row as [number, number];
  }

  /** All direct subtype pairs as [sub, sup] nums, ordered (for the relation index). */
  subclassPairs(): [number, number][] {
    return this.stmt("SELECT sub, sup FROM subclass ORDER BY sub, sup").raw(true).all() as [number, number][];
  }

  /** The largest predicate num (for sizing per-relation arrays), 0 when empty. */
  maxPredicateNum(): number {
    const r = this.stmt("SELECT max(num) AS m FROM predicate").get() as { m: number | null };
    return r.m ?? 0;
  }

  /** The largest entity num (for sizing arrays), 0 when empty. */
  maxEntityNum(): number {
    const r = this.stmt("SELECT max(num) AS m FROM entity").get() as { m: number | null };
    return r.m ?? 0;
  }

  /** Iterates every entity as [num, label, description] (for the linker's lexical snapshot). */
  *entityTexts(): IterableIterator<[number, string | null, string | null]> {
    const s = this.db.prepare("SELECT num, label, description FROM entity").raw(true);
    for (const row of s.iterate()) yield row as [number, string | null, string | null];
  }

  /** Label and aliases of an entity num as [text, norm, kind] rows (kind 0 = label). */
  aliasRows(num: number): [string, string, number][] {
    return this.stmt("SELECT text, norm, kind FROM alias WHERE entity = ? ORDER BY kind, text").raw(true).all(num) as [string, string, number][];
  }

  /** The description of an entity num, or null. */
  descriptionOf(num: number): string | null {
    const r = this.stmt("SELECT description FROM entity WHERE num = ?").get(num) as { description: string | null } | undefined;
    return r?.description ?? null;
  }

  /** Nums of the entities joined to `num` by an edge (either direction), at most `limit` each way. */
  neighbourNums(num: number, limit = 1000): number[] {
    const out = this.stmt("SELECT dst AS n FROM edge WHERE src = ? LIMIT ?").pluck().all(num, limit) as number[];
    const inn = this.stmt("SELECT src AS n FROM edge WHERE dst = ? LIMIT ?").pluck().all(num, limit) as number[];
    return out.concat(inn);
  }

  /** Label and description of the entities joined to `num` by an edge, at most `limit` each way. */
  neighbourTexts(num: number, limit = 50): [string | null, string | null][] {
    const out = this.stmt("SELECT e.label, e.description FROM edge x JOIN entity e ON e.num = x.dst WHERE x.src = ? LIMIT ?").raw(true).all(num, limit) as [string | null, string | null][];
    const inn = this.stmt("SELECT e.label, e.description FROM edge x JOIN entity e ON e.num = x.src WHERE x.dst = ? LIMIT ?").raw(true).all(num, limit) as [string | null, string | null][];
    return out.concat(inn);
  }

  /** True when entity `num` has an edge of relation `rel` (predicate num), in either direction. */
  hasRelationEdge(num: number, rel: number): boolean {
    return (
      this.stmt("SELECT 1 FROM edge WHERE src = ? AND rel = ? LIMIT 1").get(num, rel) !== undefined ||
      this.stmt("SELECT 1 FROM edge WHERE dst = ? AND rel = ? LIMIT 1").get(num, rel) !== undefined
    );
  }

  /** Units of attribute predicates (JSONL `"unit"`), by predicate id. */
  predicateUnits(): Map<string, string> {
    const rows = this.stmt("SELECT key, value FROM meta WHERE key LIKE 'unit:%' ORDER BY key").all() as { key: string; value: string }[];
    return new Map(rows.map((r) => [r.key.slice(5), r.value]));
  }

  /** The stored values of `predicate` equal to one of `texts`, ignoring case (as stored, distinct). */
  attributeValuesIn(predicate: number, texts: readonly string[]): string[] {
    const want = [...new Set(texts.map((t) => t.toLowerCase()))];
    if (want.length === 0) return [];
    const out: string[] = [];
    // bounded batches of bound parameters (SQLite's default limit is 32,766; common practice to stay far below)
    for (let i = 0; i < want.length; i += 200) {
      const part = want.slice(i, i + 200);
      const rows = this.db.prepare(`SELECT DISTINCT value FROM attribute WHERE predicate = ? AND lower(value) IN (${part.map(() => "?").join(",")})`).all(predicate, ...part) as { value: string }[];
      for (const r of rows) out.push(r.value);
    }
    return out;
  }

  /** Entities with the literal `value` (exact, as stored) of `predicate`. */
  entitiesWithValue(predicate: number, value: string): number[] {
    return (this.stmt("SELECT entity FROM attribute WHERE predicate = ? AND value = ? ORDER BY entity").all(predicate, value) as { entity: number }[]).map((r) => r.entity);
  }

  /** The literal values of `predicate` on `entity`, as stored. */
  attributeTexts(entity: number, predicate: number): string[] {
    return (this.stmt("SELECT value FROM attribute WHERE entity = ? AND predicate = ? ORDER BY value").all(entity, predicate) as { value: string }[]).map((r) => r.value);
  }

  /**
   * Per predicate used with literals: how many values, how many read as numbers, and how many
   * of those look like years or dates. Read from the copy every load stores in `meta`
   * ({@link Catalog.storeAttributeSummary}); a catalog written before that is summarised now
   * (a scan of every literal).
   */
  attributeSummary(): AttributeSummary[] {
    const stored = this.meta(ATTRIBUTE_SUMMARY_KEY);
    if (stored !== undefined) return (JSON.parse(stored) as [number, number, number, number][]).map(([num, values, numeric, dateLike]) => ({ num, values, numeric, dateLike }));
    return this.summariseAttributes();
  }

  /** The attribute summary computed from the attribute table (one scan of every literal). */
  private summariseAttributes(): AttributeSummary[] {
    return this.stmt(
      "SELECT predicate AS num, count(*) AS values_, count(num) AS numeric, sum(CASE WHEN num IS NOT NULL AND (datatype LIKE '%date%' OR datatype LIKE '%year%' OR value GLOB '[0-9][0-9][0-9][0-9]' OR value GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]*') THEN 1 ELSE 0 END) AS dateLike FROM attribute GROUP BY predicate ORDER BY predicate",
    ).all().map((r) => {
      const x = r as { num: number; values_: number; numeric: number; dateLike: number };
      return { num: x.num, values: x.values_, numeric: x.numeric, dateLike: x.dateLike };
    });
  }

  /** Stores the attribute summary in `meta` (at the end of a load, inside its transaction), so questions need no scan. */
  storeAttributeSummary(): void {
    const rows = this.summariseAttributes().map((x) => [x.num, x.values, x.numeric, x.dateLike]);
    this.stmt("INSERT OR REPLACE INTO meta(key, value) VALUES (?, ?)").run(ATTRIBUTE_SUMMARY_KEY, JSON.stringify(rows));
  }

  /** The smallest numeric value of a predicate, null when it has none (one look-up in the (predicate, num) index). */
  attributeMinimum(predicate: number): number | null {
    const r = this.stmt("SELECT min(num) AS m FROM attribute WHERE predicate = ? AND num IS NOT NULL").get(predicate) as { m: number | null } | undefined;
    return r?.m ?? null;
  }

  /**
   * The numeric values (see `AttributeInfo.num`) of one entity's attribute, smallest first.
   * For one entity; conditions over many entities read whole columns (numeric-column.ts).
   */
  attributeNumbers(entity: number, predicate: number): number[] {
    // no ORDER BY num: it would lead SQLite to the (predicate, num) index and a walk over every
    // value of the predicate; the primary key (entity, predicate, …) finds the few rows
    return (this.stmt("SELECT num FROM attribute WHERE entity = ? AND predicate = ? AND num IS NOT NULL").pluck().all(entity, predicate) as number[]).sort((a, b) => a - b);
  }

  /** Counts for `stats`. */
  counts(): CatalogCounts {
    const n = (sql: string) => (this.stmt(sql).get() as { n: number }).n;
    return {
      entities: n("SELECT count(*) AS n FROM entity"),
      predicates: n("SELECT count(*) AS n FROM predicate"),
      relations: n("SELECT count(DISTINCT rel) AS n FROM edge"),
      edges: n("SELECT count(*) AS n FROM edge"),
      types: n("SELECT count(*) AS n FROM (SELECT DISTINCT type FROM entity_type UNION SELECT sub FROM subclass UNION SELECT sup FROM subclass)"),
      aliases: n("SELECT count(*) AS n FROM alias"),
      attributes: n("SELECT count(*) AS n FROM attribute"),
    };
  }
}

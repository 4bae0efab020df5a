/**
 * Batched writes into a catalog inside one explicit transaction (BEGIN … COMMIT).
 * Importers call the `add*` methods; `commit` bumps the generation counter, `rollback`
 * leaves the catalog exactly as it was. Ids are interned to integer nums through an
 * in-memory cache so a large load does not look each id up twice.
 */
import type Database from "better-sqlite3";
import { normalize, stemToken } from "./normalize.js";
import type { Catalog } from "./store.js";

/** Parses a literal as a number for attribute comparisons: plain numbers, years and ISO dates. */
export function literalNumber(value: string, datatype: string | null): number | null {
  const v = value.trim();
  if (v === "") return null;
  if (/^[+-]?(\d{1,3}(,\d{3})+|\d+)(\.\d+)?([eE][+-]?\d+)?$/.test(v)) return Number(v.replace(/,/g, ""));
  const iso = /^(-?\d{4})(?:-(\d{2})(?:-(\d{2}))?)?(?:T.*)?$/.exec(v);
  if (iso && (datatype === null || /date|year|gYear|time/i.test(datatype) || iso[2] !== undefined)) {
    const y = Number(iso[1]);
    const m = iso[2] ? Number(iso[2]) : 1;
    const d = iso[3] ? Number(iso[3]) : 1;
    if (m < 1 || m > 12 || d < 1 || d > 31) return null;
    const start = Date.UTC(y, 0, 1);
    const end = Date.UTC(y + 1, 0, 1);
    return y + (Date.UTC(y, m - 1, d) - start) / (end - start);
  }
  return null;
}

/** The normalised and stemmed forms of an alias, normalising once (same result as `normalize` + `stemKey`). */
function forms(text: string): [string, string] {
  const norm = normalize(text);
  return [norm, norm === "" ? "" : norm.split(" ").map(stemToken).join(" ")];
}

/** Edges per multi-row INSERT (SQLite allows 32766 bound parameters; 3 per edge). */
export const EDGE_BATCH = 128;

/** Bits of the writer's per-entity flags. */
const KNOWN = 1;
const HAS_LABEL = 2;
const HAS_DESC = 4;

/** Writes into one catalog within one transaction. */
export class CatalogWriter {
  private readonly cat: Catalog;
  private readonly db: Database.Database;
  private readonly entityNums = new Map<string, number>();
  private readonly predNums = new Map<string, number>();
  private readonly s: Record<string, Database.Statement>;
  private open = false;
  /** Entity nums at or below this existed before the transaction; above were made in it. */
  private maxNumBefore = 0;
  /** Per entity num: what this writer knows about its label and description (bits below). */
  private flags = new Uint8Array(1024);
  /** Secondary indexes dropped for a fast load into an empty catalog, recreated at commit. */
  private deferred: { name: string; sql: string }[] = [];
  private readonly edgeBuf: number[] = [];
  /** Edges written in this transaction. */
  edgesWritten = 0;

  constructor(cat: Catalog) {
    this.cat = cat;
    this.db = cat.db;
    const p = (sql: string) => this.db.prepare(sql);
    this.s = {
      findEntity: p("SELECT num FROM entity WHERE id = ?"),
      insEntity: p("INSERT INTO entity(id) VALUES (?)"),
      findPred: p("SELECT num FROM predicate WHERE id = ?"),
      insPred: p("INSERT INTO predicate(id) VALUES (?)"),
      getLabel: p("SELECT label FROM entity WHERE num = ?"),
      getLabelDesc: p("SELECT label, description FROM entity WHERE num = ?"),
      promoteAlias: p("UPDATE alias SET kind = 0 WHERE entity = ? AND text = ?"),
      setLabel: p("UPDATE entity SET label = ? WHERE num = ?"),
      setDesc: p("UPDATE entity SET description = ? WHERE num = ?"),
      getDesc: p("SELECT description FROM entity WHERE num = ?"),
      insAlias: p("INSERT OR IGNORE INTO alias(entity, text, norm, stem, kind) VALUES (?, ?, ?, ?, ?)"),
      demoteLabel: p("UPDATE alias SET kind = 1 WHERE entity = ? AND kind = 0"),
      insType: p("INSERT OR IGNORE INTO entity_type(entity, type) VALUES (?, ?)"),
      insSub: p("INSERT OR IGNORE INTO subclass(sub, sup) VALUES (?, ?)"),
      insEdge: p("INSERT OR IGNORE INTO edge(src, rel, dst) VALUES (?, ?, ?)"),
      insEdges: p(`INSERT OR IGNORE INTO edge(src, rel, dst) VALUES ${Array(EDGE_BATCH).fill("(?, ?, ?)").join(", ")}`),
      insAttr: p("INSERT OR IGNORE INTO attribute(entity, predicate, value, datatype, lang, num) VALUES (?, ?, ?, ?, ?, ?)"),
      getPredLabel: p("SELECT label FROM predicate WHERE num = ?"),
      setPredLabel: p("UPDATE predicate SET label = ? WHERE num = ?"),
      insPredAlias: p("INSERT OR IGNORE INTO predicate_alias(predicate, text, norm, stem) VALUES (?, ?, ?, ?)"),
      bump: p("UPDATE meta SET value = CAST(CAST(value AS INTEGER) + 1 AS TEXT) WHERE key = 'generation'"),
    };
  }

  /** Starts the transaction (`BEGIN IMMEDIATE`, so a concurrent writer waits). */
  begin(): void {
    this.db.exec("BEGIN IMMEDIATE");
    this.open = true;
    this.resetState();
  }

  private resetState(): void {
    this.entityNums.clear();
    this.predNums.clear();
    this.lastId = undefined;
    this.edgeBuf.length = 0;
    this.flags = new Uint8Array(1024);
    this.maxNumBefore = (this.db.prepare("SELECT max(num) AS m FROM entity").get() as { m: number | null }).m ?? 0;
    this.predicatesBefore = (this.db.prepare("SELECT count(*) AS n FROM predicate").get() as { n: number }).n;
  }

  private predicatesBefore = 0;

  /** Empties every data table (for `--replace`), inside the open transaction. */
  clear(): void {
    for (const t of ["entity", "predicate", "alias", "predicate_alias", "entity_type", "subclass", "edge", "attribute"]) this.db.exec(`DELETE FROM ${t}`);
    this.db.exec("DELETE FROM meta WHERE key LIKE 'unit:%'");
    this.resetState();
  }

  /** True when the catalog held no entity when the transaction began (or after `clear`). */
  get startedEmpty(): boolean {
    return this.maxNumBefore === 0 && this.predicatesBefore === 0;
  }

  /**
   * For a load into an empty catalog: drops the secondary indexes now and rebuilds them at
   * commit, inside the same transaction (building an index once from sorted data is much
   * faster than keeping it up to date row by row). A rollback restores them unchanged.
   */
  deferIndexes(): void {
    if (!this.open || this.deferred.length > 0) return;
    const rows = this.db.prepare("SELECT name, sql FROM sqlite_master WHERE type = 'index' AND sql IS NOT NULL ORDER BY name").all() as { name: string; sql: string }[];
    for (const r of rows) this.db.exec(`DROP INDEX "${r.name.replace(/"/g, '""')}"`);
    this.deferred = rows;
  }

  /** Rebuilds deferred indexes (called by `commit`; callable earlier when a load needs them). */
  restoreIndexes(): void {
    this.flush();
    for (const r of this.deferred) this.db.exec(r.sql);
    this.deferred = [];
  }

  /** Commits, bumping the catalog generation. */
  commit(): void {
    this.restoreIndexes();
    this.flush();
    this.s.bump!.run();
    this.db.exec("COMMIT");
    this.open = false;
  }

  /** Rolls everything back (deferred indexes come back with the rollback). */
  rollback(): void {
    this.edgeBuf.length = 0;
    if (this.open && this.db.inTransaction) this.db.exec("ROLLBACK");
    this.open = false;
    this.deferred = [];
  }

  private flag(n: number): number {
    if (n >= this.flags.length) {
      const bigger = new Uint8Array(Math.max(n + 1, this.flags.length * 2));
      bigger.set(this.flags);
      this.flags = bigger;
    }
    let f = this.flags[n]!;
    if ((f & KNOWN) === 0) {
      if (n > this.maxNumBefore) f = KNOWN;
      else {
        const r = this.s.getLabelDesc!.get(n) as { label: string | null; description: string | null };
        f = KNOWN | (r.label !== null ? HAS_LABEL : 0) | (r.description !== null ? HAS_DESC : 0);
      }
      this.flags[n] = f;
    }
    return f;
  }

  /** True when an entity with this id exists (in the catalog or earlier in this load). */
  hasEntity(id: string): boolean {
    return this.entityNums.has(id) || (this.maxNumBefore > 0 && this.s.findEntity!.get(id) !== undefined);
  }

  /** The num of entity `id`, creating it when new. */
  entity(id: string): number {
    // consecutive statements usually share their subject: a one-entry cache before the map
    if (id === this.lastId) return this.lastNum;
    let n = this.entityNums.get(id);
    if (n !== undefined) {
      this.lastId = id;
      this.lastNum = n;
      return n;
    }
    const r = this.maxNumBefore > 0 ? (this.s.findEntity!.get(id) as { num: number } | undefined) : undefined;
    n = r ? r.num : Number(this.s.insEntity!.run(id).lastInsertRowid);
    this.entityNums.set(id, n);
    this.lastId = id;
    this.lastNum = n;
    return n;
  }

  private lastId: string | undefined;
  private lastNum = 0;

  /** The num of predicate `id`, creating it when new. */
  predicate(id: string): number {
    let n = this.predNums.get(id);
    if (n !== undefined) return n;
    const r = this.s.findPred!.get(id) as { num: number } | undefined;
    n = r ? r.num : Number(this.s.insPred!.run(id).lastInsertRowid);
    this.predNums.set(id, n);
    return n;
  }

  /** Adds a label: the first one becomes the label, later ones aliases (contract). */
  label(id: string, text: string, preferred = false): void {
    const n = this.entity(id);
    const f = this.flag(n);
    if ((f & HAS_LABEL) === 0) {
      this.s.setLabel!.run(text, n);
      this.s.insAlias!.run(n, text, ...forms(text), 0);
      this.flags[n] = f | HAS_LABEL;
      return;
    }
    const cur = (this.s.getLabel!.get(n) as { label: string | null }).label;
    if (preferred) {
      if (cur !== text) this.s.demoteLabel!.run(n);
      this.s.setLabel!.run(text, n);
      this.s.insAlias!.run(n, text, ...forms(text), 0);
      this.s.promoteAlias!.run(n, text);
    } else if (cur !== text) {
      this.s.insAlias!.run(n, text, ...forms(text), 1);
    }
  }

  /** True when entity `id` has a label already. */
  hasLabel(id: string): boolean {
    return (this.flag(this.entity(id)) & HAS_LABEL) !== 0;
  }

  /** Adds an alias. */
  alias(id: string, text: string): void {
    const n = this.entity(id);
    this.s.insAlias!.run(n, text, ...forms(text), 1);
  }

  /** Sets the description (the first one wins; later ones are appended after a blank line). */
  description(id: string, text: string): void {
    const n = this.entity(id);
    const f = this.flag(n);
    if ((f & HAS_DESC) === 0) {
      this.s.setDesc!.run(text, n);
      this.flags[n] = f | HAS_DESC;
      return;
    }
    const cur = this.s.getDesc!.get(n) as { description: string | null };
    if (cur.description === null) this.s.setDesc!.run(text, n);
    else if (!cur.description.includes(text)) this.s.setDesc!.run(`${cur.description}\n\n${text}`, n);
  }

  /** `id rdf:type type`. */
  type(id: string, type: string): void {
    this.s.insType!.run(this.entity(id), this.entity(type));
  }

  /** `sub rdfs:subClassOf sup`. */
  subclass(sub: string, sup: string): void {
    this.s.insSub!.run(this.entity(sub), this.entity(sup));
  }

  /** A relation edge `src rel dst` (buffered; written in batches of {@link EDGE_BATCH}). */
  edge(src: string, rel: string, dst: string): void {
    const b = this.edgeBuf;
    b.push(this.entity(src), this.predicate(rel), this.entity(dst));
    if (b.length === 3 * EDGE_BATCH) this.flush();
  }

  /** Writes buffered rows now (done before every read of the edge table and at commit). */
  flush(): void {
    const b = this.edgeBuf;
    if (b.length === 0) return;
    if (b.length === 3 * EDGE_BATCH) this.edgesWritten += this.s.insEdges!.run(b).changes;
    else for (let i = 0; i < b.length; i += 3) this.edgesWritten += this.s.insEdge!.run(b[i], b[i + 1], b[i + 2]).changes;
    b.length = 0;
  }

  /** A literal attribute. */
  attribute(id: string, predicate: string, value: string, datatype: string | null = null, lang: string | null = null): void {
    this.s.insAttr!.run(this.entity(id), this.predicate(predicate), value, datatype, lang, literalNumber(value, datatype));
  }

  /** A relation's (predicate's) label; the first one wins, later ones become aliases. */
  predicateLabel(id: string, text: string): void {
    const n = this.predicate(id);
    const cur = this.s.getPredLabel!.get(n) as { label: string | null };
    if (cur.label === null) this.s.setPredLabel!.run(text, n);
    else if (cur.label !== text) this.s.insPredAlias!.run(n, text, ...forms(text));
  }

  /**
   * An attribute's unit (JSONL `"unit"`), kept in the meta table under `unit:` + the
   * predicate id (no schema change; read back by `Catalog.predicateUnits`). The last one wins.
   */
  predicateUnit(id: string, unit: string): void {
    this.predicate(id);
    this.db.prepare("INSERT OR REPLACE INTO meta(key, value) VALUES (?, ?)").run(`unit:${id}`, unit);
  }

  /** A relation's alias phrasing. */
  predicateAlias(id: string, text: string): void {
    this.s.insPredAlias!.run(this.predicate(id), text, ...forms(text));
  }

  /** The catalog written to. */
  get catalog(): Catalog {
    return this.cat;
  }
}

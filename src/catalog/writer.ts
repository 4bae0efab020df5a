/**
 * Batched writes into a catalog inside one explicit transaction (BEGIN … COMMIT).
 * Importers call the `add*` methods; `commit` bumps the generation counter, `rollback`
 * leaves the catalog exactly as it was. Ids are interned to integer nums through an
 * in-memory table so a large load does not look each id up twice. Rows are buffered and
 * written in multi-row INSERTs (rows.ts): inside the transaction, call `flush` before
 * reading the tables directly.
 */
import type Database from "better-sqlite3";
import { normalize, stemToken } from "./normalize.js";
import { labelFromId } from "./store.js";
import type { Catalog } from "./store.js";
import { HeldRows, PendingEntities, SortedEdges } from "./rows.js";
import { IdTable } from "./intern.js";
import type { LoadSink, RowsWritten } from "./load-sink.js";
import { ReloadTracker } from "./reload.js";
import type { UpdateSummary } from "./reload.js";

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

/** Writer options; all optional. */
export const DEFAULTS = {
  /** New entity rows held back (so their label and description join the INSERT) before they are written. */
  pendingEntities: 4096,
  /** Stems remembered per token (labels repeat their words; the memo is emptied when full). */
  stemMemo: 100_000,
  /**
   * In a load into an empty catalog, hold the entity, alias, type and attribute rows until the
   * end and write each table once, in key order (rows.ts `HeldRows`, `PendingEntities.hold`):
   * no entity row is updated after it is written (with the edges file first, every entity was
   * written before its label and description came: 2M UPDATEs at L). Measured 5 December 2026
   * (shared 2-CPU machine, load average 9–14): the load's thread at M 7.65 → 7.16 CPU s
   * (median of 5 runs each), at L 77.7–106.1 → 80.0–89.8 CPU s; catalog rows identical.
   */
  holdRows: true,
  /**
   * SQLite page cache (KiB) while the deferred indexes are built at the end of a load into an
   * empty catalog (`restoreIndexes`; the load's own cache is restored after). SQLite's sorter
   * keeps up to the cache's size of records in memory as one run before merging; a small
   * cache makes it sort many small runs that fit the CPU caches and merge them. Measured on a
   * copy of the L catalog (5 M edges, 5 December 2026, load average 2.7-5.4): CREATE INDEX
   * edge_by_dst 9.2 CPU s with a 512 MiB cache, 7.6 with 64 MiB, 6.6 with 16 MiB, 4.1 with
   * 2 MiB; alias_norm 2.8 → 1.5 CPU s (512 MiB → 2 MiB); peak RSS 350 → 54 MiB. In the L
   * load itself (load average 11.8-12.7, CPU of the load's thread): the five CREATE INDEX
   * 8.6 CPU s (edge_by_dst 4.4), against 18.4 (11.3) timed the same way before.
   */
  indexBuildCacheKiB: 2048,
};

/** Porter stems of recent tokens (`stemToken` is a pure function of the token). */
const stems = new Map<string, string>();

function stemMemoised(token: string): string {
  let stem = stems.get(token);
  if (stem === undefined) {
    stem = stemToken(token);
    if (stems.size >= DEFAULTS.stemMemo) stems.clear();
    stems.set(token, stem);
  }
  return stem;
}

/** The normalised and stemmed forms of an alias, normalising once (same result as `normalize` + `stemKey`). */
function forms(text: string): [string, string] {
  const norm = normalize(text);
  return [norm, norm === "" ? "" : norm.split(" ").map(stemMemoised).join(" ")];
}

/** Bits of the writer's per-entity flags. */
const KNOWN = 1;
const HAS_LABEL = 2;
const HAS_DESC = 4;

/** Writes into one catalog within one transaction. */
export class CatalogWriter {
  private readonly cat: Catalog;
  private readonly db: Database.Database;
  private readonly entityNums = new IdTable();
  private readonly predNums = new Map<string, number>();
  private readonly s: Record<string, Database.Statement>;
  private open = false;
  /** Entity nums at or below this existed before the transaction; above were made in it. */
  private maxNumBefore = 0;
  /** Per entity num: what this writer knows about its label and description (bits below). */
  private flags = new Uint8Array(1024);
  /** Secondary indexes dropped for a fast load into an empty catalog, recreated at commit. */
  private deferred: { name: string; sql: string }[] = [];
  /** Rows buffered for multi-row INSERTs (written by `flush`, before anything reads them). */
  private readonly entities: PendingEntities;
  private readonly aliases: HeldRows;
  private readonly types: HeldRows;
  private readonly attributes: HeldRows;
  private readonly edges: SortedEdges;
  /** The num the next new entity gets (0: read it from the table first). */
  private nextNum = 0;
  /** Per predicate num: edges this load gave it (a misspelt relation id shows up rarely used). */
  private relUses = new Int32Array(64);
  /** Per type entity num: rows of this load that name it as a type or in the type hierarchy. */
  private readonly typeUseCount = new Map<number, number>();
  /** Predicate nums at or below this existed before the transaction. */
  private maxPredBefore = 0;
  /** Called the first time this load uses a relation (in an edge) or a type (so the load can note where). */
  onFirstUse?: (kind: "type" | "relation", id: string) => void;
  /** Called when a write deserves a warning (an existing entity's label kept, a second value), with the entity's id. */
  onNotice?: (kind: "label kept" | "second value", message: string, id: string) => void;
  /** Receives every row written (set by `loadFiles` for a load into an empty catalog). */
  sink: LoadSink | undefined;

  constructor(cat: Catalog) {
    this.cat = cat;
    this.db = cat.db;
    const p = (sql: string) => this.db.prepare(sql);
    this.s = {
      findEntity: p("SELECT num FROM entity WHERE id = ?"),
      maxNum: p("SELECT max(num) AS m FROM entity"),
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
      insSub: p("INSERT OR IGNORE INTO subclass(sub, sup) VALUES (?, ?)"),
      getPredLabel: p("SELECT label FROM predicate WHERE num = ?"),
      setPredLabel: p("UPDATE predicate SET label = ? WHERE num = ?"),
      insPredAlias: p("INSERT OR IGNORE INTO predicate_alias(predicate, text, norm, stem) VALUES (?, ?, ?, ?)"),
      bump: p("UPDATE meta SET value = CAST(CAST(value AS INTEGER) + 1 AS TEXT) WHERE key = 'generation'"),
    };
    this.entities = new PendingEntities(this.db, DEFAULTS.pendingEntities);
    this.aliases = new HeldRows(this.db, "INSERT OR IGNORE INTO alias(entity, text, norm, stem, kind)", ["num", "text", "text", "text", "num"]);
    this.types = new HeldRows(this.db, "INSERT OR IGNORE INTO entity_type(entity, type)", ["num", "num"]);
    this.attributes = new HeldRows(this.db, "INSERT OR IGNORE INTO attribute(entity, predicate, value, datatype, lang, num)", ["num", "num", "text", "text", "text", "num"]);
    this.edges = new SortedEdges(this.db);
  }

  /** Edges written in this transaction (duplicates not counted; buffered ones once flushed). */
  get edgesWritten(): number {
    return this.edges.changes;
  }

  /**
   * Starts the transaction (`BEGIN IMMEDIATE`, so a concurrent writer waits). With `update`,
   * the load replaces what it states about entities that existed before (reload.ts).
   */
  begin(options: { update?: boolean } = {}): void {
    this.db.exec("BEGIN IMMEDIATE");
    this.open = true;
    this.updating = options.update === true;
    this.resetState();
  }

  private updating = false;
  /** The re-load rule's bookkeeping, when the catalog held entities before the load. */
  private reload: ReloadTracker | undefined;

  /**
   * Applies the re-load rule at the end of the load (removes what `update` replaced) and
   * returns what changed; undefined without `update`.
   */
  applyReload(): UpdateSummary | undefined {
    this.flush();
    return this.reload?.apply() ?? (this.updating ? { entities: 0, labels: 0, descriptions: 0, values: 0, aliases: 0, types: 0, edges: 0 } : undefined);
  }

  private resetState(): void {
    this.entityNums.clear();
    this.predNums.clear();
    this.lastId = undefined;
    this.discardBuffers();
    this.flags = new Uint8Array(1024);
    this.maxNumBefore = (this.db.prepare("SELECT max(num) AS m FROM entity").get() as { m: number | null }).m ?? 0;
    this.predicatesBefore = (this.db.prepare("SELECT count(*) AS n FROM predicate").get() as { n: number }).n;
    this.maxPredBefore = (this.db.prepare("SELECT max(num) AS m FROM predicate").get() as { m: number | null }).m ?? 0;
    this.relUses = new Int32Array(64);
    this.typeUseCount.clear();
    this.units.clear();
    this.reload = this.maxNumBefore > 0 ? new ReloadTracker(this.db, this.maxNumBefore, this.updating, (kind, message, id) => this.onNotice?.(kind, message, id)) : undefined;
  }

  /** True when entity `num` was made in this transaction. */
  isNewEntity(num: number): boolean {
    return num > this.maxNumBefore;
  }

  /** True when predicate `num` was made in this transaction. */
  isNewPredicate(num: number): boolean {
    return num > this.maxPredBefore;
  }

  /** [predicate num, edges] of every relation this load wrote edges of. */
  relationUses(): [number, number][] {
    const out: [number, number][] = [];
    for (let i = 0; i < this.relUses.length; i++) if (this.relUses[i]! > 0) out.push([i, this.relUses[i]!]);
    return out;
  }

  /** [type num, rows] of every type this load named (entity types and the type hierarchy). */
  typeUses(): [number, number][] {
    return [...this.typeUseCount];
  }

  private useType(num: number, id: string): void {
    const c = this.typeUseCount.get(num);
    this.typeUseCount.set(num, (c ?? 0) + 1);
    if (c === undefined) this.onFirstUse?.("type", id);
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
   * faster than keeping it up to date row by row), and holds every edge until the first
   * flush, which writes them in key order (rows.ts). A rollback restores them unchanged.
   */
  deferIndexes(): void {
    if (!this.open || this.deferred.length > 0) return;
    this.edges.hold();
    if (DEFAULTS.holdRows) for (const b of [this.entities, this.aliases, this.types, this.attributes]) b.hold();
    const rows = this.db.prepare("SELECT name, sql FROM sqlite_master WHERE type = 'index' AND sql IS NOT NULL ORDER BY name").all() as { name: string; sql: string }[];
    for (const r of rows) this.db.exec(`DROP INDEX "${r.name.replace(/"/g, '""')}"`);
    this.deferred = rows;
  }

  /** Rebuilds deferred indexes (called by `commit`; callable earlier when a load needs them). */
  restoreIndexes(): void {
    this.flush();
    if (this.deferred.length === 0) return;
    const cache = this.db.pragma("cache_size", { simple: true }) as number;
    this.db.pragma(`cache_size = -${DEFAULTS.indexBuildCacheKiB}`);
    try {
      for (const r of this.deferred) this.db.exec(r.sql);
    } finally {
      this.db.pragma(`cache_size = ${cache}`);
    }
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
    this.discardBuffers();
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
    n = r ? r.num : this.newEntity(id);
    this.entityNums.add(id, n);
    this.lastId = id;
    this.lastNum = n;
    return n;
  }

  private lastId: string | undefined;
  private lastNum = 0;

  /** Makes the (pending) row of a new entity; its num is the largest num + 1, as SQLite would choose. */
  private newEntity(id: string): number {
    if (this.entities.full) this.entities.flush();
    if (this.nextNum === 0) this.nextNum = ((this.s.maxNum!.get() as { m: number | null }).m ?? 0) + 1;
    const n = this.nextNum++;
    this.entities.add(n, id);
    return n;
  }

  private labelOf(n: number): string | null {
    return this.entities.has(n) ? this.entities.label(n) : (this.s.getLabel!.get(n) as { label: string | null }).label;
  }

  private setLabelOf(n: number, text: string): void {
    this.sink?.label(n, text);
    if (this.entities.has(n)) this.entities.setLabel(n, text);
    else this.s.setLabel!.run(text, n);
  }

  private descriptionOf(n: number): string | null {
    return this.entities.has(n) ? this.entities.description(n) : (this.s.getDesc!.get(n) as { description: string | null }).description;
  }

  private setDescriptionOf(n: number, text: string): void {
    this.sink?.description(n, text);
    if (this.entities.has(n)) this.entities.setDescription(n, text);
    else this.s.setDesc!.run(text, n);
  }

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
    if (this.reload !== undefined && n <= this.maxNumBefore && this.reload.label(n, id, (f & HAS_LABEL) !== 0 ? this.labelOf(n) : null, text)) preferred = true;
    if ((f & HAS_LABEL) === 0) {
      this.setLabelOf(n, text);
      this.addAlias(n, text, 0);
      this.flags[n] = f | HAS_LABEL;
      return;
    }
    const cur = this.labelOf(n);
    if (preferred) {
      // the UPDATEs below must see every alias row added so far
      this.aliases.flush(true);
      if (cur !== text) this.s.demoteLabel!.run(n);
      this.setLabelOf(n, text);
      const [norm, stem] = forms(text);
      this.sink?.alias(n, norm, stem);
      this.s.insAlias!.run(n, text, norm, stem, 0);
      this.s.promoteAlias!.run(n, text);
    } else if (cur !== text) {
      this.addAlias(n, text, 1);
    }
  }

  /** Buffers an alias row (kind 0 = label, 1 = alias). */
  private addAlias(n: number, text: string, kind: number): void {
    const [norm, stem] = forms(text);
    this.sink?.alias(n, norm, stem);
    this.aliases.add(n, text, norm, stem, kind);
  }

  /** True when entity `id` has a label already. */
  hasLabel(id: string): boolean {
    return (this.flag(this.entity(id)) & HAS_LABEL) !== 0;
  }

  /** Adds an alias. */
  alias(id: string, text: string): void {
    const n = this.entity(id);
    if (this.reload !== undefined && n <= this.maxNumBefore) this.reload.alias(n, text);
    this.addAlias(n, text, 1);
  }

  /** Sets the description (the first one wins; later ones are appended after a blank line). */
  description(id: string, text: string): void {
    const n = this.entity(id);
    const f = this.flag(n);
    if (this.reload !== undefined && n <= this.maxNumBefore && this.reload.description(n)) {
      this.setDescriptionOf(n, text);
      this.flags[n] = f | HAS_DESC;
      return;
    }
    if ((f & HAS_DESC) === 0) {
      this.setDescriptionOf(n, text);
      this.flags[n] = f | HAS_DESC;
      return;
    }
    const cur = this.descriptionOf(n);
    if (cur === null) this.setDescriptionOf(n, text);
    else if (!cur.includes(text)) this.setDescriptionOf(n, `${cur}\n\n${text}`);
  }

  /** `id rdf:type type`. */
  type(id: string, type: string): void {
    const e = this.entity(id);
    const t = this.entity(type);
    this.useType(t, type);
    this.sink?.type(e, t);
    if (this.reload !== undefined && e <= this.maxNumBefore) this.reload.type(e, t);
    this.types.add(e, t);
  }

  /** `sub rdfs:subClassOf sup`. */
  subclass(sub: string, sup: string): void {
    const a = this.entity(sub);
    const b = this.entity(sup);
    this.useType(a, sub);
    this.useType(b, sup);
    this.sink?.subclass(a, b);
    this.s.insSub!.run(a, b);
  }

  /** A relation edge `src rel dst` (buffered; see rows.ts). */
  edge(src: string, rel: string, dst: string): void {
    const s = this.entity(src);
    const r = this.predicate(rel);
    if (r >= this.relUses.length) {
      const bigger = new Int32Array(Math.max(r + 1, this.relUses.length * 2));
      bigger.set(this.relUses);
      this.relUses = bigger;
    }
    if (this.relUses[r]++ === 0) this.onFirstUse?.("relation", rel);
    const d = this.entity(dst);
    this.sink?.edge(s, r, d);
    if (this.reload !== undefined && s <= this.maxNumBefore) this.reload.edge(s, r, d);
    this.edges.add(s, r, d);
  }

  /**
   * Writes every buffered row now: done before anything outside the writer reads the
   * tables (the end-of-load steps) and at commit.
   */
  flush(): void {
    for (const b of this.buffers()) b.flush();
    // whoever reads next may also delete rows: take the next num from the table again
    this.nextNum = 0;
  }

  /**
   * Where the load stands when its files' rows are all in (for the sink, load-sink.ts): the
   * rows of every table but the held edges are written (cheap; the edges wait for their
   * sorted write), then the catalog's nums and counts are read, with the entities the
   * end-of-load steps may remove.
   */
  rowsWritten(rdf: boolean): RowsWritten {
    for (const b of [this.entities, this.aliases, this.types, this.attributes]) b.flush();
    this.nextNum = 0;
    const one = (sql: string) => (this.db.prepare(sql).get() as { n: number | null }).n ?? 0;
    const v = this.cat.version();
    let onlyCandidates = true;
    for (const u of this.units.values()) if (u.rank === 2) onlyCandidates = false;
    return {
      path: this.cat.path,
      maxEntity: one("SELECT max(num) AS n FROM entity"),
      maxPredicate: one("SELECT max(num) AS n FROM predicate"),
      entityCount: one("SELECT count(*) AS n FROM entity"),
      stamp: { uid: v.uid, generation: v.generation + 1 },
      candidates: rdf ? (this.db.prepare("SELECT e.num FROM predicate p JOIN entity e ON e.id = p.id ORDER BY e.num").pluck().all() as number[]) : [],
      onlyCandidates,
    };
  }

  private discardBuffers(): void {
    for (const b of this.buffers()) b.discard();
    this.nextNum = 0;
  }

  /** The row buffers, entities first (the other tables' rows refer to entity nums). */
  private buffers(): readonly { flush(): void; discard(): void }[] {
    return [this.entities, this.aliases, this.types, this.attributes, this.edges];
  }

  /** A literal attribute. */
  attribute(id: string, predicate: string, value: string, datatype: string | null = null, lang: string | null = null): void {
    const n = this.entity(id);
    const p = this.predicate(predicate);
    if (this.reload !== undefined && n <= this.maxNumBefore) this.reload.attribute(n, id, p, predicate, value);
    this.attributes.add(n, p, value, datatype, lang, literalNumber(value, datatype));
  }

  /** A relation's (predicate's) label; the first one wins, later ones become aliases. */
  predicateLabel(id: string, text: string): void {
    const n = this.predicate(id);
    const cur = this.s.getPredLabel!.get(n) as { label: string | null };
    if (cur.label === null) this.s.setPredLabel!.run(text, n);
    else if (cur.label !== text) this.s.insPredAlias!.run(n, text, ...forms(text));
  }

  /**
   * An attribute's unit, written by {@link CatalogWriter.writeUnits} at the end of the load
   * into the meta table under `unit:` + the predicate id (no schema change; read back by
   * `Catalog.predicateUnits`). `source` ranks the ways a file can give it: `text` (JSON Lines
   * and CSV `unit`, schema.org `unitText`) over `code` (schema.org `unitCode`) over `iri` (QUDT
   * `qudt:unit` / `qudt:hasUnit`: `unit` is the unit's IRI, named by its label in the catalog
   * or else its last segment); within a rank the last one wins.
   */
  predicateUnit(id: string, unit: string, source: "text" | "code" | "iri" = "text"): void {
    this.predicate(id);
    const rank = source === "text" ? 0 : source === "code" ? 1 : 2;
    const cur = this.units.get(id);
    if (cur === undefined || rank <= cur.rank) this.units.set(id, { rank, value: unit });
  }

  private readonly units = new Map<string, { rank: number; value: string }>();

  /**
   * Writes the units given in this load. A unit IRI is named by its label (it was loaded as
   * an entity by its own triples) or else by its last segment; such an IRI leaves the entity
   * table when it takes no part in the graph (no edge, not a type), so "metre" does not
   * become a linkable name.
   */
  writeUnits(): void {
    if (this.units.size === 0) return;
    this.flush();
    const put = this.db.prepare("INSERT OR REPLACE INTO meta(key, value) VALUES (?, ?)");
    const find = this.db.prepare("SELECT num, label FROM entity WHERE id = ?");
    const inGraph = this.db.prepare(
      "SELECT EXISTS(SELECT 1 FROM edge WHERE src = @n) OR EXISTS(SELECT 1 FROM edge WHERE dst = @n) OR EXISTS(SELECT 1 FROM entity_type WHERE type = @n) OR EXISTS(SELECT 1 FROM subclass WHERE sub = @n OR sup = @n)",
    ).pluck();
    const drops = ["DELETE FROM alias WHERE entity = ?", "DELETE FROM attribute WHERE entity = ?", "DELETE FROM entity_type WHERE entity = ?", "DELETE FROM entity WHERE num = ?"].map((q) => this.db.prepare(q));
    for (const [id, u] of this.units) {
      let text = u.value;
      if (u.rank === 2) {
        const e = find.get(u.value) as { num: number; label: string | null } | undefined;
        text = e?.label ?? labelFromId(u.value);
        if (e !== undefined && this.isNewEntity(e.num) && !inGraph.get({ n: e.num })) {
          // (the end of the load: no id is looked up through the writer after this)
          const types = this.db.prepare("SELECT type FROM entity_type WHERE entity = ?").pluck().all(e.num) as number[];
          for (const d of drops) d.run(e.num);
          this.removedEntity(e.num);
          // a type only the unit had (qudt:Unit) goes with it
          for (const t of types) {
            if (this.isNewEntity(t) && !inGraph.get({ n: t }) && !this.db.prepare("SELECT 1 FROM edge WHERE src = ? LIMIT 1").get(t)) {
              for (const d of drops) d.run(t);
              this.removedEntity(t);
            }
          }
        }
      }
      put.run(`unit:${id}`, text);
    }
    this.units.clear();
  }

  /** A relation's alias phrasing. */
  predicateAlias(id: string, text: string): void {
    this.s.insPredAlias!.run(this.predicate(id), text, ...forms(text));
  }

  /** Entity `num` was deleted with its rows (end-of-load steps, import/finish.ts). */
  removedEntity(num: number): void {
    this.sink?.removed(num);
  }

  /** The catalog written to. */
  get catalog(): Catalog {
    return this.cat;
  }
}

/**
 * The re-load rule: what a load does to entities that were in the catalog before it.
 *
 * Without `update` a load only adds. A label different from the entity's label (and from its
 * other names) becomes an alias, and a value of an attribute that every entity so far holds
 * once at most ("single-valued") is added beside the old one; both are reported as warnings
 * (`label kept`, `second value`), once per entity and field.
 *
 * With `update` the load is the truth for every (entity, field) it mentions — a record
 * replaces what it states, per field, and leaves the rest: the first label it gives replaces
 * the label (the old one is dropped unless the load names it again); aliases it gives replace
 * the old aliases; its first description replaces the description; the types it gives replace
 * the types; the values it gives of an attribute replace that attribute's values; the edges it
 * gives from the entity with a relation replace that entity's outgoing edges of that relation
 * (edges into it, and relations the load does not mention from it, stay). This is the usual
 * "replace per subject and predicate" upsert of triple stores (common practice), applied at
 * the end of the load so that the order of statements inside it does not matter.
 */
import type Database from "better-sqlite3";

/** What `update` changed, for the load summary. */
export interface UpdateSummary {
  /** Entities that existed before and had something replaced or removed. */
  readonly entities: number;
  readonly labels: number;
  readonly descriptions: number;
  /** Attribute values removed because the load gave others for the same entity and attribute. */
  readonly values: number;
  readonly aliases: number;
  readonly types: number;
  /** Outgoing edges removed because the load gave others for the same entity and relation. */
  readonly edges: number;
}

interface Touched {
  /** The label before the load and the first one the load gave (update only). */
  label?: { old: string | null; first: string };
  /** True once the load gave it a label. */
  labelSeen?: boolean;
  /** Every label and alias the load gave. */
  readonly names: Set<string>;
  aliasesOld?: string[];
  description?: string | null;
  typesOld?: number[];
  readonly typesGiven: Set<number>;
  readonly attrs: Map<number, { old: string[]; given: Set<string> }>;
  readonly edges: Map<number, { old: number[]; given: Set<number> }>;
}

/** Bookkeeping of one load over entities that existed before it. */
export class ReloadTracker {
  private readonly db: Database.Database;
  readonly update: boolean;
  private readonly notice: (kind: "label kept" | "second value", message: string, id: string) => void;
  private readonly touched = new Map<number, Touched>();
  /** Per predicate num: true when some entity held two or more values of it before the load. */
  private readonly multi = new Map<number, boolean>();
  private readonly maxNumBefore: number;
  private readonly s;

  constructor(db: Database.Database, maxNumBefore: number, update: boolean, notice: (kind: "label kept" | "second value", message: string, id: string) => void) {
    this.db = db;
    this.maxNumBefore = maxNumBefore;
    this.update = update;
    this.notice = notice;
    const p = (sql: string) => db.prepare(sql);
    this.s = {
      isName: p("SELECT 1 FROM alias WHERE entity = ? AND text = ?"),
      aliases: p("SELECT text FROM alias WHERE entity = ? AND kind = 1").pluck(),
      types: p("SELECT type FROM entity_type WHERE entity = ?").pluck(),
      values: p("SELECT value FROM attribute WHERE entity = ? AND predicate = ?").pluck(),
      multi: p("SELECT 1 FROM attribute WHERE predicate = ? AND entity <= ? GROUP BY entity HAVING count(*) > 1 LIMIT 1"),
      dsts: p("SELECT dst FROM edge WHERE src = ? AND rel = ?").pluck(),
      label: p("SELECT label, description FROM entity WHERE num = ?"),
    };
  }

  private state(n: number): Touched {
    let t = this.touched.get(n);
    if (t === undefined) {
      t = { names: new Set(), typesGiven: new Set(), attrs: new Map(), edges: new Map() };
      this.touched.set(n, t);
    }
    return t;
  }

  /**
   * A label given to existing entity `n` whose label is `cur`: true when the writer is to
   * make it the label (update, first label of this load), false when the usual rule holds.
   */
  label(n: number, id: string, cur: string | null, text: string): boolean {
    const t = this.state(n);
    t.names.add(text);
    if (t.labelSeen) return false;
    t.labelSeen = true;
    if (this.update) {
      t.label = { old: cur, first: text };
      return cur !== null && cur !== text;
    }
    if (cur !== null && cur !== text && this.s.isName.get(n, text) === undefined) {
      this.notice("label kept", `entity ${JSON.stringify(id)} already has the label ${JSON.stringify(cur)}; ${JSON.stringify(text)} was added as an alias (load with --update to replace the label)`, id);
    }
    return false;
  }

  /** An alias given to existing entity `n`. */
  alias(n: number, text: string): void {
    const t = this.state(n);
    if (this.update && t.aliasesOld === undefined) t.aliasesOld = this.s.aliases.all(n) as string[];
    t.names.add(text);
  }

  /** A description for existing entity `n`: true when it replaces the stored one (update, first of this load). */
  description(n: number): boolean {
    if (!this.update) return false;
    const t = this.state(n);
    if (t.description !== undefined) return false;
    t.description = (this.s.label.get(n) as { description: string | null }).description;
    return true;
  }

  /** A type given to existing entity `n`. */
  type(n: number, type: number): void {
    if (!this.update) return;
    const t = this.state(n);
    if (t.typesOld === undefined) t.typesOld = this.s.types.all(n) as number[];
    t.typesGiven.add(type);
  }

  /** A value of attribute `p` given to existing entity `n`. */
  attribute(n: number, id: string, p: number, predicate: string, value: string): void {
    const t = this.state(n);
    let a = t.attrs.get(p);
    if (a === undefined) {
      a = { old: this.s.values.all(n, p) as string[], given: new Set() };
      t.attrs.set(p, a);
      if (!this.update && a.old.length > 0 && !a.old.includes(value) && !this.isMulti(p)) {
        this.notice(
          "second value",
          `entity ${JSON.stringify(id)} already has ${predicate} ${JSON.stringify(a.old[0])}; ${JSON.stringify(value)} was added as a second value (load with --update to replace it)`,
          id,
        );
      }
    }
    a.given.add(value);
  }

  private isMulti(p: number): boolean {
    let m = this.multi.get(p);
    if (m === undefined) {
      m = this.s.multi.get(p, this.maxNumBefore) !== undefined;
      this.multi.set(p, m);
    }
    return m;
  }

  /** An edge `n r dst` from existing entity `n` (update only). */
  edge(n: number, r: number, dst: number): void {
    if (!this.update) return;
    const t = this.state(n);
    let e = t.edges.get(r);
    if (e === undefined) {
      e = { old: this.s.dsts.all(n, r) as number[], given: new Set() };
      t.edges.set(r, e);
    }
    e.given.add(dst);
  }

  /**
   * Removes what the load replaced (update only; the writer has flushed every buffered row)
   * and counts the changes.
   */
  apply(): UpdateSummary | undefined {
    if (!this.update) return undefined;
    const db = this.db;
    const delAlias = db.prepare("DELETE FROM alias WHERE entity = ? AND text = ?");
    const delType = db.prepare("DELETE FROM entity_type WHERE entity = ? AND type = ?");
    const delValue = db.prepare("DELETE FROM attribute WHERE entity = ? AND predicate = ? AND value = ?");
    const delEdge = db.prepare("DELETE FROM edge WHERE src = ? AND rel = ? AND dst = ?");
    const c = { entities: 0, labels: 0, descriptions: 0, values: 0, aliases: 0, types: 0, edges: 0 };
    for (const [n, t] of this.touched) {
      const before = c.labels + c.descriptions + c.values + c.aliases + c.types + c.edges;
      const row = this.s.label.get(n) as { label: string | null; description: string | null } | undefined;
      if (row === undefined) continue;
      if (t.label && t.label.old !== null && t.label.old !== t.label.first) {
        c.labels++;
        if (!t.names.has(t.label.old)) delAlias.run(n, t.label.old);
      }
      for (const a of t.aliasesOld ?? []) {
        if (t.names.has(a) || a === row.label) continue;
        delAlias.run(n, a);
        c.aliases++;
      }
      if (t.description !== undefined && t.description !== row.description) c.descriptions++;
      for (const old of t.typesOld ?? []) {
        if (t.typesGiven.has(old)) continue;
        delType.run(n, old);
        c.types++;
      }
      for (const [p, a] of t.attrs) {
        for (const v of a.old) {
          if (a.given.has(v)) continue;
          delValue.run(n, p, v);
          c.values++;
        }
      }
      for (const [r, e] of t.edges) {
        for (const d of e.old) {
          if (e.given.has(d)) continue;
          delEdge.run(n, r, d);
          c.edges++;
        }
      }
      if (c.labels + c.descriptions + c.values + c.aliases + c.types + c.edges > before) c.entities++;
    }
    return c;
  }

  /** True when `n` existed before the load. */
  existed(n: number): boolean {
    return n <= this.maxNumBefore;
  }
}

/**
 * What every importer of one `load` shares: the writer (one open transaction), the error
 * list (collected up to a limit), the set of entities declared in this load, the edges
 * whose endpoints are still to be checked, and progress reporting.
 */
import { TiepointError } from "../../model/index.js";
import type { CatalogWriter } from "../writer.js";

/** Limits of one load. */
export const DEFAULTS = {
  /** Errors collected before the load stops looking for more. */
  maxErrors: 50,
  /** Milliseconds between two progress callbacks. */
  progressEveryMs: 200,
};

/** Progress of a running load, passed to `onProgress`. */
export interface LoadProgress {
  /** The file being read. */
  readonly file: string;
  /** 0-based index of that file among the load's files, and how many there are. */
  readonly fileIndex: number;
  readonly fileCount: number;
  /** Bytes of this file read so far and its size. */
  readonly bytes: number;
  readonly totalBytes: number;
  /** Statements (triples, records, rows) read so far in the whole load. */
  readonly statements: number;
  /** Milliseconds since the load started. */
  readonly elapsedMs: number;
}

/** What a warning is about (counted by kind in the load summary). */
export type WarningKind =
  | "undeclared type"
  | "undeclared relation"
  | "unlabelled relation"
  | "ignored column"
  | "label kept"
  | "second value"
  | "empty file";

/**
 * A problem that does not stop a load: listed as `FILE:LINE: warning: message` and counted;
 * under `--strict` every warning is an error and nothing is written.
 */
export interface LoadWarning {
  readonly kind: WarningKind;
  readonly file: string;
  /** 1-based line of the statement it is about. */
  readonly line: number;
  readonly message: string;
}

/** A warning as collected: its line may still be unknown (0), `id` names what to look for. */
export interface PendingWarning {
  readonly kind: WarningKind;
  readonly file: string;
  line: number;
  readonly message: string;
  readonly id?: string;
}

/** Where a type or relation id was first used in a load (line 0: not known yet, found by `locateWarnings`). */
export interface FirstUse {
  readonly file: string;
  readonly line: number;
}

/** Thrown internally when the error limit is reached; ends the load. */
export class TooManyErrors extends Error {}

/** An edge whose endpoints must be declared entities (JSONL and CSV layouts). */
interface PendingEdge {
  readonly file: string;
  readonly line: number;
  readonly ids: readonly string[];
}

/** State shared by the importers of one load. */
export class LoadContext {
  readonly writer: CatalogWriter;
  readonly errors: TiepointError[] = [];
  readonly maxErrors: number;
  /** Entities declared (given as records) in this load. */
  private readonly declared = new Set<string>();
  private readonly pending: PendingEdge[] = [];
  /** Entity nums at or below this existed before the load. */
  private readonly maxNumBefore: number;
  private readonly existedStmt;
  /** Statements read so far. */
  statements = 0;
  /**
   * The line of the statement being imported, set by the importers before each one (0 when
   * the reader does not track lines: the quick N-Triples pass; {@link LoadContext.where}
   * finds those lines afterwards).
   */
  line = 0;
  /** Warnings so far, in the order found (line 0 until {@link locateWarnings} finds it). */
  readonly warnings: PendingWarning[] = [];
  /** Where each type and relation id was first used in this load, by `kind + "\0" + id`. */
  readonly firstUse = new Map<string, FirstUse>();
  /** Relation and attribute ids declared by a record (JSON Lines, CSV) in this load. */
  readonly declaredPredicates = new Set<string>();
  private readonly onProgress?: (p: LoadProgress) => void;
  private readonly started = Date.now();
  private lastProgress = 0;
  /** Where the current file stands (set by the loader). */
  progressBase: { file: string; fileIndex: number; fileCount: number; totalBytes: number } = { file: "", fileIndex: 0, fileCount: 0, totalBytes: 0 };

  constructor(writer: CatalogWriter, options: { maxErrors?: number; onProgress?: (p: LoadProgress) => void }) {
    this.writer = writer;
    this.maxErrors = options.maxErrors ?? DEFAULTS.maxErrors;
    this.onProgress = options.onProgress;
    const db = writer.catalog.db;
    this.maxNumBefore = (db.prepare("SELECT max(num) AS m FROM entity").get() as { m: number | null }).m ?? 0;
    this.existedStmt = db.prepare("SELECT num FROM entity WHERE id = ?");
    writer.onFirstUse = (kind, id) => this.firstUse.set(`${kind}\0${id}`, { file: this.progressBase.file, line: this.line });
    writer.onNotice = (kind, message, id) => this.warn(kind, message, id);
  }

  /**
   * Records a warning about the statement being imported (or at `at`). `id` names the
   * entity or predicate it is about, so that a line the reader did not track (line 0) can be
   * found afterwards ({@link locateWarnings}).
   */
  warn(kind: WarningKind, message: string, id?: string, at?: FirstUse): void {
    this.warnings.push({ kind, file: at?.file ?? this.progressBase.file, line: at?.line ?? this.line, message, id });
  }

  /** Records an error at `file:line`; throws {@link TooManyErrors} at the limit. */
  error(file: string, line: number, message: string, code = "catalog/parse"): void {
    this.errors.push(new TiepointError(code, message, { file, line }));
    if (this.errors.length >= this.maxErrors) throw new TooManyErrors();
  }

  /** Notes that entity `id` is declared by a record of this load. */
  declare(id: string): void {
    this.declared.add(id);
  }

  /** True when entity `id` is declared by a record of this load. */
  isDeclared(id: string): boolean {
    return this.declared.has(id);
  }

  /** True when `id` is declared in this load or existed in the catalog before it. */
  isKnown(id: string): boolean {
    if (this.declared.has(id)) return true;
    const r = this.existedStmt.get(id) as { num: number } | undefined;
    return r !== undefined && r.num <= this.maxNumBefore;
  }

  /** Checks the endpoints of an edge now, or at the end of the load when one is not yet known. */
  requireEntities(file: string, line: number, ids: readonly string[]): void {
    const unknown = ids.filter((id) => !this.isKnown(id));
    if (unknown.length > 0) this.pending.push({ file, line, ids: unknown });
  }

  /** Reports the edges whose endpoints are still unknown at the end of the load. */
  checkPending(): void {
    if (this.pending.length === 0) return;
    // an entity an RDF file of this load describes (a label, description or type) counts as
    // declared too, so Turtle entities and CSV edges can be loaded together
    this.writer.flush();
    const described = this.writer.catalog.db
      .prepare("SELECT 1 FROM entity e WHERE e.id = ? AND (e.label IS NOT NULL OR e.description IS NOT NULL OR EXISTS(SELECT 1 FROM entity_type t WHERE t.entity = e.num))")
      .pluck();
    for (const p of this.pending) {
      for (const id of p.ids) {
        if (!this.isKnown(id) && described.get(id) === undefined) this.error(p.file, p.line, `unknown entity ${JSON.stringify(id)} (declare it as an entity in this load or an earlier one)`);
      }
    }
    this.pending.length = 0;
  }

  /** Counts one statement and reports progress now and then. */
  tick(bytes: number): void {
    this.statements++;
    if ((this.statements & 1023) === 0 && this.onProgress) this.progress(bytes, false);
  }

  /** Reports progress (forced at the end of each file). */
  progress(bytes: number, force: boolean): void {
    if (!this.onProgress) return;
    const now = Date.now();
    if (!force && now - this.lastProgress < DEFAULTS.progressEveryMs) return;
    this.lastProgress = now;
    this.onProgress({ ...this.progressBase, bytes, statements: this.statements, elapsedMs: now - this.started });
  }
}

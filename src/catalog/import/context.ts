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
    for (const p of this.pending) {
      for (const id of p.ids) {
        if (!this.isKnown(id)) this.error(p.file, p.line, `unknown entity ${JSON.stringify(id)} (declare it as an entity in this load or an earlier one)`);
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

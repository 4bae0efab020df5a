/**
 * `loadFiles`: imports files into a catalog in one transaction. The format is chosen by
 * extension (.nt, .ttl, .jsonl, .csv, .tsv). Errors are collected (up to a limit) as
 * `FILE:LINE: message`; on any error the transaction is rolled back, so the catalog is
 * exactly as it was. A committed load bumps the catalog generation.
 *
 * Every load ends, inside its transaction (so a failed load leaves no statistics of rows it
 * did not write), with `ANALYZE` under `PRAGMA analysis_limit`: the planner statistics
 * (`sqlite_stat1`) that let SQLite choose the index whose leading columns are bound, as
 * SQLite's documentation recommends after loading ("The ANALYZE command",
 * https://www.sqlite.org/lang_analyze.html; the limit is its "Approximate ANALYZE For Large
 * Databases", which bounds the rows examined per index). It also stores the attribute
 * summary (`Catalog.storeAttributeSummary`), so no question has to scan every literal.
 */
import { statSync, accessSync, constants } from "node:fs";
import { extname } from "node:path";
import { TiepointError } from "../model/index.js";
import type { Catalog } from "./store.js";
import { CatalogWriter } from "./writer.js";
import { LoadContext, TooManyErrors, DEFAULTS as CONTEXT_DEFAULTS } from "./import/context.js";
import type { LoadProgress, LoadWarning, WarningKind } from "./import/context.js";
import { checkNames, locateWarnings } from "./import/names.js";
import type { UpdateSummary } from "./reload.js";
import { importJsonl } from "./import/jsonl.js";
import { importCsv } from "./import/csv.js";
import { importRdf } from "./import/rdf.js";
import { finishLoad } from "./import/finish.js";
import type { LoadSink, PreparedFiles } from "./load-sink.js";

export type { LoadProgress, LoadWarning, WarningKind, UpdateSummary };

/** Defaults of {@link loadFiles}. */
export const DEFAULTS = {
  /** Errors collected before the load stops. */
  maxErrors: CONTEXT_DEFAULTS.maxErrors,
  /**
   * SQLite page cache during a load, in KiB (PRAGMA cache_size = -N; the handle's own
   * setting is restored afterwards). Large enough that a 1M-entity / 5M-edge catalog
   * (~460 MiB) is built without spilling dirty pages to the log mid-transaction. (The index
   * rebuild at the end runs with a small cache, writer.ts `DEFAULTS.indexBuildCacheKiB`: SQLite's
   * sorter is faster in small runs.)
   */
  cacheKiB: 512 * 1024,
  /**
   * Rows examined per index by the end-of-load ANALYZE (PRAGMA analysis_limit; 0 = all).
   * SQLite's documentation suggests 100 to 1000 for large databases. Measured on the Debian
   * catalog (1.03M triples): 0.35 s with 1000 against 3.1 s for a full ANALYZE.
   */
  analysisLimit: 1000,
};

/** The formats `load` reads, by file extension. */
export type ImportFormat = "nt" | "ttl" | "jsonl" | "csv" | "tsv";

const FORMATS: Record<string, ImportFormat> = { ".nt": "nt", ".ttl": "ttl", ".jsonl": "jsonl", ".csv": "csv", ".tsv": "tsv" };

/** Options of {@link loadFiles}; all optional. */
export interface LoadOptions {
  /** Empty the catalog first (inside the same transaction). @default false */
  readonly replace?: boolean;
  /** Called now and then while reading (about every 200 ms) and at the end of each file. */
  readonly onProgress?: (p: LoadProgress) => void;
  /** @default DEFAULTS.maxErrors */
  readonly maxErrors?: number;
  /** Every warning is an error: nothing is written when there is one. @default false */
  readonly strict?: boolean;
  /**
   * Receives every row written when the catalog is empty at the start (or `replace`), and
   * builds derived files before the commit (load-sink.ts); told to `abort` otherwise.
   */
  readonly sink?: LoadSink;
  /**
   * Replace what the files state about entities already in the catalog (label, aliases,
   * description, types, each attribute's values, each relation's outgoing edges) instead of
   * adding to it; see reload.ts. @default false
   */
  readonly update?: boolean;
  /** Called as each step of the load ends (for per-step timings, e.g. CPU time of this thread). */
  readonly onStep?: (step: LoadStep) => void;
}

/**
 * The steps of a load, in order, named when each ends ({@link LoadOptions.onStep}): reading
 * the files; writing the rows held until then (a load into an empty catalog); SQLite's
 * deferred indexes (and the held edges); the end-of-load fix-ups and checks; the derived
 * files the sink builds in this thread; the attribute summary; the planner statistics; the
 * commit.
 */
export type LoadStep = "files" | "heldRows" | "indexes" | "endOfLoad" | "derivedFiles" | "summary" | "statistics" | "commit";

/** What one file contributed. */
export interface FileReport {
  readonly file: string;
  readonly format: ImportFormat;
  /** Statements (triples, records, rows) read from it. */
  readonly statements: number;
  readonly bytes: number;
}

/** The result of a committed load. */
export interface LoadReport {
  readonly files: readonly FileReport[];
  /** Statements read over all files. */
  readonly statements: number;
  /** Row counts added by the load (negative when `replace` removed more than was added). */
  readonly added: { readonly entities: number; readonly edges: number; readonly attributes: number; readonly aliases: number; readonly predicates: number };
  /** The catalog's generation after the load. */
  readonly generation: number;
  /** Warnings, in file and line order (each `FILE:LINE`). */
  readonly warnings: readonly LoadWarning[];
  /** What `update` replaced (only with that option). */
  readonly updated?: UpdateSummary;
  readonly seconds: number;
  /** True when the sink's files were built and published with the commit. */
  readonly prepared: boolean;
}

/** The import format of a file name, or undefined. */
export function formatOf(file: string): ImportFormat | undefined {
  return FORMATS[extname(file).toLowerCase()];
}

function fileProblem(file: string): string | undefined {
  let st;
  try {
    st = statSync(file);
  } catch (e) {
    const code = (e as { code?: string }).code;
    return code === "ENOENT" ? "cannot read the file: no such file" : `cannot read the file: ${(e as Error).message}`;
  }
  if (st.isDirectory()) return "is a directory, expected a file";
  try {
    accessSync(file, constants.R_OK);
  } catch {
    return "cannot read the file: permission denied";
  }
  if (formatOf(file) === undefined) return `unknown file extension "${extname(file)}" (expected .nt, .ttl, .jsonl, .csv or .tsv)`;
  return undefined;
}

function counts(cat: Catalog): { entities: number; edges: number; attributes: number; aliases: number; predicates: number } {
  const n = (t: string) => (cat.db.prepare(`SELECT count(*) AS n FROM ${t}`).get() as { n: number }).n;
  return { entities: n("entity"), edges: n("edge"), attributes: n("attribute"), aliases: n("alias"), predicates: n("predicate") };
}

/**
 * Imports `files` into `cat` in one transaction. Throws a `TiepointError` (code
 * `catalog/parse`, `catalog/encoding`, `catalog/file`, …) carrying `file` and `line`, its
 * `.more` holding the further errors; nothing is written then.
 */
export function loadFiles(cat: Catalog, files: readonly string[], options: LoadOptions = {}): LoadReport {
  const t0 = Date.now();
  if (cat.readonly) throw new TiepointError("catalog/readonly", "the catalog is read-only (file permissions); cannot load into it", { file: cat.path });
  if (files.length === 0) throw new TiepointError("cli/usage", "no files to load");
  const problems: TiepointError[] = [];
  for (const f of files) {
    const p = fileProblem(f);
    if (p) problems.push(new TiepointError("catalog/file", p, { file: f, line: 1 }));
  }
  if (problems.length > 0) throw new TiepointError(problems[0]!.code, problems[0]!.message, { file: problems[0]!.file, line: 1, more: problems.slice(1) });

  const db = cat.db;
  if (cat.path !== ":memory:") db.pragma("synchronous = NORMAL");
  const cacheBefore = db.pragma("cache_size", { simple: true }) as number;
  db.pragma(`cache_size = -${DEFAULTS.cacheKiB}`);
  try {
    return loadInTransaction(cat, files, options, t0);
  } finally {
    try {
      db.pragma(`cache_size = ${cacheBefore}`);
    } catch {
      // the handle is unusable (an I/O error); the load's own error is the one to report
    }
  }
}

/** The transaction of {@link loadFiles}: every file imported, then commit (or rollback on any error). */
function loadInTransaction(cat: Catalog, files: readonly string[], options: LoadOptions, t0: number): LoadReport {
  const before = counts(cat);
  const writer = new CatalogWriter(cat);
  try {
    writer.begin({ update: options.update === true });
  } catch (e) {
    if ((e as { code?: string }).code === "SQLITE_BUSY") throw new TiepointError("catalog/busy", "another load is writing this catalog; run this one when it has finished", { file: cat.path });
    throw e;
  }
  const reports: FileReport[] = [];
  const order = new Map(files.map((f, i) => [f, i]));
  let ctx: LoadContext | undefined;
  let sink: LoadSink | undefined;
  let prepared: PreparedFiles | undefined;
  let updated: UpdateSummary | undefined;
  try {
    if (options.replace) writer.clear();
    if (writer.startedEmpty) {
      writer.deferIndexes();
      sink = options.sink;
    } else options.sink?.abort();
    writer.sink = sink;
    ctx = new LoadContext(writer, { maxErrors: options.maxErrors, onProgress: options.onProgress });
    let rdf = false;
    try {
      for (let i = 0; i < files.length; i++) {
        const file = files[i]!;
        const format = formatOf(file)!;
        const size = statSync(file).size;
        ctx.progressBase = { file, fileIndex: i, fileCount: files.length, totalBytes: size };
        const startStatements = ctx.statements;
        try {
          if (format === "jsonl") importJsonl(ctx, file);
          else if (format === "csv" || format === "tsv") importCsv(ctx, file, format);
          else {
            rdf = true;
            importRdf(ctx, file, format);
          }
        } catch (e) {
          if (e instanceof TooManyErrors || e instanceof TiepointError) throw e;
          const code = (e as { code?: string }).code;
          if (typeof code === "string" && /^E[A-Z]+$/.test(code)) ctx.error(file, 1, `cannot read the file: ${(e as Error).message}`, "catalog/file");
          else throw e;
        }
        ctx.progress(size, true);
        const statements = ctx.statements - startStatements;
        if (statements === 0 && ctx.errors.length === 0) ctx.warn("empty file", "no statements in this file; nothing was loaded from it", undefined, { file, line: 1 });
        reports.push({ file, format, statements, bytes: size });
      }
      ctx.checkPending();
      const step = options.onStep ?? (() => {});
      step("files");
      if (ctx.errors.length === 0) {
        if (sink?.rowsWritten) sink.rowsWritten(writer.rowsWritten(rdf));
        step("heldRows");
        writer.restoreIndexes();
        step("indexes");
        updated = writer.applyReload();
        writer.writeUnits();
        finishLoad(writer, { rdf });
        checkNames(ctx);
        locateWarnings(ctx.warnings);
        // --strict: every warning is an error (up to the error limit)
        if (options.strict) for (const x of ctx.warnings) ctx.error(x.file, x.line, `${x.message} (--strict: warnings are errors)`, "catalog/strict");
      }
    } catch (e) {
      if (!(e instanceof TooManyErrors)) throw e;
    }
    if (ctx.errors.length > 0) {
      // in file order, then line order (end-of-load checks come last otherwise)
      const errs = inFileOrder(ctx.errors, order);
      const more = errs.slice(1);
      if (errs.length >= ctx.maxErrors) more.push(new TiepointError("catalog/parse", `stopped after ${ctx.maxErrors} errors; nothing was loaded`));
      else more.push(new TiepointError("catalog/parse", `${errs.length} error${errs.length === 1 ? "" : "s"}; nothing was loaded`));
      throw new TiepointError(errs[0]!.code, errs[0]!.message, { file: errs[0]!.file, line: errs[0]!.line, more });
    }
    writer.flush();
    options.onStep?.("endOfLoad");
    // the commit bumps the generation by one: derived files are stamped with the new one; a
    // sink may build them in a second thread while the summary, ANALYZE and the commit run
    prepared = sink?.finish(cat, { uid: cat.version().uid, generation: cat.version().generation + 1 });
    writer.sink = undefined;
    options.onStep?.("derivedFiles");
    cat.storeAttributeSummary();
    options.onStep?.("summary");
    gatherStatistics(cat);
    options.onStep?.("statistics");
    writer.commit();
    options.onStep?.("commit");
  } catch (e) {
    writer.sink = undefined;
    writer.rollback();
    prepared?.discard();
    sink?.abort();
    const code = (e as { code?: string }).code;
    if (code === "SQLITE_FULL") throw new TiepointError("catalog/full", "the disk is full (or the catalog reached its size limit); nothing was loaded", { file: cat.path });
    if (typeof code === "string" && code.startsWith("SQLITE_IOERR")) throw new TiepointError("catalog/io", `cannot write the catalog (${code}); nothing was loaded`, { file: cat.path });
    throw e;
  }
  let published = false;
  if (prepared) {
    try {
      prepared.publish();
      published = true;
    } catch {
      // the catalog is committed; without its derived files the first question builds them
      prepared.discard();
    }
  }
  const after = counts(cat);
  return {
    files: reports,
    statements: ctx.statements,
    added: {
      entities: after.entities - before.entities,
      edges: after.edges - before.edges,
      attributes: after.attributes - before.attributes,
      aliases: after.aliases - before.aliases,
      predicates: after.predicates - before.predicates,
    },
    generation: cat.version().generation,
    warnings: inFileOrder(ctx.warnings, order).map((x) => ({ kind: x.kind, file: x.file, line: x.line, message: x.message })),
    ...(updated ? { updated } : {}),
    seconds: (Date.now() - t0) / 1000,
    prepared: published,
  };
}

/** ANALYZE with a bounded sample per index (see the header), the handle's analysis_limit restored. */
function gatherStatistics(cat: Catalog): void {
  const db = cat.db;
  const before = db.pragma("analysis_limit", { simple: true }) as number;
  db.pragma(`analysis_limit = ${DEFAULTS.analysisLimit}`);
  try {
    db.exec("ANALYZE");
  } finally {
    db.pragma(`analysis_limit = ${before}`);
  }
}

/** Problems in file order, then line order, then the order found (a stable sort). */
function inFileOrder<T extends { readonly file?: string; readonly line?: number }>(list: readonly T[], order: ReadonlyMap<string, number>): T[] {
  return list
    .map((e, i) => ({ e, i }))
    .sort((a, b) => (order.get(a.e.file ?? "") ?? 0) - (order.get(b.e.file ?? "") ?? 0) || (a.e.line ?? 0) - (b.e.line ?? 0) || a.i - b.i)
    .map((x) => x.e);
}

/**
 * `tiepoint load FILE… --db PATH [--replace]`: imports files into a catalog (created when
 * missing) in one transaction. Errors print as `FILE:LINE: message` on stderr, exit 1.
 * A progress bar is drawn on stderr when it is a terminal and the load runs over a second.
 */
import { existsSync, rmSync, statSync } from "node:fs";
import { dirname } from "node:path";
import type { Command } from "commander";
import { Catalog, loadFiles } from "../../catalog/index.js";
import type { LoadProgress, LoadReport, LoadWarning } from "../../catalog/index.js";
import { TiepointError } from "../../model/index.js";
import { LoadPreparation, Session } from "../../pipeline/index.js";
import { reportError } from "../run.js";

/** Progress display settings. */
export const DEFAULTS = {
  /** The bar appears only after this many milliseconds. */
  showAfterMs: 1000,
  /** Width of the bar in cells. */
  barWidth: 24,
  /** Warnings listed on stderr (the rest are counted). */
  maxWarnings: 20,
};

/** `n word` or `n words` (English plural with -s; `many` for the irregular ones). */
export function count(n: number, word: string, many = `${word}s`): string {
  return `${n.toLocaleString("en-US")} ${n === 1 || n === -1 ? word : many}`;
}

const signed = (n: number, word: string, many?: string): string => `${n >= 0 ? "+" : ""}${count(n, word, many)}`;

/** Draws one progress line (pure; exported for tests). */
export function progressLine(p: LoadProgress, width = DEFAULTS.barWidth): string {
  const frac = p.totalBytes > 0 ? Math.min(1, p.bytes / p.totalBytes) : 1;
  const filled = Math.round(frac * width);
  const rate = p.elapsedMs > 0 ? Math.round((p.statements * 1000) / p.elapsedMs) : 0;
  const files = p.fileCount > 1 ? ` (file ${p.fileIndex + 1}/${p.fileCount})` : "";
  return `loading ${p.file}${files} [${"#".repeat(filled)}${"-".repeat(width - filled)}] ${Math.floor(frac * 100)}%  ${p.statements.toLocaleString("en-US")} statements  ${rate.toLocaleString("en-US")}/s`;
}

/** The one-line summary of a committed load (pure; exported for tests). */
export function summary(r: LoadReport, db: string): string {
  const a = r.added;
  const rate = r.seconds > 0 ? Math.round(r.statements / r.seconds) : r.statements;
  let line =
    `loaded ${count(r.files.length, "file")} into ${db}: ${count(r.statements, "statement")} in ${r.seconds.toFixed(2)} s (${rate.toLocaleString("en-US")}/s); ` +
    `${signed(a.entities, "entity", "entities")}, ${signed(a.edges, "edge")}, ${signed(a.attributes, "attribute")}`;
  if (r.warnings.length > 0) line += `; ${warningCounts(r.warnings)}`;
  if (r.updated) line += `\n${updateLine(r.updated)}`;
  return line;
}

/** "updated 2 entities: 1 label changed, 1 attribute value replaced, …" (only the non-zero parts). */
export function updateLine(u: NonNullable<LoadReport["updated"]>): string {
  const parts = [
    [u.labels, "label changed", "labels changed"],
    [u.aliases, "alias removed", "aliases removed"],
    [u.descriptions, "description replaced", "descriptions replaced"],
    [u.types, "type removed", "types removed"],
    [u.values, "attribute value replaced", "attribute values replaced"],
    [u.edges, "edge removed", "edges removed"],
  ] as const;
  const changed = parts.filter(([n]) => n > 0).map(([n, one, many]) => count(n, one, many));
  return `updated ${count(u.entities, "entity", "entities")}${changed.length ? `: ${changed.join(", ")}` : " (the files matched the catalog)"}`;
}

/** "3 warnings (2 undeclared types, 1 ignored column)". */
export function warningCounts(warnings: readonly LoadWarning[]): string {
  const byKind = new Map<string, number>();
  for (const w of warnings) byKind.set(w.kind, (byKind.get(w.kind) ?? 0) + 1);
  const parts = [...byKind].map(([kind, n]) => count(n, kind));
  return `${count(warnings.length, "warning")} (${parts.join(", ")})`;
}

/** The warnings as `FILE:LINE: warning: message` lines, at most `max`, then how many more. */
export function warningLines(warnings: readonly LoadWarning[], max = DEFAULTS.maxWarnings): string[] {
  const lines = warnings.slice(0, max).map((w) => `${w.file}:${w.line}: warning: ${w.message}`);
  if (warnings.length > max) lines.push(`… and ${count(warnings.length - max, "more warning")}`);
  return lines;
}

/** A catalog path whose folder is missing: one clear line instead of SQLite's own message. */
function checkFolder(db: string): void {
  if (db === ":memory:" || existsSync(db)) return;
  const dir = dirname(db);
  let isDir = false;
  try {
    isDir = statSync(dir).isDirectory();
  } catch {
    isDir = false;
  }
  if (!isDir) throw new TiepointError("catalog/open", `cannot create catalog ${db}: folder ${dir} does not exist`);
}

/**
 * Builds the snapshots a question needs (relation index `PATH.idx`, name index `PATH.link`)
 * right after a load, so the first `ask` starts fast. A failure here leaves the catalog
 * loaded (it is committed) and only means the first question builds them.
 */
function prepare(db: string, quiet: boolean): void {
  const t0 = performance.now();
  if (!quiet && process.stderr.isTTY) process.stderr.write("preparing the question indexes…");
  try {
    Session.open({ db }).close();
    if (!quiet) process.stderr.write(`${process.stderr.isTTY ? "\r\x1b[K" : ""}prepared the question indexes in ${((performance.now() - t0) / 1000).toFixed(2)} s\n`);
  } catch (e) {
    if (process.stderr.isTTY) process.stderr.write("\r\x1b[K");
    process.stderr.write(`tiepoint: warning: the catalog is loaded, but its question indexes were not prepared (${(e as Error).message}); the first question will build them\n`);
  }
}

/** Registers `load`. */
export function registerLoad(program: Command): void {
  program
    .command("load")
    .description("import .nt, .ttl, .jsonl, .csv or .tsv files into a catalog (one transaction: all or nothing)")
    .argument("<files...>", "files to import")
    .requiredOption("--db <path>", "the catalog file (created when missing)")
    .option("--replace", "empty the catalog first (in the same transaction)")
    .option("--update", "replace what the files state about entities already in the catalog (label, aliases, description, types, each attribute's values, each relation's edges from the entity) instead of adding to it")
    .option("--strict", "treat warnings (undeclared or unlabelled types and relations, ignored columns, kept labels, second values, empty files) as errors: nothing is written")
    .option("--quiet", "print nothing on success")
    .option("--no-prepare", "skip building the question indexes (relation index, name index) after the load; the first question builds them instead")
    .action((files: string[], opts: { db: string; replace?: boolean; update?: boolean; strict?: boolean; quiet?: boolean; prepare?: boolean }) => {
      let cat: Catalog | undefined;
      const tty = process.stderr.isTTY === true;
      let drawn = false;
      const onProgress = tty
        ? (p: LoadProgress) => {
            if (p.elapsedMs < DEFAULTS.showAfterMs) return;
            const cols = process.stderr.columns ?? 100;
            process.stderr.write(`\r${progressLine(p).slice(0, cols - 1)}\x1b[K`);
            drawn = true;
          }
        : undefined;
      const existed = existsSync(opts.db);
      let ok = false;
      // the question indexes are built from the rows as they are written (pipeline/prepare.ts)
      const sink =
        opts.prepare !== false
          ? new LoadPreparation((message) => {
              if (!tty || opts.quiet) return;
              process.stderr.write(`\r${`preparing the question indexes: ${message}…`.slice(0, (process.stderr.columns ?? 100) - 1)}\x1b[K`);
              drawn = true;
            })
          : undefined;
      try {
        checkFolder(opts.db);
        cat = Catalog.open(opts.db, { create: true });
        const report = loadFiles(cat, files, { replace: opts.replace === true, strict: opts.strict === true, update: opts.update === true, onProgress, ...(sink ? { sink } : {}) });
        if (drawn) process.stderr.write("\r\x1b[K");
        ok = true;
        // warnings print even with --quiet: they are about the data just loaded
        if (report.warnings.length > 0) process.stderr.write(warningLines(report.warnings).join("\n") + "\n");
        if (!opts.quiet) process.stderr.write(summary(report, opts.db) + "\n");
        cat.close();
        cat = undefined;
        if (report.prepared && !opts.quiet) {
          const where = sink!.threaded ? `in a second thread; the load waited ${(sink!.waitMs / 1000).toFixed(2)} s for it after its commit` : "after the last row";
          process.stderr.write(`prepared the question indexes during the load (${(sink!.finishMs / 1000).toFixed(2)} s ${where})\n`);
        }
        if (!report.prepared && opts.prepare !== false) prepare(opts.db, opts.quiet === true);
      } catch (e) {
        if (drawn) process.stderr.write("\r\x1b[K");
        if (e instanceof TiepointError && e.file !== undefined && e.line !== undefined) {
          // load errors print as FILE:LINE: message (contract), one per line
          process.stderr.write([e, ...e.more].map((x) => x.format()).join("\n") + "\n");
          process.exitCode = 1;
        } else {
          process.exitCode = reportError(e);
        }
      } finally {
        cat?.close();
        // a failed first load leaves no empty catalog file behind
        if (!ok && !existed) for (const f of [opts.db, `${opts.db}-wal`, `${opts.db}-shm`]) rmSync(f, { force: true });
      }
    });
}

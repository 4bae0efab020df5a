/**
 * The bundled demo catalog: data/schema.jsonl, data/core.jsonl and data/filler.jsonl (the
 * invented Velmarra Basin setting), built once through the ordinary importer into a cache
 * folder outside the source tree and reused until the sources change.
 *
 * Cache folder: $TIEPOINT_CACHE, else $XDG_CACHE_HOME/tiepoint, else ~/.cache/tiepoint. The
 * file is named by a SHA-256 of the schema version and the sources' names and bytes, so an
 * edited source gives a new file. A build writes a private temporary file and renames it into
 * place (rename is atomic on POSIX), so two processes starting at once never see a half-built
 * catalog; the loser's rename simply replaces an identical file.
 */
import { createHash, randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync } from "node:fs";
import { homedir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { TiepointError } from "../model/index.js";
import { loadFiles } from "./load.js";
import { SCHEMA_VERSION } from "./schema.js";
import { Catalog } from "./store.js";

/** The demo source files, in load order (names inside data/). */
export const DEMO_SOURCES: readonly string[] = ["schema.jsonl", "core.jsonl", "filler.jsonl"];

/** The data/ folder of this installation (beside src/ and dist/). */
export function demoDataDir(): string {
  return resolve(dirname(fileURLToPath(import.meta.url)), "..", "..", "data");
}

/** Absolute paths of the demo source files, in load order. */
export function demoSourceFiles(): string[] {
  return DEMO_SOURCES.map((f) => join(demoDataDir(), f));
}

/** The cache folder for built catalogs (not created here). */
export function cacheDir(env: NodeJS.ProcessEnv = process.env): string {
  if (env.TIEPOINT_CACHE) return resolve(env.TIEPOINT_CACHE);
  if (env.XDG_CACHE_HOME) return join(resolve(env.XDG_CACHE_HOME), "tiepoint");
  return join(homedir(), ".cache", "tiepoint");
}

function sourceHash(files: readonly string[]): string {
  const h = createHash("sha256");
  // "units": catalogs built before the importer stored attribute units (meta `unit:…`) are rebuilt
  h.update(`tiepoint demo, schema ${SCHEMA_VERSION}, units\n`);
  for (const f of files) {
    let bytes: Buffer;
    try {
      bytes = readFileSync(f);
    } catch {
      throw new TiepointError("catalog/demo", "demo catalog source missing (the installation is incomplete)", { file: f });
    }
    h.update(`${f.slice(f.lastIndexOf("/") + 1)}\n${bytes.length}\n`);
    h.update(bytes);
  }
  return h.digest("hex").slice(0, 16);
}

/** Options of {@link demoCatalogPath}; all optional (tests use them). */
export interface DemoCatalogOptions {
  /** Source files to build from. @default demoSourceFiles() */
  readonly files?: readonly string[];
  /** Cache folder. @default cacheDir() */
  readonly cacheDir?: string;
}

/**
 * The path of the built demo catalog, building it first when the cache holds no catalog for
 * the current sources. Stale demo catalogs (other hashes) are removed after a build.
 */
export function demoCatalogPath(options: DemoCatalogOptions = {}): string {
  const files = options.files ?? demoSourceFiles();
  const name = `demo-${sourceHash(files)}.db`;
  const dir = options.cacheDir ?? cacheDir();
  const path = join(dir, name);
  if (existsSync(path)) return path;
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    throw new TiepointError("catalog/demo", `cannot create the cache folder for the demo catalog (${(e as Error).message}); set TIEPOINT_CACHE to a writable folder`, { file: dir });
  }
  const tmp = join(dir, `.${name}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);
  const cleanTmp = () => {
    for (const suffix of ["", "-wal", "-shm", "-journal"]) rmSync(tmp + suffix, { force: true });
  };
  try {
    const cat = Catalog.open(tmp, { create: true });
    try {
      loadFiles(cat, files);
      cat.db.pragma("journal_mode = DELETE"); // a single self-contained file, readable without -wal/-shm
    } finally {
      cat.close();
    }
    renameSync(tmp, path);
  } catch (e) {
    cleanTmp();
    if (e instanceof TiepointError) throw e;
    throw new TiepointError("catalog/demo", `cannot build the demo catalog: ${(e as Error).message}; set TIEPOINT_CACHE to a writable folder`, { file: dir });
  }
  cleanTmp();
  // remove demo catalogs of earlier sources (and their derived files); ignore races
  try {
    for (const f of readdirSync(dir)) {
      if (/^demo-[0-9a-f]{16}\.db/.test(f) && !f.startsWith(name)) rmSync(join(dir, f), { force: true });
    }
  } catch {
    // a concurrent cleaner got there first
  }
  return path;
}

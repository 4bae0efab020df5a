/**
 * The evaluation sets of issue 16 and where their catalogs come from, and the catalog cache:
 * each set's catalog is built from its dataset package into N-Triples (plus a JSONL schema of
 * units), written with the ordinary importer into `cacheDir()/eval-SET-HASH/catalog.db`
 * (HASH: SHA-256 of the catalog schema version and the generated files), built into a private
 * temporary folder and renamed into place, as the demo catalog is (src/catalog/demo.ts).
 */
import { createHash, randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { Catalog, SCHEMA_VERSION, cacheDir, loadFiles } from "../catalog/index.js";
import { TiepointError } from "../model/index.js";
import { DEFAULTS as DEBIAN_DEFAULTS, readPackagesText, stanzasToNTriples } from "./debian-packages.js";
import { readQuestionSet, type EvalQuestion, type SplitFile } from "./question-set.js";
import { WORLD_PREFIXES, buildWorldCatalog, worldCountriesVersion, type EvalCatalogSource } from "./world-catalog.js";

/** One evaluation set: its question file, SPARQL prefixes and catalog builder. */
export interface SetSpec {
  readonly name: string;
  /** Question file, relative to the repository root. */
  readonly file: string;
  readonly prefixes: Readonly<Record<string, string>>;
  /** The dataset and version the catalog is built from. */
  readonly source: () => string;
  readonly build: () => EvalCatalogSource;
}

/** The repository root (beside src/ and dist/). */
export function repoRoot(): string {
  return resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");
}

/** The committed split file, relative to the repository root. */
export const SPLIT_FILE = "test/fixtures/eval/split.json";

/** The seed of the committed split (the date the world set was written, 4 December 2026). */
export const SPLIT_SEED = 20261204;

/** The committed Debian slice the debian set is asked over (test/fixtures/debian/README.md). */
export const DEBIAN_SLICE = "test/fixtures/debian/packages-slice.txt.gz";

/** SPARQL prefixes declared before every query of the debian question set (IRIs of src/eval/debian-packages.ts). */
export const DEBIAN_PREFIXES: Readonly<Record<string, string>> = {
  ds: `${DEBIAN_DEFAULTS.base}schema:`,
  pkg: `${DEBIAN_DEFAULTS.base}package:`,
  sec: `${DEBIAN_DEFAULTS.base}section:`,
  pri: `${DEBIAN_DEFAULTS.base}priority:`,
  mnt: `${DEBIAN_DEFAULTS.base}maintainer:`,
  arch: `${DEBIAN_DEFAULTS.base}architecture:`,
  xsd: "http://www.w3.org/2001/XMLSchema#",
  rdfs: "http://www.w3.org/2000/01/rdf-schema#",
};

/** The world-countries catalog (src/eval/world-catalog.ts), shared by the world sets. */
const WORLD_CATALOG = {
  prefixes: WORLD_PREFIXES,
  source: () => `world-countries ${worldCountriesVersion()} (npm; mledoze/countries, ODbL)`,
  build: buildWorldCatalog,
};

/** The Debian slice's catalog (src/eval/debian-packages.ts), shared by the debian sets. */
const DEBIAN_CATALOG = {
  prefixes: DEBIAN_PREFIXES,
  source: () => `Debian 12 "bookworm" binary package index, amd64 main, 3,044-stanza slice (${DEBIAN_SLICE}; converter src/eval/debian-packages.ts)`,
  build: (): EvalCatalogSource => {
    const c = stanzasToNTriples(readPackagesText(join(repoRoot(), DEBIAN_SLICE)));
    return { triples: c.nt, schema: c.declarations };
  },
};

/**
 * Every set, by name. `world` and `debian` were written on 4 December 2026; `world-b` and
 * `debian-b` (same catalogs) were written on 5 December 2026 by someone who had not seen
 * tiepoint's answers on them, and split before tiepoint was first run on them.
 */
export const SETS: readonly SetSpec[] = [
  { name: "world", file: "test/fixtures/eval/world.tsv", ...WORLD_CATALOG },
  { name: "debian", file: "test/fixtures/eval/debian.tsv", ...DEBIAN_CATALOG },
  { name: "world-b", file: "test/fixtures/eval/world-b.tsv", ...WORLD_CATALOG },
  { name: "debian-b", file: "test/fixtures/eval/debian-b.tsv", ...DEBIAN_CATALOG },
];

/** The set called `name`; an unknown name is a usage error. */
export function setByName(name: string): SetSpec {
  const s = SETS.find((x) => x.name === name);
  if (!s) throw new TiepointError("cli/usage", `unknown set "${name}" (sets: ${SETS.map((x) => x.name).join(", ")})`);
  return s;
}

/** The questions of a set. */
export function questionsOf(spec: SetSpec): EvalQuestion[] {
  return readQuestionSet(join(repoRoot(), spec.file), spec.name);
}

/** A committed split file (default: the question sets'). */
export function readSplit(file: string = SPLIT_FILE): SplitFile {
  return JSON.parse(readFileSync(join(repoRoot(), file), "utf8")) as SplitFile;
}

/** A built set catalog: the SQLite file and the N-Triples text both engines read. */
export interface BuiltCatalog {
  readonly db: string;
  readonly triples: string;
}

/** Builds (or reuses from the cache) the catalog of a set. */
export function builtCatalog(spec: SetSpec, dir: string = cacheDir()): BuiltCatalog {
  const src = spec.build();
  const h = createHash("sha256");
  h.update(`tiepoint eval ${spec.name}, schema ${SCHEMA_VERSION}\n`);
  h.update(src.triples);
  h.update(src.schema);
  const folder = join(dir, `eval-${spec.name}-${h.digest("hex").slice(0, 16)}`);
  const db = join(folder, "catalog.db");
  if (existsSync(db)) return { db, triples: src.triples };
  const tmp = join(dir, `.eval-${spec.name}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);
  try {
    mkdirSync(tmp, { recursive: true });
    writeFileSync(join(tmp, `${spec.name}.nt`), src.triples);
    writeFileSync(join(tmp, `${spec.name}-schema.jsonl`), src.schema);
    const cat = Catalog.open(join(tmp, "catalog.db"), { create: true });
    try {
      loadFiles(cat, [join(tmp, `${spec.name}.nt`), join(tmp, `${spec.name}-schema.jsonl`)]);
      cat.db.pragma("journal_mode = DELETE");
    } finally {
      cat.close();
    }
    try {
      renameSync(tmp, folder);
    } catch {
      // another process renamed an identical build into place first
    }
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
  if (!existsSync(db)) throw new TiepointError("eval/catalog", `cannot build the ${spec.name} catalog`, { file: folder });
  return { db, triples: src.triples };
}

/** Runs a tool's main: a TiepointError becomes its one line on stderr and exit status 1 (2 for bad usage). */
export function runTool(main: () => void | Promise<void>): void {
  const fail = (e: unknown) => {
    if (!(e instanceof TiepointError)) throw e;
    process.stderr.write(`${e.format()}\n`);
    process.exit(e.code === "cli/usage" ? 2 : 1);
  };
  try {
    const r = main();
    if (r instanceof Promise) r.catch(fail);
  } catch (e) {
    fail(e);
  }
}

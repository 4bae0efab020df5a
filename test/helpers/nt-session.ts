/**
 * A small N-Triples catalog asked through the real pipeline, with gold from an independent
 * engine: the triples and a JSONL schema are written to a temporary folder, loaded through the
 * real `loadFiles` into a fresh SQLite file and opened as a Session; `gold` runs a SPARQL
 * SELECT over the same triples in oxigraph (npm `oxigraph`, src/eval/question-set.ts
 * `goldStore`) and returns the first column's values, sorted.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Catalog, loadFiles } from "../../src/catalog/index.js";
import { goldStore } from "../../src/eval/question-set.js";
import { Session } from "../../src/pipeline/index.js";

/** An open catalog of {@link openNtSession}. */
export interface NtSession {
  readonly session: Session;
  /** The first column of a SPARQL SELECT over the same triples (`PREFIX : <base>` declared), sorted. */
  readonly gold: (sparql: string) => string[];
  /** Closes the session and removes the folder. */
  readonly close: () => void;
}

/** Loads `nt` and `schema` (JSONL, may be empty) into a catalog in a new temporary folder named after `tag`. */
export function openNtSession(tag: string, nt: string, schema: string, base: string): NtSession {
  const dir = mkdtempSync(join(tmpdir(), `tiepoint-${tag}-`));
  try {
    writeFileSync(join(dir, `${tag}.nt`), nt);
    writeFileSync(join(dir, `${tag}-schema.jsonl`), schema);
    const db = join(dir, "catalog.db");
    const cat = Catalog.open(db, { create: true });
    try {
      loadFiles(cat, [join(dir, `${tag}.nt`), join(dir, `${tag}-schema.jsonl`)]);
    } finally {
      cat.close();
    }
    const session = Session.open({ db });
    const store = goldStore(nt);
    const gold = (sparql: string): string[] => {
      const r = store.query(`PREFIX : <${base}>\n${sparql}`);
      if (typeof r === "boolean") throw new Error("not a SELECT");
      return [...r].map((row) => [...row.values()][0]!.value).sort();
    };
    return {
      session,
      gold,
      close: () => {
        session.close();
        rmSync(dir, { recursive: true, force: true });
      },
    };
  } catch (e) {
    rmSync(dir, { recursive: true, force: true });
    throw e;
  }
}

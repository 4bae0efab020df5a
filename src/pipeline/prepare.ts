/**
 * Question indexes prepared during a load
 * =======================================
 *
 * A {@link LoadSink} that builds the two files a question process opens — the relation index
 * snapshot `PATH.idx` (ranking/snapshot.ts, with its walk tables) and the name index
 * `PATH.link` (linking/lexical-snapshot.ts) — from the rows a load into an empty catalog
 * writes, instead of reading the finished catalog back: edges, types and subtype pairs go to
 * ranking's `IndexBuilder` (radix sorted into the index's canonical order at the end), alias
 * rows and entity texts to linking's `LexicalBuilder` (term statistics computed as the texts
 * arrive). Both give, byte for byte, the files the read-back path builds (test/prepare.test.ts).
 *
 * Before vouching for the files it checks that the distinct edges it saw are exactly the
 * catalog's edge rows (a count, read inside the load's transaction); a mismatch (a write path
 * it was not told about) leaves preparation to the read-back path after the commit.
 */
import { renameSync, unlinkSync } from "node:fs";
import type { Catalog, LoadSink, PreparedFiles } from "../catalog/index.js";
import { LexicalSnapshot } from "../linking/index.js";
import { IndexBuilder, snapshotPath, writeSnapshotTemp } from "../ranking/index.js";

/** A progress note while the files are built (for a line on stderr). */
export type PrepareProgressFn = (message: string) => void;

function remove(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    /* already gone */
  }
}

/** Builds `PATH.idx` and `PATH.link` from the rows of a load (see the file header). */
export class LoadPreparation implements LoadSink {
  private readonly index = new IndexBuilder();
  private readonly lexical = LexicalSnapshot.builder();
  private readonly onProgress: PrepareProgressFn | undefined;
  /** Why the files were not built (after `finish` returned undefined), for the caller's message. */
  reason: string | undefined;
  /** Milliseconds spent in `finish`, and per step of it. */
  finishMs = 0;
  readonly stepMs: Record<string, number> = {};

  constructor(onProgress?: PrepareProgressFn) {
    this.onProgress = onProgress;
  }

  edge(src: number, rel: number, dst: number): void {
    this.index.edge(src, rel, dst);
  }

  type(entity: number, type: number): void {
    this.index.type(entity, type);
  }

  subclass(sub: number, sup: number): void {
    this.index.subclass(sub, sup);
  }

  alias(entity: number, norm: string, stem: string): void {
    this.lexical.alias(entity, norm, stem);
  }

  label(entity: number, text: string): void {
    this.lexical.label(entity, text);
  }

  description(entity: number, text: string): void {
    this.lexical.description(entity, text);
  }

  removed(entity: number): void {
    this.index.remove(entity);
    this.lexical.remove(entity);
  }

  abort(): void {
    this.reason ??= "the catalog was not empty when the load began";
  }

  finish(cat: Catalog, stamp: { readonly uid: string; readonly generation: number }): PreparedFiles | undefined {
    const t0 = performance.now();
    if (cat.path === ":memory:" || cat.path === "") {
      this.reason = "an in-memory catalog keeps no index files";
      return undefined;
    }
    const temps: string[] = [];
    let last = t0;
    const step = (name: string) => {
      const now = performance.now();
      this.stepMs[name] = now - last;
      last = now;
    };
    try {
      this.onProgress?.(`sorting ${this.index.edgeRows.toLocaleString("en-US")} edges`);
      const { index, edges } = this.index.build(cat.maxEntityNum(), cat.maxPredicateNum());
      step("sort");
      const rows = (cat.db.prepare("SELECT count(*) AS n FROM edge").get() as { n: number }).n;
      if (rows !== edges) {
        this.reason = `the load's rows (${edges} edges) do not match the catalog (${rows} edge rows)`;
        return undefined;
      }
      const entityCount = (cat.db.prepare("SELECT count(*) AS n FROM entity").get() as { n: number }).n;
      step("count");
      this.onProgress?.("writing the relation index");
      const idx = snapshotPath(cat.path);
      temps.push(writeSnapshotTemp(idx, index, stamp));
      step("relationIndex");
      this.onProgress?.("writing the name index");
      const degree = new Int32Array(index.nodeCount);
      for (let u = 0; u < degree.length; u++) degree[u] = index.degree(u);
      const link = LexicalSnapshot.pathFor(cat.path);
      temps.push(LexicalSnapshot.fromParts(stamp.uid, stamp.generation, this.lexical.finish(degree, entityCount)).saveTemp(link));
      step("nameIndex");
      const [idxTemp, linkTemp] = temps as [string, string];
      return {
        publish: () => {
          renameSync(idxTemp, idx);
          renameSync(linkTemp, link);
        },
        discard: () => temps.forEach(remove),
      };
    } catch (e) {
      temps.forEach(remove);
      this.reason = (e as Error).message;
      return undefined;
    } finally {
      this.finishMs = performance.now() - t0;
    }
  }
}

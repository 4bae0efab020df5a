/**
 * Question indexes prepared during a load
 * =======================================
 *
 * A {@link LoadSink} that builds the files a question process opens — the relation index
 * snapshot `PATH.idx` (ranking/snapshot.ts, with its walk tables), the name index
 * `PATH.link` (linking/lexical-snapshot.ts) and the numeric attribute columns `PATH.num`
 * (catalog/numeric-column.ts, read from the catalog inside the load's transaction, in the
 * load's thread) — from the rows a load into an empty catalog
 * writes, instead of reading the finished catalog back: edges, types and subtype pairs go to
 * ranking's `IndexBuilder` (radix sorted into the index's canonical order at the end), alias
 * rows and entity texts to linking's `LexicalBuilder` (term statistics computed as the texts
 * arrive). Both give, byte for byte, the files the read-back path builds (test/prepare.test.ts).
 *
 * Both builders run in a second thread (a `worker_threads` worker, prepare-worker.ts) once a
 * load is large enough to fill one batch of rows: the load's thread only packs the rows into
 * batches (edges as Int32 columns, transferred without copying; texts as arrays of strings)
 * and posts them, so tokenising and stemming the texts, sorting the edges and writing the
 * files use the machine's second core while the first parses, writes SQLite rows, builds
 * SQLite's indexes and commits. The load waits for the thread only when it publishes the
 * files after its commit (`Atomics.wait` on a shared flag). Smaller loads, and a build run
 * from the TypeScript sources (no compiled worker file), use the same builders in the load's
 * own thread — the same code either way, so the same bytes. When the files' rows are all in
 * (`rowsWritten`), the thread sorts the edges at once (index-builder.ts `presort`) while the
 * load's thread has SQLite build its indexes; the end-of-load removals are applied after.
 *
 * Built ahead: when the rows are all in (`rowsWritten`), the second thread builds both files
 * at once, from what the load's thread tells of the catalog the commit will give (largest
 * nums, entity count, stamp) and the entities the end-of-load step will remove — foreseen
 * here only when they are certain: entities named like a predicate that take no part in any
 * edge, type or subtype row (import/finish.ts removes exactly those; anything else, and unit
 * IRIs, leaves the build to `finish`). So the files are written while the load's thread
 * writes the edges, has SQLite build its indexes and commits, instead of after. `finish`
 * keeps them only when what happened is what was foreseen: the same nums, counts and stamp,
 * and exactly the foreseen removals after them (no other row); otherwise they are deleted
 * and the files built as before — the same function of the same rows either way.
 *
 * Before vouching for the files it checks that the distinct edges it saw are exactly the
 * catalog's edge rows (a count, read inside the load's transaction); a mismatch (a write path
 * it was not told about) leaves preparation to the read-back path after the commit.
 */
import { existsSync, renameSync, unlinkSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { numericColumnsPath, writeNumericColumnsTemp, type Catalog, type LoadSink, type PreparedFiles, type RowsWritten } from "../catalog/index.js";
import { LexicalSnapshot } from "../linking/index.js";
import { IndexBuilder, snapshotPath, writeSnapshotTemp } from "../ranking/index.js";

/** A progress note while the files are built (for a line on stderr). */
export type PrepareProgressFn = (message: string) => void;

/** Batch sizes and the thread's limits; all optional. */
export const DEFAULTS = {
  /** Edge, type and subtype rows per batch (a load that fills one starts the second thread). */
  indexBatch: 1 << 15,
  /** Name rows (aliases, labels, descriptions) per batch. */
  textBatch: 1 << 13,
  /** Longest wait for the second thread at publish, in milliseconds (then the files are not published). */
  waitMs: 30 * 60 * 1000,
  /** Bytes for the thread's result (a short JSON document). */
  resultBytes: 1 << 16,
};

/** Op codes of a batch of index rows (4 Int32 per row: code, a, b, c). */
const EDGE = 0;
const TYPE = 1;
const SUBCLASS = 2;
const REMOVED = 3;
/** Op codes of a batch of name rows (4 values per row: code, entity, text, stem). */
const ALIAS = 0;
const LABEL = 1;
const DESCRIPTION = 2;

/** What the builders need from the finished catalog (read inside the load's transaction). */
export interface PrepareInput {
  readonly maxEntity: number;
  readonly maxPredicate: number;
  /** The catalog's edge rows. */
  readonly edgeRows: number;
  readonly entityCount: number;
  /** The catalog file (the two files go beside it). */
  readonly path: string;
  readonly stamp: { readonly uid: string; readonly generation: number };
  /** Degrees for the name index when the edges are not in the load (an attached store's counts, pipeline/attach.ts). */
  readonly degrees?: Int32Array;
}

/**
 * The outcome of {@link PrepareCore.build}: `edges` the distinct edges indexed; `ahead` when
 * the files are the ones built when the rows were all in.
 */
export type PrepareOutput = { readonly ok: true; readonly temps: [string, string]; readonly edges: number; readonly ahead?: boolean; readonly stepMs: Record<string, number>; readonly ms: number } | { readonly ok: false; readonly reason: string; readonly stepMs: Record<string, number>; readonly ms: number };

/** What the load's thread knows when the rows are all in (load-sink.ts `RowsWritten`), for the build ahead. */
export interface AheadInput {
  /** The input `finish` is expected to give, `edgeRows` not known yet (−1). */
  readonly input: PrepareInput;
  readonly candidates: readonly number[];
  readonly onlyCandidates: boolean;
}

/** A build ahead and the rows that arrived after it. */
interface Ahead {
  readonly input: PrepareInput;
  readonly removed: ReadonlySet<number>;
  readonly output: PrepareOutput;
  readonly indexRemoved: Set<number>;
  readonly textRemoved: Set<number>;
  other: boolean;
}

const sameSet = (a: ReadonlySet<number>, b: ReadonlySet<number>): boolean => a.size === b.size && [...a].every((x) => b.has(x));

/** True when two inputs give the same files (the edge count is only checked). */
function sameInput(a: PrepareInput, b: PrepareInput): boolean {
  return a.maxEntity === b.maxEntity && a.maxPredicate === b.maxPredicate && a.entityCount === b.entityCount && a.path === b.path && a.stamp.uid === b.stamp.uid && a.stamp.generation === b.stamp.generation && a.degrees === undefined && b.degrees === undefined;
}

function remove(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    /* already gone */
  }
}

function edgeMismatch(edges: number, rows: number): string {
  return `the load's rows (${edges} edges) do not match the catalog (${rows} edge rows)`;
}

/** The two builders, fed batches of rows (in the load's thread or in the second one). @internal */
export class PrepareCore {
  private readonly index = new IndexBuilder();
  private readonly lexical = LexicalSnapshot.builder();

  /** The build ahead, while `finish` has not come (see the file header). */
  private ahead: Ahead | undefined;

  /** Applies `n` rows of an index batch. */
  indexRows(batch: Int32Array, n: number): void {
    const index = this.index;
    const ahead = this.ahead;
    for (let i = 0; i < 4 * n; i += 4) {
      const code = batch[i]!;
      if (ahead !== undefined) {
        if (code === REMOVED) ahead.indexRemoved.add(batch[i + 1]!);
        else ahead.other = true;
      }
      if (code === EDGE) index.edge(batch[i + 1]!, batch[i + 2]!, batch[i + 3]!);
      else if (code === TYPE) index.type(batch[i + 1]!, batch[i + 2]!);
      else if (code === SUBCLASS) index.subclass(batch[i + 1]!, batch[i + 2]!);
      else index.remove(batch[i + 1]!);
    }
  }

  /** Applies the rows of a name batch. */
  textRows(batch: readonly unknown[]): void {
    const lexical = this.lexical;
    const ahead = this.ahead;
    for (let i = 0; i < batch.length; i += 4) {
      const code = batch[i] as number;
      const entity = batch[i + 1] as number;
      if (ahead !== undefined) {
        if (code === REMOVED) ahead.textRemoved.add(entity);
        else ahead.other = true;
      }
      if (code === ALIAS) lexical.alias(entity, batch[i + 2] as string, batch[i + 3] as string);
      else if (code === LABEL) lexical.label(entity, batch[i + 2] as string);
      else if (code === DESCRIPTION) lexical.description(entity, batch[i + 2] as string);
      else lexical.remove(entity);
    }
  }

  /** Sorts the edges collected so far (index-builder.ts `presort`): the load's rows are all in. */
  presort(): void {
    this.index.presort();
  }

  /**
   * Builds both files now, when the rows are all in, from what `ahead` foresees (see the file
   * header); does nothing when the end-of-load removals cannot be foreseen.
   */
  buildAhead(ahead: AheadInput): void {
    if (!ahead.onlyCandidates) return;
    // a candidate in some edge, type or subtype row: whether it stays depends on its relations
    if (this.index.touches(ahead.candidates).some((t) => t)) return;
    const removed = new Set(ahead.candidates);
    let maxEntity = ahead.input.maxEntity;
    if (removed.has(maxEntity)) {
      // the largest num goes: the next largest is known when the nums are 1 … n without a gap
      if (maxEntity !== ahead.input.entityCount) return;
      while (removed.has(maxEntity)) maxEntity--;
    }
    for (const e of removed) {
      this.index.remove(e);
      this.lexical.remove(e);
    }
    const input: PrepareInput = { ...ahead.input, maxEntity, entityCount: ahead.input.entityCount - removed.size, edgeRows: -1 };
    const output = this.buildNow(input);
    this.ahead = { input, removed, output, indexRemoved: new Set(), textRemoved: new Set(), other: false };
  }

  /** Deletes the files built ahead (the load failed). */
  discardAhead(): void {
    if (this.ahead?.output.ok) this.ahead.output.temps.forEach(remove);
    this.ahead = undefined;
  }

  /**
   * Builds both files under temporary names beside the catalog — or takes the ones built
   * ahead, when what happened since is what was foreseen.
   */
  build(input: PrepareInput, onProgress?: PrepareProgressFn): PrepareOutput {
    const ahead = this.ahead;
    this.ahead = undefined;
    if (ahead !== undefined) {
      const out = ahead.output;
      if (out.ok && !ahead.other && sameSet(ahead.indexRemoved, ahead.removed) && sameSet(ahead.textRemoved, ahead.removed) && sameInput(ahead.input, input)) {
        if (out.edges === input.edgeRows) return { ...out, ahead: true };
        out.temps.forEach(remove);
        return { ok: false, reason: edgeMismatch(out.edges, input.edgeRows), stepMs: out.stepMs, ms: out.ms };
      }
      if (out.ok) out.temps.forEach(remove);
      // the builders hold the foreseen removals: a build now is right only when they all happened
      for (const e of ahead.removed) {
        if (!ahead.indexRemoved.has(e) || !ahead.textRemoved.has(e)) return { ok: false, reason: `entity ${e} was foreseen to be removed at the end of the load, and was not`, stepMs: {}, ms: 0 };
      }
    }
    return this.buildNow(input, onProgress);
  }

  /** Builds both files under temporary names beside the catalog (`input.edgeRows` −1: the edge count is not checked). */
  private buildNow(input: PrepareInput, onProgress?: PrepareProgressFn): PrepareOutput {
    const t0 = performance.now();
    const stepMs: Record<string, number> = {};
    const temps: string[] = [];
    let last = t0;
    const step = (name: string) => {
      const now = performance.now();
      stepMs[name] = now - last;
      last = now;
    };
    try {
      onProgress?.(`sorting ${this.index.edgeRows.toLocaleString("en-US")} edges`);
      const { index, edges } = this.index.build(input.maxEntity, input.maxPredicate);
      step("sort");
      if (input.edgeRows >= 0 && edges !== input.edgeRows) return { ok: false, reason: edgeMismatch(edges, input.edgeRows), stepMs, ms: performance.now() - t0 };
      onProgress?.("writing the relation index");
      temps.push(writeSnapshotTemp(snapshotPath(input.path), index, input.stamp));
      step("relationIndex");
      onProgress?.("writing the name index");
      let degree = new Int32Array(index.nodeCount);
      if (input.degrees) degree.set(input.degrees.subarray(0, degree.length));
      else for (let u = 0; u < degree.length; u++) degree[u] = index.degree(u);
      const parts = this.lexical.finish(degree, input.entityCount);
      temps.push(LexicalSnapshot.fromParts(input.stamp.uid, input.stamp.generation, parts).saveTemp(LexicalSnapshot.pathFor(input.path)));
      step("nameIndex");
      return { ok: true, temps: temps as [string, string], edges, stepMs, ms: performance.now() - t0 };
    } catch (e) {
      temps.forEach(remove);
      return { ok: false, reason: (e as Error).message, stepMs, ms: performance.now() - t0 };
    }
  }
}

/** The compiled second-thread entry beside this file (absent when run from the TypeScript sources). */
const WORKER_URL = new URL("./prepare-worker.js", import.meta.url);

/** The second thread and the shared flag it sets when its result is written. */
interface Thread {
  readonly worker: Worker;
  /** [0]: 0 = working, 1 = result written; [1]: result length in bytes (after 8 bytes). */
  readonly flag: Int32Array;
  readonly result: Uint8Array;
}

/** Builds `PATH.idx` and `PATH.link` from the rows of a load (see the file header). */
export class LoadPreparation implements LoadSink {
  private readonly onProgress: PrepareProgressFn | undefined;
  private readonly useThread: boolean;
  private core: PrepareCore | undefined;
  private thread: Thread | undefined;
  private indexBatch = new Int32Array(4 * DEFAULTS.indexBatch);
  private indexN = 0;
  private textBatch: unknown[] = [];
  private output: PrepareOutput | undefined;
  /** Why the files were not built (after `finish` returned undefined, or publishing failed), for the caller's message. */
  reason: string | undefined;
  /** Milliseconds spent building the files (in whichever thread built them), and per step of it. */
  finishMs = 0;
  stepMs: Record<string, number> = {};
  /** Milliseconds the load waited for the second thread after its commit (0 without one). */
  waitMs = 0;
  /** True when the second thread built the files. */
  threaded = false;
  /** True when the files published are the ones built when the rows were all in (see the file header). */
  builtAhead = false;
  /** Build the files when the rows are all in (default: when a second thread builds them). */
  private readonly aheadOption: boolean | undefined;
  /** True once a build ahead may have started (a failed load then waits for it, to delete its files). */
  private aheadStarted = false;

  /**
   * @param options.thread use a second thread for loads that fill a batch (default true;
   *   false keeps every step in the load's thread)
   */
  /** Degrees for the name index when the edges are not in the load (an attached store's counts, pipeline/attach.ts). */
  private readonly degrees: ((cat: Catalog, nodeCount: number) => Int32Array) | undefined;

  constructor(onProgress?: PrepareProgressFn, options: { thread?: boolean; readonly degrees?: (cat: Catalog, nodeCount: number) => Int32Array; readonly ahead?: boolean } = {}) {
    this.onProgress = onProgress;
    this.degrees = options.degrees;
    this.aheadOption = options.ahead;
    this.useThread = options.thread !== false && existsSync(fileURLToPath(WORKER_URL));
  }

  edge(src: number, rel: number, dst: number): void {
    this.indexRow(EDGE, src, rel, dst);
  }

  type(entity: number, type: number): void {
    this.indexRow(TYPE, entity, type, 0);
  }

  subclass(sub: number, sup: number): void {
    this.indexRow(SUBCLASS, sub, sup, 0);
  }

  alias(entity: number, norm: string, stem: string): void {
    this.textRow(ALIAS, entity, norm, stem);
  }

  label(entity: number, text: string): void {
    this.textRow(LABEL, entity, text, null);
  }

  description(entity: number, text: string): void {
    this.textRow(DESCRIPTION, entity, text, null);
  }

  removed(entity: number): void {
    this.indexRow(REMOVED, entity, 0, 0);
    this.textRow(REMOVED, entity, null, null);
  }

  rowsWritten(at: RowsWritten): void {
    this.sendIndex(false);
    this.sendText(false);
    const onDisk = at.path !== ":memory:" && at.path !== "";
    const wanted = this.aheadOption ?? this.thread !== undefined;
    const ahead: AheadInput | undefined =
      onDisk && wanted && this.degrees === undefined
        ? { input: { maxEntity: at.maxEntity, maxPredicate: at.maxPredicate, edgeRows: -1, entityCount: at.entityCount, path: at.path, stamp: { uid: at.stamp.uid, generation: at.stamp.generation } }, candidates: [...at.candidates], onlyCandidates: at.onlyCandidates }
        : undefined;
    this.aheadStarted = ahead !== undefined;
    if (this.thread) this.thread.worker.postMessage({ presort: true, ahead });
    else {
      const core = (this.core ??= new PrepareCore());
      core.presort();
      if (ahead) core.buildAhead(ahead);
    }
  }

  abort(): void {
    this.reason ??= "the catalog was not empty when the load began";
    if (this.aheadStarted) {
      // files built ahead are deleted before the failed load returns
      this.aheadStarted = false;
      if (this.thread && this.output === undefined) {
        this.thread.worker.postMessage({ discard: true });
        this.await(this.thread);
      }
      this.core?.discardAhead();
    }
    this.stop();
  }

  private indexRow(code: number, a: number, b: number, c: number): void {
    const i = 4 * this.indexN++;
    const batch = this.indexBatch;
    batch[i] = code;
    batch[i + 1] = a;
    batch[i + 2] = b;
    batch[i + 3] = c;
    if (this.indexN === DEFAULTS.indexBatch) this.sendIndex(true);
  }

  private textRow(code: number, entity: number, text: string | null, stem: string | null): void {
    const batch = this.textBatch;
    batch.push(code, entity, text, stem);
    if (batch.length === 4 * DEFAULTS.textBatch) this.sendText(true);
  }

  /** Where full batches go: the second thread once one fills (when it can run), else this thread's builders. */
  private target(full: boolean): Thread | PrepareCore {
    if (this.thread) return this.thread;
    if (this.core) return this.core;
    if (full && this.useThread) {
      const flag = new Int32Array(new SharedArrayBuffer(8));
      const shared = new SharedArrayBuffer(DEFAULTS.resultBytes);
      const worker = new Worker(WORKER_URL, { workerData: { flag: flag.buffer, result: shared } });
      worker.unref();
      this.thread = { worker, flag, result: new Uint8Array(shared) };
      this.threaded = true;
      return this.thread;
    }
    this.core = new PrepareCore();
    return this.core;
  }

  private sendIndex(full: boolean): void {
    const n = this.indexN;
    if (n === 0) return;
    const to = this.target(full);
    if (to instanceof PrepareCore) to.indexRows(this.indexBatch, n);
    else {
      const batch = n === DEFAULTS.indexBatch ? this.indexBatch : this.indexBatch.slice(0, 4 * n);
      to.worker.postMessage({ index: batch }, [batch.buffer]);
      if (batch === this.indexBatch) this.indexBatch = new Int32Array(4 * DEFAULTS.indexBatch);
    }
    this.indexN = 0;
  }

  private sendText(full: boolean): void {
    if (this.textBatch.length === 0) return;
    const to = this.target(full);
    if (to instanceof PrepareCore) to.textRows(this.textBatch);
    else to.worker.postMessage({ text: this.textBatch });
    this.textBatch = [];
  }

  /** The second thread's result, waiting for it (at most `DEFAULTS.waitMs`). */
  private await(thread: Thread): PrepareOutput {
    if (this.output) return this.output;
    const t0 = performance.now();
    while (Atomics.load(thread.flag, 0) === 0 && performance.now() - t0 < DEFAULTS.waitMs) Atomics.wait(thread.flag, 0, 0, 1000);
    this.waitMs = performance.now() - t0;
    if (Atomics.load(thread.flag, 0) === 0) this.output = { ok: false, reason: "the second thread did not finish the question indexes in time", stepMs: {}, ms: this.waitMs };
    else this.output = JSON.parse(Buffer.from(thread.result.buffer, 0, Atomics.load(thread.flag, 1)).toString("utf8")) as PrepareOutput;
    this.stop();
    return this.output;
  }

  private stop(): void {
    if (this.thread) void this.thread.worker.terminate();
    this.thread = undefined;
  }

  /** Takes a build's outcome: the files to publish, or undefined with the reason. */
  private adopt(out: PrepareOutput): [string, string] | undefined {
    this.finishMs = out.ms;
    this.stepMs = out.stepMs;
    this.aheadStarted = false;
    if (out.ok) {
      this.builtAhead = out.ahead === true;
      return out.temps;
    }
    this.reason = out.reason;
    return undefined;
  }

  finish(cat: Catalog, stamp: { readonly uid: string; readonly generation: number }): PreparedFiles | undefined {
    if (cat.path === ":memory:" || cat.path === "") {
      this.reason = "an in-memory catalog keeps no index files";
      this.stop();
      return undefined;
    }
    const count = (table: string) => (cat.db.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;
    const input: PrepareInput = { maxEntity: cat.maxEntityNum(), maxPredicate: cat.maxPredicateNum(), edgeRows: count("edge"), entityCount: count("entity"), path: cat.path, stamp: { uid: stamp.uid, generation: stamp.generation }, ...(this.degrees ? { degrees: this.degrees(cat, cat.maxEntityNum() + 1) } : {}) };
    this.sendIndex(false);
    this.sendText(false);
    const thread = this.thread;
    // the numeric attribute columns (catalog numeric-column.ts), read in this thread inside the load's transaction
    const columns = () => writeNumericColumnsTemp(cat, cat.path, stamp);
    if (thread === undefined) {
      const numTemp = columns();
      const temps = this.adopt((this.core ?? new PrepareCore()).build(input, this.onProgress));
      this.core = undefined;
      if (temps === undefined) {
        remove(numTemp);
        return undefined;
      }
      return { publish: () => this.publish(cat.path, temps, numTemp), discard: () => [...temps, numTemp].forEach(remove) };
    }
    this.onProgress?.("building the question indexes in a second thread");
    thread.worker.postMessage({ finish: input });
    // (while the second thread builds the other files)
    const numTemp = columns();
    const built = () => this.adopt(this.await(thread));
    const path = cat.path;
    return {
      publish: () => {
        const temps = built();
        if (temps === undefined) {
          remove(numTemp);
          throw new Error(this.reason);
        }
        this.publish(path, temps, numTemp);
      },
      discard: () => [...(built() ?? []), numTemp].forEach(remove),
    };
  }

  /** Moves the temporary files over the catalog's `PATH.idx`, `PATH.link` and `PATH.num`. */
  private publish(path: string, [idxTemp, linkTemp]: [string, string], numTemp: string): void {
    renameSync(idxTemp, snapshotPath(path));
    renameSync(linkTemp, LexicalSnapshot.pathFor(path));
    renameSync(numTemp, numericColumnsPath(path));
  }
}

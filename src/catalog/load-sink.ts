/**
 * `LoadSink`: what a load hands, row by row, to whoever prepares derived files from it (the
 * question indexes: relation index and name index, built in src/pipeline, which the catalog
 * stage does not import). The writer calls it with every row it writes into a catalog that
 * was empty when the load began (or emptied by `--replace`), in the nums the rows are stored
 * under, duplicates included; the end-of-load steps report the entities they remove. Before
 * the commit `finish` builds the derived files under temporary names; after the commit they
 * are published (renamed into place), on any error discarded, so a load's files land together
 * or not at all.
 */
import type { Catalog } from "./store.js";

/** Files built by {@link LoadSink.finish}, waiting for the commit. */
export interface PreparedFiles {
  /** Moves the files into place (after the commit). */
  publish(): void;
  /** Deletes the temporary files (after a rollback, or when they are not wanted). */
  discard(): void;
}

/**
 * The catalog as it stands when a load's rows are all written (entity rows written, edges
 * perhaps still held), and which entities the end-of-load steps may remove.
 */
export interface RowsWritten {
  /** The catalog file. */
  readonly path: string;
  /** The largest entity and predicate nums, and the number of entity rows, now. */
  readonly maxEntity: number;
  readonly maxPredicate: number;
  readonly entityCount: number;
  /** The catalog stamp the commit will give. */
  readonly stamp: { readonly uid: string; readonly generation: number };
  /**
   * Entities whose id is also a predicate's (RDF loads): the end-of-load step removes those
   * that take no part in the graph (import/finish.ts); no other entity is removed when
   * `onlyCandidates` holds.
   */
  readonly candidates: readonly number[];
  /** False when other entities may be removed too (unit IRIs, writer.ts `writeUnits`). */
  readonly onlyCandidates: boolean;
}

/** Receives the rows of a load into an empty catalog. */
export interface LoadSink {
  /** A relation edge (entity, predicate, entity nums). */
  edge(src: number, rel: number, dst: number): void;
  /** A direct type of an entity. */
  type(entity: number, type: number): void;
  /** A subtype pair. */
  subclass(sub: number, sup: number): void;
  /** A label or alias row of an entity: its normalised and stemmed forms. */
  alias(entity: number, norm: string, stem: string): void;
  /** The entity's label column is now `text`. */
  label(entity: number, text: string): void;
  /** The entity's description column is now `text`. */
  description(entity: number, text: string): void;
  /** The entity row was deleted, with its edges, aliases, types and attributes. */
  removed(entity: number): void;
  /**
   * The files' rows are all written; the end-of-load steps follow (SQLite's indexes, then
   * fix-ups that may still remove entities): a sink may start work now, from what `ahead`
   * tells of the catalog the commit will give, and check at `finish` that it came true.
   */
  rowsWritten?(ahead: RowsWritten): void;
  /**
   * Called inside the transaction after the last write: builds the derived files for the
   * catalog stamp the commit will give (`uid`, `generation`) under temporary names. Returns
   * undefined when it cannot vouch for them (the rows it saw do not match the tables).
   */
  finish(cat: Catalog, stamp: { readonly uid: string; readonly generation: number }): PreparedFiles | undefined;
  /** The load failed or was not into an empty catalog: nothing will be built. */
  abort(): void;
}

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
   * fix-ups that may still remove entities): a sink may start work that does not depend on
   * those removals.
   */
  rowsWritten?(): void;
  /**
   * Called inside the transaction after the last write: builds the derived files for the
   * catalog stamp the commit will give (`uid`, `generation`) under temporary names. Returns
   * undefined when it cannot vouch for them (the rows it saw do not match the tables).
   */
  finish(cat: Catalog, stamp: { readonly uid: string; readonly generation: number }): PreparedFiles | undefined;
  /** The load failed or was not into an empty catalog: nothing will be built. */
  abort(): void;
}

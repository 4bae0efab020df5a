/**
 * Where a session's relation edges come from: one interface, two implementations
 * ==============================================================================
 *
 * Everything above the data access — linking, reading, ranking, explanation, verdict,
 * compose, the entity card — runs the same code for every catalog. What differs is only
 * where the relation edges are read from:
 *
 * - {@link LocalEdges}: a loaded catalog holds every edge in its own file; its relation index
 *   (opened once per session) is the one every question reads, and nothing is fetched;
 * - `StoreEdges` (store-edges.ts): an attached catalog's edges stay in its SPARQL store; per
 *   question (or per compose target, or per card) the neighbourhood that the stages read is
 *   pulled in a few batched requests into a relation index of its own.
 *
 * Callers ask through {@link EdgeAccess} only (Session.askAsync, Session.around), so a
 * command works on both kinds of catalog by construction.
 */
import type { Pin, Linker } from "../linking/index.js";
import type { RelationIndex } from "../ranking/index.js";
import type { AskResult } from "../model/index.js";
import type { QueryGraph } from "../analysis/index.js";

/** What one question's run returns (the part the edge access reads and amends). */
export interface QuestionRun {
  readonly result: AskResult;
  readonly timings: { readonly total: number };
  /** The question's reading (query graph): an attached catalog sends it to its store for the exact matches. */
  readonly reading?: QueryGraph;
}

/** What a session gives its edge access: the catalog-wide relation index (types, degrees), the linker, and the reading of a question without ranking it. */
export interface EdgeContext {
  readonly index: RelationIndex;
  readonly linker: Linker;
  readingOf?(question: string, pins: readonly Pin[] | undefined): QueryGraph;
}

/** Counts of the relation edges, for `stats` and titles. */
export interface EdgeCounts {
  /** All relation edges. */
  readonly edges: number;
  /** Degree (edges in + out) per entity num. */
  readonly degree: ArrayLike<number>;
  /** Edges per relation (predicate num). */
  readonly relationEdges: ArrayLike<number>;
}

/** Where an attached catalog's edges live (no credentials). */
export interface StoreDescription {
  /** The endpoint URL as shown (no user info, no query string). */
  readonly endpoint: string;
  readonly graph: string | null;
  /** ISO time of the attach (or the last refresh). */
  readonly attachedAt: string;
}

/** The relation edges of a session's catalog. */
export interface EdgeAccess {
  /** The attached store, or undefined for a loaded catalog. */
  readonly store: StoreDescription | undefined;
  /** Runs one question on a relation index that holds every edge the question reads (`run` is the session's own pipeline). */
  forQuestion<O extends QuestionRun>(ctx: EdgeContext, question: string, pins: readonly Pin[] | undefined, run: (index: RelationIndex) => O): Promise<O>;
  /** A relation index holding the rows of `nums` and of `rings` rings of neighbours around them (hubs not expanded); the catalog's `edge` reads see the same rows until the next call. */
  around(ctx: EdgeContext, nums: readonly number[], rings: number): Promise<RelationIndex>;
  /** Edge counts, or undefined when the catalog's own edge table is to be counted. */
  counts(): EdgeCounts | undefined;
}

/** A loaded catalog: its edges are in the file, its relation index is read as is. */
export class LocalEdges implements EdgeAccess {
  readonly store = undefined;

  forQuestion<O extends QuestionRun>(ctx: EdgeContext, _question: string, _pins: readonly Pin[] | undefined, run: (index: RelationIndex) => O): Promise<O> {
    return Promise.resolve(run(ctx.index));
  }

  around(ctx: EdgeContext): Promise<RelationIndex> {
    return Promise.resolve(ctx.index);
  }

  counts(): undefined {
    return undefined;
  }
}

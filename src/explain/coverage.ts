/**
 * Clue-coverage table
 * ===================
 *
 * The top answers against the clues: each cell holds the hop count and the relations of the
 * best path from that clue to that answer, or "not reached within N hops". A row whose cells
 * are all reached is an answer that every clue supports.
 *
 * [Reference] A plain tabulation of the paths found in paths.ts (common practice); nothing
 * is estimated here.
 */
import type { EntityRef } from "../model/index.js";
import type { AnswerPaths } from "./paths.js";

/** A relation as shown in a cell: id, label and the walking direction. */
export interface CellRelation {
  readonly id: string;
  readonly label: string;
  /** True when walked against the stored direction. */
  readonly inverse: boolean;
}

/** One cell: the best path of one clue to one answer. */
export interface CoverageCell {
  /** True when a path of at most `maxHops` hops was found. */
  readonly reached: boolean;
  /** Hops of the best path (null when not reached). */
  readonly hops: number | null;
  /** Relations along the best path, in walking order (empty when not reached). */
  readonly relations: readonly CellRelation[];
  /** Path cost of the best path (Infinity when not reached). */
  readonly cost: number;
}

/** One row: an answer and its cells in clue order. */
export interface CoverageRow {
  readonly answer: EntityRef;
  readonly cells: readonly CoverageCell[];
  /** How many clues reach this answer. */
  readonly reachedBy: number;
}

/** The table: clues (columns), answers (rows, best first) and the hop bound. */
export interface CoverageTable {
  readonly clues: readonly EntityRef[];
  readonly rows: readonly CoverageRow[];
  /** The N of "not reached within N hops". */
  readonly maxHops: number;
}

/** Builds the coverage table from the found paths. */
export function coverageTable(
  clues: readonly EntityRef[],
  answers: readonly AnswerPaths[],
  answerRef: (num: number) => EntityRef,
  relationRef: (rel: number) => EntityRef,
  maxHops: number,
): CoverageTable {
  const rows = answers.map((a): CoverageRow => {
    const cells = a.byClue.map((paths): CoverageCell => {
      const best = paths[0];
      if (!best) return { reached: false, hops: null, relations: [], cost: Infinity };
      return {
        reached: true,
        hops: best.steps.length,
        relations: best.steps.map((s) => ({ ...relationRef(s.rel), inverse: s.inverse })),
        cost: best.cost,
      };
    });
    return { answer: answerRef(a.answer), cells, reachedBy: cells.filter((c) => c.reached).length };
  });
  return { clues, rows, maxHops };
}

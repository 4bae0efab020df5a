/**
 * The shapes explain reads from earlier stages, stated structurally so the explain stage
 * depends only on the fields it uses (ranking's `RelationIndex`, `Ranked` and analysis's
 * `Analysis` satisfy them as they are).
 */

/** The walkable relation graph (ranking's `RelationIndex` is one). */
export interface WalkGraph {
  /** Number of node ids (entity nums are 1..nodeCount-1). */
  readonly nodeCount: number;
  /** Adjacency entries at `u`, both directions. */
  degree(u: number): number;
  /** Every adjacency entry of `u`; `inverse` is true when the stored triple is `v rel u`. */
  forEach(u: number, fn: (v: number, rel: number, inverse: boolean) => void): void;
  /** Direct type nums of `u`. */
  typesOf(u: number): readonly number[];
  /** True when `u` has a type in `typeSet` (directly or through supertypes). */
  isA(u: number, typeSet: ReadonlySet<number>): boolean;
}

/** A clue: a seed entity of the question (ranking's `Clue`). */
export interface ExplainClue {
  readonly node: number;
  readonly id: string;
  readonly label: string;
  readonly weight: number;
  /** Index into the analysis's mentions. */
  readonly mention: number;
}

/** A ranked candidate (ranking's `RankedCandidate`). */
export interface ExplainCandidate {
  readonly node: number;
  readonly score: number;
  /** Score part per clue, in clue order. */
  readonly perClue: readonly number[];
  /** Clues with a non-negligible score part. */
  readonly covered: number;
  /** The ranking's relation-path pattern factor (1: on every clue's pattern), when checked. */
  readonly chainFit?: number;
}

/** The relation-path pattern the ranking matched for one clue (ranking's `RankedPattern`). */
export interface ExplainPattern {
  /** Per hop: the allowed relations, each with its direction (true: against the stored triple); empty: any relation. */
  readonly hops: readonly (readonly { readonly relation: number; readonly inverse: boolean }[])[];
  /** Per hop: the types the node it reaches must have (empty: any); the last hop reaches the answer, whose types are not checked. */
  readonly types: readonly (readonly number[])[];
  /** False when the hops' directions were not required. */
  readonly directed: boolean;
}

/** Ranking's output (`Ranked`): clues and candidates, best first. */
export interface ExplainRanked {
  readonly clues: readonly ExplainClue[];
  readonly candidates: readonly ExplainCandidate[];
  /** Per clue (same order as `clues`): the relation-path pattern of the reading that the ranking matched; undefined where none was. */
  readonly patterns?: readonly (ExplainPattern | undefined)[];
  /** Clues (indexes into `clues`) whose relation-path pattern was checked and misses `node`; absent when none was checked. */
  readonly chainMissOf?: (node: number) => readonly number[];
}

/** A relation cue of the question (analysis's `relationCues` entries). */
export interface ExplainRelationCue {
  readonly relation: number;
  readonly id: string;
  readonly weight: number;
  readonly words: readonly string[];
}

/** The parts of analysis's `Analysis` that explain reads. */
export interface ExplainAnalysis {
  readonly question: string;
  readonly answerTypes: readonly { readonly id: string; readonly label: string; readonly num: number }[];
  readonly relationCues: readonly ExplainRelationCue[];
  readonly clues: readonly ExplainClue[];
}

/**
 * The direct types found at each end of each relation, with counts: computed by the
 * relation index (ranking), read by question analysis to type the answer of a question whose
 * head noun names a relation. Shared here so both stages use one definition.
 */

/** One direct type at one end of a relation, and how many of its edges have it there. */
export interface RelationEnd {
  readonly type: number;
  readonly count: number;
}

/** Direct types at the ends of every relation. */
export interface RelationEnds {
  /** Types at the subject end (`object` false) or the object end of `rel`, most frequent first. */
  types(rel: number, object: boolean): readonly RelationEnd[];
  /** Stored edges of `rel`. */
  edges(rel: number): number;
}

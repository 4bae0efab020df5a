/**
 * Clue cost: what a clue costs a reader
 * =====================================
 *
 * The price of one clue about an answer, lower is better, from what makes a clue easy for a
 * player: an entity they have heard of (its salience percentile, ranking/salience.ts), a
 * short path to the answer (hops), a short name, and a name that points to one entity only.
 *
 *   cost = base + obscurity·(1 − fit) + hop·(hops − 1) + perWord·max(0, words − freeWords)
 *          + ambiguous·[label shared]
 *   fit  = 1 − |salience − (1 − difficulty)|
 *
 * With difficulty 0 (the default) fit is the salience itself (well-known clues are cheap);
 * with difficulty 1 it is 1 − salience (obscure clues are cheap); values between aim at the
 * middle. An attribute clue (a literal value, no entity) takes `attributeSalience`. The
 * `base` cost per clue makes fewer clues win (the "brevity" side of the trade-off).
 *
 * [Reference] Krahmer, van Erk & Verleg, "Graph-based generation of referring expressions",
 * Computational Linguistics 29(1), 2003 (a cost per property, the description of least total
 * cost wins); Dale & Reiter, "Computational interpretations of the Gricean maxims in the
 * generation of referring expressions", Cognitive Science 19(2), 1995 (preferred attributes
 * first). The weights are ours (common practice: a hop costs about half a clue).
 */

import { normalize } from "../catalog/index.js";

/** Defaults of {@link clueCost}. */
export const DEFAULTS = Object.freeze({
  /** Cost of any clue (fewer clues win). */
  base: 1,
  /** Weight of the clue entity's distance from the wanted salience. */
  obscurity: 1.5,
  /** Cost of each hop beyond the first (a chain through a described middle entity). */
  hop: 0.6,
  /** Cost per label word beyond `freeWords`. */
  perWord: 0.1,
  /** Label words that cost nothing. */
  freeWords: 3,
  /** Extra cost of a clue entity whose label other entities share (linking may pick another). */
  ambiguous: 1.5,
  /** The salience given to an attribute value (no entity to be known or not). */
  attributeSalience: 0.5,
  /** 0: well-known clues are cheap … 1: obscure clues are cheap. */
  difficulty: 0,
});

/** Options of {@link clueCost}; all optional (see {@link DEFAULTS}). */
export interface ClueCostOptions {
  readonly base?: number;
  readonly obscurity?: number;
  readonly hop?: number;
  readonly perWord?: number;
  readonly freeWords?: number;
  readonly ambiguous?: number;
  readonly attributeSalience?: number;
  /** In [0, 1]. @default 0 */
  readonly difficulty?: number;
}

/** What one clue is made of, for pricing. */
export interface ClueShape {
  /** Salience percentile of the named clue entity in [0, 1]; undefined for an attribute clue. */
  readonly salience?: number;
  /** Hops from the named entity (or the attribute) to the answer (1 = a direct fact). */
  readonly hops: number;
  /** The clue's own words (the named entity's label, or the attribute's label and value). */
  readonly label: string;
  /** True when the named entity's label names other entities too. */
  readonly ambiguous?: boolean;
}

/** The difficulty words of the CLI and their values. */
export const DIFFICULTIES: Readonly<Record<string, number>> = Object.freeze({ easy: 0, medium: 0.5, hard: 1 });

/** The cost of one clue (lower is better). */
export function clueCost(clue: ClueShape, options: ClueCostOptions = {}): number {
  const o = { ...DEFAULTS, ...options };
  if (!(o.difficulty >= 0 && o.difficulty <= 1)) throw new RangeError(`explain/clue-cost: difficulty must be in [0, 1], got ${String(o.difficulty)}`);
  const s = clue.salience ?? o.attributeSalience;
  const fit = 1 - Math.abs(s - (1 - o.difficulty));
  const words = clue.label.trim() === "" ? 0 : clue.label.trim().split(/\s+/).length;
  return o.base + o.obscurity * (1 - fit) + o.hop * Math.max(0, clue.hops - 1) + o.perWord * Math.max(0, words - o.freeWords) + (clue.ambiguous ? o.ambiguous : 0);
}

/**
 * True when a clue's words would give the answer away: `text`, read as lower-case words
 * (catalog normalisation), contains one of `names` (the answer's label and aliases) as a
 * run of whole words. Names without a letter or digit are ignored.
 */
export function givesAway(text: string, names: readonly string[]): boolean {
  const hay = ` ${normalize(text)} `;
  return names.some((n) => {
    const w = normalize(n);
    return w !== "" && hay.includes(` ${w} `);
  });
}

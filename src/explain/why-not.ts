/**
 * Why not this entity?
 * ====================
 *
 * For an entity the user expected: where it ranks, its score part per clue, which clues do
 * not reach it within N hops or reach it only through long paths (more hops than the best
 * answer's path from the same clue, or more than `longHops`), whether the expected answer
 * type excluded it, and whether it is itself a clue (clues are never their own answers).
 *
 * [Reference] A contrastive explanation ("why P rather than Q") in the sense of Lipton,
 * "Contrastive explanation", Royal Institute of Philosophy Supplement 27, 1990 (from memory);
 * every figure comes from the ranking and the paths, nothing is estimated here.
 */
import type { EntityRef } from "../model/index.js";
import type { CoverageCell } from "./coverage.js";

/** Options of why-not; all optional. */
export interface WhyNotOptions {
  /** A path with more hops than this counts as long. @default 3 */
  readonly longHops?: number;
}

/** The defaults of {@link WhyNotOptions}. */
export const DEFAULTS = { longHops: 3 } as const;

/** One clue's view of the entity. */
export interface WhyNotClue {
  readonly clue: EntityRef;
  /** Its score part for this clue (null when the ranking did not score it). */
  readonly score: number | null;
  /** The best answer's score part for this clue, for comparison. */
  readonly bestScore: number | null;
  /** The best path's cell (hops, relations) for the entity. */
  readonly cell: CoverageCell;
  /** True when not reached, or reached only through a long path. */
  readonly weak: boolean;
}

/** The why-not report of one entity. */
export interface WhyNot {
  readonly entity: EntityRef;
  /** 1-based rank among the ranked candidates, null when not among them. */
  readonly rank: number | null;
  readonly candidates: number;
  readonly score: number | null;
  /** The best answer, for comparison. */
  readonly best: EntityRef | null;
  readonly bestScore: number | null;
  readonly types: readonly EntityRef[];
  readonly expectedTypes: readonly EntityRef[];
  /** True when the expected answer type excluded it. */
  readonly excludedByType: boolean;
  /** True when it is itself one of the question's clues. */
  readonly isClue: boolean;
  readonly perClue: readonly WhyNotClue[];
  /** One line per finding, most important first. */
  readonly reasons: readonly string[];
}

/** What {@link whyNotFigures} reads: the ranking's candidates, the expected types and the type relation. */
export interface WhyNotSource {
  readonly candidates: readonly { readonly node: number; readonly score: number }[];
  readonly answerTypes: readonly { readonly num: number; readonly id: string; readonly label: string }[];
  typesOf(num: number): readonly number[];
  isA(num: number, types: ReadonlySet<number>): boolean;
  ref(num: number): EntityRef;
}

/** The ranking and type figures of a why-not report: everything but the per-clue view and the reasons. */
export function whyNotFigures(num: number, src: WhyNotSource, isClue: boolean): Omit<WhyNot, "reasons" | "perClue"> {
  const pos = src.candidates.findIndex((c) => c.node === num);
  const best = src.candidates[0];
  const typeSet = new Set(src.answerTypes.map((t) => t.num));
  return {
    entity: src.ref(num),
    rank: pos >= 0 ? pos + 1 : null,
    candidates: src.candidates.length,
    score: pos >= 0 ? src.candidates[pos]!.score : null,
    best: best ? src.ref(best.node) : null,
    bestScore: best ? best.score : null,
    types: src.typesOf(num).map((t) => src.ref(t)),
    expectedTypes: src.answerTypes.map((t) => ({ id: t.id, label: t.label })),
    excludedByType: typeSet.size > 0 && !src.isA(num, typeSet),
    isClue,
  };
}

/** Writes the reasons of a why-not report from its figures. */
export function whyNotReasons(r: Omit<WhyNot, "reasons">, maxHops: number, longHops: number): string[] {
  const out: string[] = [];
  const name = r.entity.label;
  if (r.isClue) out.push(`${name} is itself a clue of the question; clues are never their own answers`);
  if (r.excludedByType) {
    const exp = r.expectedTypes.map((t) => t.label).join(" or ");
    const has = r.types.length > 0 ? r.types.map((t) => t.label).join(", ") : "no type";
    out.push(`the question asks for ${exp}; ${name} is ${has}, so the type filter excluded it`);
  }
  if (r.rank === 1) out.push(`${name} is the best answer`);
  else if (r.rank !== null) out.push(`${name} ranks ${r.rank} of ${r.candidates} (score ${r.score?.toPrecision(3)} against ${r.bestScore?.toPrecision(3)} for ${r.best?.label})`);
  else if (!r.excludedByType && !r.isClue) out.push(`${name} is not among the ${r.candidates} ranked candidates`);
  for (const c of r.perClue) {
    // the entity itself as a clue is said above; a clue of the same name is told apart by ids
    if (c.clue.id === r.entity.id) continue;
    const twins = c.clue.label === name;
    const clue = twins ? `"${c.clue.label}" [${c.clue.id}]` : `"${c.clue.label}"`;
    const it = twins ? `${name} [${r.entity.id}]` : name;
    if (!c.cell.reached) out.push(`${clue} does not reach ${it} within ${maxHops} hops`);
    else if (c.weak) out.push(`${clue} reaches ${it} only through a long path (${c.cell.hops} hops${c.cell.hops! > longHops ? "" : ", longer than to the best answer"})`);
  }
  return out;
}

/**
 * Relation cues: the question's remaining content words matched to relation labels and
 * aliases, giving per-relation transition weights for this question.
 *
 * Method: token containment of Porter stems (Porter 1980) — the share of a relation
 * surface's content stems found among the question's content stems, an exact stem counting
 * 1 and a shared prefix of at least `prefixMin` letters (one stem a prefix of the other:
 * "carrier"/"carri(ed)") counting `partialCredit` — the best surface per relation. The
 * weight is a soft boost, `1 + boost × score`, so uncued relations keep weight 1 and are
 * still walked; each cue also records where it stands in the question and whether the voice
 * flips its direction (see {@link expectedInverse}) (lexical relation matching as a soft prior, as in the relation-matching step
 * of Yih et al. 2015, "Semantic Parsing via Staged Query Graph Generation", ACL, here with
 * plain stem overlap instead of a learned similarity). A question word also matches through
 * the general-English paraphrase lexicon and as a closed compound (relation-lexicon.ts), at
 * `LEXICON_CREDIT` (0.9) of a direct match — only when no relation label or alias of the
 * catalog holds the word's stem itself (the lexicon fills gaps, it does not compete).
 */
import { tokens } from "../catalog/index.js";
import type { QuestionModel } from "./question-model.js";
import type { Word } from "./words.js";
import { compoundCovers, LEXICON_CREDIT, lexiconCredit, paraphrasesOf } from "./relation-lexicon.js";

/** Options of {@link relationCues}; all optional. */
export interface RelationCueOptions {
  /** Weight added at a full match (weight = 1 + boost × score). @default 4 */
  readonly boost?: number;
  /** Smallest score that counts as a cue. @default 0.5 */
  readonly minScore?: number;
  /** Credit of a prefix (partial) stem match. @default 0.7 */
  readonly partialCredit?: number;
  /** Shortest shared prefix of a partial match. @default 4 */
  readonly prefixMin?: number;
}

/** Defaults of {@link RelationCueOptions}. */
export const DEFAULTS = { boost: 4, minScore: 0.5, partialCredit: 0.7, prefixMin: 4 } as const;

/** One place a cued relation stands in the question. */
export interface CueOccurrence {
  /** UTF-16 offset of the word. */
  readonly start: number;
  /** The voice flip at this place (see {@link RelationCue.flip}). */
  readonly flip: boolean;
}

/** One relation cued by the question. */
export interface RelationCue {
  /** Predicate num. */
  readonly relation: number;
  readonly id: string;
  readonly label: string;
  /** Transition weight for this question (uncued relations: 1). */
  readonly weight: number;
  /** Match score 0..1. */
  readonly score: number;
  /** The question words that matched. */
  readonly words: readonly string[];
  /** UTF-16 offset of the first matched word. */
  readonly start: number;
  /**
   * True when the question's voice differs from the label's: "made by" (passive) against
   * "manufactured by" (a passive label) is no flip; "which company made …" (active) is.
   */
  readonly flip: boolean;
  /**
   * UTF-16 offsets of every place the cue stands in the question, in order: the first matched
   * word and each later content word with the same stem ("cites a document that cites …"
   * names the relation twice, one hop each), each with its own voice.
   * @default [{ start, flip }]
   */
  readonly occurrences?: readonly CueOccurrence[];
}

/**
 * The stored direction a clue should walk a cued relation in (SVO order of English, Quirk
 * et al. 1985 §2.11): the subject stands left of the verb and the object right of it, so
 * from a clue right of the cue word the walk goes object → subject, against the stored
 * triple `subject relation object` — unless the voice flips it. True: against (inverse).
 */
export function expectedInverse(cue: RelationCue, clueStart: number): boolean {
  return clueStart > cue.start !== cue.flip;
}

function stemCredit(a: string, b: string, options: Required<RelationCueOptions>): number {
  if (a === b) return 1;
  const short = a.length <= b.length ? a : b;
  const long = a.length <= b.length ? b : a;
  if (short.length >= options.prefixMin && long.startsWith(short)) return options.partialCredit;
  return 0;
}

const stemSets = new WeakMap<QuestionModel, ReadonlySet<string>>();
/** Every stem of every relation surface of the model (cached per model). */
function surfaceStems(model: QuestionModel): ReadonlySet<string> {
  let set = stemSets.get(model);
  if (!set) {
    set = new Set(model.relations.flatMap((r) => r.surfaces.flat()));
    stemSets.set(model, set);
  }
  return set;
}

const stemOwners = new WeakMap<QuestionModel, ReadonlyMap<string, ReadonlySet<number>>>();
/** Per stem, the relations some surface of which holds it (cached per model). */
function stemRelations(model: QuestionModel): ReadonlyMap<string, ReadonlySet<number>> {
  let map = stemOwners.get(model);
  if (!map) {
    const m = new Map<string, Set<number>>();
    for (const r of model.relations) for (const x of r.surfaces.flat()) m.set(x, (m.get(x) ?? new Set()).add(r.num));
    stemOwners.set(model, (map = m));
  }
  return map;
}

/** Suffixes of agent nouns, which name the subject of their verb (-er, -or, -ant, -ent, -ist: Quirk et al. 1985, Appendix I.31–I.34; from memory). */
const AGENT_SUFFIX = /(?:er|or|ant|ent|ist)$/;

/**
 * True when question word `k` is a relational noun in "the N of Y" that names the object of
 * the relation, so Y is its subject: "the capital of Norway" (Norway —capital→ ?), "the
 * dependency of wget" (wget —depends on→ ?). Not when the label itself ends in "of" ("member
 * of": the "of" is the label's), nor for an agent noun derived from the label's verb ("the
 * dependent of wget", "the author of X" read as "wrote"), which names the subject.
 */
function relationalNounOf(ws: readonly Word[], k: number, labelTokens: readonly string[]): boolean {
  if (ws[k + 1]?.norm !== "of" || labelTokens[labelTokens.length - 1] === "of") return false;
  const word = ws[k]!.norm.replace(/s$/, "");
  const derived = !labelTokens.some((t) => t === ws[k]!.norm || t === word);
  return !(derived && AGENT_SUFFIX.test(word));
}

/** Matches content words (by index into `ws`) to the model's relations; best first, ties by id. */
export function relationCues(ws: readonly Word[], content: readonly number[], model: QuestionModel, options: RelationCueOptions = {}): RelationCue[] {
  const o: Required<RelationCueOptions> = { ...DEFAULTS, ...options };
  // the paraphrase lexicon fills gaps only: a word some label or alias holds as it is stays literal
  const direct = surfaceStems(model);
  const cues: RelationCue[] = [];
  for (const r of model.relations) {
    let best = 0;
    let bestWords: number[] = [];
    for (const surface of r.surfaces) {
      let sum = 0;
      const used: number[] = [];
      for (const s of surface) {
        let c = 0;
        let w = -1;
        for (const k of content) {
          let x = stemCredit(s, ws[k]!.stem, o);
          if (x < 1 && !direct.has(ws[k]!.stem)) {
            // general-English paraphrases ("born" ~ "birth") and closed compounds ("birthplace")
            const phrases = paraphrasesOf(ws[k]!.stem);
            if (phrases.length > 0) x = Math.max(x, lexiconCredit(s, surface, phrases));
            if (compoundCovers(ws[k]!.norm, surface)) x = Math.max(x, LEXICON_CREDIT);
          }
          if (x > c) {
            c = x;
            w = k;
          }
        }
        sum += c;
        if (c > 0 && !used.includes(w)) used.push(w);
      }
      const score = surface.length > 0 ? sum / surface.length : 0;
      if (score > best) {
        best = score;
        bestWords = used.sort((a, b) => a - b);
      }
    }
    if (best >= o.minScore) {
      const first = bestWords[0]!;
      const last = bestWords[bestWords.length - 1]!;
      // voice: the question's ("made by") against the label's ("manufactured by"); a relational
      // noun before "of" reads like the passive: "the dependency of wget" is what wget depends on
      const labelTokens = tokens(r.label);
      const questionPassive = ws[last + 1]?.norm === "by" || relationalNounOf(ws, last, labelTokens);
      const labelPassive = labelTokens[labelTokens.length - 1] === "by";
      // repeated occurrences: later content words with the first matched word's stem, or that
      // alone spell another one-word surface of the same relation ("depends on … is *needed*
      // by" with an alias "needs"): one relation named twice, one hop per place
      // (a word other relations' surfaces hold too is no sure second name: "works" in "works
      // on" against an alias "works with")
      const oneWord = new Set(r.surfaces.filter((x) => x.length === 1 && stemRelations(model).get(x[0]!)?.size === 1).map((x) => x[0]!));
      const occurrences: CueOccurrence[] = [{ start: ws[first]!.start, flip: questionPassive !== labelPassive }];
      for (const k of content) {
        if (k <= last || bestWords.includes(k)) continue;
        if (ws[k]!.stem === ws[first]!.stem || oneWord.has(ws[k]!.stem)) occurrences.push({ start: ws[k]!.start, flip: (ws[k + 1]?.norm === "by") !== labelPassive });
      }
      cues.push({
        relation: r.num,
        id: r.id,
        label: r.label,
        weight: 1 + o.boost * best,
        score: best,
        words: bestWords.map((k) => ws[k]!.text),
        start: ws[first]!.start,
        flip: questionPassive !== labelPassive,
        occurrences,
      });
    }
  }
  return cues.sort((a, b) => b.score - a.score || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/**
 * Answer type from a relational head noun: the range of the relation it names.
 *
 * Method: when the question's head noun names no type but a relation ("what is the
 * *capital* of …", "which *home port* does …"), the answer stands at one end of that
 * relation, so its type is that end's type — the relation's range or domain in RDF Schema
 * terms (RDF Schema 1.1, W3C 2014, §3.6 rdfs:range, §3.5 rdfs:domain), here estimated from
 * the catalog's own edges instead of declared: the direct types found at that end on at
 * least `minShare` of the relation's edges. Which end: the one the clues do not stand at —
 * when some clue's type (or a supertype) is found at one end only, the answer is at the
 * other; otherwise (both ends alike, as in "borders", or no clue typed) the types of both
 * ends are kept. The ranking's type filter follows subtypes and falls back to every type
 * when nothing typed is reachable, so a wrong estimate cannot empty the answers.
 * (Using the relation's target types as the answer type is common practice in question
 * answering over knowledge bases.)
 *
 * "where" questions ({@link whereRangeType}): "where" asks for the entity at the far end of
 * the question's last relation word ("where did X *study*" — a university, not a town), so
 * when that relation's far end holds no place-like type at all, its types replace the
 * place-like default; when it holds one, the default stays. "Who" followed at once by a
 * relation verb ({@link subjectRangeType}) asks for that verb's subject: its end's types.
 */
import type { QuestionModel } from "./question-model.js";
import type { RelationCue } from "./relation-cues.js";
import { COPULAS, LOCATIVE_PREPOSITIONS } from "./lexicon.js";
import { isFunctionWord, type Word } from "./words.js";

/** Options of {@link relationalAnswerType}; all optional. */
export interface RelationRangeOptions {
  /** A type counts at a relation end when at least this share of the relation's edges have it there. @default 0.02 */
  readonly minShare?: number;
  /** Smallest cue match score of the head noun. @default 0.75 */
  readonly minScore?: number;
}

/** Defaults of {@link RelationRangeOptions}. */
export const DEFAULTS = { minShare: 0.02, minScore: 0.75 } as const;

/** The answer type read from a relational head noun. */
export interface RelationalType {
  /** Type nums, ascending. */
  readonly types: readonly number[];
  /** The relation cue the head noun matched. */
  readonly cue: RelationCue;
  /** Which end of the relation the answer is taken at. */
  readonly end: "object" | "subject" | "either";
}

/**
 * The answer type named by a relation in the head noun phrase (`headPhrase`: word indexes),
 * or undefined when no cue stands there or the catalog has no types at its ends. `clueNodes`:
 * entity nums of the question's clues.
 */
export function relationalAnswerType(ws: readonly Word[], headPhrase: readonly number[], cues: readonly RelationCue[], clueNodes: readonly number[], model: QuestionModel, options: RelationRangeOptions = {}): RelationalType | undefined {
  const minScore = options.minScore ?? DEFAULTS.minScore;
  if (headPhrase.length === 0 || !model.relationEnds) return undefined;
  const starts = new Set(headPhrase.map((k) => ws[k]!.start));
  const cue = cues.filter((c) => c.score >= minScore && starts.has(c.start)).sort((a, b) => b.score - a.score || a.start - b.start)[0];
  if (!cue) return undefined;
  const ofType = ofPhraseType(ws, Math.max(...headPhrase), model, LOCATIVE_PREPOSITIONS.has(ws[Math.min(...headPhrase) - 2]?.norm ?? "")) ?? ofPhraseRelation(ws, Math.max(...headPhrase), cues, cue, model, options);
  return farEnd(cue, clueNodes, model, options, ofType);
}

/**
 * The type named by the of-phrase after a relational head noun ("the capital of *the one
 * country* that …"): "of", then function words, up to two pre-modifiers, then a type label or
 * alias (one or two words, by stem). The of-phrase is the relational noun's argument (Quirk et al. 1985 §17.38 ff., the
 * of-genitive; from memory), so that type stands at the relation's near end, whatever the
 * clues further away are. Likewise the subject after a copula in a wh-question opened by a
 * preposition of place, with inversion ("*in* which section *are the packages* that …",
 * Quirk et al. 1985 §11.14, §9.15 ff.): the subject is located at the relational noun's
 * referent, so its type stands at the near end (without the preposition, "which capital is
 * the city …" identifies the two, and nothing is read).
 */
function ofPhraseType(ws: readonly Word[], head: number, model: QuestionModel, locative = false): number[] | undefined {
  const next = ws[head + 1]?.norm ?? "";
  if (next !== "of" && !(locative && COPULAS.has(next))) return undefined;
  let k = head + 2;
  while (k < ws.length && isFunctionWord(ws[k]!.norm)) k++;
  // up to two pre-modifiers before the type noun ("of the *largest* country")
  for (let m = k; m <= k + 2 && m < ws.length; m++) {
    for (const len of [2, 1]) {
      if (m + len > ws.length) continue;
      const types = model.typesByKey.get(ws.slice(m, m + len).map((w) => w.stem).join(" "));
      if (types && types.length > 0) return [...types];
    }
    if (isFunctionWord(ws[m]!.norm)) break;
  }
  return undefined;
}

/**
 * The types of an of-phrase headed by another relational noun ("the capitals of *the
 * neighbours* of …"): the of-phrase's noun names a relation, so the node it stands for is at
 * one of that relation's ends — its types are those found at either end (the of-genitive
 * chains: Quirk et al. 1985 §17.38 ff.). Undefined when no other cue stands there.
 */
function ofPhraseRelation(ws: readonly Word[], head: number, cues: readonly RelationCue[], own: RelationCue, model: QuestionModel, options: RelationRangeOptions): number[] | undefined {
  if (ws[head + 1]?.norm !== "of") return undefined;
  let k = head + 2;
  while (k < ws.length && isFunctionWord(ws[k]!.norm)) k++;
  const minScore = options.minScore ?? DEFAULTS.minScore;
  const minShare = options.minShare ?? DEFAULTS.minShare;
  const inner = cues.filter((c) => c !== own && c.relation !== own.relation && c.score >= minScore && c.start === ws[k]?.start).sort((a, b) => b.score - a.score)[0];
  if (!inner || !model.relationEnds) return undefined;
  const ends = model.relationEnds();
  const total = ends.edges(inner.relation);
  if (!(total > 0)) return undefined;
  const types = [false, true].flatMap((object) => ends.types(inner.relation, object).filter((t) => t.count >= minShare * total).map((t) => t.type));
  return types.length > 0 ? [...new Set(types)] : undefined;
}

/**
 * The far-end types of the last relation word of a "where" question, when none of them is
 * place-like (else undefined: the place-like default stands). `placeTypes`: the place-like
 * types with their subtypes.
 */
export function whereRangeType(cues: readonly RelationCue[], clueNodes: readonly number[], placeTypes: ReadonlySet<number>, model: QuestionModel, options: RelationRangeOptions = {}): RelationalType | undefined {
  const minScore = options.minScore ?? DEFAULTS.minScore;
  if (!model.relationEnds) return undefined;
  const last = cues.filter((c) => c.score >= minScore).sort((a, b) => b.start - a.start || b.score - a.score)[0];
  if (!last) return undefined;
  const r = farEnd(last, clueNodes, model, options);
  if (!r || r.types.some((t) => placeTypes.has(t))) return undefined;
  return r;
}

/**
 * "Who" as the subject of a relation verb right after it ("who *maintains* the packages …"):
 * the answer is the sentence's subject (SVO order, Quirk et al. 1985 §2.11), the stored
 * subject of the relation unless the voice flips it (an active verb for a passive label:
 * "maintains" for "maintained by" — the stored object). Its types are that end's, however
 * far away the clues stand. `next`: UTF-16 offset of the word after the wh-word; undefined
 * when no cue starts there or that end holds no type.
 */
export function subjectRangeType(cues: readonly RelationCue[], next: number, model: QuestionModel, options: RelationRangeOptions = {}): RelationalType | undefined {
  const minScore = options.minScore ?? DEFAULTS.minScore;
  const minShare = options.minShare ?? DEFAULTS.minShare;
  if (!model.relationEnds) return undefined;
  const cue = cues.filter((c) => c.score >= minScore && c.start === next).sort((a, b) => b.score - a.score)[0];
  if (!cue) return undefined;
  const ends = model.relationEnds();
  const total = ends.edges(cue.relation);
  if (!(total > 0)) return undefined;
  const object = cue.flip;
  const types = ends.types(cue.relation, object).filter((t) => t.count >= minShare * total).map((t) => t.type);
  if (types.length === 0) return undefined;
  return { types: [...new Set(types)].sort((a, b) => a - b), cue, end: object ? "object" : "subject" };
}

function farEnd(cue: RelationCue, clueNodes: readonly number[], model: QuestionModel, options: RelationRangeOptions, nearTypes?: readonly number[]): RelationalType | undefined {
  const minShare = options.minShare ?? DEFAULTS.minShare;
  const ends = model.relationEnds!();
  const total = ends.edges(cue.relation);
  if (!(total > 0)) return undefined;
  const at = (object: boolean) => ends.types(cue.relation, object).filter((t) => t.count >= minShare * total).map((t) => t.type);
  const subject = at(false);
  const object = at(true);
  if (subject.length === 0 && object.length === 0) return undefined;
  // the clues' types with their supertypes
  const clueTypes = new Set<number>();
  const addTypes = (ts: readonly number[]) => {
    for (const t of ts) for (const a of model.typeByNum.get(t)?.ancestors ?? [t]) clueTypes.add(a);
  };
  if (nearTypes) addTypes(nearTypes);
  else for (const n of clueNodes) addTypes(model.typesOf?.(n) ?? []);
  const clueAtSubject = subject.some((t) => clueTypes.has(t));
  const clueAtObject = object.some((t) => clueTypes.has(t));
  const sorted = (xs: readonly number[]) => [...new Set(xs)].sort((a, b) => a - b);
  if (clueAtSubject && !clueAtObject && object.length > 0) return { types: sorted(object), cue, end: "object" };
  if (clueAtObject && !clueAtSubject && subject.length > 0) return { types: sorted(subject), cue, end: "subject" };
  return { types: sorted([...subject, ...object]), cue, end: "either" };
}

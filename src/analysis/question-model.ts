/**
 * The question model: the catalog's type and relation vocabulary, read once per session, in
 * the stemmed form that question analysis matches against.
 *
 * - Types: label and aliases as Porter-stem keys (Porter 1980), the supertype closure
 *   (rdfs:subClassOf followed transitively) and the subtype closure.
 * - Relations: label and aliases as stem-token lists (content words only).
 * - Agent-like types for "who" and place-like types for "where": a type is person-like when
 *   its own label or an alias — or those of a supertype — is, as a whole (stemmed), the
 *   general noun the wh-word refers to (lexicon.ts {@link WH_REFERENTS}: "person", "people",
 *   "organisation", "place", "location"); organisation-like and place-like likewise. The
 *   catalog's type hierarchy does the rest ("researcher" ⊑ "person", "port" ⊑ "place"), so
 *   no list of the catalog's own nouns is needed. "who" asks for an agent: a person or an
 *   organisation ("who made the sonar?" — a company). When no type qualifies, "who"/"where"
 *   take the far end of the question's relation word (relation-range.ts) or set no filter.
 */
import type { Catalog } from "../catalog/index.js";
import { stemKey, stemToken, tokens } from "../catalog/index.js";
import type { EntityRef, RelationEnds } from "../model/index.js";
import { isFunctionWord } from "./words.js";
import { WH_REFERENTS } from "./lexicon.js";

/** Options of {@link buildQuestionModel}; all optional. */
export interface QuestionModelOptions {
  /**
   * Edge count per predicate num (index = num). When given, predicates with no edges
   * (attribute names) are left out of the relation vocabulary. @default all predicates
   */
  readonly relationEdgeCounts?: ArrayLike<number>;
  /**
   * Types at the relations' ends (the relation index's `relationEnds`, which caches them),
   * asked for on first use; without it a relational head noun sets no answer type.
   */
  readonly relationEnds?: () => RelationEnds;
  /** Direct type nums of an entity (to tell which end of a relation the clues stand at). */
  readonly typesOf?: (num: number) => readonly number[];
}

/** A type of the catalog as question analysis sees it. */
export interface ModelType extends EntityRef {
  readonly num: number;
  /** Stem keys of the label and each alias (space-joined stems). */
  readonly keys: readonly string[];
  /** Nums of this type and all its supertypes. */
  readonly ancestors: readonly number[];
  /** Nums of this type and all its subtypes. */
  readonly descendants: readonly number[];
}

/** A relation of the catalog as question analysis sees it. */
export interface ModelRelation extends EntityRef {
  readonly num: number;
  /** One entry per surface form (label, aliases): its content-word stems. */
  readonly surfaces: readonly (readonly string[])[];
}

/** The catalog's vocabulary for question analysis, built once per session. */
export interface QuestionModel {
  readonly types: readonly ModelType[];
  /** Type by num. */
  readonly typeByNum: ReadonlyMap<number, ModelType>;
  /** Types by stem key of a label or alias. */
  readonly typesByKey: ReadonlyMap<string, readonly number[]>;
  /** The longest type key, in words (bounds the n-gram search). */
  readonly maxTypeWords: number;
  readonly relations: readonly ModelRelation[];
  /** Person-like types, most general first. */
  readonly personTypes: readonly number[];
  /** Organisation-like types, most general first. */
  readonly organisationTypes: readonly number[];
  /** Agent types, the answer type of "who": person-like and organisation-like, most general first. */
  readonly agentTypes: readonly number[];
  /** Place-like types (answer type of "where"), most general first. */
  readonly placeTypes: readonly number[];
  /**
   * Stems of relation surfaces made of one function word only (a relation labelled "about"):
   * such words of a question are matched against relations after all. @default none
   */
  readonly functionCueStems?: ReadonlySet<string>;
  /** See {@link QuestionModelOptions.relationEnds}. */
  readonly relationEnds?: () => RelationEnds;
  /** See {@link QuestionModelOptions.typesOf}. */
  readonly typesOf?: (num: number) => readonly number[];
  /** The units the catalog declares for its attributes (quantity.ts reads "2000 KiB" as a number by them). @default none */
  readonly units?: readonly string[];
}

const PERSON_KEYS = new Set(WH_REFERENTS.person.map(stemKey));
const ORGANISATION_KEYS = new Set(WH_REFERENTS.organisation.map(stemKey));
const PLACE_KEYS = new Set(WH_REFERENTS.place.map(stemKey));

function closure(start: number, next: (n: number) => readonly number[]): number[] {
  const seen = new Set<number>([start]);
  const stack = [start];
  while (stack.length > 0) {
    const n = stack.pop()!;
    for (const m of next(n)) {
      if (!seen.has(m)) {
        seen.add(m);
        stack.push(m);
      }
    }
  }
  return [...seen].sort((a, b) => a - b);
}

/** Builds the question model from the catalog's types and predicates. */
export function buildQuestionModel(cat: Catalog, options: QuestionModelOptions = {}): QuestionModel {
  const infos = cat.types();
  const parents = new Map<number, readonly number[]>();
  const children = new Map<number, number[]>();
  for (const t of infos) {
    parents.set(t.num, t.parents);
    for (const p of t.parents) {
      const list = children.get(p) ?? [];
      list.push(t.num);
      children.set(p, list);
    }
  }
  const types: ModelType[] = [];
  const typesByKey = new Map<string, number[]>();
  let maxTypeWords = 1;
  for (const t of infos) {
    const keys = [...new Set([t.label, ...t.aliases].map(stemKey).filter((k) => k !== ""))];
    for (const k of keys) {
      const list = typesByKey.get(k) ?? [];
      list.push(t.num);
      typesByKey.set(k, list);
      maxTypeWords = Math.max(maxTypeWords, k.split(" ").length);
    }
    types.push({
      num: t.num,
      id: t.id,
      label: t.label,
      keys,
      ancestors: closure(t.num, (n) => parents.get(n) ?? []),
      descendants: closure(t.num, (n) => children.get(n) ?? []),
    });
  }
  const typeByNum = new Map(types.map((t) => [t.num, t]));

  // a whole label or alias must be the lexicon word ("research vessel" is not "researcher")
  const qualifies = (t: ModelType, lexicon: ReadonlySet<string>) =>
    t.ancestors.some((a) => {
      const at = typeByNum.get(a);
      return at !== undefined && at.keys.some((k) => lexicon.has(k));
    });
  // most general first: fewer ancestors first, then num
  const byGenerality = (a: number, b: number) => typeByNum.get(a)!.ancestors.length - typeByNum.get(b)!.ancestors.length || a - b;
  const personTypes = types.filter((t) => qualifies(t, PERSON_KEYS)).map((t) => t.num).sort(byGenerality);
  const organisationTypes = types.filter((t) => qualifies(t, ORGANISATION_KEYS)).map((t) => t.num).sort(byGenerality);
  const agentTypes = [...new Set([...personTypes, ...organisationTypes])].sort(byGenerality);
  const placeTypes = types.filter((t) => qualifies(t, PLACE_KEYS)).map((t) => t.num).sort(byGenerality);

  const counts = options.relationEdgeCounts;
  const relations: ModelRelation[] = [];
  const functionCueStems = new Set<string>();
  for (const p of cat.predicates()) {
    if (counts !== undefined && !((counts[p.num] ?? 0) > 0)) continue;
    const surfaces: string[][] = [];
    for (const s of [p.label, ...p.aliases]) {
      const all = tokens(s);
      const content = all.filter((x) => !isFunctionWord(x));
      if (content.length === 0 && all.length === 1) functionCueStems.add(stemToken(all[0]!));
      const chosen = (content.length > 0 ? content : all).map(stemToken);
      if (chosen.length > 0 && !surfaces.some((o) => o.join(" ") === chosen.join(" "))) surfaces.push(chosen);
    }
    relations.push({ num: p.num, id: p.id, label: p.label, surfaces });
  }
  return {
    types, typeByNum, typesByKey, maxTypeWords, relations, personTypes, organisationTypes, agentTypes, placeTypes, functionCueStems,
    units: [...new Set(cat.predicateUnits().values())].sort(),
    ...(options.relationEnds ? { relationEnds: options.relationEnds } : {}),
    ...(options.typesOf ? { typesOf: options.typesOf } : {}),
  };
}

/**
 * The question model: the catalog's type and relation vocabulary, read once per session, in
 * the stemmed form that question analysis matches against.
 *
 * - Types: label and aliases as Porter-stem keys (Porter 1980), the supertype closure
 *   (rdfs:subClassOf followed transitively) and the subtype closure.
 * - Relations: label and aliases as stem-token lists (content words only).
 * - Agent-like types for "who" and place-like types for "where": a type is person-like when
 *   its own label or an alias — or those of a supertype — is, as a whole (stemmed), a general
 *   English word for people (person, people, human, researcher, …; {@link PERSON_WORDS});
 *   organisation-like and place-like likewise ({@link ORGANISATION_WORDS},
 *   {@link PLACE_WORDS}). "who" asks for an agent: a person or an organisation ("who made
 *   the sonar?" — a company). The words are general English nouns, never catalog names;
 *   the decision is made on the catalog's own type labels and hierarchy, so it carries over
 *   to held-out catalogs. When no type qualifies, "who"/"where" set no type filter.
 */
import type { Catalog } from "../catalog/index.js";
import { stemKey, stemToken, tokens } from "../catalog/index.js";
import type { EntityRef, RelationEnds } from "../model/index.js";
import { isFunctionWord } from "./words.js";

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
}

/** General English words for people (common practice; no catalog names). */
export const PERSON_WORDS: readonly string[] = [
  "person", "people", "human", "individual", "man", "woman", "persona",
  "researcher", "scientist", "scholar", "author", "writer", "artist", "engineer", "employee", "worker",
  "staff", "officer", "captain", "pilot", "crew", "founder", "director", "leader", "politician",
  "player", "athlete", "actor", "musician", "composer", "student", "teacher", "professor", "doctor",
];

/** General English words for organisations (common practice; no catalog names). */
export const ORGANISATION_WORDS: readonly string[] = [
  "organisation", "organization", "agent", "company", "firm", "corporation", "business", "enterprise",
  "institution", "institute", "agency", "authority", "government", "university", "school", "college",
  "laboratory", "lab", "society", "association", "club", "team", "band", "party", "union", "foundation",
  "charity", "funder", "sponsor", "manufacturer", "publisher", "employer",
];

/** General English words for places (common practice; no catalog names). */
export const PLACE_WORDS: readonly string[] = [
  "place", "location", "site", "area", "region", "country", "nation", "state", "province", "county",
  "district", "city", "town", "village", "settlement", "municipality", "port", "harbour", "harbor",
  "island", "continent", "territory", "locality", "facility", "building", "venue", "station",
  "landmark", "zone", "geographic", "geographical", "spatial",
];

const PERSON_KEYS = new Set(PERSON_WORDS.map(stemKey));
const ORGANISATION_KEYS = new Set(ORGANISATION_WORDS.map(stemKey));
const PLACE_KEYS = new Set(PLACE_WORDS.map(stemKey));

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
    ...(options.relationEnds ? { relationEnds: options.relationEnds } : {}),
    ...(options.typesOf ? { typesOf: options.typesOf } : {}),
  };
}

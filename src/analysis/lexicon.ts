/**
 * The closed-class English the reader of a question relies on, in one place: adjectives of
 * dimension and time with their comparative and superlative forms, ordinals, number words
 * for plurality, the verbs and question words that open a value question. Each list names
 * its reason and source. Nothing here is taken from a catalog: everything domain-specific
 * (types, relations, attributes, units) comes from the catalog's own labels, aliases and
 * units (question-model.ts, conditions.ts).
 *
 * Sources: Quirk, Greenbaum, Leech & Svartvik 1985, "A Comprehensive Grammar of the English
 * Language" (§7.74 ff. comparison of adjectives, §5.73 ff. irregular plurals, §6.53 ordinal
 * numerals, §11.14 wh-questions); where a list is only common practice, it says so.
 */

/** A gradable adjective of dimension: its forms going up, going down, and the general nouns of the dimension it measures. */
export interface Dimension {
  readonly up: readonly string[];
  readonly down: readonly string[];
  /** General English nouns of the dimension ("deep" measures "depth"), matched against attribute labels. */
  readonly hints: readonly string[];
}

/**
 * Adjectives of dimension with their comparative and superlative forms (Quirk et al. 1985
 * §7.74 ff., inflected and irregular comparison) and the general nouns they hint at (common
 * practice: the dimension a native speaker means by the adjective).
 */
export const DIMENSIONS: readonly Dimension[] = [
  { up: ["large", "larger", "largest", "big", "bigger", "biggest", "great", "greater", "greatest", "huge", "hugest"], down: ["small", "smaller", "smallest", "little", "tiny", "tiniest"], hints: ["size", "area", "surface", "extent", "volume", "capacity", "tonnage", "population"] },
  { up: ["long", "longer", "longest"], down: ["short", "shorter", "shortest"], hints: ["length", "duration"] },
  { up: ["deep", "deeper", "deepest"], down: ["shallow", "shallower", "shallowest"], hints: ["depth"] },
  { up: ["tall", "taller", "tallest", "high", "higher", "highest"], down: ["low", "lower", "lowest"], hints: ["height", "altitude", "elevation"] },
  { up: ["heavy", "heavier", "heaviest"], down: ["light", "lighter", "lightest"], hints: ["weight", "mass", "tonnage"] },
  { up: ["wide", "wider", "widest", "broad", "broader", "broadest"], down: ["narrow", "narrower", "narrowest"], hints: ["width", "breadth"] },
  { up: ["expensive", "costlier", "costliest", "rich", "richer", "richest"], down: ["cheap", "cheaper", "cheapest", "poor", "poorer", "poorest"], hints: ["cost", "price", "budget", "value"] },
  { up: ["populous", "crowded"], down: [], hints: ["population", "inhabitants"] },
];

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

/** Plural copulas ("which *are* …"): the question asks for a set. */
export const PLURAL_COPULAS: ReadonlySet<string> = new Set(["are", "were"]);

/** Wh-words that open a question about a thing's value or identity (Quirk et al. 1985 §11.14). */
export const VALUE_WH: ReadonlySet<string> = new Set(["what", "how"]);

/** "How" + a measure noun asks for an amount ("how many", "how much"; Quirk et al. 1985 §11.14): a count, not a value. */
export const HOW_AMOUNT: ReadonlySet<string> = new Set(["many", "much"]);

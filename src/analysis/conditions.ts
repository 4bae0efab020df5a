/**
 * Conditions in a question: comparisons on literal attributes, superlatives and ordinals,
 * negation and exclusion, and counting.
 *
 * Method: a rule-based shallow parse (cue phrases around the quantities found by
 * quantity.ts), the way comparative and superlative constructions are read in rule-based
 * question answering over databases (Androutsopoulos, Ritchie & Thanisch 1995, "Natural
 * Language Interfaces to Databases — An Introduction", Natural Language Engineering 1(1),
 * §4 on comparatives, superlatives, negation and counting). The cue phrases are general
 * English (common practice), never catalog names:
 *
 * - comparison: before/after/since/until/in/during a year, date or decade; more than, over,
 *   above, at least, at most, less/fewer than, under, below, "X or more", an adjective's
 *   comparative ("longer than"), between X and Y, from X to Y; a compass point + "of" and
 *   the attribute's words ("south of latitude -50", lexicon.ts `COMPASS_COMPARATIVES`);
 * - superlative: an adjective's superlative (largest, oldest, …), "most"/"least"/"fewest"
 *   + the attribute's words, first/last; an ordinal before it ("second largest") gives the
 *   position;
 * - exclusion: "not", "other than", "except (for)", "apart from", "aside from",
 *   "excluding", "besides", "but not" before a linked mention (that mention stops being a
 *   clue and becomes an exclusion); "not" before a comparison inverts the comparison; a
 *   negated copula after a name and before an article and a relation noun ("where X isn't an
 *   R") excludes what has X as its R ({@link negatedPredicate});
 * - count: "how many", "number of".
 *
 * The attribute is found the way relation cues are matched to relations (relation-cues.ts):
 * Porter-stem containment (Porter 1980) of the attribute's label, aliases and unit among
 * the question's free words (not in a linked mention), an exact stem counting 1 and a
 * shared prefix of ≥ 4 letters `partialCredit`; the unit written after the number adds
 * `unitBonus`. An adjective of dimension ("larger", "deepest") adds the nouns of the
 * attribute it measures (WordNet 3.1's attribute pointer: size, depth, …; lexicon.ts
 * `DIMENSIONS`) as weaker hints; an adjective of size itself, which names no one dimension,
 * is then followed by the catalog's magnitudes (numeric attributes with a unit and no negative
 * value: a ratio scale, Stevens 1946), marked `measured`, the ranking taking the first the
 * candidates carry, with a note; temporal words (before, oldest, first, …) and
 * year/date quantities prefer attributes whose values are years or dates. Every attribute
 * scoring above `minScore` is kept, best first, as `choices`: the ranking stage uses the
 * first one the candidates actually carry. No match leaves `choices` empty and the ranking
 * says so in a note.
 */
import type { Catalog } from "../catalog/index.js";
import { stemToken, tokens } from "../catalog/index.js";
import type { Analysis, AnswerType } from "./analyze.js";
import type { QuestionModel } from "./question-model.js";
import { findQuantities, unitMatches, type Quantity } from "./quantity.js";
import { isFunctionWord, words, type Word } from "./words.js";
import { AFTER_QUANTITY, ANSWER_TYPE_WORDS, BEFORE_QUANTITY, COMPASS_COMPARATIVES, COPULAS, NEGATED_COPULAS, DIMENSIONS, EXCLUDE_CUES, HOW_AMOUNT, NEGATIONS, ORDINALS, QUANTITY_COMPARATIVES, SHARING_VERBS, SUPERLATIVE_FORM, TEMPORAL, VALUE_WH, gradable, isComparativeForm, type Dimension } from "./lexicon.js";

/** Options of {@link detectConditions}; all optional. */
export interface ConditionOptions {
  /** Credit of a prefix (partial) stem match. @default 0.7 */
  readonly partialCredit?: number;
  /** Shortest shared prefix of a partial match. @default 4 */
  readonly prefixMin?: number;
  /** Added when the number's written unit matches the attribute's unit. @default 0.5 */
  readonly unitBonus?: number;
  /** Score of a hint noun of a dimension adjective ("larger" → area, size). @default 0.4 */
  readonly hintScore?: number;
  /** Added to attributes with year/date values when the condition is temporal. @default 0.3 */
  readonly temporalBonus?: number;
  /** Smallest score that makes an attribute a choice. @default 0.3 */
  readonly minScore?: number;
  /** Words allowed between a negation cue and the mention it excludes. @default 4 */
  readonly negationWindow?: number;
}

/** Defaults of {@link ConditionOptions}. */
export const DEFAULTS = { partialCredit: 0.7, prefixMin: 4, unitBonus: 0.5, hintScore: 0.4, temporalBonus: 0.3, minScore: 0.3, negationWindow: 4 } as const;

/** An attribute predicate as condition analysis sees it. */
export interface ModelAttribute {
  /** Predicate num. */
  readonly num: number;
  readonly id: string;
  readonly label: string;
  /** The declared unit, if any. */
  readonly unit?: string;
  /** Stems of the label and each alias. */
  readonly surfaces: readonly (readonly string[])[];
  /** Stems of the unit. */
  readonly unitStems: readonly string[];
  /** Most numeric values are years or dates. */
  readonly temporal: boolean;
  /**
   * A magnitude: not temporal, a declared unit and no negative value — a quantity on a ratio
   * scale (Stevens 1946, "On the theory of scales of measurement", Science 103), what an
   * adjective of size measures when no label names the size. @default false
   */
  readonly magnitude?: boolean;
}

/** The catalog's attribute vocabulary (attributes with numeric values), built once per session. */
export interface AttributeModel {
  readonly attributes: readonly ModelAttribute[];
  /** Attributes with text (non-numeric) values: codes, names, symbols, booleans. @default none */
  readonly textAttributes?: readonly ModelAttribute[];
  /** The stored values of a text attribute equal to one of `texts` (ignoring case). @default none */
  readonly textValues?: (predicate: number, texts: readonly string[]) => readonly string[];
}

/** The chosen attribute of a condition (JSON-shaped). */
export interface AttributeRef {
  readonly num: number;
  readonly id: string;
  readonly label: string;
  readonly unit?: string;
}

/** An attribute that fits a condition's words, with its match score. */
export interface AttributeChoice extends AttributeRef {
  readonly score: number;
  /** Indexes (into the question's words) of the words that matched. */
  readonly wordIndexes: readonly number[];
  /** True when no word names it: a magnitude an adjective of size measures ({@link ModelAttribute.magnitude}). @default false */
  readonly measured?: boolean;
}

/** Fields every condition has. */
interface ConditionBase {
  /** The question words that expressed the condition. */
  readonly words: string;
  /** UTF-16 offsets of those words. */
  readonly start: number;
  readonly end: number;
}

/** A comparison operator as shown to the user. */
export type ComparisonOperator = "<" | "<=" | ">" | ">=" | "between" | "in" | "not in" | "not between";

/** A comparison on a literal attribute: keep candidates whose value lies in the range. */
export interface ComparisonCondition extends ConditionBase {
  readonly kind: "comparison";
  readonly operator: ComparisonOperator;
  /** The quantities as written. */
  readonly values: readonly string[];
  /** Range on the catalog's numeric scale: `min` (inclusive unless `minStrict`) and/or `max` (inclusive unless `maxStrict`). */
  readonly min?: number;
  readonly minStrict?: boolean;
  readonly max?: number;
  readonly maxStrict?: boolean;
  /** True: the range is negated ("not before 1980"). */
  readonly negated: boolean;
  /** Attributes that fit the words, best first (the ranking uses the first the candidates carry). */
  readonly choices: readonly AttributeChoice[];
}

/** A superlative or ordinal: order the candidates that fit the other clues by an attribute. */
export interface SuperlativeCondition extends ConditionBase {
  readonly kind: "superlative";
  /** "max": largest first; "min": smallest first. */
  readonly order: "max" | "min";
  /** 1-based position asked for ("second largest": 2). */
  readonly position: number;
  /** True when the word is temporal (oldest, first, newest …): on a non-temporal attribute (an age) the order flips. */
  readonly temporal: boolean;
  readonly choices: readonly AttributeChoice[];
}

/** An exclusion: the mentioned entity (and, depending on `mode`, the entities linked to it) is not an answer. */
export interface ExclusionCondition extends ConditionBase {
  readonly kind: "exclusion";
  /** Entity num, id and label of the excluded mention. */
  readonly node: number;
  readonly id: string;
  readonly label: string;
  /** Index into `Analysis.mentions`. */
  readonly mention: number;
  /** "other": "other than X" (X itself, and its linked entities when X is not of the answer type); "not": X and every entity linked to it. */
  readonly mode: "other" | "not";
  /** Relation nums in the negation's scope ("not bordering X", "not in the X section"): only links of these relations count; empty: any. */
  readonly relations: readonly number[];
  /**
   * Per relation (same order): true when the link from the excluded entity to an excluded
   * candidate walks against the stored triple (the entity is the relation's object). With
   * relations, "not" excludes the entities so linked, not the entity itself ("packages that
   * do not depend on X": X does not depend on itself). Absent: either direction, the entity too.
   */
  readonly inverse?: readonly boolean[];
}

/** A literal condition on a text attribute: keep candidates whose value equals `value` (negated: differs). */
export interface LiteralCondition extends ConditionBase {
  readonly kind: "literal";
  /** The stored value to match (as stored). */
  readonly value: string;
  readonly negated: boolean;
  /** The attribute (one choice). */
  readonly choices: readonly AttributeChoice[];
}

/**
 * An absence: a negated relation with no named object ("countries that do not border any
 * other country"): the node has no edge of these relations, walked in the sentence's
 * direction, to an entity of `types` (empty: any).
 */
export interface AbsenceCondition extends ConditionBase {
  readonly kind: "absence";
  /** The negated relations, each with the direction of the walk from the node that must lack it (true: against the stored triple). */
  readonly relations: readonly { readonly relation: number; readonly inverse: boolean }[];
  /** Types of the missing partner (a type noun in the scope: "any other *country*"); empty: any. */
  readonly types: readonly number[];
}

/** A count question: the answer is the number of entities that fit. */
export interface CountCondition extends ConditionBase {
  readonly kind: "count";
}

/** One recognised condition. */
export type Condition = ComparisonCondition | SuperlativeCondition | ExclusionCondition | CountCondition | LiteralCondition | AbsenceCondition;

/** The result of {@link detectConditions}. */
export interface ConditionAnalysis {
  /** The analysis with excluded mentions removed from the clues, condition words removed from the relation cues, and the answer type of a "how many X" question. */
  readonly analysis: Analysis;
  readonly conditions: readonly Condition[];
  /** A value question ("What is the depth of X?", "How tall is X?"): the answer is an attribute value of one clue. */
  readonly value?: ValueQuestion;
  /** A comparison between named entities ("Which is bigger, A or B?"): the answer is one of them. */
  readonly compare?: EntityComparison;
  /** An identity question ("Which package is the lightweight PDF viewer?"): the answer is the entity the description names. */
  readonly identity?: IdentityQuestion;
}

/**
 * An identity question: "Which/What TYPE is/are (the) D?" with D one linked mention and
 * nothing else: the copula identifies the subject with its complement (Quirk et al. 1985
 * §10.8, the subject complement identifies the subject; a definite description denotes the one
 * entity it fits, Russell 1905), so the answer is the entity D is linked to, not what is
 * linked to it; the mention's other senses of the expected type are the other answers.
 */
export interface IdentityQuestion extends ConditionBase {
  /** Index into `Analysis.mentions` of the description (or name). */
  readonly mention: number;
  readonly node: number;
}

/** A value question: the asked attribute of one named entity. */
export interface ValueQuestion extends ConditionBase {
  /** Index into `Analysis.mentions` of the entity whose value is asked. */
  readonly mention: number;
  readonly node: number;
  /** Attributes that fit the words, best first. */
  readonly choices: readonly AttributeChoice[];
}

/** A comparison between named entities: order them by an attribute, the first is the answer. */
export interface EntityComparison extends ConditionBase {
  /** Indexes into `Analysis.mentions` of the compared entities, in question order. */
  readonly mentions: readonly number[];
  readonly nodes: readonly number[];
  /** "max": the larger value wins; "min": the smaller. */
  readonly order: "max" | "min";
  /** True when the word is temporal ("older"): on a non-temporal attribute (an age) the order flips. */
  readonly temporal: boolean;
  readonly choices: readonly AttributeChoice[];
  /**
   * True when each compared entity is described, not named ("the country whose capital is
   * A or the one whose capital is B"): the entities compared are those each clue's chain of
   * the reading reaches (`nodes` are the clues' own until then). Absent: the clues themselves.
   */
  readonly described?: boolean;
}

function surfaceStems(text: string): string[] {
  const all = tokens(text);
  const content = all.filter((x) => !isFunctionWord(x));
  return (content.length > 0 ? content : all).map(stemToken);
}

/** Builds the attribute vocabulary: every predicate with numeric literal values, its label, aliases and unit. */
export function buildAttributeModel(cat: Catalog): AttributeModel {
  const summary = new Map(cat.attributeSummary().map((s) => [s.num, s]));
  const units = cat.predicateUnits();
  const attributes: ModelAttribute[] = [];
  const textAttributes: ModelAttribute[] = [];
  for (const p of cat.predicates()) {
    const s = summary.get(p.num);
    if (s && s.values > s.numeric) {
      const surfaces: string[][] = [];
      for (const t of [p.label, ...p.aliases]) {
        const st = surfaceStems(t);
        if (st.length > 0 && !surfaces.some((o) => o.join(" ") === st.join(" "))) surfaces.push(st);
      }
      textAttributes.push({ num: p.num, id: p.id, label: p.label, surfaces, unitStems: [], temporal: false });
    }
    if (!s || s.numeric === 0) continue;
    const unit = units.get(p.id);
    const surfaces: string[][] = [];
    for (const t of [p.label, ...p.aliases]) {
      const st = surfaceStems(t);
      if (st.length > 0 && !surfaces.some((o) => o.join(" ") === st.join(" "))) surfaces.push(st);
    }
    const unitStems = unit !== undefined ? surfaceStems(unit) : [];
    const temporal = s.dateLike * 2 > s.numeric || (unit !== undefined && /^(year|years|date|yr)$/i.test(unit.trim()));
    const magnitude = !temporal && unit !== undefined && (cat.attributeMinimum(p.num) ?? -1) >= 0;
    attributes.push({ num: p.num, id: p.id, label: p.label, ...(unit !== undefined ? { unit } : {}), surfaces, unitStems, temporal, ...(magnitude ? { magnitude } : {}) });
  }
  return { attributes, textAttributes, textValues: (predicate, texts) => cat.attributeValuesIn(predicate, texts) };
}

/** Matches a phrase (space-separated normalised words) at word index i; returns the words it spans or 0. */
function phraseAt(ws: readonly Word[], i: number, phrase: string): number {
  const parts = phrase.split(" ");
  for (let k = 0; k < parts.length; k++) if (ws[i + k]?.norm !== parts[k]) return 0;
  return parts.length;
}

/** Detects the conditions of an analysed question. */
export function detectConditions(analysis: Analysis, model: QuestionModel, attributes: AttributeModel, options: ConditionOptions = {}): ConditionAnalysis {
  const o: Required<ConditionOptions> = { ...DEFAULTS, ...options };
  const question = analysis.question;
  const ws = words(question);
  // a mention that is only a number inside a quantity ("20" of "20,000") is the quantity, not a name
  const allQuantities = findQuantities(question, { units: attributes.attributes.flatMap((a) => (a.unit !== undefined ? [a.unit] : [])) });
  const numeric = new Set<number>();
  analysis.mentions.forEach((m, mi) => {
    if (/^[\d.,\s]+$/.test(m.text) && allQuantities.some((q) => q.start <= m.start && m.end <= q.end)) numeric.add(mi);
  });
  const names = analysis.mentions.filter((_, mi) => !numeric.has(mi));
  const inMention = ws.map((w) => names.some((m) => w.start < m.end && w.end > m.start));
  const used = new Set<number>(); // word indexes consumed by conditions
  const conditions: Condition[] = [];
  const notes: string[] = [];
  let answerTypes: readonly AnswerType[] = analysis.answerTypes;

  // --- count ---------------------------------------------------------------------------
  for (let i = 0; i < ws.length; i++) {
    if (inMention[i]) continue;
    const n = phraseAt(ws, i, "how many") || phraseAt(ws, i, "number of");
    if (n === 0) continue;
    for (let k = 0; k < n; k++) used.add(i + k);
    conditions.push({ kind: "count", words: question.slice(ws[i]!.start, ws[i + n - 1]!.end), start: ws[i]!.start, end: ws[i + n - 1]!.end });
    {
      // "how many research vessels …": the longest type key among the next words names the answer type
      let found = false;
      for (let len = Math.min(model.maxTypeWords, 3); len >= 1 && !found; len--) {
        for (let s = i + n; s <= i + n + 2 - len + 1 && s + len <= ws.length; s++) {
          if (ws.slice(s, s + len).some((_, k) => inMention[s + k])) continue;
          const key = ws.slice(s, s + len).map((w) => w.stem).join(" ");
          const nums = model.typesByKey.get(key);
          if (nums && nums.length > 0) {
            answerTypes = nums.map((t) => ({ num: t, id: model.typeByNum.get(t)!.id, label: model.typeByNum.get(t)!.label }));
            for (let k = 0; k < len; k++) used.add(s + k);
            found = true;
            break;
          }
        }
      }
    }
    break;
  }

  // --- comparisons around quantities ---------------------------------------------------
  const quantities = allQuantities.filter((q) => !names.some((m) => q.start < m.end && q.end > m.start));
  const wordAt = (offset: number) => ws.findIndex((w) => w.start <= offset && offset < w.end);
  const negationBefore = (i: number): number => {
    // "not" right before an operator phrase: returns the negation word index or -1
    for (let j = i - 1; j >= Math.max(0, i - 2); j--) if (ws[j]!.norm === "not" || ws[j]!.norm === "never") return j;
    return -1;
  };
  for (let qi = 0; qi < quantities.length; qi++) {
    const q = quantities[qi]!;
    const qw = wordAt(q.start);
    if (qw < 0) continue;
    const qEnd = ws.findIndex((w) => w.start >= q.end);
    const afterQ = qEnd < 0 ? ws.length : qEnd;
    // between X and Y / from X to Y
    const next = quantities[qi + 1];
    const bw = qw - 1;
    if (next && bw >= 0 && (ws[bw]!.norm === "between" || ws[bw]!.norm === "from")) {
      const link = ws[afterQ]?.norm;
      const nw = wordAt(next.start);
      if (((ws[bw]!.norm === "between" && link === "and") || (ws[bw]!.norm === "from" && (link === "to" || link === "until"))) && nw === afterQ + 1) {
        const neg = negationBefore(bw);
        const span = [bw, ...range(qw, nw + 1)];
        const nEnd = ws.findIndex((w) => w.start >= next.end);
        const lastWord = (nEnd < 0 ? ws.length : nEnd) - 1;
        for (let k = bw; k <= lastWord; k++) used.add(k);
        if (neg >= 0) used.add(neg);
        const from = neg >= 0 ? neg : bw;
        const lo = Math.min(q.lo, next.lo);
        const hiQ = q.lo <= next.lo ? next : q;
        conditions.push(comparison(question, ws, from, lastWord, "between", [q.text, next.text], { min: lo, max: hiQ.hi, maxStrict: hiQ.hi > hiQ.lo }, neg >= 0, chooseAttributes(ws, inMention, used, span, [q, next], attributes, o, temporalQuantity(q))));
        qi++;
        continue;
      }
    }
    // operator before the quantity
    let op: string | undefined;
    let opStart = qw;
    for (const [phrase, kind] of BEFORE_QUANTITY) {
      const len = phrase.split(" ").length;
      const at = qw - len;
      if (at >= 0 && phraseAt(ws, at, phrase) === len) {
        op = kind;
        opStart = at;
        break;
      }
      // skip an article: "of a 1,000", "over the 1970s" is read by the decade parser already
    }
    // a comparative adjective: "longer than 60", "older than 1980"
    let dimension: Dimension | undefined;
    if (op === undefined && qw >= 2 && ws[qw - 1]!.norm === "than") {
      const adj = ws[qw - 2]!.norm;
      const temporal = TEMPORAL.up.includes(adj as never) ? "after" : TEMPORAL.down.includes(adj as never) ? "before" : undefined;
      const dim = DIMENSIONS.find((d) => d.up.includes(adj) || d.down.includes(adj));
      if (temporal && temporalQuantity(q)) op = temporal;
      else if (dim) {
        op = dim.up.includes(adj) ? ">" : "<";
        dimension = dim;
      } else if (/er$/.test(adj)) op = ">";
      if (op !== undefined) opStart = qw - 2;
    }
    // a compass point before "of", the attribute's words between it and the number: "south of latitude -50"
    for (let gap = 0; op === undefined && gap <= 2; gap++) {
      const at = qw - gap - 2;
      if (at < 0 || inMention[at] || ws[at + 1]!.norm !== "of") continue;
      const between = range(at + 2, qw);
      if (between.some((k) => inMention[k] || isFunctionWord(ws[k]!.norm))) continue;
      const dir = COMPASS_COMPARATIVES[ws[at]!.norm];
      if (dir === undefined || (gap > 0 && !attributeWordNear(ws, inMention, qw, attributes, o))) continue;
      op = dir;
      opStart = at;
    }
    // trailing "or more", "or earlier"
    let lastWord = afterQ - 1;
    if (op === undefined || op === "=" || op === "in") {
      for (const [phrase, kind] of AFTER_QUANTITY) {
        const len = phraseAt(ws, afterQ, phrase);
        if (len > 0) {
          op = kind;
          lastWord = afterQ + len - 1;
          break;
        }
      }
    }
    if (op === undefined) continue;
    if ((op === "in" || op === "=") && q.kind === "number" && op === "in") continue; // "in 3 places" is no comparison
    if (op === "=" && q.kind === "number" && q.unit === undefined && !attributeWordNear(ws, inMention, opStart, attributes, o)) continue;
    const neg = negationBefore(opStart);
    const from = neg >= 0 ? neg : opStart;
    for (let k = from; k <= lastWord; k++) used.add(k);
    const r = rangeOf(op, q);
    const temporalCond = temporalQuantity(q) || ["before", "after", "since", "until"].includes(op);
    const display = displayOperator(op);
    const choices = chooseAttributes(ws, inMention, used, range(opStart, lastWord + 1), [q], attributes, o, temporalCond, dimension);
    conditions.push(comparison(question, ws, from, lastWord, display, [q.text], r, neg >= 0, choices));
  }

  // --- superlatives and ordinals -------------------------------------------------------
  for (let i = 0; i < ws.length; i++) {
    if (inMention[i] || used.has(i)) continue;
    const n = ws[i]!.norm;
    let order: "max" | "min" | undefined;
    let temporal = false;
    let dimension: Dimension | undefined;
    let span = 1;
    if (n === "most" || n === "least" || n === "fewest") {
      // "most recent" is temporal; "most populous"/"most staff" name the attribute by the next words
      const nx = ws[i + 1]?.norm;
      if (nx === "recent") {
        order = "max";
        temporal = true;
        span = 2;
      } else order = n === "most" ? "max" : "min";
    } else if (TEMPORAL.up.includes(n as never) && (SUPERLATIVE_FORM.test(n) || n === "last")) {
      order = "max";
      temporal = true;
    } else if (TEMPORAL.down.includes(n as never) && (SUPERLATIVE_FORM.test(n) || n === "first")) {
      order = "min";
      temporal = true;
    } else {
      const dim = DIMENSIONS.find((d) => (d.up.includes(n) || d.down.includes(n)) && SUPERLATIVE_FORM.test(n));
      if (dim) {
        order = dim.up.includes(n) ? "max" : "min";
        dimension = dim;
      }
    }
    if (order === undefined) continue;
    // "first"/"last" order only as a determiner phrase ("the first …"); "first served on" is an adverb
    if ((n === "first" || n === "last") && ws[i - 1]?.norm !== "the" && ORDINALS[ws[i - 1]?.norm ?? ""] === undefined) continue;
    let from = i;
    let position = 1;
    const prev = ws[i - 1]?.norm;
    if (prev !== undefined && ORDINALS[prev] !== undefined && !inMention[i - 1]) {
      position = ORDINALS[prev]!;
      from = i - 1;
    }
    for (let k = from; k < i + span; k++) used.add(k);
    const choices = chooseAttributes(ws, inMention, used, range(from, i + span), [], attributes, o, temporal, dimension);
    conditions.push({ kind: "superlative", order, position, temporal, choices, words: question.slice(ws[from]!.start, ws[i + span - 1]!.end), start: ws[from]!.start, end: ws[i + span - 1]!.end });
  }
  // a bare ordinal before a type noun ("the second vessel …") is left alone: without a superlative it names no attribute

  // --- exclusions ----------------------------------------------------------------------
  const excluded = new Set<number>(); // mention indexes
  for (let i = 0; i < ws.length; i++) {
    if (inMention[i] || used.has(i)) continue;
    for (const [phrase, mode] of EXCLUDE_CUES) {
      const len = phraseAt(ws, i, phrase);
      if (len === 0) continue;
      const cueEnd = ws[i + len - 1]!.end;
      // "X is not an R": the negated predicate noun names the relation, X before the negation
      const pred = mode === "not" ? negatedPredicate(analysis, ws, i, len, (mi) => excluded.has(mi) || numeric.has(mi)) : undefined;
      /** Records the exclusion of mention `mi` negated by the cue at i, over `scope` in [start, end). */
      const exclude = (mi: number, scope: readonly { relation: number; inverse: boolean }[], start: number, end: number) => {
        const m = analysis.mentions[mi]!;
        excluded.add(mi);
        for (let k = i; k < i + len; k++) used.add(k);
        conditions.push({
          kind: "exclusion",
          node: m.num,
          id: m.entity.id,
          label: m.entity.label,
          mention: mi,
          mode,
          relations: scope.map((r) => r.relation),
          ...(scope.length > 0 ? { inverse: scope.map((r) => r.inverse) } : {}),
          words: question.slice(start, end),
          start,
          end,
        });
      };
      if (pred) {
        exclude(pred.mention, pred.relations, analysis.mentions[pred.mention]!.start, pred.end);
        break;
      }
      // the first clue mention after the cue, within the window, with no comma between
      let best = -1;
      analysis.mentions.forEach((m, mi) => {
        if (m.start < cueEnd || excluded.has(mi) || numeric.has(mi) || !analysis.clues.some((c) => c.mention === mi)) return;
        if (best < 0 || m.start < analysis.mentions[best]!.start) best = mi;
      });
      if (best >= 0) {
        const m = analysis.mentions[best]!;
        const gap = question.slice(cueEnd, m.start);
        const between = words(gap);
        if (!/[,;:]/.test(gap) && between.length <= o.negationWindow) {
          const scope = negationScope(analysis, ws, cueEnd, m);
          exclude(best, scope.relations, ws[i]!.start, scope.end);
        }
      } else if (mode === "not") {
        const absence = absenceAt(analysis, ws, i + len, inMention);
        if (absence) {
          for (let k = i; k <= absence.last; k++) used.add(k);
          conditions.push({ kind: "absence", relations: absence.relations, types: absence.types, words: question.slice(ws[i]!.start, ws[absence.last]!.end), start: ws[i]!.start, end: ws[absence.last]!.end });
        }
      }
      break;
    }
  }

  // --- "shares X with Y": Y is the partner the sharer is not (lexicon.ts SHARING_VERBS) -----
  for (let i = 0; i < ws.length; i++) {
    if (inMention[i] || used.has(i) || !SHARING_VERBS.has(ws[i]!.norm)) continue;
    const clueAfter = (from: number) =>
      analysis.mentions.findIndex((m, mi) => m.start >= from && !excluded.has(mi) && !numeric.has(mi) && analysis.clues.some((c) => c.mention === mi));
    const object = clueAfter(ws[i]!.end);
    if (object < 0) continue;
    const withAt = ws.findIndex((w, k) => k > i && w.start >= analysis.mentions[object]!.end && w.norm === "with");
    if (withAt < 0 || /[,;:]/.test(question.slice(ws[i]!.end, ws[withAt]!.start))) continue;
    const partner = clueAfter(ws[withAt]!.end);
    if (partner < 0) continue;
    const m = analysis.mentions[partner]!;
    if (!argumentGapWords(question.slice(ws[withAt]!.end, m.start))) continue;
    excluded.add(partner);
    used.add(i);
    used.add(withAt);
    conditions.push({ kind: "exclusion", node: m.num, id: m.entity.id, label: m.entity.label, mention: partner, mode: "other", relations: [], words: question.slice(ws[withAt]!.start, m.end), start: ws[withAt]!.start, end: m.end });
  }

  // --- literal conditions on text attributes ----------------------------------------------
  const wanted = new Set(analysis.answerTypes.flatMap((t) => model.typeByNum.get(t.num)?.descendants ?? [t.num]));
  const ofAnswerType = (num: number) => wanted.size > 0 && model.typesOf !== undefined && model.typesOf(num).some((t) => wanted.has(t));
  const literal = detectLiterals(analysis, ws, inMention, used, attributes, o, ofAnswerType);
  for (const c of literal.conditions) conditions.push(c);
  for (const mi of literal.mentions) numeric.add(mi);

  for (const c of conditions) {
    if ((c.kind === "comparison" || c.kind === "superlative") && c.choices.length > 0) for (const k of c.choices[0]!.wordIndexes) used.add(k);
  }
  for (const c of conditions) {
    if ((c.kind === "comparison" || c.kind === "superlative") && c.choices.length === 0) {
      notes.push(`"${c.words}": no attribute of the catalog matches these words, so the condition is not applied`);
    }
    if ((c.kind === "comparison" || c.kind === "superlative") && c.choices[0]?.measured) {
      notes.push(`"${c.words}" names no attribute: it measures the first of the catalog's magnitudes the candidates carry (${c.choices.map((a) => a.label).join(", ")})`);
    }
  }
  const direct = directQuestion(analysis, ws, inMention, used, attributes, o);
  if (direct.value || direct.compare) {
    // the value or the comparison explains the question: no count, no superlative of its own words
    const span = direct.value ?? direct.compare!;
    const rest = conditions.filter((c) => c.kind === "exclusion" || c.end <= span.start || c.start >= span.end);
    const gap = analysis.noteFacts?.answerTypeGap?.note;
    const notesLeft = analysis.notes.filter((n) => n !== gap);
    return { analysis: { ...analysis, notes: notesLeft }, conditions: rest, ...direct };
  }
  if (conditions.length === 0) {
    const identity = identityQuestion(analysis, ws, model);
    return identity ? { analysis, conditions, identity } : { analysis, conditions };
  }

  // condition words are no relation cues; excluded mentions are no clues
  const usedText = new Set([...used].map((k) => ws[k]!.text));
  // a relation word inside an exclusion ("not *commanded* by X") says what to exclude: it
  // makes no hop of the other clues' patterns (its other places, if any, still do)
  const exclusions = conditions.filter((c) => c.kind === "exclusion" || c.kind === "absence");
  const inExclusion = (start: number) => exclusions.some((c) => start >= c.start && start < c.end);
  const relationCues = analysis.relationCues
    .filter((c) => !c.words.every((w) => usedText.has(w)))
    .flatMap((c) => {
      const places = c.occurrences ?? [{ start: c.start, flip: c.flip }];
      const kept = places.filter((p) => !inExclusion(p.start));
      if (kept.length === places.length) return [c];
      return kept.length === 0 ? [] : [{ ...c, start: kept[0]!.start, flip: kept[0]!.flip, occurrences: kept }];
    });
  const clues = analysis.clues.filter((c) => !excluded.has(c.mention) && !numeric.has(c.mention));
  for (const mi of numeric) {
    const asValue = literal.mentions.has(mi);
    notes.push(`"${analysis.mentions[mi]!.text}" is read as ${asValue ? "an attribute value" : "part of a number"}, not as ${analysis.mentions[mi]!.entity.label}`);
  }
  // notes about words the conditions explain ("1980" matched no entity) are dropped
  const usedSpans = [...used].map((k) => ws[k]!);
  const explained = (text: string) =>
    words(text).every((x) => usedSpans.some((w) => w.text === x.text) || quantities.some((q) => question.slice(q.start, q.end).includes(x.text)));
  // the analysis's notes of what it did not find (analyze.ts NoteFacts), dropped where the conditions explain it
  const facts = analysis.noteFacts;
  const dropped = new Set<string>();
  if (answerTypes !== analysis.answerTypes && facts?.answerTypeGap?.kind === "no-question-word") dropped.add(facts.answerTypeGap.note);
  for (const u of facts?.unmatched ?? []) if (explained(u.text)) dropped.add(u.note);
  if (facts?.noClue !== undefined && answerTypes.length > 0) dropped.add(facts.noClue);
  const baseNotes = analysis.notes.filter((n) => !dropped.has(n));
  for (const c of conditions) if (c.kind === "exclusion") notes.push(`"${c.words}": ${c.label} is excluded, not used as a clue`);
  return { analysis: { ...analysis, answerTypes, relationCues, clues, notes: [...baseNotes, ...notes] }, conditions };
}

/**
 * The scope of a negation before a mention (Quirk et al. 1985 §10.64 ff.: the scope runs from
 * the negation to the end of the clause element it precedes): the relation words between the
 * cue and the mention ("not *depend on* X": the mention is their object, so the hop from X to
 * the answer walks against the stored triple, voice flip included, as in cue-chains.ts) and
 * a relation noun that heads the noun phrase the mention pre-modifies ("not in the devel
 * *section*": Quirk et al. 1985 §17.104, nouns as pre-modifiers; the noun names X's role, so
 * X is its object too). Returns those relations with the direction of the walk from X, and
 * the end of the scope.
 */
function negationScope(analysis: Analysis, ws: readonly Word[], cueEnd: number, m: { start: number; end: number }): { relations: { relation: number; inverse: boolean }[]; end: number } {
  const relations: { relation: number; inverse: boolean }[] = [];
  const add = (relation: number, inverse: boolean) => {
    if (!relations.some((r) => r.relation === relation && r.inverse === inverse)) relations.push({ relation, inverse });
  };
  let end = m.end;
  const next = ws.find((w) => w.start >= m.end);
  const head = next !== undefined && /^\s*$/.test(analysis.question.slice(m.end, next.start)) ? next : undefined;
  for (const c of analysis.relationCues) {
    for (const p of c.occurrences ?? [{ start: c.start, flip: c.flip }]) {
      if (p.start >= cueEnd && p.start < m.start) add(c.relation, !p.flip);
      else if (head !== undefined && p.start === head.start) {
        add(c.relation, !p.flip);
        let k = ws.indexOf(head);
        while (k + 1 < ws.length && c.words.includes(ws[k + 1]!.text)) k++;
        end = Math.max(end, ws[k]!.end);
      }
    }
  }
  return { relations, end };
}

/** Most function words between a negation and the predicate noun after it ("is not *an* official language"). */
const PREDICATE_GAP = 2;

/**
 * A negated copular clause whose predicate is a relational noun, after a name: "where X is not
 * an R", "X isn't the R" (Quirk et al. 1985 §10.54 ff., negation of the clause; §16.43,
 * predicate nouns): the entity asked for does not have X as its R. The clue mention X ends right
 * before the negation (or before a copula right before it: "is not"), no punctuation between,
 * and a relation cue's word follows the negation after an article and at most `PREDICATE_GAP`
 * function words in all.
 * X is the object of R, so the walk from X to what it excludes runs against the cue (`inverse`
 * = not the cue's flip, as in {@link negationScope}). Undefined when the words are no such clause.
 */
function negatedPredicate(analysis: Analysis, ws: readonly Word[], at: number, len: number, skip: (mention: number) => boolean): { mention: number; relations: { relation: number; inverse: boolean }[]; end: number } | undefined {
  // a copular negation only: "is not", "are never", or a contracted copula ("isn't"); "don't use" negates a verb
  let j = at - 1;
  const contracted = NEGATED_COPULAS.has(ws[at]!.norm);
  if (!contracted && !(j >= 0 && COPULAS.has(ws[j]!.norm))) return undefined;
  if (!contracted) j--;
  if (j < 0 || /[,;:.!?()]/.test(analysis.question.slice(ws[j]!.end, ws[at]!.start))) return undefined;
  const mention = analysis.mentions.findIndex((m, mi) => m.end === ws[j]!.end && !skip(mi) && analysis.clues.some((c) => c.mention === mi));
  if (mention < 0) return undefined;
  // a predicate noun phrase opens with an article ("is not *an* official language"); a participle
  // ("are not commanded by") is a passive verb, read by the exclusion after it
  let k = at + len;
  if (!ARTICLES.has(ws[k]?.norm ?? "")) return undefined;
  while (k < ws.length && k < at + len + PREDICATE_GAP && isFunctionWord(ws[k]!.norm)) k++;
  const head = ws[k];
  if (!head || /[,;:.!?()]/.test(analysis.question.slice(ws[at + len - 1]!.end, head.start))) return undefined;
  const relations: { relation: number; inverse: boolean }[] = [];
  let end = head.end;
  for (const c of analysis.relationCues) {
    for (const p of c.occurrences ?? [{ start: c.start, flip: c.flip }]) {
      if (p.start !== head.start) continue;
      if (!relations.some((r) => r.relation === c.relation && r.inverse === !p.flip)) relations.push({ relation: c.relation, inverse: !p.flip });
      let e = k;
      while (e + 1 < ws.length && c.words.includes(ws[e + 1]!.text)) e++;
      end = Math.max(end, ws[e]!.end);
    }
  }
  return relations.length > 0 ? { mention, relations, end } : undefined;
}

/** True when `gap` holds only function words (no content word, no punctuation): a preposition and its object. */
function argumentGapWords(gap: string): boolean {
  return !/[,;:.!?()]/.test(gap) && words(gap).every((w) => isFunctionWord(w.norm));
}

/** Most words between a negated relation word and the type noun of its missing object ("border *any other* country"). */
const ABSENCE_GAP = 2;

/**
 * A negated relation with no named object (Quirk et al. 1985 §10.58 ff.: "not … any" is the
 * negative of an existential, "no R at all"): a relation word right after the negation, with
 * no clue mention after the negation at all. The sentence's subject stands left of the verb,
 * so the walk from the node that must lack the relation runs along the stored triple (against
 * it for a passive: the cue's flip). A type noun after the word, with at most `ABSENCE_GAP`
 * function words between ("any other country"), types the missing partner and ends the scope.
 */
function absenceAt(analysis: Analysis, ws: readonly Word[], at: number, inMention: readonly boolean[]): { relations: { relation: number; inverse: boolean }[]; types: number[]; last: number } | undefined {
  const w = ws[at];
  if (!w || inMention.slice(at).some((x) => x)) return undefined;
  const relations: { relation: number; inverse: boolean }[] = [];
  let last = at;
  for (const c of analysis.relationCues) {
    for (const p of c.occurrences ?? [{ start: c.start, flip: c.flip }]) {
      if (p.start !== w.start) continue;
      if (!relations.some((r) => r.relation === c.relation && r.inverse === p.flip)) relations.push({ relation: c.relation, inverse: p.flip });
      let k = at;
      while (k + 1 < ws.length && c.words.includes(ws[k + 1]!.text)) k++;
      last = Math.max(last, k);
    }
  }
  if (relations.length === 0) return undefined;
  let types: number[] = [];
  for (let k = last + 1; k < ws.length && k <= last + 1 + ABSENCE_GAP; k++) {
    const t = (analysis.typeWords ?? []).find((x) => x.start === ws[k]!.start);
    if (t) {
      types = [...t.types];
      last = ws.findIndex((x) => x.start >= t.end) - 1;
      if (last < 0) last = ws.length - 1;
      break;
    }
    if (!isFunctionWord(ws[k]!.norm) && ws[k]!.norm !== "other") break;
  }
  return { relations, types, last };
}

function range(a: number, b: number): number[] {
  const out: number[] = [];
  for (let i = a; i < b; i++) out.push(i);
  return out;
}

function temporalQuantity(q: Quantity): boolean {
  return q.kind !== "number";
}

function displayOperator(op: string): ComparisonOperator {
  switch (op) {
    case "before":
    case "<":
      return "<";
    case "after":
    case ">":
      return ">";
    case "since":
    case ">=":
      return ">=";
    case "until":
    case "<=":
      return "<=";
    default:
      return "in";
  }
}

/** The value range of an operator applied to a quantity's interval [lo, hi). */
function rangeOf(op: string, q: Quantity): { min?: number; minStrict?: boolean; max?: number; maxStrict?: boolean } {
  const point = q.hi === q.lo;
  switch (op) {
    case "before": // before 1980: earlier than its start
      return { max: q.lo, maxStrict: true };
    case "after": // after 1980: from its end on
      return point ? { min: q.lo, minStrict: true } : { min: q.hi };
    case "since":
      return { min: q.lo };
    case "until":
      return point ? { max: q.lo } : { max: q.hi, maxStrict: true };
    case ">":
      return point ? { min: q.lo, minStrict: true } : { min: q.hi };
    case "<":
      return { max: q.lo, maxStrict: true };
    case ">=":
      return { min: q.lo };
    case "<=":
      return point ? { max: q.lo } : { max: q.hi, maxStrict: true };
    default: // "in", "=": within the interval (a point: equal)
      return point ? { min: q.lo, max: q.lo } : { min: q.lo, max: q.hi, maxStrict: true };
  }
}

function comparison(
  question: string,
  ws: readonly Word[],
  from: number,
  to: number,
  operator: ComparisonOperator,
  values: readonly string[],
  r: { min?: number; minStrict?: boolean; max?: number; maxStrict?: boolean },
  negated: boolean,
  choices: readonly AttributeChoice[],
): ComparisonCondition {
  const op: ComparisonOperator = negated ? (operator === "between" ? "not between" : operator === "<" ? ">=" : operator === "<=" ? ">" : operator === ">" ? "<=" : operator === ">=" ? "<" : "not in") : operator;
  return { kind: "comparison", operator: op, values, ...r, negated, choices, words: question.slice(ws[from]!.start, ws[to]!.end), start: ws[from]!.start, end: ws[to]!.end };
}

function credit(a: string, b: string, o: Required<ConditionOptions>): number {
  if (a === b) return 1;
  const short = a.length <= b.length ? a : b;
  const long = a.length <= b.length ? b : a;
  return short.length >= o.prefixMin && long.startsWith(short) ? o.partialCredit : 0;
}

/** True when some free word near `at` matches an attribute surface (so "of 62" is a comparison only with an attribute word). */
function attributeWordNear(ws: readonly Word[], inMention: readonly boolean[], at: number, attributes: AttributeModel, o: Required<ConditionOptions>): boolean {
  for (let k = Math.max(0, at - 3); k < at; k++) {
    if (inMention[k] || isFunctionWord(ws[k]!.norm)) continue;
    if (attributes.attributes.some((a) => a.surfaces.some((s) => s.some((x) => credit(x, ws[k]!.stem, o) > 0)))) return true;
  }
  return false;
}

/**
 * Scores every attribute against the question's free words (nearer words first on ties),
 * the written units and the dimension hints; returns those above `minScore`, best first.
 */
function chooseAttributes(
  ws: readonly Word[],
  inMention: readonly boolean[],
  used: ReadonlySet<number>,
  span: readonly number[],
  quantities: readonly Quantity[],
  attributes: AttributeModel,
  o: Required<ConditionOptions>,
  temporal: boolean,
  dimension?: Dimension,
): AttributeChoice[] {
  const centre = span.length > 0 ? span[0]! : 0;
  const free: number[] = [];
  ws.forEach((w, k) => {
    if (inMention[k] || isFunctionWord(w.norm)) return;
    if (used.has(k) && !span.includes(k)) return;
    free.push(k);
  });
  const unitStems = quantities.flatMap((q) => (q.unit !== undefined ? surfaceStems(q.unit) : []));
  const hints = (dimension?.attributes ?? []).map(stemToken);
  const scored: { a: ModelAttribute; score: number; dist: number; at: number[] }[] = [];
  for (const a of attributes.attributes) {
    let best = 0;
    let dist = Infinity;
    let at: number[] = [];
    for (const surface of a.surfaces) {
      let sum = 0;
      let d = Infinity;
      const hit: number[] = [];
      for (const s of surface) {
        let c = 0;
        let cd = Infinity;
        let ck = -1;
        for (const k of free) {
          const x = credit(s, ws[k]!.stem, o);
          const kd = Math.abs(k - centre);
          if (x > c || (x === c && x > 0 && kd < cd)) {
            c = x;
            cd = kd;
            ck = k;
          }
        }
        sum += c;
        if (c > 0) {
          d = Math.min(d, cd);
          hit.push(ck);
        }
      }
      const sc = surface.length > 0 ? sum / surface.length : 0;
      if (sc > best || (sc === best && d < dist)) {
        best = sc;
        dist = d;
        at = hit;
      }
    }
    const hinted = hints.some((x) => a.surfaces.some((sf) => sf.includes(x)) || a.id.toLowerCase() === x);
    // a unit alone does not pick an attribute against the adjective ("wider than 10 metres" is no length)
    const unitOk = dimension === undefined || best > 0 || hinted;
    const unitHit = (unitStems.length > 0 && a.unitStems.length > 0 && a.unitStems.every((u) => unitStems.some((x) => credit(u, x, o) > 0))) || (a.unit !== undefined && quantities.some((q) => q.unit !== undefined && unitMatches(q.unit, a.unit!)));
    if (unitOk && unitHit) best += o.unitBonus;
    // a unit word written in the question without a number ("most inhabitants") matches like a label word
    if (best === 0 && quantities.length === 0 && a.unitStems.length > 0 && a.unitStems.every((u) => free.some((k) => credit(u, ws[k]!.stem, o) === 1))) {
      best = 0.6;
      at = free.filter((k) => a.unitStems.some((u) => credit(u, ws[k]!.stem, o) === 1));
    }
    if (hints.length > 0) {
      const h = hints.findIndex((x) => a.surfaces.some((s) => s.includes(x)) || a.id.toLowerCase() === x);
      if (h >= 0) best = Math.max(best, o.hintScore - 0.01 * h);
    }
    if (temporal && a.temporal) best += o.temporalBonus;
    if (!temporal && a.temporal && quantities.length > 0 && best > 0) best -= o.temporalBonus;
    if (best >= o.minScore) scored.push({ a, score: best, dist, at });
  }
  scored.sort((x, y) => y.score - x.score || x.dist - y.dist || (x.a.id < y.a.id ? -1 : x.a.id > y.a.id ? 1 : 0));
  const out: AttributeChoice[] = scored.map(({ a, score, at }) => ({ num: a.num, id: a.id, label: a.label, ...(a.unit !== undefined ? { unit: a.unit } : {}), score, wordIndexes: at }));
  // an adjective of size that no label names measures the catalog's magnitudes: after the
  // named choices, at the lowest score, so the ranking takes the first the candidates carry
  if (dimension?.general) {
    for (const a of attributes.attributes) {
      if (!a.magnitude || out.some((c) => c.num === a.num)) continue;
      out.push({ num: a.num, id: a.id, label: a.label, ...(a.unit !== undefined ? { unit: a.unit } : {}), score: o.minScore, wordIndexes: [], measured: true });
    }
  }
  return out;
}

/**
 * A question answered by attribute values of named entities instead of a walk:
 *
 * - value: "what is/was the ATTRIBUTE of X", "what is X's ATTRIBUTE", "how ADJECTIVE is X"
 *   (an adjective of dimension, lexicon.ts) with exactly one clue and every content word
 *   outside the clue explained by the attribute (so "the area of the country that borders
 *   X" is no value question: it names a relation too);
 * - compare: a comparative ("bigger", "older", "more") and two or more clues joined by
 *   "or"/"and"/commas, every clue in that group, no "than" after the comparative
 *   ("Which is bigger, A or B?", "Which city has more inhabitants, A or B?").
 *
 * The wh-question forms are Quirk et al. 1985 §11.14 (wh-questions with a copula and a
 * degree adverb "how" + adjective); the attribute is chosen as for every condition
 * (chooseAttributes: label, alias and unit stems, dimension hints).
 */
function directQuestion(
  analysis: Analysis,
  ws: readonly Word[],
  inMention: readonly boolean[],
  used: ReadonlySet<number>,
  attributes: AttributeModel,
  o: Required<ConditionOptions>,
): { value?: ValueQuestion; compare?: EntityComparison } {
  const question = analysis.question;
  const clueMentions = analysis.clues.map((c) => c.mention).sort((a, b) => analysis.mentions[a]!.start - analysis.mentions[b]!.start);
  if (clueMentions.length === 0 || ws.length === 0) return {};
  const mentionOf = (k: number) => clueMentions.find((mi) => ws[k]!.start < analysis.mentions[mi]!.end && ws[k]!.end > analysis.mentions[mi]!.start);
  // --- comparison between named entities -----------------------------------------------
  if (clueMentions.length >= 2) {
    const spans = clueMentions.map((mi) => analysis.mentions[mi]!);
    const coordinated = spans.every((m, k) => k === 0 || /^\s*(?:,|or|and|,\s*or|,\s*and)\s*(?:the\s+)?$/i.test(question.slice(spans[k - 1]!.end, m.start)));
    // "Which is larger, the country whose capital is A or the one whose capital is B?": an
    // alternative question over described noun phrases (Quirk et al. 1985 §11.20), one clue in
    // each alternative, "or" between them, the alternatives after a comma that follows the comparative
    const alternatives = !coordinated && spans.every((m, k) => k === 0 || /\bor\b/i.test(question.slice(spans[k - 1]!.end, m.start)));
    if (coordinated || alternatives) {
      for (let i = 0; i < ws.length; i++) {
        if (inMention[i] || ws[i + 1]?.norm === "than") continue;
        if (alternatives && !(ws[i]!.end <= spans[0]!.start && /,/.test(question.slice(ws[i]!.end, spans[0]!.start)))) continue;
        const n = ws[i]!.norm;
        const g = isComparativeForm(n) ? gradable(n) : QUANTITY_COMPARATIVES[n] !== undefined ? { order: QUANTITY_COMPARATIVES[n]!, temporal: false } : undefined;
        if (!g) continue;
        const dimension = "dimension" in g ? g.dimension : undefined;
        const choices = chooseAttributes(ws, inMention, used, [i], [], attributes, o, g.temporal, dimension);
        return {
          compare: {
            mentions: clueMentions,
            nodes: clueMentions.map((mi) => analysis.mentions[mi]!.num),
            order: g.order,
            temporal: g.temporal,
            choices,
            ...(alternatives ? { described: true } : {}),
            words: ws[i]!.text,
            start: ws[i]!.start,
            end: ws[i]!.end,
          },
        };
      }
    }
    return {};
  }
  // --- value question --------------------------------------------------------------------
  const wh = ws.findIndex((w, k) => !inMention[k] && VALUE_WH.has(w.norm));
  if (wh < 0 || ws.slice(0, wh).some((w, k) => !inMention[k] && !isFunctionWord(w.norm))) return {};
  const mi = clueMentions[0]!;
  let choices: AttributeChoice[] = [];
  let from = wh;
  if (ws[wh]!.norm === "how") {
    const adj = ws[wh + 1];
    if (!adj || HOW_AMOUNT.has(adj.norm) || !COPULAS.has(ws[wh + 2]?.norm ?? "")) return {};
    const g = gradable(adj.norm);
    if (!g) return {};
    choices = chooseAttributes(ws, inMention, used, [wh + 1], [], attributes, o, g.temporal, g.dimension);
  } else {
    if (!COPULAS.has(ws[wh + 1]?.norm ?? "")) return {};
    // text attributes answer value questions too ("what is the demonym of X")
    const numeric = new Set(attributes.attributes.map((a) => a.num));
    const all: AttributeModel = { attributes: [...attributes.attributes, ...(attributes.textAttributes ?? []).filter((a) => !numeric.has(a.num))] };
    choices = chooseAttributes(ws, inMention, used, [wh + 2], [], all, o, false);
    // every content word outside the clue is a word of the attribute
    const best = choices[0];
    if (!best || best.score < 0.75) return {};
    const free = ws.map((_, k) => k).filter((k) => k > wh + 1 && !inMention[k] && !isFunctionWord(ws[k]!.norm) && ws[k]!.norm !== "s");
    if (free.some((k) => !best.wordIndexes.includes(k))) return {};
    from = wh;
  }
  if (choices.length === 0) return {};
  // the clue must be the only name, after the wh-phrase
  if (ws.some((w, k) => k > wh && inMention[k] && mentionOf(k) === undefined)) return {};
  const m = analysis.mentions[mi]!;
  const last = ws.length - 1;
  return { value: { mention: mi, node: m.num, choices, words: question.slice(ws[from]!.start, ws[last]!.end), start: ws[from]!.start, end: ws[last]!.end } };
}


/**
 * An identity question (see {@link IdentityQuestion}): a wh-determiner ("which", "what") and
 * the answer-type words, a copula, an optional article, then one clue mention that ends the
 * question; every other word is one of those. The clue's entity must have an expected type.
 */
function identityQuestion(analysis: Analysis, ws: readonly Word[], model: QuestionModel): IdentityQuestion | undefined {
  if (analysis.clues.length !== 1 || analysis.answerTypes.length === 0 || ws.length === 0) return undefined;
  const clue = analysis.clues[0]!;
  const m = analysis.mentions[clue.mention];
  if (!m || ws[ws.length - 1]!.end > m.end) return undefined;
  const inType = (w: Word) => (analysis.answerTypeWords ?? []).some((s) => w.start >= s.start && w.end <= s.end);
  const before = ws.filter((w) => w.end <= m.start);
  if (before.length < 3 || !ANSWER_TYPE_WORDS.WH_WHICH.has(before[0]!.norm)) return undefined;
  let k = before.length - 1;
  if (ARTICLES.has(before[k]!.norm)) k--;
  if (k < 2 || !COPULAS.has(before[k]!.norm)) return undefined;
  if (!before.slice(1, k).every(inType)) return undefined;
  // the entity must be of an expected type (the catalog's hierarchy included)
  const want = new Set(analysis.answerTypes.flatMap((t) => model.typeByNum.get(t.num)?.descendants ?? [t.num]));
  if (!model.typesOf || !model.typesOf(m.num).some((t) => want.has(t))) return undefined;
  return { mention: clue.mention, node: m.num, words: analysis.question.slice(before[0]!.start, m.end), start: before[0]!.start, end: m.end };
}

/** Articles before the complement of an identity question ("is *the* …"; Quirk et al. 1985 §5.10 ff., central determiners). */
const ARTICLES: ReadonlySet<string> = new Set(["the", "a", "an"]);

/** Stored values that read as booleans (xsd:boolean's lexical forms, W3C XML Schema 1.1 Part 2 §3.3.2). */
const BOOLEAN_TRUE: ReadonlySet<string> = new Set(["true", "1"]);

/**
 * Literal conditions on text attributes: an attribute named by its label, alias (stems,
 * score ≥ 0.75 as for relation cues) and either (a) a value written in the question that is
 * one of the attribute's stored values ("whose demonym is *Motswana*", "the internet domain
 * *.ly*", "the symbol *₪*": the question's whitespace-separated tokens, 1 to 4 in a row,
 * stripped of sentence punctuation, looked up among the stored values ignoring case), or (b)
 * a boolean attribute used as a predicate adjective ("which countries are *landlocked*"):
 * value true, false after a negation word within two words before it. A mention over the
 * value stops being a clue (it is the value).
 */
function detectLiterals(
  analysis: Analysis,
  ws: readonly Word[],
  inMention: readonly boolean[],
  used: ReadonlySet<number>,
  attributes: AttributeModel,
  o: Required<ConditionOptions>,
  ofAnswerType: (num: number) => boolean = () => false,
): { conditions: LiteralCondition[]; mentions: Set<number> } {
  const out: LiteralCondition[] = [];
  const mentions = new Set<number>();
  const lookup = attributes.textValues;
  const texts = attributes.textAttributes ?? [];
  if (!lookup || texts.length === 0) return { conditions: out, mentions };
  const question = analysis.question;
  // whitespace tokens with offsets, sentence punctuation stripped at both ends (a leading "." stays: ".ly")
  const toks: { text: string; start: number; end: number }[] = [];
  for (const m of question.matchAll(/\S+/g)) {
    let t = m[0];
    let start = m.index!;
    const lead = /^["'“‘(\[]+/.exec(t)?.[0].length ?? 0;
    t = t.slice(lead);
    start += lead;
    t = t.replace(/["'”’)\]]+$/, "").replace(/[?!,;:]+$/, "").replace(/["'”’)\]]+$/, "");
    if (t !== "") toks.push({ text: t, start, end: start + t.length });
  }
  const taken: { start: number; end: number }[] = [];
  for (const a of texts) {
    // the attribute's words among the free words
    let best = 0;
    let at: number[] = [];
    for (const surface of a.surfaces) {
      let sum = 0;
      const hit: number[] = [];
      for (const st of surface) {
        let c = 0;
        let ck = -1;
        ws.forEach((w, k) => {
          if (inMention[k] || used.has(k) || isFunctionWord(w.norm)) return;
          const x = credit(st, w.stem, o);
          if (x > c) {
            c = x;
            ck = k;
          }
        });
        sum += c;
        if (ck >= 0) hit.push(ck);
      }
      const sc = surface.length > 0 ? sum / surface.length : 0;
      if (sc > best) {
        best = sc;
        at = hit;
      }
    }
    if (best < 0.75 || at.length === 0) continue;
    const first = Math.min(...at);
    const last = Math.max(...at);
    if (taken.some((t) => ws[first]!.start < t.end && ws[last]!.end > t.start)) continue;
    const choice: AttributeChoice = { num: a.num, id: a.id, label: a.label, score: best, wordIndexes: at };
    const negatedBefore = (k: number) => [k - 1, k - 2].some((j) => j >= 0 && NEGATIONS.has(ws[j]!.norm));
    // (a) a stored value written in the question, outside the attribute's words
    const grams: { text: string; start: number; end: number }[] = [];
    for (let i = 0; i < toks.length; i++) {
      for (let n = 1; n <= 4 && i + n <= toks.length; n++) {
        const g = { text: question.slice(toks[i]!.start, toks[i + n - 1]!.end), start: toks[i]!.start, end: toks[i + n - 1]!.end };
        if (g.end > ws[first]!.start && g.start < ws[last]!.end) continue;
        grams.push(g);
        if (g.text.endsWith(".")) grams.push({ ...g, text: g.text.slice(0, -1), end: g.end - 1 });
      }
    }
    const found = new Set(lookup(a.num, grams.map((g) => g.text)).map((v) => v.toLowerCase()));
    const stored = lookup(a.num, grams.map((g) => g.text));
    const matches = grams.filter((g) => found.has(g.text.toLowerCase())).sort((x, y) => y.text.length - x.text.length || x.start - y.start);
    const boolValues = lookup(a.num, ["true", "false"]);
    const isBoolean = boolValues.length > 0;
    if (matches.length > 0 && !(isBoolean && /^(true|false)$/i.test(matches[0]!.text))) {
      const g = matches[0]!;
      const value = stored.find((v) => v.toLowerCase() === g.text.toLowerCase())!;
      const valueWord = ws.findIndex((w) => w.start >= g.start);
      const negated = valueWord >= 0 && negatedBefore(valueWord) && valueWord - 2 >= last;
      const start = Math.min(ws[first]!.start, g.start);
      const end = Math.max(ws[last]!.end, g.end);
      analysis.mentions.forEach((m, mi) => {
        if (m.start < g.end && m.end > g.start) mentions.add(mi);
      });
      taken.push({ start, end });
      out.push({ kind: "literal", value, negated, choices: [choice], words: question.slice(start, end), start, end });
      continue;
    }
    // (b) a boolean attribute as a predicate adjective
    if (isBoolean) {
      const trueValue = boolValues.find((v) => BOOLEAN_TRUE.has(v.toLowerCase())) ?? "true";
      const negated = negatedBefore(first);
      const from = negated ? ws.slice(0, first).map((w, j) => j).filter((j) => j >= first - 2 && NEGATIONS.has(ws[j]!.norm))[0]! : first;
      taken.push({ start: ws[from]!.start, end: ws[last]!.end });
      out.push({ kind: "literal", value: trueValue, negated, choices: [choice], words: question.slice(ws[from]!.start, ws[last]!.end), start: ws[from]!.start, end: ws[last]!.end });
    }
  }
  // (c) a word linked only as a derived form of a name of the answer type ("known as
  //     *Kazakhstani*") that is, as written, a stored value of a text attribute: the word is that
  //     value — the form the catalog stores for the entity — not a clue next to the answer.
  //     Not when it modifies a type noun ("Kazakhstani towns": the attributive adjective names a
  //     place, Quirk et al. 1985 §7.15 ff.) nor with a negation before it.
  analysis.mentions.forEach((m, mi) => {
    if (m.match !== "derived" || mentions.has(mi) || !ofAnswerType(m.num) || !analysis.clues.some((c) => c.mention === mi)) return;
    if (taken.some((t) => m.start < t.end && m.end > t.start)) return;
    const k = ws.findIndex((w) => w.start >= m.end);
    if (k >= 0 && (analysis.typeWords ?? []).some((t) => t.start === ws[k]!.start)) return;
    const first = ws.findIndex((w) => w.start >= m.start);
    if (first > 0 && [first - 1, first - 2].some((j) => j >= 0 && NEGATIONS.has(ws[j]!.norm))) return;
    const hits = texts.flatMap((a) => lookup(a.num, [m.text]).filter((v) => v.toLowerCase() === m.text.toLowerCase()).map((value) => ({ a, value })));
    if (hits.length !== 1) return;
    const { a, value } = hits[0]!;
    mentions.add(mi);
    taken.push({ start: m.start, end: m.end });
    out.push({ kind: "literal", value, negated: false, choices: [{ num: a.num, id: a.id, label: a.label, score: o.minScore, wordIndexes: [] }], words: m.text, start: m.start, end: m.end });
  });
  return { conditions: out, mentions };
}

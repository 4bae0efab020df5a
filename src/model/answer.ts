/**
 * The JSON-shaped types that flow between stages and out of `ask --json`.
 * Field names follow ../shared/contract.md exactly; extra fields are additive.
 */

/** An entity as it appears in outputs: id (IRI or source id) and label. */
export interface EntityRef {
  readonly id: string;
  readonly label: string;
}

/**
 * How a mention's words matched an entity (additive): its label or another alias (exactly or by
 * stem), a derived form of one of its name's words ("Braskian" ~ Brask), part of a longer name
 * phrase or some of its name's words ("the Kingdom of Brask", "Quell"), a misspelling, or the
 * entity's description ("the survey ship built in 1994").
 */
export type MatchKind = "label" | "alias" | "derived" | "partial" | "fuzzy" | "description";

/** A derived form's morphology (additive): the suffix stripped from the word and the name it came from. */
export interface Derivation {
  readonly suffix: string;
  readonly base: string;
}

/** A ranked alternative for a mention. */
export interface Alternative extends EntityRef {
  /** Calibrated probability that the mention names this entity, 0..1. */
  readonly confidence: number;
  /** Additive: how the mention's words matched this entity. */
  readonly match?: MatchKind;
}

/** A span of the question linked to a catalog entity. */
export interface Mention {
  /** The question text of the span (`question.slice(start, end)`). */
  readonly text: string;
  /** UTF-16 offset of the first character. */
  readonly start: number;
  /** UTF-16 offset one past the last character. */
  readonly end: number;
  /** The chosen entity. */
  readonly entity: EntityRef;
  /** Calibrated confidence of the chosen entity, 0..1. */
  readonly confidence: number;
  /** Other candidates, best first. */
  readonly alternatives: readonly Alternative[];
  /** True when the user pinned this link (`--pin`). */
  readonly pinned?: boolean;
  /** Additive: how the words matched the chosen entity (see {@link MatchKind}). */
  readonly match?: MatchKind;
  /** Additive: for `match: "derived"`, the morphology. */
  readonly derivation?: Derivation;
  /** Additive: the second element of a hyphenated compound the name heads ("based" in "Vask-based"). */
  readonly compound?: string;
}

/** One walked edge of a path. */
export interface PathStep {
  readonly from: string;
  /** The relation's id (IRI). */
  readonly relation: string;
  readonly to: string;
  /** True when the walk goes against the stored triple `to relation from`. */
  readonly inverse: boolean;
}

/** A relation path from a clue entity to an answer. */
export interface AnswerPath {
  /** The clue (seed) entity id. */
  readonly from: string;
  readonly steps: readonly PathStep[];
}

/** One recognised condition in `ask --json` (`conditions`, additive). */
export interface ConditionDoc {
  readonly kind: "comparison" | "superlative" | "exclusion" | "count" | "literal" | "absence";
  /** The question words that expressed it. */
  readonly words: string;
  readonly start: number;
  readonly end: number;
  /** The attribute used (comparisons, superlatives); null when none was found. */
  readonly attribute?: { readonly id: string; readonly label: string; readonly unit?: string } | null;
  /** Comparisons: operator and the values as written. */
  readonly operator?: string;
  readonly values?: readonly string[];
  /** Comparisons: the range on the catalog's numeric scale. */
  readonly range?: { readonly min?: number; readonly minStrict?: boolean; readonly max?: number; readonly maxStrict?: boolean; readonly negated: boolean };
  /** Superlatives: direction and 1-based position. */
  readonly order?: "max" | "min";
  readonly position?: number;
  /** Exclusions: the excluded entity and how far the exclusion reaches. */
  readonly entity?: EntityRef;
  readonly mode?: "other" | "not";
  /** False when the condition could not be applied (no attribute). */
  readonly applied: boolean;
  /** Candidates before and after it. */
  readonly before?: number;
  readonly after?: number;
}

/** One condition step of an answer (`answers[i].values`, additive). */
export interface ConditionStepDoc {
  /** Index into `conditions`. */
  readonly condition: number;
  /** Attribute id and label (comparisons, superlatives). */
  readonly attribute?: string;
  readonly label?: string;
  /** The values read (catalog numeric scale) and as text. */
  readonly values: readonly number[];
  readonly text: string;
  readonly satisfied: boolean;
  /** Superlatives: the answer's place in the ordering. */
  readonly place?: number;
}

/** The answer of a count question (`count`, additive). */
export interface CountDoc {
  readonly value: number;
  /** Ids of the entities counted. */
  readonly entities: readonly string[];
}

/** A ranked answer with its explanation. */
export interface Answer {
  readonly id: string;
  readonly label: string;
  /** Comparable within one question only. */
  readonly score: number;
  /** Type ids of the answer. */
  readonly types: readonly string[];
  readonly paths: readonly AnswerPath[];
  /** Additive: the attribute values the question's conditions used, one step per condition (README "Conditions"). */
  readonly values?: readonly ConditionStepDoc[];
}

/** The uniqueness verdict. */
export type VerdictStatus = "unique" | "tied" | "weak" | "none";

export interface Verdict {
  readonly status: VerdictStatus;
  /** Relative lead of the best answer over the next one, 0..1. */
  readonly margin: number;
  /** Ids of the other answers that fit as well (status `tied`). */
  readonly tiedWith: readonly string[];
  /** Human-readable reason for the status (additive; always set by the pipeline). */
  readonly reason?: string;
  /** Additive: the mention the verdict turns on (a doubtful sense, a name not found), when one does. */
  readonly mention?: VerdictMention;
  /** Additive: the `tiedWith` answers that come from another sense of a mention, with that sense. */
  readonly senses?: readonly SenseAnswer[];
}

/** The mention a verdict turns on (additive; README "Verdicts"). */
export interface VerdictMention {
  /** The words of the question. */
  readonly text: string;
  readonly start: number;
  readonly end: number;
  /** The entity it was linked to (for a name not found: the nearest catalog name), null when none. */
  readonly entity: EntityRef | null;
  /** The linker's confidence in `entity`. */
  readonly confidence?: number;
  /** The next sense and its confidence (a doubtful link). */
  readonly next?: EntityRef & { readonly confidence: number };
  /** True when no catalog entity matches the words (reported as not found). */
  readonly notFound?: boolean;
}

/** An answer that comes from another sense of a mention (`Verdict.senses`). */
export interface SenseAnswer {
  /** The answer's id (also in `tiedWith`) and label. */
  readonly id: string;
  readonly label: string;
  /** The mention's words and the sense it was read as for this answer. */
  readonly mention: string;
  readonly sense: EntityRef & { readonly confidence: number };
}

/** A suggested extra clue (additive; explain stage): appended to the question it would single out the best answer. */
export interface SuggestionDoc {
  /** The clue as a writer would append it, e.g. `that is moored at Harrowgate`. */
  readonly text: string;
  /** The question with the clue appended. */
  readonly question: string;
  /** The catalog fact behind it (ids; `object` is a literal value when `literal`). */
  readonly triple: { readonly subject: string; readonly predicate: string; readonly object: string; readonly literal: boolean };
  /** Ids of the rival answers the fact rules out. */
  readonly rulesOut: readonly string[];
  /** True/false when the pipeline re-asked the extended question and it came out unique with the same answer / did not. */
  readonly verified?: boolean;
}

/** One attribute value that answers a value or comparison question (`values`, additive; README "JSON"). */
export interface ValueDoc {
  /** The entity the value belongs to. */
  readonly entity: EntityRef;
  readonly attribute: { readonly id: string; readonly label: string; readonly unit?: string };
  /** The literal as stored in the catalog. */
  readonly value: string;
  /** The value on the catalog's numeric scale (dates as a year with fraction), when it has one. */
  readonly number?: number;
  /** The catalog statement it comes from (ids; `object` is the literal). */
  readonly triple: { readonly subject: string; readonly predicate: string; readonly object: string; readonly literal: true };
}

/** A node of the question's reading (`reading.nodes`, additive). */
export interface ReadingNodeDoc {
  /** "?answer", "?v1", … for variables; the entity id for a constant. */
  readonly name: string;
  readonly kind: "answer" | "variable" | "constant";
  /** Constants: the linked entity, the mention text and the link confidence. */
  readonly entity?: EntityRef;
  readonly text?: string;
  readonly confidence?: number;
  /** Type ids the node must have (empty: any). */
  readonly types: readonly string[];
  /** Variables: the conditions on this middle node in words ("coastal = true", "largest by area"), as `constraints` are the answer's; absent when none. */
  readonly conditions?: readonly string[];
}

/** An edge of the question's reading (`reading.edges`, additive). */
export interface ReadingEdgeDoc {
  /** Indexes into `reading.nodes`: the walk goes from `from` (nearer the clue) to `to` (nearer the answer). */
  readonly from: number;
  readonly to: number;
  /** The relations the words allow (ids), with the stored direction of each: `inverse: false` is the triple `from relation to`. */
  readonly relations: readonly { readonly id: string; readonly label: string; readonly inverse: boolean }[];
  /** "forward"/"backward": the sentence says which way (`inverse` above); "either": it does not. "any": no relation word (any relation, the walk decides). */
  readonly direction: "forward" | "backward" | "either" | "any";
  /** The question words that named the relation. */
  readonly words: readonly string[];
  /** "whose only neighbour is C": the `to` node has exactly this many edges of these relations (absent: no count). */
  readonly only?: number;
}

/** The question's reading as a query graph (`reading`, additive; README "Reading"). */
export interface ReadingDoc {
  /** One line, as printed after "reading:". */
  readonly text: string;
  readonly nodes: readonly ReadingNodeDoc[];
  readonly edges: readonly ReadingEdgeDoc[];
  /** Conditions on the answer in words ("area > 500000", "largest by area", "count", "not linked to X"). */
  readonly constraints: readonly string[];
  /** True when the question asks for a set (a plural head noun, "all", "which are"). */
  readonly plural: boolean;
  /** How many entities satisfy the whole structure (null: not evaluated, e.g. no relation word); absent before ranking. */
  readonly matched?: number | null;
  /** True when no entity satisfied the structure and the answers come from the PageRank alone. */
  readonly fallback?: boolean;
  /** Question words the reading does not use. */
  readonly ignored: readonly string[];
}

/**
 * Additive (`ask --json` `notFound`): words that name something the catalog does not hold — a
 * linked mention whose best confidence is below the linker's floor (`linked: true`; it stays in
 * `mentions`), or a name-like span nothing matched (`linked: false`). `nearest` is the closest
 * catalog name with the mention's confidence for it, or (unlinked) its string similarity; null
 * when there is none.
 */
export interface NotFoundDoc {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  readonly linked: boolean;
  readonly nearest: (EntityRef & { readonly confidence?: number; readonly similarity?: number }) | null;
}

/** One document of `ask --json`. */
export interface AskResult {
  readonly question: string;
  readonly mentions: readonly Mention[];
  readonly answerTypes: readonly EntityRef[];
  readonly answers: readonly Answer[];
  readonly verdict: Verdict;
  /** Additive: notes and warnings for the user (unlinked words, ignored conditions, …). */
  readonly notes?: readonly string[];
  /** Additive: a reminder that answers are ranked suggestions, not facts. */
  readonly disclaimer?: string;
  /** Additive: clues that would single out the best answer (tied or weak verdicts). */
  readonly suggestions?: readonly SuggestionDoc[];
  /** Additive: the conditions recognised in the question (README "Conditions"). */
  readonly conditions?: readonly ConditionDoc[];
  /** Additive: the answer of a count question ("how many …"). */
  readonly count?: CountDoc;
  /** Additive: the attribute values that answer a value question ("What is the depth of X?") or decide a comparison ("Which is bigger, A or B?"), best first. */
  readonly values?: readonly ValueDoc[];
  /** Additive: how the question was read (a query graph; README "Reading"). */
  readonly reading?: ReadingDoc;
  /** Additive: names the catalog does not hold (see {@link NotFoundDoc}). */
  readonly notFound?: readonly NotFoundDoc[];
  /** Additive: present when the question's time budget was spent and stages were cut (README "Time budget"). */
  readonly budget?: BudgetDoc;
}

/** The time budget of a question that hit it: the limit, and the stages stopped early, in the order they run. */
export interface BudgetDoc {
  readonly limitMs: number;
  readonly hit: true;
  readonly cut: readonly string[];
}

/** The reminder printed with every answer set. */
export const DISCLAIMER =
  "Answers are ranked suggestions drawn from the catalog, not facts: check the paths before relying on one.";

/** One question's result in `check --json`. */
export interface CheckItem {
  /** 1-based line of the question file. */
  readonly line: number;
  readonly question: string;
  /** Expected ids or labels as written in the file (empty when none given). */
  readonly expected: readonly string[];
  /** 1-based rank of the best-ranked expected answer, null when none is among the answers. */
  readonly rank: number | null;
  /** rank === 1 (false when no expected answers were given). */
  readonly hit: boolean;
  readonly answer: AskResult;
  /** Expected values that are neither an entity id nor an exact label of the catalog (absent when none); they can never match. */
  readonly unknownExpected?: readonly string[];
  /** The verdict the question file expects (a TSV third column or a CSV `verdict` column), when given. */
  readonly expectedVerdict?: VerdictStatus;
  /** Additive: whether the verdict is the expected one (present when `expectedVerdict` is). */
  readonly verdictMatch?: boolean;
}

/** Additive: verdict accuracy of the questions that carry an expected verdict (`check` summary). */
export interface VerdictCheck {
  /** Questions with an expected verdict. */
  readonly questions: number;
  /** Share of them whose verdict is the expected one. */
  readonly accuracy: number;
  /** Counts by expected verdict (rows), then verdict given (columns); every status is present. */
  readonly confusion: Readonly<Record<VerdictStatus, Readonly<Record<VerdictStatus, number>>>>;
}

/** The summary of `check --json`. */
export interface CheckSummary {
  readonly questions: number;
  readonly withExpected: number;
  readonly hits1: number;
  readonly hits5: number;
  readonly mrr: number;
  readonly verdicts: Readonly<Record<VerdictStatus, number>>;
  readonly seconds: number;
  /** Additive: verdict accuracy and the confusion matrix, when some question carries an expected verdict. */
  readonly verdictCheck?: VerdictCheck;
  /** Additive: questions whose time budget was spent (their `budget` field says what was cut); absent in reports written before it. */
  readonly budgetHit?: number;
  /** Additive: the time budget per question in milliseconds (0: none). */
  readonly timeLimitMs?: number;
}

/** The one document of `check --json`. */
export interface CheckReport {
  readonly results: readonly CheckItem[];
  readonly summary: CheckSummary;
}

/**
 * The plain, readonly data the terminal screen shows. The engine (hooks/engine.ts) builds it
 * from the pipeline's AskOutcome and the catalog; components only read it. Everything here
 * is JSON-shaped so it can cross a worker boundary by structured clone.
 */
import type { AskResult, EntityRef } from "../../model/index.js";

/** A clue: one linked entity that seeds the ranking. */
export interface ClueView {
  /** Entity id of the clue. */
  readonly id: string;
  /** Its label. */
  readonly label: string;
  /** Index of the mention it came from, -1 when none. */
  readonly mention: number;
  /** Its weight in the combination. */
  readonly weight: number;
}

/** One cell of the clue-coverage table: how a clue reaches an answer. */
export interface CoverageCell {
  /** True when the clue reaches the answer. */
  readonly reached: boolean;
  /** Hops of the best path, when known. */
  readonly hops?: number;
  /** The clue's share of the answer's score, 0..1 relative to the best cell of the table, when known. */
  readonly strength?: number;
  /** A short text for the cell (relations of the best path, or "not reached"). */
  readonly text: string;
}

/** One row of the coverage table: an answer against every clue. */
export interface CoverageRow {
  /** Answer id. */
  readonly id: string;
  /** Answer label. */
  readonly label: string;
  /** One cell per clue, in the order of `clues`. */
  readonly cells: readonly CoverageCell[];
}

/** What dropping one clue does to the answer. */
export interface AblationView {
  /** The dropped clue's id. */
  readonly clue: string;
  /** The dropped clue's label. */
  readonly label: string;
  /** A one-word effect, e.g. "necessary", "redundant", "shifts". */
  readonly effect: string;
  /** The best answer without the clue, when there is one. */
  readonly topWithout?: EntityRef;
  /** A one-line description. */
  readonly text: string;
}

/** A clue a writer could add to make a tied or weak question unique. */
export interface SuggestionView {
  /** The clue as words to append to the question. */
  readonly text: string;
  /** How many rival answers it rules out, when known. */
  readonly rulesOut?: number;
  /** The fact behind it, as `subject relation object`, when known. */
  readonly fact?: string;
  /** The entity the suggestion is about (for an entity card), when known. */
  readonly entity?: string;
}

/** One composed question (the compose stage's proposal) as the screen shows it. */
export interface ComposedQuestionView {
  readonly question: string;
  /** Asked back, it came out unique with the intended answer first. */
  readonly verified: boolean;
  /** Why it is not verified (absent when verified). */
  readonly reason?: string;
  /** The facts it rests on, one line each (labels, salience percentile). */
  readonly facts: readonly string[];
  /** The candidate counts after the type and after each clue, e.g. "vessel 23 → 1". */
  readonly proof: string;
}

/** Questions composed for an intended answer (compose on the screen). */
export interface ComposeView {
  readonly target: EntityRef;
  readonly proposals: readonly ComposedQuestionView[];
  /** Why nothing was found, when so. */
  readonly notes: readonly string[];
  readonly millis: number;
}

/** One answered question as the screen shows it. */
export interface TuiResult {
  /** The contract document (question, mentions, answer types, answers with paths, verdict). */
  readonly result: AskResult;
  /** Labels of every entity and relation id that appears (path steps, clues, types). */
  readonly labels: Readonly<Record<string, string>>;
  /** The clues of the ranking, in combination order. */
  readonly clues: readonly ClueView[];
  /** Answer × clue coverage, one row per shown answer (same order as answers). */
  readonly coverage: readonly CoverageRow[];
  /** Clue ablation, one row per clue (empty when not computed). */
  readonly ablation: readonly AblationView[];
  /** Suggested clues for tied or weak questions (empty otherwise). */
  readonly suggestions: readonly SuggestionView[];
  /** Notes from the analysis (unlinked words, fallbacks). */
  readonly notes: readonly string[];
  /** Milliseconds spent answering. */
  readonly millis: number;
}

/** One relation edge on an entity card. */
export interface CardNeighbour {
  /** "out": this → other; "in": other → this. */
  readonly direction: "out" | "in";
  /** The relation's id. */
  readonly relation: string;
  /** The relation's label. */
  readonly relationLabel: string;
  /** The other entity's id. */
  readonly id: string;
  /** The other entity's label. */
  readonly label: string;
}

/** Everything an entity card shows. */
export interface EntityCard {
  /** Entity id. */
  readonly id: string;
  /** Its label. */
  readonly label: string;
  /** Other names. */
  readonly aliases: readonly string[];
  /** Direct types. */
  readonly types: readonly EntityRef[];
  /** Its description, when there is one. */
  readonly description: string | null;
  /** Literal attributes as label and value. */
  readonly attributes: readonly { readonly label: string; readonly value: string }[];
  /** Relation edges in both directions (at most a few hundred). */
  readonly neighbours: readonly CardNeighbour[];
}

/** A link the user fixed: the mention text and the chosen entity id. */
export interface PinView {
  /** The mention's text as it appears in the question. */
  readonly text: string;
  /** The chosen entity's id. */
  readonly entity: string;
}

/** A progress report while the catalog opens. */
export interface OpenProgress {
  /** What is happening, e.g. "building relation index". */
  readonly phase: string;
  /** Fraction done, 0..1, when known. */
  readonly fraction?: number;
}

/** What the screen needs from the engine; every call may be slow, so all are asynchronous. */
export interface TuiEngine {
  /** One line naming the catalog, e.g. "demo catalog · 412 entities". */
  readonly title: string;
  /** Answers a question with the given pinned links. */
  ask(question: string, pins: readonly PinView[], top: number): Promise<TuiResult>;
  /** The card of an entity id, or null when the id is unknown. */
  card(id: string): Promise<EntityCard | null>;
  /** Questions whose only answer is the entity id (the compose stage), or null when the id is unknown. */
  compose?(id: string): Promise<ComposeView | null>;
  /** Releases the catalog. */
  close(): void;
}

/**
 * The screen's state and its transitions, as a pure reducer (tested without rendering).
 *
 * Method: a single immutable state object updated by typed actions (the reducer pattern);
 * work that needs the engine is requested by setting `request` / a card without data, and a
 * hook performs it and reports back with a matching sequence number, so late replies to an
 * older request are dropped (common practice for asynchronous UI state).
 */
import { initialLine, lineReducer, type LineAction, type LineState } from "./line-editor.js";
import type { ComposeView, EntityCard, OpenProgress, PinView, TuiResult } from "./view-types.js";

/** The panes of the main view, in Tab order. */
export const PANES = ["question", "mentions", "answers", "detail"] as const;
/** A pane of the main view. */
export type Pane = (typeof PANES)[number];

/** The tabs of the detail area, in order. */
export const DETAIL_TABS = ["paths", "coverage", "ablation", "suggestions"] as const;
/** A tab of the detail area. */
export type DetailTab = (typeof DETAIL_TABS)[number];

/** One entity card on the card stack. */
export interface CardFrame {
  /** The entity id. */
  readonly id: string;
  /** The loaded card; undefined while loading; null when the id is unknown. */
  readonly card?: EntityCard | null;
  /** Selected neighbour row. */
  readonly cursor: number;
}

/** Questions composed for an intended answer, shown over the results (`c` on an answer or a card). */
export interface ComposeFrame {
  /** The intended answer's id. */
  readonly id: string;
  /** The composition; undefined while composing; null when the id is unknown. */
  readonly view?: ComposeView | null;
  /** Selected proposal. */
  readonly cursor: number;
}

/** A pending question for the engine. */
export interface AskRequest {
  /** Sequence number; a reply must carry the same one. */
  readonly seq: number;
  readonly question: string;
  readonly pins: readonly PinView[];
  /** True when this re-ranks the shown question after a link was fixed (focus stays put). */
  readonly rerank: boolean;
}

/** The whole screen state. */
export interface TuiState {
  /** Engine life cycle. */
  readonly engine: "opening" | "ready" | "failed";
  /** Last progress report while opening. */
  readonly progress?: OpenProgress;
  /** Catalog title once open. */
  readonly title: string;
  /** The question line. */
  readonly line: LineState;
  /** The focused pane. */
  readonly pane: Pane;
  /** The help view is showing. */
  readonly help: boolean;
  /** Open entity cards, the top one last (empty: no card). */
  readonly cards: readonly CardFrame[];
  /** Composed questions shown over the results and cards, when asked for. */
  readonly compose?: ComposeFrame;
  /** The question being answered, when one is pending. */
  readonly request?: AskRequest;
  /** Last sequence number used. */
  readonly seq: number;
  /** The last answered question. */
  readonly view?: TuiResult;
  /** Links fixed by the user for the current question. */
  readonly pins: readonly PinView[];
  /** Selected mention. */
  readonly mention: number;
  /** Selected candidate of the mention: 0 = its current entity, k = alternative k-1. */
  readonly alternative: number;
  /** Selected answer. */
  readonly answer: number;
  /** Tab of the detail area. */
  readonly tab: DetailTab;
  /** Selected entity in the detail area. */
  readonly detailCursor: number;
  /** True when the user pressed enter before the catalog was open: ask once it is. */
  readonly queued?: boolean;
  /** A one-line message (errors, "no answers"), cleared by the next action that succeeds. */
  readonly message?: string;
}

/** Every state transition. */
export type TuiAction =
  | { readonly type: "line"; readonly action: LineAction }
  | { readonly type: "submit" }
  | { readonly type: "focus"; readonly pane: Pane }
  | { readonly type: "cycle-pane"; readonly delta: 1 | -1 }
  | { readonly type: "move"; readonly delta: number }
  | { readonly type: "move-mention"; readonly delta: number }
  | { readonly type: "relink" }
  | { readonly type: "unpin" }
  | { readonly type: "tab"; readonly delta: number }
  | { readonly type: "tab-set"; readonly tab: DetailTab }
  | { readonly type: "open-card"; readonly id: string }
  | { readonly type: "card-loaded"; readonly id: string; readonly card: EntityCard | null }
  | { readonly type: "compose"; readonly id: string }
  | { readonly type: "composed"; readonly id: string; readonly view: ComposeView | null }
  /** Ask the selected composed question (it goes to the question line). */
  | { readonly type: "ask-composed" }
  | { readonly type: "back" }
  | { readonly type: "help"; readonly show: boolean }
  | { readonly type: "progress"; readonly progress: OpenProgress }
  | { readonly type: "opened"; readonly title: string }
  | { readonly type: "open-failed"; readonly message: string }
  | { readonly type: "answered"; readonly seq: number; readonly view: TuiResult }
  | { readonly type: "ask-failed"; readonly seq: number; readonly message: string };

/** The state before anything happened. */
export function initialState(history: readonly string[] = []): TuiState {
  return {
    engine: "opening",
    title: "",
    line: initialLine(history),
    pane: "question",
    help: false,
    cards: [],
    seq: 0,
    pins: [],
    mention: 0,
    alternative: 0,
    answer: 0,
    tab: "paths",
    detailCursor: 0,
  };
}

function clamp(x: number, lo: number, hi: number): number {
  return Math.max(lo, Math.min(hi, x));
}

/**
 * The entity ids the detail area lists for the selected answer and tab, in screen order
 * (the cursor moves over them; a card opens on the selected one).
 */
export function detailEntities(s: TuiState): string[] {
  const v = s.view;
  if (!v) return [];
  const a = v.result.answers[s.answer];
  const seen = new Set<string>();
  const add = (id: string | undefined) => {
    if (id !== undefined && !seen.has(id)) seen.add(id);
  };
  switch (s.tab) {
    case "paths":
      if (!a) return [];
      for (const p of a.paths) {
        add(p.from);
        for (const st of p.steps) add(st.to);
      }
      break;
    case "coverage":
      for (const r of v.coverage) add(r.id);
      break;
    case "ablation":
      for (const r of v.ablation) add(r.clue);
      break;
    case "suggestions":
      for (const r of v.suggestions) add(r.entity);
      break;
  }
  return [...seen];
}

/** The entity a card would open on in the current view, or undefined. */
export function focusedEntity(s: TuiState): string | undefined {
  if (s.help || s.compose) return undefined;
  const top = s.cards[s.cards.length - 1];
  if (top) return top.card ? top.card.neighbours[top.cursor]?.id : undefined;
  const v = s.view;
  if (!v) return undefined;
  switch (s.pane) {
    case "question":
      return undefined;
    case "mentions": {
      const m = v.result.mentions[s.mention];
      if (!m) return undefined;
      return s.alternative === 0 ? m.entity.id : m.alternatives[s.alternative - 1]?.id;
    }
    case "answers":
      return v.result.answers[s.answer]?.id;
    case "detail":
      return detailEntities(s)[s.detailCursor];
  }
}

function ask(s: TuiState, question: string, pins: readonly PinView[], rerank: boolean): TuiState {
  const seq = s.seq + 1;
  return { ...s, seq, request: { seq, question, pins, rerank }, pins, message: undefined };
}

/** Applies one action. */
export function tuiReducer(s: TuiState, a: TuiAction): TuiState {
  switch (a.type) {
    case "line":
      return { ...s, line: lineReducer(s.line, a.action) };
    case "submit": {
      const q = s.line.text.trim();
      if (q.length === 0) return s;
      if (s.engine === "opening") return { ...s, queued: true, message: "the catalog is still opening: the question will be asked once it is open" };
      if (s.engine === "failed") return s;
      return { ...ask({ ...s, line: lineReducer(s.line, { type: "submit" }) }, q, [], false), pane: "question" };
    }
    case "focus":
      if (a.pane !== "question" && !s.view) return s;
      return { ...s, pane: a.pane };
    case "cycle-pane": {
      if (!s.view) return { ...s, pane: "question" };
      const panes = PANES.filter((p) => p !== "mentions" || s.view!.result.mentions.length > 0);
      const i = panes.indexOf(s.pane);
      const next = panes[(i + a.delta + panes.length) % panes.length]!;
      return { ...s, pane: next };
    }
    case "move": {
      if (s.compose) {
        const n = s.compose.view?.proposals.length ?? 0;
        return { ...s, compose: { ...s.compose, cursor: clamp(s.compose.cursor + a.delta, 0, Math.max(0, n - 1)) } };
      }
      const top = s.cards[s.cards.length - 1];
      if (top) {
        const n = top.card?.neighbours.length ?? 0;
        const cards = [...s.cards.slice(0, -1), { ...top, cursor: clamp(top.cursor + a.delta, 0, Math.max(0, n - 1)) }];
        return { ...s, cards };
      }
      const v = s.view;
      if (!v) return s;
      if (s.pane === "answers") {
        const answer = clamp(s.answer + a.delta, 0, Math.max(0, v.result.answers.length - 1));
        return { ...s, answer, detailCursor: answer === s.answer ? s.detailCursor : 0 };
      }
      if (s.pane === "mentions") {
        const m = v.result.mentions[s.mention];
        if (!m) return s;
        return { ...s, alternative: clamp(s.alternative + a.delta, 0, m.alternatives.length) };
      }
      if (s.pane === "detail") {
        const n = detailEntities(s).length;
        return { ...s, detailCursor: clamp(s.detailCursor + a.delta, 0, Math.max(0, n - 1)) };
      }
      return s;
    }
    case "move-mention": {
      const n = s.view?.result.mentions.length ?? 0;
      if (n === 0) return s;
      return { ...s, mention: clamp(s.mention + a.delta, 0, n - 1), alternative: 0 };
    }
    case "relink": {
      const v = s.view;
      if (!v || s.request) return s;
      const m = v.result.mentions[s.mention];
      if (!m || s.alternative === 0) return s;
      const alt = m.alternatives[s.alternative - 1];
      if (!alt) return s;
      const pins = [...s.pins.filter((p) => p.text !== m.text), { text: m.text, entity: alt.id }];
      return { ...ask(s, v.result.question, pins, true), alternative: 0 };
    }
    case "unpin": {
      const v = s.view;
      if (!v || s.request) return s;
      const m = v.result.mentions[s.mention];
      if (!m || !s.pins.some((p) => p.text === m.text)) return s;
      return { ...ask(s, v.result.question, s.pins.filter((p) => p.text !== m.text), true), alternative: 0 };
    }
    case "tab": {
      const i = DETAIL_TABS.indexOf(s.tab);
      return { ...s, tab: DETAIL_TABS[(i + a.delta + DETAIL_TABS.length * 4) % DETAIL_TABS.length]!, detailCursor: 0 };
    }
    case "tab-set":
      return { ...s, tab: a.tab, detailCursor: 0 };
    case "open-card":
      return { ...s, help: false, cards: [...s.cards, { id: a.id, cursor: 0 }] };
    case "card-loaded": {
      const top = s.cards[s.cards.length - 1];
      if (!top || top.id !== a.id || top.card !== undefined) return s;
      return { ...s, cards: [...s.cards.slice(0, -1), { ...top, card: a.card }] };
    }
    case "compose":
      if (s.engine !== "ready") return s;
      return { ...s, help: false, compose: { id: a.id, cursor: 0 }, message: undefined };
    case "composed":
      if (!s.compose || s.compose.id !== a.id || s.compose.view !== undefined) return s;
      return { ...s, compose: { ...s.compose, view: a.view } };
    case "ask-composed": {
      const p = s.compose?.view?.proposals[s.compose.cursor];
      if (!p) return s;
      return tuiReducer({ ...s, compose: undefined, cards: [], line: lineReducer(s.line, { type: "set", text: p.question }) }, { type: "submit" });
    }
    case "back":
      if (s.help) return { ...s, help: false };
      if (s.compose) return { ...s, compose: undefined };
      if (s.cards.length > 0) return { ...s, cards: s.cards.slice(0, -1) };
      return s;
    case "help":
      return { ...s, help: a.show };
    case "progress":
      return { ...s, progress: a.progress };
    case "opened": {
      const open: TuiState = { ...s, engine: "ready", title: a.title, progress: undefined, queued: false, message: undefined };
      return s.queued ? tuiReducer(open, { type: "submit" }) : open;
    }
    case "open-failed":
      return { ...s, engine: "failed", message: a.message, progress: undefined, queued: false };
    case "answered": {
      if (!s.request || s.request.seq !== a.seq) return s;
      const keep = s.request.rerank;
      const nMentions = a.view.result.mentions.length;
      return {
        ...s,
        request: undefined,
        view: a.view,
        answer: 0,
        detailCursor: 0,
        mention: keep ? clamp(s.mention, 0, Math.max(0, nMentions - 1)) : 0,
        alternative: 0,
        pane: keep ? s.pane : a.view.result.answers.length > 0 ? "answers" : "question",
        message: a.view.result.answers.length === 0 ? "no answers: nothing linked or nothing reachable" : undefined,
      };
    }
    case "ask-failed":
      if (!s.request || s.request.seq !== a.seq) return s;
      return { ...s, request: undefined, message: a.message };
  }
}

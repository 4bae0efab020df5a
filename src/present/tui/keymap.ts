/**
 * Which key does what in which view, and the one-line key hint for the view: pure
 * functions of the state, tested without rendering. One table per view keeps the hint and
 * the behaviour from drifting apart: the hint is generated from the same table.
 */
import type { KeyEvent, KeyName } from "./keys.js";
import { DETAIL_TABS, focusedEntity, type TuiAction, type TuiState } from "./state.js";

/** The view whose keys apply. */
export type KeyView = "help" | "compose" | "card" | "question" | "mentions" | "answers" | "detail";

/** What a key does: a state action, quitting, or nothing. */
export type KeyResult = TuiAction | "quit" | null;

/** One entry of a key hint: the key's label and what it does. */
export interface HintItem {
  /** The key as printed, e.g. "enter", "↑↓". */
  readonly key: string;
  /** What it does, in two or three words. */
  readonly what: string;
}

/** The view whose keys apply now. */
export function keyView(s: TuiState): KeyView {
  if (s.help) return "help";
  if (s.compose) return "compose";
  if (s.cards.length > 0) return "card";
  return s.pane;
}

const is = (ev: KeyEvent, ...names: KeyName[]) => ev.kind === "key" && names.includes(ev.name);
const ch = (ev: KeyEvent, ...texts: string[]) => ev.kind === "text" && texts.includes(ev.text);

function openCard(s: TuiState): KeyResult {
  const id = focusedEntity(s);
  return id === undefined ? null : { type: "open-card", id };
}

/** Keys shared by the non-editing panes of the main view. */
function paneCommon(s: TuiState, ev: KeyEvent): KeyResult | undefined {
  if (is(ev, "tab")) return { type: "cycle-pane", delta: 1 };
  if (is(ev, "backtab")) return { type: "cycle-pane", delta: -1 };
  if (ch(ev, "/")) return { type: "focus", pane: "question" };
  if (ch(ev, "?") || is(ev, "f1")) return { type: "help", show: true };
  if (ch(ev, "q")) return "quit";
  if (ch(ev, "e")) return openCard(s);
  if (ch(ev, "m") && s.view && s.view.result.mentions.length > 0) return { type: "focus", pane: "mentions" };
  if (ch(ev, "a")) return { type: "focus", pane: "answers" };
  return undefined;
}

/** Maps one key press to what it does in the current view. */
export function keyAction(s: TuiState, ev: KeyEvent): KeyResult {
  if (ev.kind === "ctrl" && ev.letter === "c") return "quit";
  const view = keyView(s);
  switch (view) {
    case "help":
      if (is(ev, "escape", "enter", "backspace", "f1") || ch(ev, "?", "q")) return { type: "back" };
      return null;
    case "compose":
      if (is(ev, "escape", "backspace", "left")) return { type: "back" };
      if (is(ev, "up")) return { type: "move", delta: -1 };
      if (is(ev, "down")) return { type: "move", delta: 1 };
      if (is(ev, "enter")) return { type: "ask-composed" };
      if (ch(ev, "?") || is(ev, "f1")) return { type: "help", show: true };
      if (ch(ev, "q")) return "quit";
      return null;
    case "card":
      if (ch(ev, "c")) return { type: "compose", id: s.cards[s.cards.length - 1]!.id };
      if (is(ev, "escape", "backspace", "left")) return { type: "back" };
      if (is(ev, "up")) return { type: "move", delta: -1 };
      if (is(ev, "down")) return { type: "move", delta: 1 };
      if (is(ev, "pageup")) return { type: "move", delta: -10 };
      if (is(ev, "pagedown")) return { type: "move", delta: 10 };
      if (is(ev, "enter", "right") || ch(ev, "e")) return openCard(s);
      if (ch(ev, "?") || is(ev, "f1")) return { type: "help", show: true };
      if (ch(ev, "q")) return "quit";
      return null;
    case "question": {
      if (ev.kind === "text") return { type: "line", action: { type: "insert", text: ev.text } };
      if (ev.kind === "ctrl") {
        if (ev.letter === "u") return { type: "line", action: { type: "kill-to-start" } };
        if (ev.letter === "a") return { type: "line", action: { type: "home" } };
        if (ev.letter === "e") return { type: "line", action: { type: "end" } };
        return null;
      }
      switch (ev.name) {
        case "enter": return { type: "submit" };
        case "up": return { type: "line", action: { type: "history-prev" } };
        case "down": return { type: "line", action: { type: "history-next" } };
        case "left": return { type: "line", action: { type: "left" } };
        case "right": return { type: "line", action: { type: "right" } };
        case "home": return { type: "line", action: { type: "home" } };
        case "end": return { type: "line", action: { type: "end" } };
        case "backspace": return { type: "line", action: { type: "backspace" } };
        case "delete": return { type: "line", action: { type: "delete" } };
        case "tab": return { type: "cycle-pane", delta: 1 };
        case "backtab": return { type: "cycle-pane", delta: -1 };
        case "escape": return s.view ? { type: "focus", pane: "answers" } : null;
        case "f1": return { type: "help", show: true };
        default: return null;
      }
    }
    case "mentions": {
      if (is(ev, "left")) return { type: "move-mention", delta: -1 };
      if (is(ev, "right")) return { type: "move-mention", delta: 1 };
      if (is(ev, "up")) return { type: "move", delta: -1 };
      if (is(ev, "down")) return { type: "move", delta: 1 };
      if (is(ev, "enter")) return { type: "relink" };
      if (ch(ev, "u")) return { type: "unpin" };
      if (is(ev, "escape")) return { type: "focus", pane: "answers" };
      return paneCommon(s, ev) ?? null;
    }
    case "answers": {
      if (is(ev, "up")) return { type: "move", delta: -1 };
      if (is(ev, "down")) return { type: "move", delta: 1 };
      if (is(ev, "pageup")) return { type: "move", delta: -5 };
      if (is(ev, "pagedown")) return { type: "move", delta: 5 };
      if (is(ev, "home")) return { type: "move", delta: -1e9 };
      if (is(ev, "end")) return { type: "move", delta: 1e9 };
      if (is(ev, "enter", "right")) return { type: "focus", pane: "detail" };
      if (ch(ev, "c")) {
        const id = s.view?.result.answers[s.answer]?.id;
        return id === undefined ? null : { type: "compose", id };
      }
      if (ch(ev, "m")) return { type: "focus", pane: "mentions" };
      if (is(ev, "escape")) return { type: "focus", pane: "question" };
      if (ev.kind === "text" && /^[1-4]$/.test(ev.text)) return { type: "tab-set", tab: DETAIL_TABS[Number(ev.text) - 1]! };
      return paneCommon(s, ev) ?? null;
    }
    case "detail": {
      if (is(ev, "left")) return { type: "tab", delta: -1 };
      if (is(ev, "right")) return { type: "tab", delta: 1 };
      if (is(ev, "up")) return { type: "move", delta: -1 };
      if (is(ev, "down")) return { type: "move", delta: 1 };
      if (is(ev, "enter")) return openCard(s);
      if (is(ev, "escape")) return { type: "focus", pane: "answers" };
      if (ev.kind === "text" && /^[1-4]$/.test(ev.text)) return { type: "tab-set", tab: DETAIL_TABS[Number(ev.text) - 1]! };
      return paneCommon(s, ev) ?? null;
    }
  }
}

/** The key hint of the current view, most useful keys first. */
export function keyHint(s: TuiState): readonly HintItem[] {
  switch (keyView(s)) {
    case "help":
      return [{ key: "esc", what: "close help" }, { key: "ctrl-c", what: "quit" }];
    case "compose":
      return [
        { key: "↑↓", what: "question" },
        { key: "enter", what: "ask it" },
        { key: "esc", what: "close" },
        { key: "?", what: "help" },
        { key: "q", what: "quit" },
      ];
    case "card":
      return [
        { key: "↑↓", what: "neighbour" },
        { key: "enter", what: "open it" },
        { key: "c", what: "compose" },
        { key: "esc", what: s.cards.length > 1 ? `back (${s.cards.length - 1})` : "close card" },
        { key: "?", what: "help" },
        { key: "q", what: "quit" },
      ];
    case "question":
      return [
        { key: "enter", what: "ask" },
        { key: "↑↓", what: "history" },
        { key: "←→", what: "edit" },
        { key: "ctrl-u", what: "clear" },
        ...(s.view ? [{ key: "tab", what: "to results" }] : []),
        { key: "F1", what: "help" },
        { key: "ctrl-c", what: "quit" },
      ];
    case "mentions":
      return [
        { key: "←→", what: "mention" },
        { key: "↑↓", what: "candidate" },
        { key: "enter", what: "re-link" },
        { key: "u", what: "unpin" },
        { key: "e", what: "card" },
        { key: "tab", what: "next pane" },
        { key: "/", what: "ask" },
        { key: "?", what: "help" },
      ];
    case "answers":
      return [
        { key: "↑↓", what: "answer" },
        { key: "enter", what: "details" },
        { key: "e", what: "card" },
        { key: "c", what: "compose" },
        { key: "m", what: "fix links" },
        { key: "1-4", what: "detail tab" },
        { key: "/", what: "ask" },
        { key: "?", what: "help" },
        { key: "q", what: "quit" },
      ];
    case "detail":
      return [
        { key: "←→", what: "tab" },
        { key: "↑↓", what: "entity" },
        { key: "enter", what: "card" },
        { key: "esc", what: "answers" },
        { key: "/", what: "ask" },
        { key: "?", what: "help" },
        { key: "q", what: "quit" },
      ];
  }
}

/** The help view's sections: a title and its key lines. */
export const HELP: readonly { readonly title: string; readonly keys: readonly HintItem[] }[] = [
  {
    title: "question line",
    keys: [
      { key: "enter", what: "ask the question" },
      { key: "↑ ↓", what: "earlier / later questions" },
      { key: "← → home end", what: "move the cursor (ctrl-a, ctrl-e too)" },
      { key: "backspace delete", what: "delete before / under the cursor" },
      { key: "ctrl-u", what: "delete to the start of the line" },
      { key: "tab / esc", what: "go to the results" },
    ],
  },
  {
    title: "results",
    keys: [
      { key: "tab shift-tab", what: "next / previous pane: question, links, answers, detail" },
      { key: "m", what: "the links pane: ← → pick a mention, ↑ ↓ pick a candidate" },
      { key: "enter (links)", what: "re-link the mention to the candidate and re-rank" },
      { key: "u (links)", what: "undo a fixed link" },
      { key: "1 2 3 4", what: "detail: paths, coverage, ablation, suggested clues" },
      { key: "e", what: "entity card of the selected entity (from any pane)" },
      { key: "c", what: "compose: questions whose only answer is the selected answer or card (↑ ↓ enter asks one)" },
      { key: "/", what: "back to the question line" },
    ],
  },
  {
    title: "entity card",
    keys: [
      { key: "↑ ↓ enter", what: "pick a neighbour and open its card" },
      { key: "esc backspace", what: "back to the previous card or the results" },
    ],
  },
  {
    title: "marks",
    keys: [
      { key: "[text 93%]", what: "a linked mention and its link confidence" },
      { key: "[text!]", what: "a link you fixed" },
      { key: ">", what: "the selected row" },
      { key: "(=) (~) (?) (-)", what: "verdict: unique, tied, weak, none" },
    ],
  },
];

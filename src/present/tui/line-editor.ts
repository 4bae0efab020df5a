/**
 * The question line: a single-line text editor with a history, as a pure reducer.
 *
 * Method: a gap-free string with a cursor held as a UTF-16 offset that always sits on a
 * grapheme-cluster boundary (Unicode UAX #29), so left/right, backspace and delete move
 * over a base letter with its combining marks, or a wide character, as one unit. History
 * browsing keeps the unsent draft and restores it when the user walks past the newest entry
 * (common practice in line editors).
 */
import { graphemes } from "./text-width.js";

/** Options of the editor. */
export const DEFAULTS = {
  /** History entries kept (oldest dropped first). */
  historyLimit: 200,
} as const;

/** The editor's state; every field is replaced, never mutated. */
export interface LineState {
  /** The text being edited. */
  readonly text: string;
  /** Cursor as a UTF-16 offset into `text`, on a grapheme boundary. */
  readonly cursor: number;
  /** Sent questions, oldest first, without consecutive duplicates. */
  readonly history: readonly string[];
  /** Position while browsing the history; `history.length` when not browsing. */
  readonly historyPos: number;
  /** The unsent text kept while browsing the history. */
  readonly draft: string;
}

/** One editing action. */
export type LineAction =
  | { readonly type: "insert"; readonly text: string }
  | { readonly type: "left" }
  | { readonly type: "right" }
  | { readonly type: "home" }
  | { readonly type: "end" }
  | { readonly type: "backspace" }
  | { readonly type: "delete" }
  /** Delete from the start of the line to the cursor (ctrl-u). */
  | { readonly type: "kill-to-start" }
  | { readonly type: "history-prev" }
  | { readonly type: "history-next" }
  /** Record the current text in the history and clear the line. */
  | { readonly type: "submit" }
  /** Replace the whole text (cursor at the end). */
  | { readonly type: "set"; readonly text: string };

/** An empty editor with an optional starting history. */
export function initialLine(history: readonly string[] = []): LineState {
  return { text: "", cursor: 0, history, historyPos: history.length, draft: "" };
}

/** Grapheme boundaries of `s` as UTF-16 offsets, 0 and s.length included. */
function boundaries(s: string): number[] {
  const out = [0];
  let at = 0;
  for (const g of graphemes(s)) {
    at += g.length;
    out.push(at);
  }
  return out;
}

function prevBoundary(s: string, at: number): number {
  const b = boundaries(s);
  let best = 0;
  for (const x of b) if (x < at) best = x;
  return best;
}

function nextBoundary(s: string, at: number): number {
  for (const x of boundaries(s)) if (x > at) return x;
  return s.length;
}

/** Removes control characters (other than none) from pasted or typed text. */
function printable(text: string): string {
  return text.replace(/[\p{Cc}]/gu, (c) => (c === "\t" || c === "\n" || c === "\r" ? " " : ""));
}

/** Applies one action. */
export function lineReducer(s: LineState, a: LineAction): LineState {
  switch (a.type) {
    case "insert": {
      const ins = printable(a.text);
      if (ins.length === 0) return s;
      const text = s.text.slice(0, s.cursor) + ins + s.text.slice(s.cursor);
      return { ...s, text, cursor: s.cursor + ins.length, historyPos: s.history.length };
    }
    case "left":
      return { ...s, cursor: prevBoundary(s.text, s.cursor) };
    case "right":
      return { ...s, cursor: nextBoundary(s.text, s.cursor) };
    case "home":
      return { ...s, cursor: 0 };
    case "end":
      return { ...s, cursor: s.text.length };
    case "backspace": {
      if (s.cursor === 0) return s;
      const from = prevBoundary(s.text, s.cursor);
      return { ...s, text: s.text.slice(0, from) + s.text.slice(s.cursor), cursor: from };
    }
    case "delete": {
      if (s.cursor >= s.text.length) return s;
      const to = nextBoundary(s.text, s.cursor);
      return { ...s, text: s.text.slice(0, s.cursor) + s.text.slice(to) };
    }
    case "kill-to-start":
      return { ...s, text: s.text.slice(s.cursor), cursor: 0 };
    case "history-prev": {
      if (s.historyPos === 0 || s.history.length === 0) return s;
      const draft = s.historyPos === s.history.length ? s.text : s.draft;
      const pos = s.historyPos - 1;
      const text = s.history[pos]!;
      return { ...s, text, cursor: text.length, historyPos: pos, draft };
    }
    case "history-next": {
      if (s.historyPos >= s.history.length) return s;
      const pos = s.historyPos + 1;
      const text = pos === s.history.length ? s.draft : s.history[pos]!;
      return { ...s, text, cursor: text.length, historyPos: pos };
    }
    case "submit": {
      const q = s.text.trim();
      let history = s.history;
      if (q.length > 0 && history[history.length - 1] !== q) history = [...history, q].slice(-DEFAULTS.historyLimit);
      return { text: "", cursor: 0, history, historyPos: history.length, draft: "" };
    }
    case "set":
      return { ...s, text: a.text, cursor: a.text.length, historyPos: s.history.length };
  }
}

import { describe, expect, it } from "vitest";
import { initialState, tuiReducer, focusedEntity, detailEntities, type TuiAction, type TuiState } from "./state.js";
import { keyAction, keyHint, keyView } from "./keymap.js";
import { parseKeys } from "./keys.js";
import type { TuiResult } from "./view-types.js";

// A hand-written answered question (contract shapes, invented names) to drive the reducer.
const VIEW: TuiResult = {
  result: {
    question: "which lab employs the author of Tidal Engines?",
    mentions: [
      { text: "Tidal Engines", start: 32, end: 45, entity: { id: "b:tidal", label: "Tidal Engines" }, confidence: 0.9, alternatives: [{ id: "b:tidal2", label: "Tidal Engines II", confidence: 0.08 }] },
    ],
    answerTypes: [{ id: "t:Lab", label: "lab" }],
    answers: [
      { id: "o:harbor", label: "Harbor Lab", score: 0.4, types: ["t:Lab"], paths: [{ from: "b:tidal", steps: [{ from: "b:tidal", relation: "r:author", to: "p:ada", inverse: false }, { from: "p:ada", relation: "r:memberOf", to: "o:harbor", inverse: false }] }] },
      { id: "o:dune", label: "Dune Lab", score: 0.1, types: ["t:Lab"], paths: [] },
    ],
    verdict: { status: "unique", margin: 0.75, tiedWith: [] },
  },
  labels: { "b:tidal": "Tidal Engines", "p:ada": "Ada Quell", "o:harbor": "Harbor Lab", "r:author": "author", "r:memberOf": "member of", "t:Lab": "lab" },
  clues: [{ id: "b:tidal", label: "Tidal Engines", mention: 0, weight: 1 }],
  coverage: [],
  ablation: [],
  suggestions: [],
  notes: [],
  millis: 3,
};

const run = (s: TuiState, ...as: TuiAction[]) => as.reduce(tuiReducer, s);
const keys = (s: TuiState, chunk: string) =>
  parseKeys(chunk).reduce((st, ev) => {
    const r = keyAction(st, ev);
    return r && r !== "quit" ? tuiReducer(st, r) : st;
  }, s);

function answered(): TuiState {
  let s = run(initialState(), { type: "opened", title: "t" });
  s = keys(s, "which lab employs the author of Tidal Engines?\r");
  expect(s.request?.question).toBe("which lab employs the author of Tidal Engines?");
  return run(s, { type: "answered", seq: s.request!.seq, view: VIEW });
}

describe("screen state", () => {
  it("keeps a question sent before the catalog is open and asks it once it is", () => {
    let s = keys(initialState(), "hello\r");
    expect(s.request).toBeUndefined();
    expect(s.message).toMatch(/still opening/);
    expect(s.line.text).toBe("hello");
    s = run(s, { type: "opened", title: "t" });
    expect(s.request?.question).toBe("hello");
    expect(s.message).toBeUndefined();
  });
  it("asks on enter, then focuses the answers", () => {
    const s = answered();
    expect(s.pane).toBe("answers");
    expect(s.line.text).toBe("");
    expect(s.line.history).toEqual(["which lab employs the author of Tidal Engines?"]);
  });
  it("drops a reply to an older request", () => {
    let s = run(initialState(), { type: "opened", title: "t" });
    s = keys(s, "a\r");
    const old = s.request!.seq;
    s = keys(run(s, { type: "focus", pane: "question" }), "b\r");
    s = run(s, { type: "answered", seq: old, view: VIEW });
    expect(s.view).toBeUndefined();
    expect(s.request?.question).toBe("b");
  });
  it("re-links a mention to an alternative: pins it and re-asks the same question", () => {
    let s = keys(answered(), "m"); // links pane
    expect(keyView(s)).toBe("mentions");
    s = keys(s, "\x1b[B"); // down: first alternative
    expect(focusedEntity(s)).toBe("b:tidal2");
    s = keys(s, "\r");
    expect(s.request).toMatchObject({ question: VIEW.result.question, pins: [{ text: "Tidal Engines", entity: "b:tidal2" }], rerank: true });
    s = run(s, { type: "answered", seq: s.request!.seq, view: VIEW });
    expect(s.pane).toBe("mentions"); // focus stays on the links after a re-rank
  });
  it("opens entity cards from any pane, stacks them and goes back", () => {
    let s = keys(answered(), "e");
    expect(s.cards.map((c) => c.id)).toEqual(["o:harbor"]);
    s = run(s, { type: "card-loaded", id: "o:harbor", card: { id: "o:harbor", label: "Harbor Lab", aliases: [], types: [], description: null, attributes: [], neighbours: [{ direction: "in", relation: "r:memberOf", relationLabel: "member of", id: "p:ada", label: "Ada Quell" }] } });
    s = keys(s, "\r"); // open the neighbour
    expect(s.cards.map((c) => c.id)).toEqual(["o:harbor", "p:ada"]);
    s = keys(s, "\x1b[D\x7f"); // left (back), backspace (back)
    expect(s.cards).toEqual([]);
    expect(keyView(s)).toBe("answers");
  });
  it("moves through the entities of the paths in the detail area", () => {
    let s = keys(answered(), "\r"); // enter: detail
    expect(keyView(s)).toBe("detail");
    expect(detailEntities(s)).toEqual(["b:tidal", "p:ada", "o:harbor"]);
    s = keys(s, "\x1b[B");
    expect(focusedEntity(s)).toBe("p:ada");
    s = keys(s, "\x1b[C"); // right: next tab resets the cursor
    expect(s.tab).toBe("coverage");
    expect(s.detailCursor).toBe(0);
  });
  it("clamps the answer selection", () => {
    const s = keys(answered(), "\x1b[B\x1b[B\x1b[B");
    expect(s.answer).toBe(1);
  });
});

describe("key hint", () => {
  it("changes with the view", () => {
    const start = initialState();
    const words = (s: TuiState) => keyHint(s).map((h) => `${h.key} ${h.what}`);
    expect(words(start)).toContain("enter ask");
    const a = answered();
    expect(words(a)).toContain("m fix links");
    expect(words(keys(a, "?"))).toEqual(["esc close help", "ctrl-c quit"]);
    expect(words(keys(a, "e"))).toContain("esc close card");
    expect(words(keys(a, "m"))).toContain("enter re-link");
  });
  it("q quits from the results but types a q on the question line", () => {
    const a = answered();
    expect(keyAction(a, { kind: "text", text: "q" })).toBe("quit");
    expect(keyAction(initialState(), { kind: "text", text: "q" })).toEqual({ type: "line", action: { type: "insert", text: "q" } });
    expect(keyAction(initialState(), { kind: "ctrl", letter: "c" })).toBe("quit");
  });
});

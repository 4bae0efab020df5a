/**
 * Compose on the terminal screen (ink-testing-library, the real demo catalog and Session in
 * process): `c` on the selected answer composes questions whose only answer it is, the same
 * ones the compose stage gives for that entity; enter asks the selected one, and its first
 * answer is the entity it was composed for. The reducer part is checked without rendering.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { render } from "ink-testing-library";
import { Composer } from "../src/compose/index.js";
import { Session } from "../src/pipeline/index.js";
import { TuiApp, inProcessEngine, PLAIN_THEME } from "../src/present/tui/index.js";
import { initialState, tuiReducer } from "../src/present/tui/state.js";

const KEY = { enter: "\r", esc: "\x1b" } as const;
let session: Session;
beforeAll(() => {
  session = Session.open();
});
afterAll(() => session.close());

async function frameWhere(app: ReturnType<typeof render>, ok: (f: string) => boolean, what: string): Promise<string> {
  for (let i = 0; i < 600; i++) {
    const f = app.lastFrame() ?? "";
    if (ok(f)) return f;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`screen never showed ${what}; last frame:\n${app.lastFrame()}`);
}

describe("compose on the terminal screen", () => {
  it("c on an answer shows the composed questions; enter asks one and its first answer is that entity", async () => {
    const question = "Which vessel carries the Deepeye sonar?";
    const first = session.ask(question).result.answers[0]!;
    const expected = (await new Composer(session).compose(session.catalog.numOf(first.id)!)).proposals;
    expect(expected.length).toBeGreaterThan(0);
    const app = render(<TuiApp open={(p) => inProcessEngine({}, p)} columns={120} rows={40} theme={PLAIN_THEME} />);
    try {
      await frameWhere(app, (f) => f.includes("[ready]"), "the catalog opened");
      app.stdin.write(question);
      await frameWhere(app, (f) => f.includes(question.slice(0, 30)), "the typed question");
      app.stdin.write(KEY.enter);
      await frameWhere(app, (f) => f.includes("verdict ") && f.includes("[ready]"), "an answer");
      app.stdin.write("c");
      const f = await frameWhere(app, (x) => x.includes("» compose") && x.includes("proof:"), "the composed questions");
      expect(f).toContain(first.label);
      expect(f).toContain(expected[0]!.question.slice(0, 40));
      expect(f).toContain(expected[0]!.verified ? "[verified]" : "[NOT verified]");
      app.stdin.write(KEY.enter);
      // the marked question shows the linked names in brackets, so its first words are compared
      const opening = expected[0]!.question.split(" ").slice(0, 3).join(" ");
      const g = await frameWhere(app, (x) => !x.includes("» compose") && x.includes(`Q: ${opening}`) && x.includes("[ready]") && x.includes("verdict "), "the composed question answered");
      expect(g.split("\n").find((l) => /^>\s+1 /.test(l))).toContain(first.label);
      expect(session.ask(expected[0]!.question).result.answers[0]!.id).toBe(first.id);
    } finally {
      app.unmount();
    }
  }, 60_000);

  it("the reducer opens, fills, moves over and closes the compose frame (hand-derived)", () => {
    let s = { ...initialState(), engine: "ready" as const };
    s = tuiReducer(s, { type: "compose", id: "ves:caddrow" });
    expect(s.compose).toEqual({ id: "ves:caddrow", cursor: 0 });
    const view = { target: { id: "ves:caddrow", label: "Caddrow" }, notes: [], millis: 1, proposals: [1, 2].map((i) => ({ question: `Q${i}?`, verified: true, facts: [], proof: "vessel 23 → 1" })) };
    expect(tuiReducer(s, { type: "composed", id: "other", view }).compose?.view).toBeUndefined();
    s = tuiReducer(s, { type: "composed", id: "ves:caddrow", view });
    s = tuiReducer(s, { type: "move", delta: 5 });
    expect(s.compose?.cursor).toBe(1);
    const asked = tuiReducer(s, { type: "ask-composed" });
    expect(asked.compose).toBeUndefined();
    expect(asked.request?.question).toBe("Q2?");
    expect(tuiReducer(s, { type: "back" }).compose).toBeUndefined();
  });
});

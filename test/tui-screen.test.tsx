/**
 * The terminal screen driven through ink-testing-library on the real demo catalog, with
 * the real pipeline Session behind it (in-process engine). Expected answers come from the
 * demo question file (data/demo-questions.tsv, written by the demo's author); the shown
 * verdict and re-ranked answers are checked against the Session's own contract document.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { render } from "ink-testing-library";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { demoDataDir } from "../src/catalog/index.js";
import { Session } from "../src/pipeline/index.js";
import { TuiApp, inProcessEngine, PLAIN_THEME, truncate } from "../src/present/tui/index.js";
import { ignoredLine, readingLine } from "../src/present/index.js";

const KEY = { enter: "\r", down: "\x1b[B", up: "\x1b[A", esc: "\x1b", backspace: "\x7f", tab: "\t" } as const;

let session: Session;
let demo: { question: string; expected: string }[];

beforeAll(() => {
  session = Session.open();
  demo = readFileSync(join(demoDataDir(), "demo-questions.tsv"), "utf8")
    .split("\n")
    .filter((l) => l.trim() !== "" && !l.startsWith("#"))
    .map((l) => {
      const [question, expected] = l.split("\t");
      return { question: question!.trim(), expected: (expected ?? "").split("|")[0]!.trim() };
    });
});
afterAll(() => session.close());

/** Polls the last frame until `ok` holds (the engine answers asynchronously). */
async function frameWhere(app: ReturnType<typeof render>, ok: (f: string) => boolean, what: string): Promise<string> {
  for (let i = 0; i < 400; i++) {
    const f = app.lastFrame() ?? "";
    if (ok(f)) return f;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`screen never showed ${what}; last frame:\n${app.lastFrame()}`);
}

function screen(columns = 80, rows = 24) {
  return render(<TuiApp open={(p) => inProcessEngine({}, p)} columns={columns} rows={rows} theme={PLAIN_THEME} />);
}

const hintLine = (f: string) => f.split("\n").filter((l) => l.trim() !== "").pop() ?? "";
const answerRow = (f: string, rank: number) => f.split("\n").find((l) => new RegExp(`^[ >·~]{2}\\s*${rank} `).test(l)) ?? "";

async function ask(app: ReturnType<typeof render>, question: string): Promise<string> {
  await frameWhere(app, (f) => f.includes("[ready]"), "the catalog opened");
  app.stdin.write(question);
  await frameWhere(app, (f) => f.includes(question.slice(0, 30)), "the typed question");
  app.stdin.write(KEY.enter);
  return frameWhere(app, (f) => f.includes("verdict ") && f.includes("[ready]"), "an answer");
}

describe("terminal screen (ink-testing-library, demo catalog)", () => {
  it("typing a demo question and pressing enter shows its expected first answer and the verdict", async () => {
    // the first demo question the pipeline ranks correctly (the demo file says which answer is right)
    const item = demo.find((d) => session.ask(d.question).result.answers[0]?.id === d.expected);
    expect(item, "no demo question is answered correctly by the pipeline").toBeDefined();
    const truth = session.ask(item!.question).result;
    const app = screen();
    const f = await ask(app, item!.question);
    expect(answerRow(f, 1)).toContain(truth.answers[0]!.label);
    expect(f).toContain(`verdict (${{ unique: "=", tied: "~", weak: "?", none: "-" }[truth.verdict.status]}) ${truth.verdict.status.toUpperCase()}`);
    // linked mentions are marked in the question: [text NN%]
    for (const m of truth.mentions) expect(f).toContain(`[${m.text}`);
    // at most 24 rows, none wider than 80 columns
    const lines = f.split("\n");
    expect(lines.length).toBeLessThanOrEqual(24);
    for (const l of lines) expect(l.length, l).toBeLessThanOrEqual(80);
    app.unmount();
  });

  it("re-linking a mention to an alternative re-ranks and changes the answers", async () => {
    // a demo question with a mention whose first alternative, pinned, changes the best answer
    let pick: { question: string; text: string; alt: { id: string; label: string }; before: string; after: string } | undefined;
    for (const d of demo) {
      const r = session.ask(d.question).result;
      const m = r.mentions.find((x) => x.alternatives.length > 0);
      if (!m || !r.answers[0]) continue;
      const alt = m.alternatives[0]!;
      const r2 = session.ask(d.question, { pins: [{ text: m.text, entity: alt.id }] }).result;
      if (r2.answers[0] && r2.answers[0].id !== r.answers[0].id && r2.answers[0].label !== r.answers[0].label) {
        pick = { question: d.question, text: m.text, alt, before: r.answers[0].label, after: r2.answers[0].label };
        // move the links pane to this mention: how many mentions come before it
        (pick as { index?: number }).index = r.mentions.indexOf(m);
        break;
      }
    }
    expect(pick, "no demo question has a mention whose alternative changes the answer").toBeDefined();
    const app = screen();
    const f1 = await ask(app, pick!.question);
    expect(answerRow(f1, 1)).toContain(pick!.before);
    app.stdin.write("m");
    await frameWhere(app, (f) => hintLine(f).includes("re-link"), "the links pane");
    for (let i = 0; i < ((pick as { index?: number }).index ?? 0); i++) app.stdin.write("\x1b[C");
    app.stdin.write(KEY.down); // the first alternative
    await frameWhere(app, (f) => f.includes("enter: re-link"), "a selected alternative");
    app.stdin.write(KEY.enter);
    const f2 = await frameWhere(app, (f) => answerRow(f, 1).includes(pick!.after) && f.includes("[ready]"), "the re-ranked answers");
    expect(f2).toContain(`[${pick!.text}!]`); // the fixed link is marked
    expect(answerRow(f2, 1)).not.toContain(pick!.before);
    if (process.env.TUI_DUMP) console.log(f1 + "\n----\n" + f2);
    app.unmount();
  });

  it("opens an entity card from the answers, follows a neighbour, and goes back", async () => {
    const item = demo[0]!;
    const truth = session.ask(item.question).result;
    const top = truth.answers[0]!;
    const info = session.catalog.entity(session.catalog.numOf(top.id)!);
    const app = screen();
    await ask(app, item.question);
    expect(hintLine(app.lastFrame()!)).toContain("fix links");
    app.stdin.write("e");
    const card = await frameWhere(app, (f) => f.includes("» card") && f.includes("neighbours ("), "the entity card");
    expect(card).toContain(info.label);
    expect(card).toContain(`(${top.id})`);
    for (const t of info.types) expect(card).toContain(t.label);
    expect(hintLine(card)).toContain("close card");
    app.stdin.write(KEY.enter); // open the first neighbour
    const second = await frameWhere(app, (f) => f.includes("2 cards deep") && f.includes("neighbours ("), "a second card");
    expect(hintLine(second)).toContain("back (1)");
    app.stdin.write(KEY.esc);
    await frameWhere(app, (f) => !f.includes("cards deep") && f.includes("» card"), "the first card again");
    app.stdin.write(KEY.backspace);
    const back = await frameWhere(app, (f) => !f.includes("» card") && f.includes("verdict "), "the results again");
    expect(hintLine(back)).toContain("fix links");
    app.unmount();
  });

  it("the key hint follows the view: question line, answers, detail, help", async () => {
    const app = screen();
    await frameWhere(app, (f) => f.includes("[ready]"), "the catalog opened");
    expect(hintLine(app.lastFrame()!)).toMatch(/enter ask/);
    await ask(app, demo[1]!.question);
    expect(hintLine(app.lastFrame()!)).toMatch(/↑↓ answer/);
    app.stdin.write(KEY.enter);
    const detail = await frameWhere(app, (f) => hintLine(f).includes("←→ tab"), "the detail hint");
    expect(detail).toContain("[1 paths]");
    app.stdin.write("2");
    await frameWhere(app, (f) => f.includes("[2 coverage]") && f.includes("answer \\ clue"), "the coverage table");
    app.stdin.write("?");
    const help = await frameWhere(app, (f) => hintLine(f).includes("close help"), "the help view");
    expect(help).toContain("not facts");
    app.stdin.write(KEY.esc);
    await frameWhere(app, (f) => hintLine(f).includes("←→ tab"), "the detail hint again");
    app.stdin.write("/");
    await frameWhere(app, (f) => hintLine(f).includes("enter ask"), "the question hint again");
    app.unmount();
  });

  it("lays answers and detail side by side at 160×48 and is readable without colour", async () => {
    const app = screen(160, 48);
    const f = await ask(app, demo[0]!.question);
    const lines = f.split("\n");
    expect(lines.length).toBeLessThanOrEqual(48);
    // the first answer row also carries the detail tab bar to its right
    const row = lines.find((l) => /^[ >·~]{2}\s*1 /.test(l))!;
    expect(row).toBeDefined();
    expect(row).toMatch(/\[1 paths\]/);
    expect(f).toMatch(/\(=\)|\(~\)|\(\?\)|\(-\)/); // the verdict mark, not a colour
    expect(f).not.toMatch(/\x1b\[3\dm/); // PLAIN_THEME: no foreground colour codes
    app.unmount();
  });

  it("shows the reading as ask prints it, and the words it ignores", async () => {
    // a demo question whose reading the ranking matched, and one with words the reading leaves out
    const chain = "Where is the home port of the ship Bram Tulley captains?";
    const typo = demo.find((d) => (session.ask(d.question).result.reading?.ignored.length ?? 0) > 0)!;
    expect(typo, "no demo question has ignored words").toBeDefined();
    for (const question of [chain, typo.question]) {
      const truth = session.ask(question).result.reading!;
      const app = screen();
      const f = await ask(app, question);
      const lines = f.split("\n");
      // the text output's reading line (present/reading-line.ts), cut to the 72 columns after "reading "
      expect(lines).toContain(`reading ${truncate(readingLine(truth), 72)}`);
      if (truth.ignored.length > 0) expect(lines).toContain(`ignored ${ignoredLine(truth)}`);
      else expect(f).not.toContain("ignored ");
      expect(lines.length).toBeLessThanOrEqual(24);
      for (const l of lines) expect(l.length, l).toBeLessThanOrEqual(80);
      app.unmount();
    }
  });

  it("cuts every line to a small 50×16 terminal", async () => {
    const app = screen(50, 16);
    const f = await ask(app, demo[0]!.question);
    const lines = f.split("\n");
    expect(lines.length).toBeLessThanOrEqual(16);
    for (const l of lines) expect(l.length, l).toBeLessThanOrEqual(50);
    expect(hintLine(f)).toMatch(/answer/);
    app.unmount();
  });
});

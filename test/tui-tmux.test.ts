/**
 * The real terminal: `node dist/cli/main.js` (no command) inside tmux at 80×24, a demo
 * question typed key by key, the pane captured (`tmux capture-pane -p`) and checked for
 * what a user sees — answers, verdict, marked mentions — against the `ask --json` document
 * of the same question (the contract output). Then the window is resized to 160×48 and the
 * screen must re-lay itself out. Needs a build (`npm test` builds first) and tmux (.ci/run
 * installs it); skipped with a message only when tmux is absent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import type { AskResult } from "../src/model/index.js";
import { HAVE_TMUX, tmuxPane } from "./helpers/tmux-pane.js";

const ROOT = resolve(__dirname, "..");
const CLI = join(ROOT, "dist/cli/main.js");
const hasTmux = HAVE_TMUX;
if (!hasTmux) console.warn("test/tui-tmux.test.ts: SKIPPED — tmux is not installed (apt-get install -y tmux); the real-terminal test did not run");

const { tmux, capture, captureEscapes, paneWhere, kill } = tmuxPane("tiepoint-test", "tp");

function demoQuestion(): { question: string; expected: string } {
  const line = readFileSync(join(ROOT, "data/demo-questions.tsv"), "utf8").split("\n").find((l) => l.trim() !== "" && !l.startsWith("#"))!;
  const [question, expected] = line.split("\t");
  return { question: question!.trim(), expected: expected!.split("|")[0]!.trim() };
}

describe.skipIf(!hasTmux)("terminal screen in a real terminal (tmux)", () => {
  let truth: AskResult;
  const demo = demoQuestion();

  beforeAll(() => {
    if (!existsSync(CLI)) throw new Error(`${CLI} is missing: build first (npm run build, or npm test which builds)`);
    truth = JSON.parse(execFileSync(process.execPath, [CLI, "ask", demo.question, "--json"], { cwd: ROOT, encoding: "utf8" })) as AskResult;
    const env = Object.entries({ NO_COLOR: "1", TERM: "xterm-256color" }).map(([k, v]) => `${k}=${v}`).join(" ");
    tmux("new-session", "-d", "-s", "tp", "-x", "80", "-y", "24", `cd '${ROOT}' && env ${env} '${process.execPath}' '${CLI}'; echo "[exit $?]"; sleep 60`);
  });
  afterAll(() => {
    if (hasTmux) kill();
  });

  it("shows the answers, the verdict and the marked mentions of a typed demo question at 80×24", async () => {
    await paneWhere((p) => p.includes("[ready]"), "the opened catalog");
    tmux("send-keys", "-t", "tp", "-l", demo.question);
    await paneWhere((p) => p.includes(demo.question.slice(0, 20)), "the typed question");
    tmux("send-keys", "-t", "tp", "Enter");
    const pane = await paneWhere((p) => p.includes("verdict (") && p.includes("[ready]"), "an answer");
    const lines = pane.replace(/\n$/, "").split("\n");
    expect(lines.length).toBe(24);
    // the best answer in the first answer row, as in `ask --json`, and it is the demo's expected one
    const first = lines.find((l) => /^[>·~ ]{2}\s*1 /.test(l))!;
    expect(first).toContain(truth.answers[0]!.label);
    expect(truth.answers[0]!.id).toBe(demo.expected);
    expect(pane).toContain(`${truth.verdict.status.toUpperCase()}`);
    for (const m of truth.mentions) expect(pane).toContain(`[${m.text} ${Math.round(m.confidence * 100)}%]`);
    // NO_COLOR: no foreground colour codes at all, yet every state has a mark
    expect(captureEscapes()).not.toMatch(/\x1b\[(3[0-7]|9[0-7]|38;)/);
    expect(pane).toMatch(/\((=|~|\?|-)\) /);
  });

  it("adapts to a resize to 160×48 and opens an entity card", async () => {
    tmux("resize-window", "-t", "tp", "-x", "160", "-y", "48");
    const pane = await paneWhere((p) => p.split("\n").some((l) => l.length > 100 && /\[1 paths\]/.test(l)), "the side-by-side layout");
    expect(pane.replace(/\n$/, "").split("\n").length).toBe(48);
    tmux("send-keys", "-t", "tp", "e");
    const card = await paneWhere((p) => p.includes("» card") && p.includes("neighbours ("), "the loaded entity card");
    expect(card).toContain(truth.answers[0]!.label);
    tmux("send-keys", "-t", "tp", "Escape");
    await paneWhere((p) => !p.includes("» card") && p.includes("verdict ("), "the results again");
  });

  it("quits on q with exit status 0", async () => {
    tmux("send-keys", "-t", "tp", "q");
    await paneWhere((p) => p.includes("[exit 0]"), "a clean exit");
  });
});

/**
 * The terminal screen in a real terminal (tmux, as test/tui-tmux.test.ts), issue 18: answer
 * names use the width there is (not 16 characters at 120 columns), the help screen keeps its
 * key column apart from the text, and a question with a condition shows the value that met
 * it. Facts from the demo sources (data/core.jsonl): the Greywater Transect 2019 cruise sailed
 * aboard the Skerrin Dawn; the Caddrow was built in 1978. Skipped only when tmux is absent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { existsSync } from "node:fs";
import { join, resolve } from "node:path";
import { HAVE_TMUX, tmuxPane } from "./helpers/tmux-pane.js";

const ROOT = resolve(__dirname, "..");
const CLI = join(ROOT, "dist/cli/main.js");
const hasTmux = HAVE_TMUX;
if (!hasTmux) console.warn("test/tui-widths.test.ts: SKIPPED — tmux is not installed (apt-get install -y tmux)");

const { tmux, paneWhere, kill } = tmuxPane("tiepoint-widths", "tw");

async function ask(question: string, shows: string): Promise<string> {
  tmux("send-keys", "-t", "tw", "/");
  tmux("send-keys", "-t", "tw", "C-u");
  tmux("send-keys", "-t", "tw", "-l", question);
  tmux("send-keys", "-t", "tw", "Enter");
  return paneWhere((p) => p.includes(`Q: ${question.slice(0, 12)}`) && p.includes(shows), `the answers to "${question}"`);
}

describe.skipIf(!hasTmux)("terminal screen widths (tmux)", () => {
  beforeAll(async () => {
    if (!existsSync(CLI)) throw new Error(`${CLI} is missing: build first`);
    const env = "NO_COLOR=1 TERM=xterm-256color";
    tmux("new-session", "-d", "-s", "tw", "-x", "120", "-y", "30", `cd '${ROOT}' && env ${env} '${process.execPath}' '${CLI}'; sleep 60`);
    await paneWhere((p) => p.includes("[ready]"), "the opened catalog");
  });
  afterAll(() => {
    if (hasTmux) kill();
  });

  it("shows a 23-character answer name whole at 120 columns", async () => {
    const pane = await ask("Which cruises sailed aboard the Skerrin Dawn?", "Greywater Transect 2019 ");
    const row = pane.split("\n").find((l) => /^[>·~ ]{2}\s*1 /.test(l))!;
    expect(row).toMatch(/ 1 Greywater Transect 2019 +[█░]/);
  });

  it("shows the value that met the question's condition beside each answer", async () => {
    const pane = await ask("Which vessels were built before 1980?", "build year:");
    const row = pane.split("\n").find((l) => / Caddrow /.test(l) && /build year/.test(l))!;
    expect(row).toMatch(/Caddrow +[█░]+ +\d\.\d{3} build year: 1978/);
  });

  it("keeps the help screen's key column apart from the text, in one and two columns", async () => {
    tmux("send-keys", "-t", "tw", "F1");
    let pane = await paneWhere((p) => p.includes("» question line"), "the help screen");
    expect(pane).toMatch(/ {2}backspace delete {2,}delete before/);
    expect(pane).toMatch(/\(=\) \(~\) \(\?\) \(-\) {2,}verdict/);
    tmux("resize-window", "-t", "tw", "-x", "160", "-y", "20");
    pane = await paneWhere((p) => p.split("\n").some((l) => l.includes("» question line") && l.includes("» ")), "the help screen in two columns");
    for (const line of pane.split("\n")) {
      // each key keeps at least two spaces before its text; the right column starts at its own place
      if (/backspace delete/.test(line)) expect(line).toMatch(/backspace delete {2,}delete before/);
    }
    tmux("send-keys", "-t", "tw", "Escape");
  });
});

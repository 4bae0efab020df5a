/**
 * A reader that closes the pipe early (`tiepoint … | head -1`): the command ends quietly with
 * status 0 and no stack trace (common practice for Unix filters; issue 18). Real CLI from
 * dist/, real pipes: the test reads the first chunk (or nothing) and destroys its read end,
 * so the CLI's next write meets EPIPE.
 */
import { spawn } from "node:child_process";
import { describe, expect, it } from "vitest";
import { ensureBuilt, MAIN, ROOT } from "./reliability-cli.js";
import { join } from "node:path";

ensureBuilt();

const QUESTIONS = join(ROOT, "data/demo-questions.tsv");

/** Runs the CLI, closes its stdout after `afterBytes` bytes (0: at once), resolves with the exit status and stderr. */
function closedEarly(args: readonly string[], afterBytes: number): Promise<{ status: number | null; stderr: string; got: number }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [MAIN, ...args], { cwd: ROOT, env: { ...process.env, TIEPOINT_DEBUG: "" }, stdio: ["ignore", "pipe", "pipe"] });
    let stderr = "";
    let got = 0;
    child.stderr.setEncoding("utf8").on("data", (s: string) => (stderr += s));
    const close = () => child.stdout.destroy();
    if (afterBytes === 0) close();
    else
      child.stdout.on("data", (b: Buffer) => {
        got += b.length;
        if (got >= afterBytes) close();
      });
    child.on("error", reject);
    child.on("close", (status) => resolve({ status, stderr, got }));
  });
}

describe("a closed stdout ends the command quietly", () => {
  const cases: ReadonlyArray<{ name: string; args: string[]; after: number }> = [
    // check's reports are far larger than a pipe's buffer (64 KiB on Linux, pipe(7)), so the
    // writes after the first chunk meet the closed pipe
    { name: "check --json | head -1", args: ["check", QUESTIONS, "--json"], after: 1 },
    { name: "check --format html | head", args: ["check", QUESTIONS, "--format", "html"], after: 1 },
    { name: "check (text) | head -1", args: ["check", QUESTIONS], after: 1 },
    // ask's document fits in the pipe buffer: the pipe is closed before the answer is written
    { name: "ask --json | head -1", args: ["ask", "Which vessels have Tolvane as their home port?", "--json"], after: 0 },
    { name: "ask | head -1", args: ["ask", "Which vessels have Tolvane as their home port?"], after: 0 },
    { name: "ask --dot | head -1", args: ["ask", "Which vessels have Tolvane as their home port?", "--dot"], after: 0 },
  ];
  for (const c of cases) {
    it(c.name, async () => {
      const r = await closedEarly(c.args, c.after);
      expect(r.stderr).not.toMatch(/EPIPE|node:events|at .*\(node:|Unhandled/);
      expect(r.stderr).not.toMatch(/internal error/);
      expect(r.status).toBe(0);
    });
  }
});

/**
 * The no-command entry of the built CLI when it is not on a terminal: it prints the usage
 * and exits 0 (contract: the screen is for terminals only), and a screen option placed before
 * a command name is a usage error (exit 2) rather than silently ignored by that command.
 */
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { join, resolve } from "node:path";

const ROOT = resolve(__dirname, "..");
const CLI = join(ROOT, "dist/cli/main.js");
const run = (...args: string[]) => {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: build first (npm run build, or npm test which builds)`);
  return spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: "utf8", stdio: ["pipe", "pipe", "pipe"] });
};

describe("tiepoint with no command, piped", () => {
  it("prints the usage and exits 0", () => {
    const r = run();
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^Usage: tiepoint/);
    expect(r.stdout).toMatch(/interactive screen/);
    expect(r.stderr).toBe("");
  });
  it("does not open a catalog when piped, even with --db", () => {
    const r = run("--db", join(ROOT, "no-such-catalog.db"));
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^Usage: tiepoint/);
  });
  it("refuses --db before a command name with a one-line usage error", () => {
    const r = run("--db", "x.db", "ask", "who?");
    expect(r.status).toBe(2);
    expect(r.stderr.split("\n")[0]).toMatch(/--db before the command name .* tiepoint ask … --db/);
    expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
  });
});

/**
 * `tiepoint ask` and `tiepoint check` through the real CLI (dist/cli/main.js, built by
 * `npm test`), spawned as a child process on the demo catalog: exit statuses (0 ok,
 * 1 bad input with one line on stderr, 2 bad usage; contract.md), `--json` alone on stdout
 * and parseable, the disclaimer in both outputs, `--pin`.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DISCLAIMER, type AskResult, type CheckReport } from "../src/model/index.js";

const ROOT = resolve(__dirname, "..");
const MAIN = join(ROOT, "dist/cli/main.js");
const dir = mkdtempSync(join(tmpdir(), "tiepoint-ask-cli-"));

function run(args: readonly string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: "utf8", env: { ...process.env, TIEPOINT_DEBUG: "" } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(() => {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (npx tsc -p tsconfig.json)`);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("tiepoint ask", () => {
  it("--json prints exactly one contract document on stdout", () => {
    const r = run(["ask", "Which vessel carries the VK-7 spectrometer?", "--json", "--top", "3"]);
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout) as AskResult;
    expect(Object.keys(doc)).toEqual(expect.arrayContaining(["question", "mentions", "answerTypes", "answers", "verdict"]));
    expect(doc.answers.length).toBeLessThanOrEqual(3);
    expect(doc.answerTypes.map((t) => t.id)).toEqual(["t:Vessel"]);
    expect(doc.disclaimer).toBe(DISCLAIMER);
    for (const a of doc.answers) expect(Object.keys(a)).toEqual(expect.arrayContaining(["id", "label", "score", "types", "paths"]));
  });

  it("prints mentions, expected type, answers, verdict and the disclaimer as text", () => {
    const r = run(["ask", "Which vessel carries the VK-7 spectrometer?", "--top", "3"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/linked: +"VK-7 spectrometer" -> .*\d+%/);
    expect(r.stdout).toMatch(/expects: +vessel \[t:Vessel\]/);
    expect(r.stdout).toMatch(/ 1\. .* \d\.\d{4} +\[/);
    expect(r.stdout).toMatch(/verdict: +(unique|tied|weak|none)/);
    expect(r.stdout).toContain(DISCLAIMER);
    // answer types by their label (data/schema.jsonl labels t:Vessel "vessel"), not by id
    expect(r.stdout).toMatch(/ 1\. .*\]  \(vessel\)/);
    expect(r.stdout).not.toMatch(/\(t:Vessel\)/);
  });

  it("names a tied answer by its label (data/core.jsonl: Caddrow and Lumen Ray have Tolvane as home port)", () => {
    const r = run(["ask", "Which vessels have Tolvane as their home port?"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/verdict: +tied \(margin [0-9.]+; tied with (Caddrow|Lumen Ray)\)/);
  });

  it("--pin fixes a link", () => {
    const r = run(["ask", "Which ship carries the VK-7?", "--json", "--pin", "VK-7=ins:vk7"]);
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout) as AskResult;
    const m = doc.mentions.find((x) => x.text === "VK-7");
    expect(m?.entity.id).toBe("ins:vk7");
    expect(m?.pinned).toBe(true);
  });

  it("exits 2 on bad usage and 1 on bad input, with one line and no stack trace", () => {
    for (const args of [["ask", "Who?", "--top", "zero"], ["ask", "Who?", "--top", "0"], ["ask"], ["ask", "Who?", "--pin", "novalue"]]) {
      const r = run(args);
      expect(r.status, args.join(" ")).toBe(2);
      expect(r.stdout).toBe("");
    }
    const missing = run(["ask", "Who?", "--db", join(dir, "missing.db")]);
    expect(missing.status).toBe(1);
    expect(missing.stderr.trim().split("\n")).toHaveLength(1);
    expect(missing.stderr).toMatch(/missing\.db: catalog not found/);
    expect(missing.stderr).not.toMatch(/\bat .*\.js:\d+/);
    const empty = run(["ask", "  "]);
    expect(empty.status).toBe(1);
    expect(empty.stderr).toMatch(/the question is empty/);
  });
});

describe("tiepoint check", () => {
  it("--json prints one document with results and the summary", () => {
    const file = join(dir, "q.tsv");
    writeFileSync(file, "# two questions\nWho made the VK-7?\tco:quorveth\n\nWhich vessels have Tolvane as their home port?\tves:lumen|Caddrow\nWhat is this?\n");
    const r = run(["check", file, "--json", "--top", "5"]);
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout) as CheckReport;
    expect(doc.results.map((x) => x.line)).toEqual([2, 4, 5]);
    expect(doc.results[1]!.expected).toEqual(["ves:lumen", "Caddrow"]);
    expect(doc.summary.questions).toBe(3);
    expect(doc.summary.withExpected).toBe(2);
    const v = doc.summary.verdicts;
    expect(v.unique + v.tied + v.weak + v.none).toBe(3);
    for (const x of doc.results) expect(x.hit).toBe(x.rank === 1);
  });

  it("reports a bad question file as FILE:LINE and exits 1", () => {
    const file = join(dir, "bad.tsv");
    writeFileSync(file, "ok?\n\tp:x\n");
    const r = run(["check", file]);
    expect(r.status).toBe(1);
    expect(r.stderr.trim()).toBe(`tiepoint: ${file}:2: empty question before the tab`);
    expect(run(["check", join(dir, "none.tsv")]).status).toBe(1);
    expect(run(["check"]).status).toBe(2);
  });
});

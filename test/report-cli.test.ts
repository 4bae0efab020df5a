/**
 * The report options of the real CLI (dist/cli/main.js, built by `npm test`), spawned as a
 * child process on the demo catalog with the first questions of data/demo-questions.tsv:
 * `check --format tsv|md|html --out --compare`, the progress bar (on a pseudo-terminal made
 * by util-linux `script`, and absent when stderr is a pipe), and `ask --dot`.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { dotUnescape } from "../src/present/dot.js";
import { parseDot } from "../src/present/graph-svg.js";
import type { AskResult, CheckReport } from "../src/model/index.js";

const ROOT = resolve(__dirname, "..");
const MAIN = join(ROOT, "dist/cli/main.js");
const dir = mkdtempSync(join(tmpdir(), "tiepoint-report-cli-"));
const QUESTIONS = join(dir, "questions.tsv");

function run(args: readonly string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: "utf8", env: { ...process.env, TIEPOINT_DEBUG: "" } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** One `check --json` run shared by several tests (stderr is a pipe here). */
let base: ReturnType<typeof run>;

beforeAll(() => {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (npx tsc -p tsconfig.json)`);
  const lines = readFileSync(join(ROOT, "data/demo-questions.tsv"), "utf8").split("\n").filter((l) => l.trim() !== "" && !l.startsWith("#"));
  writeFileSync(QUESTIONS, lines.slice(0, 6).join("\n") + "\n");
  base = run(["check", QUESTIONS, "--json"]);
});

describe("check report options", () => {
  it("--format tsv: a header and one row per question", () => {
    const r = run(["check", QUESTIONS, "--format", "tsv"]);
    expect(r.status, r.stderr).toBe(0);
    const rows = parse(r.stdout, { delimiter: "\t", quote: false }) as string[][];
    expect(rows[0]![0]).toBe("line");
    expect(rows).toHaveLength(7);
  });

  it("--format md --out writes the file atomically and nothing on stdout", () => {
    const out = join(dir, "md-out");
    mkdirSync(out);
    const r = run(["check", QUESTIONS, "--format", "md", "--out", join(out, "report.md")]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toBe("");
    expect(readdirSync(out)).toEqual(["report.md"]); // no temporary file left behind
    expect(readFileSync(join(out, "report.md"), "utf8")).toMatch(/^# tiepoint check report\n[\s\S]*## Summary[\s\S]*\| Hits@1 \|/);
  });

  it("--format html --out writes one self-contained page with a drawing", () => {
    const file = join(dir, "report.html");
    const r = run(["check", QUESTIONS, "--format", "html", "--out", file]);
    expect(r.status, r.stderr).toBe(0);
    const html = readFileSync(file, "utf8");
    expect(html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(html).toContain("<svg");
    expect(html.match(/<article class="question"/g)).toHaveLength(6);
  });

  it("a bad --out path: one line naming it, exit 1, before any question runs", () => {
    for (const bad of [join(dir, "no-such-folder", "r.html"), dir]) {
      const r = run(["check", QUESTIONS, "--format", "html", "--out", bad]);
      expect(r.status).toBe(1);
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toContain(`tiepoint: ${bad}: cannot write the report`);
    }
  });

  it("bad usage: an unknown format, or --json with another format, exits 2", () => {
    expect(run(["check", QUESTIONS, "--format", "pdf"]).status).toBe(2);
    expect(run(["check", QUESTIONS, "--format", "md", "--json"]).status).toBe(2);
  });

  it("--compare: an unreadable or foreign earlier report is one line, exit 1", () => {
    const foreign = join(dir, "foreign.json");
    writeFileSync(foreign, JSON.stringify({ results: [{ line: "one" }] }));
    const r = run(["check", QUESTIONS, "--compare", foreign]);
    expect(r.status).toBe(1);
    expect(r.stderr.trim()).toBe(`tiepoint: ${foreign}: not a check report: results[0].line should be a number (write one with: tiepoint check FILE --json)`);
    const missing = run(["check", QUESTIONS, "--compare", join(dir, "nope.json")]);
    expect(missing.status).toBe(1);
    expect(missing.stderr).toContain("nope.json: cannot read the earlier report: no such file");
  });

  it("--compare against an earlier run: the changes, in text and as a JSON field", () => {
    expect(base.status, base.stderr).toBe(0);
    const old = JSON.parse(base.stdout) as CheckReport;
    // make the earlier run differ on purpose: its first question was a miss with another answer
    const edited = { ...old, results: old.results.map((x, i) => (i === 0 ? { ...x, rank: null, hit: false, answer: { ...x.answer, answers: x.answer.answers.slice(1) } } : x)) };
    const file = join(dir, "before.json");
    writeFileSync(file, JSON.stringify(edited));
    const text = run(["check", QUESTIONS, "--compare", file]);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toContain("Changes since the earlier run (6 questions in both)");
    if (old.results[0]!.hit) expect(text.stdout).toMatch(/fixed misses: 1\n {4}line \d+: rank - → 1/);
    const json = run(["check", QUESTIONS, "--json", "--compare", file]);
    const doc = JSON.parse(json.stdout) as CheckReport & { comparison: { matched: number } };
    expect(doc.comparison.matched).toBe(6);
    expect(doc.results).toHaveLength(6);
  });

  it("draws a progress bar on a terminal only", () => {
    expect(base.stderr).not.toMatch(/\[#*-*\]/);
    // util-linux script(1) gives the child a pseudo-terminal; stdout goes to a file
    const out = join(dir, "tty.json");
    const cmd = `${JSON.stringify(process.execPath)} ${JSON.stringify(MAIN)} check ${JSON.stringify(QUESTIONS)} --json > ${JSON.stringify(out)}`;
    const r = spawnSync("script", ["-qec", cmd, "/dev/null"], { cwd: ROOT, encoding: "utf8" });
    if (r.error) return void process.stderr.write(`report-cli: script(1) unavailable, terminal check skipped\n`);
    expect(r.status, r.stdout).toBe(0);
    expect(r.stdout).toMatch(/\[#+\] 6\/6 100%/); // the last frame: a full bar
    expect(JSON.parse(readFileSync(out, "utf8")).results).toHaveLength(6);
  });
});

describe("ask --dot", () => {
  it("prints DOT whose edges are exactly the path edges of ask --json", async () => {
    const q = "What is the home port of the Caddrow?";
    const json = run(["ask", q, "--json"]);
    const dot = run(["ask", q, "--dot"]);
    expect(json.status, json.stderr).toBe(0);
    expect(dot.status, dot.stderr).toBe(0);
    const doc = JSON.parse(json.stdout) as AskResult;
    const want = new Set<string>();
    for (const a of doc.answers) for (const p of a.paths) for (const s of p.steps) want.add(JSON.stringify(s.inverse ? [s.to, s.relation, s.from] : [s.from, s.relation, s.to]));
    const g = await parseDot(dot.stdout);
    const entity = new Map(g.nodes.map((n) => [n.name, dotUnescape(n.attributes.entity!)]));
    const got = g.edges.map((e) => JSON.stringify([entity.get(e.tail), dotUnescape(e.attributes.relation!), entity.get(e.head)]));
    expect(got.length).toBe(want.size);
    expect(new Set(got)).toEqual(want);
    expect(want.size).toBeGreaterThan(0);
  });

  it("refuses --dot with --json (exit 2)", () => {
    expect(run(["ask", "Who leads the MICA project?", "--dot", "--json"]).status).toBe(2);
  });
});

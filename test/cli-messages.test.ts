/**
 * Messages a new user meets (issue 18): an unknown command, a catalog that does not exist
 * (the suggested load command must work as printed), a condition whose attribute the
 * candidates lack. Real CLI from dist/, real files, real SQLite.
 */
import { execSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ensureBuilt, tp } from "./reliability-cli.js";

ensureBuilt();
const dir = mkdtempSync(join(tmpdir(), "tp-msg-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// an invented orchard cooperative: orchards carry an acreage, growers do not
const ORCHARDS = [
  '{"kind":"type","id":"t:Orchard","label":"orchard"}',
  '{"kind":"type","id":"t:Grower","label":"grower"}',
  '{"kind":"relation","id":"r:tends","label":"tends"}',
  '{"id":"o:fenwold","label":"Fenwold Orchard","types":["t:Orchard"],"attributes":{"acreage":12}}',
  '{"id":"o:brisk","label":"Briskmere Orchard","types":["t:Orchard"],"attributes":{"acreage":30}}',
  '{"id":"g:alia","label":"Alia Tormund","types":["t:Grower"],"relations":{"r:tends":["o:fenwold"]}}',
  '{"id":"g:bren","label":"Bren Osk","types":["t:Grower"],"relations":{"r:tends":["o:brisk"]}}',
].join("\n");
writeFileSync(join(dir, "orchards.jsonl"), ORCHARDS + "\n");

describe("an unknown command", () => {
  it("is named, with the list of commands, not 'too many arguments'", () => {
    const r = tp(dir, "query", "x");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/unknown command 'query'/);
    expect(r.stderr).toMatch(/load, show, stats, ask, check/);
    expect(r.stderr).not.toMatch(/too many arguments|did you mean/);
  });
  it("a near miss gets the nearest command", () => {
    expect(tp(dir, "chek", "q.txt").stderr).toMatch(/unknown command 'chek' \(did you mean check\?\)/);
    expect(tp(dir, "aks", "Who?").stderr).toMatch(/did you mean ask\?/);
  });
});

describe("a catalog that does not exist", () => {
  it("says so, and the load command it gives works as printed (folder missing too)", () => {
    const db = join(dir, "new folder", "cat.db");
    const r = tp(dir, "ask", "Who tends Fenwold Orchard?", "--db", db);
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/catalog not found \(the folder .*new folder does not exist either\)/);
    const cmd = /make one from your data with: (.*)$/m.exec(r.stderr)![1]!;
    // run exactly what was printed, with the user's file in place of FILE…
    const tiepoint = `${process.execPath} ${join(__dirname, "..", "dist/cli/main.js")}`;
    execSync(cmd.replace("tiepoint load", `${tiepoint} load`).replace("FILE…", "orchards.jsonl"), { cwd: dir, stdio: "pipe" });
    const again = tp(dir, "ask", "Who tends Fenwold Orchard?", "--db", db, "--json");
    expect(again.status).toBe(0);
    expect(JSON.parse(again.stdout).answers[0].id).toBe("g:alia");
  });
});

describe("a condition whose attribute the candidates lack", () => {
  it("names the word that matched the attribute, not every attribute they lack", () => {
    const db = join(dir, "orchards.db");
    expect(tp(dir, "load", "orchards.jsonl", "--db", db).status).toBe(0);
    const r = tp(dir, "ask", "Which grower has the largest acreage?", "--db", db);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/the word "acreage" matched the attribute acreage, but none of the 2 candidates has it, so the ordering is not applied/);
  });
});

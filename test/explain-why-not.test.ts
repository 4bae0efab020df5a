/**
 * `--why-not ENTITY` through the real pipeline (Session on the demo catalog) and the real CLI
 * (spawned `node dist/cli/main.js`, so it needs the build that `npm test` runs first).
 * Facts from the demo catalog sources (data/core.jsonl): the Deepeye sonar is carried aboard
 * the Caddrow; the Lumen Ray is another vessel; Tolvane is a town.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { Session } from "../src/pipeline/index.js";
import { TiepointError } from "../src/model/index.js";

const MAIN = join(__dirname, "..", "dist", "cli", "main.js");
let session: Session;
beforeAll(() => {
  session = Session.open();
});
afterAll(() => session?.close());

describe("why not", () => {
  it("explains why another vessel and a town are not the answer", () => {
    const out = session.ask("Which vessel carries the Deepeye sonar?", { whyNot: ["Lumen Ray", "town:tolvane"] });
    expect(out.result.answers[0]!.id).toBe("ves:caddrow");
    const [lumen, town] = out.explanation!.whyNot;
    expect(lumen!.entity.id).toBe("ves:lumen");
    expect(lumen!.rank).toBeGreaterThan(1);
    expect(lumen!.excludedByType).toBe(false);
    expect(lumen!.perClue[0]!.weak).toBe(true); // Deepeye is not aboard the Lumen Ray: a longer path
    expect(lumen!.perClue[0]!.cell.hops!).toBeGreaterThan(1);
    expect(town!.excludedByType).toBe(true);
    expect(town!.rank).toBeNull();
    expect(town!.reasons.join("\n")).toMatch(/type filter excluded it/);
  });

  it("rejects an unknown entity with a one-line error", () => {
    expect(() => session.ask("Which vessel carries the Deepeye sonar?", { whyNot: ["no such thing"] })).toThrow(TiepointError);
  });

  it("prints the why-not section from the CLI, and exits 1 on an unknown entity", () => {
    const ok = spawnSync(process.execPath, [MAIN, "ask", "Which vessel carries the Deepeye sonar?", "--why-not", "Lumen Ray"], { encoding: "utf8" });
    expect(ok.status).toBe(0);
    expect(ok.stdout).toContain("why not Lumen Ray [ves:lumen]?");
    expect(ok.stdout).toMatch(/Deepeye sonar —carried aboard→ Caddrow/);
    const bad = spawnSync(process.execPath, [MAIN, "ask", "Which vessel carries the Deepeye sonar?", "--why-not", "no such thing"], { encoding: "utf8" });
    expect(bad.status).toBe(1);
    // one line for the error (progress lines may precede it when the demo cache is rebuilt), no stack trace
    expect(bad.stderr.trim().split("\n").filter((l) => /no such thing/.test(l))).toHaveLength(1);
    expect(bad.stderr).toMatch(/^tiepoint: no entity with id or label "no such thing"/m);
    expect(bad.stderr).not.toMatch(/\n\s+at /);
  });
});

/**
 * `ask --why-not` and the additive `ask --json` fields through the real CLI on the demo
 * catalog (issue 18). Facts from the demo sources (data/core.jsonl): "Caddrow" names both a
 * town (town:caddrow) and a vessel (ves:caddrow); the Deepeye sonar is carried aboard the
 * vessel Caddrow; the Lumen Ray (ves:lumen) is another vessel; the Pellory was built in 1978
 * and the Skerrin Dawn in 2004 (data/core.jsonl attribute `built`).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { ensureBuilt, ROOT, tp } from "./reliability-cli.js";

ensureBuilt();

/** A reason that says an entity does not reach (or reaches) itself: "X" … X with nothing to tell them apart. */
const SELF_REACH = /^\s*- "([^"]+)" (?:does not reach|reaches) \1(?: within| only)/m;

describe("--why-not with a shared name", () => {
  it("explains every entity of the name, told apart by ids, and never says X does not reach X", () => {
    const r = tp(ROOT, "ask", "What is the home port of the Caddrow?", "--why-not", "Caddrow");
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("why not Caddrow [town:caddrow]?");
    expect(r.stdout).toContain("why not Caddrow [ves:caddrow]?");
    expect(r.stdout).toMatch(/note: +--why-not "Caddrow": 2 entities have this name \(town:caddrow \(town\); ves:caddrow \(vessel\)\); each is explained, give an id to explain one/);
    expect(r.stdout).not.toMatch(SELF_REACH);
    // the vessel is the question's clue: said once, not as an unreached clue of itself
    expect(r.stdout).toMatch(/Caddrow is itself a clue of the question/);
    expect(r.stdout).not.toMatch(/"Caddrow": not scored; not reached/);
  });
  it("an id explains that one entity only", () => {
    const r = tp(ROOT, "ask", "What is the home port of the Caddrow?", "--why-not", "town:caddrow", "--json");
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.whyNot.map((w: { entity: { id: string } }) => w.entity.id)).toEqual(["town:caddrow"]);
    // the clue of the same name is named with its id in the reasons
    expect(doc.whyNot[0].reasons.join("\n")).not.toMatch(/"Caddrow" (does not reach|reaches) Caddrow /);
  });
});

describe("--why-not with an unknown name", () => {
  it("says so with the nearest names, not 'try show NAME'", () => {
    const r = tp(ROOT, "ask", "Which vessel carries the Deepeye sonar?", "--why-not", "Lumen Rai");
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe('tiepoint: no entity with id or label "Lumen Rai" in the catalog; did you mean Lumen Ray [ves:lumen]?\n');
  });
  it("a name that differs only in case is found", () => {
    const r = tp(ROOT, "ask", "Which vessel carries the Deepeye sonar?", "--why-not", "lumen ray");
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("why not Lumen Ray [ves:lumen]?");
  });
});

describe("--why-not without a clue", () => {
  it("still reports, with the condition the entity fails", () => {
    const r = tp(ROOT, "ask", "Which vessels were built before 1980?", "--why-not", "Skerrin Dawn", "--json");
    expect(r.status).toBe(0);
    const w = JSON.parse(r.stdout).whyNot;
    expect(w).toHaveLength(1);
    expect(w[0].entity.id).toBe("ves:skerrin");
    expect(w[0].reasons.join("\n")).toMatch(/fails a condition of the question: build year: 2004 fails < 1980/);
  });
});

describe("--why-not on a value question", () => {
  it("says there is no ranking to compare with, and still checks the name", () => {
    // the invented observatory network (test/fixtures/observatory): Calloway Dome's altitude is 95 metres
    const fix = join(ROOT, "test/fixtures/observatory");
    const dir = mkdtempSync(join(tmpdir(), "tp-whynot-"));
    try {
      const db = join(dir, "obs.db");
      expect(tp(fix, "load", "network.ttl", "--db", db).status).toBe(0);
      const q = "What is the altitude of Calloway Dome?";
      const r = tp(fix, "ask", q, "--db", db, "--why-not", "Greyhill Observatory", "--json");
      expect(r.status).toBe(0);
      const doc = JSON.parse(r.stdout);
      expect(doc.values.length).toBeGreaterThan(0);
      expect(doc.notes.join("\n")).toMatch(/--why-not "Greyhill Observatory": this question is answered from attribute values/);
      expect(tp(fix, "ask", q, "--db", db, "--why-not", "Greyhil Observatory").stderr).toMatch(/did you mean Greyhill Observatory \[/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("ask --json carries what the text shows", () => {
  it("relation cues, clue coverage, clue ablation, why-not and timing", () => {
    const q = "Which vessel carries the Deepeye sonar?";
    const r = tp(ROOT, "ask", q, "--json", "--why-not", "Lumen Ray");
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    const text = tp(ROOT, "ask", q).stdout;
    // the text's cues line lists the same relations, in the same order
    const cues = /^cues: +(.*)$/m.exec(text)![1]!;
    expect(cues).toBe(doc.relationCues.map((c: { label: string; words: string[] }) => `${c.label} (${c.words.join(" ")})`).join(", "));
    expect(doc.relationCues[0]).toMatchObject({ id: "r:carriedAboard", words: ["carries"] });
    // coverage: one row per answer in answer order, one cell per linked clue
    expect(doc.coverage.clues.map((c: { id: string }) => c.id)).toEqual(doc.mentions.map((m: { entity: { id: string } }) => m.entity.id));
    expect(doc.coverage.rows.map((x: { answer: { id: string } }) => x.answer.id)).toEqual(doc.answers.map((a: { id: string }) => a.id));
    // the best answer's cell is its shortest path from the clue: Deepeye —carried aboard→ Caddrow
    expect(doc.coverage.rows[0].cells[0]).toEqual({ reached: true, hops: 1, relations: [{ id: "r:carriedAboard", label: "carried aboard", inverse: false }] });
    expect(doc.ablation).toHaveLength(1);
    expect(doc.ablation[0].clue.id).toBe("ins:deepeye");
    expect(["necessary", "narrowing", "redundant", "conflicting"]).toContain(doc.ablation[0].role);
    expect(doc.whyNot[0].entity.id).toBe("ves:lumen");
    expect(doc.whyNot[0].perClue[0].clue.id).toBe("ins:deepeye");
    for (const k of ["link", "analyze", "rank", "explain", "total"]) expect(doc.timing[k]).toBeGreaterThanOrEqual(0);
    expect(doc.timing.total).toBeGreaterThanOrEqual(doc.timing.link);
  });
});

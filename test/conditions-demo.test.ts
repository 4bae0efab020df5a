/**
 * Questions with conditions on the demo catalog (issue 11), end to end through one real
 * Session: comparisons, superlatives/ordinals, exclusions and counts. Gold answers (and the
 * number of a count) are computed by SQL over the built catalog in
 * test/fixtures/condition-questions.ts, independently of tiepoint's stages; the same
 * questions are in data/demo-questions.tsv with those answers as `expected`.
 */
import { execFileSync } from "node:child_process";
import { resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../src/pipeline/index.js";
import { conditionGold, type ConditionGold } from "./fixtures/condition-questions.js";

const ROOT = resolve(__dirname, "..");
let session: Session;
let gold: Map<string, ConditionGold>;

beforeAll(() => {
  session = Session.open();
  gold = conditionGold(session.catalog);
});
afterAll(() => session?.close());

describe("demo questions with conditions", () => {
  it("has at least 4 questions of each kind", () => {
    for (const kind of ["comparison", "superlative", "exclusion", "count"] as const) expect([...gold.values()].filter((g) => g.kind === kind).length, kind).toBeGreaterThanOrEqual(4);
  });

  it("recognises each question's condition and answers it as the SQL gold says", () => {
    const problems: string[] = [];
    for (const [q, g] of gold) {
      const r = session.ask(q, { top: 20 }).result;
      const kinds = (r.conditions ?? []).map((c) => c.kind);
      if (!kinds.includes(g.kind)) problems.push(`${q}: conditions ${kinds.join(",")} lack ${g.kind}`);
      if (g.kind === "count") {
        if (r.count?.value !== g.count) problems.push(`${q}: count ${r.count?.value} != ${g.count}`);
        if (JSON.stringify([...(r.count?.entities ?? [])].sort()) !== JSON.stringify(g.answers)) problems.push(`${q}: counted ${r.count?.entities.join(",")}`);
      } else {
        // exactly the gold answers first (in any order), then nothing else that passes
        const first = r.answers.slice(0, g.answers.length).map((a) => a.id).sort();
        if (JSON.stringify(first) !== JSON.stringify(g.answers)) problems.push(`${q}: first answers ${first.join(",")} != ${g.answers.join(",")}`);
      }
      if (g.kind === "superlative" && r.verdict.status !== "unique") problems.push(`${q}: verdict ${r.verdict.status}`);
    }
    expect(problems).toEqual([]);
  });

  it("shows the attribute value that satisfied each comparison, per answer", () => {
    const r = session.ask("Which vessels were built before 1980?", { top: 20 }).result;
    const c = r.conditions?.[0];
    expect(c).toMatchObject({ kind: "comparison", operator: "<", values: ["1980"], attribute: { id: "built", unit: "year" }, applied: true });
    for (const a of r.answers) {
      const step = a.values?.find((v) => v.attribute === "built");
      expect(step?.satisfied, a.id).toBe(true);
      expect(step!.values.every((v) => v < 1980)).toBe(true);
    }
    // the same answers as the SQL gold, all fitting equally: a tie
    expect(r.verdict.status).toBe("tied");
  });

  it("orders a superlative among the candidates that fit the clue, with each one's place", () => {
    const r = session.ask("Which vessel with Tolvane as its home port is the longest?", { top: 5 }).result;
    const step = r.answers[0]!.values!.find((v) => v.attribute === "length")!;
    expect(step).toMatchObject({ satisfied: true, place: 1 });
    const second = r.answers[1]!.values!.find((v) => v.attribute === "length")!;
    expect(second.place).toBe(2);
    expect(second.values[0]!).toBeLessThanOrEqual(step.values[0]!);
  });

  it("says so when no attribute of the catalog matches the condition's words, and applies nothing", () => {
    const r = session.ask("Which vessels are wider than 10 metres?", { top: 5 }).result;
    expect(r.conditions?.[0]).toMatchObject({ kind: "comparison", attribute: null, applied: false });
    expect((r.notes ?? []).some((n) => /no attribute of the catalog matches/.test(n))).toBe(true);
  });

  it("prints the conditions, the count and the values in the text output (needs the build: npm test runs tsc first)", () => {
    const out = execFileSync(process.execPath, [resolve(ROOT, "dist/cli/main.js"), "ask", "How many vessels were built before 1980?", "--top", "3"], { encoding: "utf8" });
    expect(out).toMatch(/^if: +count the answers/m);
    expect(out).toMatch(/^(if:)? +build year \(year\) < 1980/m);
    expect(out).toMatch(/^count: +8$/m); // 8: SQL gold in test/fixtures/condition-questions.ts
    expect(out).toMatch(/meets build year: \d{4} satisfies < 1980/);
  });
});

/**
 * The explain stage over every demo question (data/demo-questions.tsv) through the real
 * Session on the demo catalog:
 * - every path of every answer is valid: consecutive steps join, every step is a stored
 *   edge of the catalog in the stated direction (`cat.hasEdge`), the path starts at a clue's
 *   seed and ends at the answer;
 * - the verdict: questions with several expected answers are `tied` and list all of them;
 *   questions with one expected answer that the ranking puts first are `unique` (when the
 *   ranking puts another entity first, "unique" would be wrong, so those are only counted;
 *   the confusion counts are in the failure message);
 * - round trip: for every tied question, at least one suggested clue, appended to the
 *   question, makes tiepoint report `unique` with the same best answer.
 * Expected answers come from the demo question file (written by hand with the catalog).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { join } from "node:path";
import { parseQuestionFile, Session, type AskOutcome } from "../src/pipeline/index.js";
import type { VerdictStatus } from "../src/model/index.js";

const QUESTIONS = join(__dirname, "..", "data", "demo-questions.tsv");

let session: Session;
let items: ReturnType<typeof parseQuestionFile>;
const outcomes = new Map<number, AskOutcome>();

beforeAll(() => {
  session = Session.open();
  items = parseQuestionFile(QUESTIONS);
  for (const q of items) outcomes.set(q.line, session.ask(q.question, { top: 10 }));
});
afterAll(() => session?.close());

describe("explanations of the demo questions", () => {
  it("every path of every answer is valid against the catalog", () => {
    const cat = session.catalog;
    const problems: string[] = [];
    let paths = 0;
    for (const q of items) {
      const out = outcomes.get(q.line)!;
      const seeds = new Set<string>();
      for (const c of out.analysis.clues) {
        seeds.add(c.id);
        for (const a of out.analysis.mentions[c.mention]?.alternatives ?? []) seeds.add(a.id);
      }
      for (const a of out.result.answers) {
        for (const p of a.paths) {
          paths++;
          const where = `line ${q.line} answer ${a.id} path from ${p.from}`;
          if (!seeds.has(p.from)) problems.push(`${where}: does not start at a clue`);
          if (p.steps.length === 0) problems.push(`${where}: no steps`);
          if (p.steps[0]?.from !== p.from) problems.push(`${where}: first step does not start at the path's from`);
          if (p.steps.at(-1)?.to !== a.id) problems.push(`${where}: does not end at the answer`);
          p.steps.forEach((s, i) => {
            if (i > 0 && s.from !== p.steps[i - 1]!.to) problems.push(`${where}: step ${i} does not join`);
            const stored = s.inverse ? cat.hasEdge(s.to, s.relation, s.from) : cat.hasEdge(s.from, s.relation, s.to);
            if (!stored) problems.push(`${where}: step ${i} ${s.from} ${s.relation} ${s.to} (inverse ${s.inverse}) is not a stored edge`);
          });
        }
      }
    }
    expect(problems).toEqual([]);
    expect(paths).toBeGreaterThan(items.length); // every question has answers with paths
  });

  it("reports the multi-answer questions tied with all their answers and the others unique", () => {
    const confusion: Record<string, Record<VerdictStatus, number>> = {
      several: { unique: 0, tied: 0, weak: 0, none: 0 },
      one: { unique: 0, tied: 0, weak: 0, none: 0 },
      "one, ranked wrong": { unique: 0, tied: 0, weak: 0, none: 0 },
    };
    const wrong: string[] = [];
    for (const q of items) {
      const r = outcomes.get(q.line)!.result;
      const rankedRight = q.expected.includes(r.answers[0]?.id ?? "");
      // a count's answer is the number (README "Verdicts"): unique however many entities it counts
      if (r.count) {
        if (r.count.value !== q.expected.length || r.verdict.status !== "unique") wrong.push(`line ${q.line}: count ${r.count.value} ${r.verdict.status} (${r.verdict.reason})`);
        continue;
      }
      const kind = q.expected.length > 1 ? "several" : rankedRight ? "one" : "one, ranked wrong";
      confusion[kind]![r.verdict.status]++;
      if (kind === "several") {
        const fitting = new Set([r.answers[0]?.id, ...r.verdict.tiedWith]);
        const missing = q.expected.filter((e) => !fitting.has(e));
        if (r.verdict.status !== "tied" || missing.length > 0) wrong.push(`line ${q.line}: ${r.verdict.status}, missing ${missing.join(",")}`);
      } else if (kind === "one" && r.verdict.status !== "unique") wrong.push(`line ${q.line}: ${r.verdict.status} (${r.verdict.reason})`);
    }
    expect(wrong, JSON.stringify(confusion)).toEqual([]);
    expect(confusion.several!.tied + confusion.one!.unique + Object.values(confusion["one, ranked wrong"]!).reduce((a, b) => a + b, 0)).toBe(items.filter((q) => !outcomes.get(q.line)!.result.count).length);
  });

  it("for every tied question, some suggested clue makes the answer unique (round trip through the pipeline)", () => {
    const failures: string[] = [];
    let tied = 0;
    for (const q of items) {
      const out = outcomes.get(q.line)!;
      if (out.result.verdict.status !== "tied") continue;
      tied++;
      const want = out.result.answers[0]!.id;
      const suggestions = out.explanation?.suggestions ?? [];
      const ok = suggestions.find((s) => {
        const again = session.ask(s.question, { top: 3 }).result;
        return again.verdict.status === "unique" && again.answers[0]?.id === want;
      });
      if (!ok) failures.push(`line ${q.line}: none of ${suggestions.length} suggestions (${suggestions.map((s) => s.text).join(" / ")}) singles out ${want}`);
    }
    expect(tied).toBeGreaterThan(0);
    expect(failures).toEqual([]);
  });

  it("the suggestion checks' verdict-only re-ask (no answer paths, ablation or suggestions) gives the full ask's verdict and answers", () => {
    let checked = 0;
    for (const q of items) {
      const out = outcomes.get(q.line)!;
      for (const s of out.explanation?.suggestions ?? []) {
        const full = session.ask(s.question, { top: 3, timeLimitMs: 0 }).result;
        const lean = session.ask(s.question, { top: 3, timeLimitMs: 0, verdictOnly: true }).result;
        expect(lean.verdict, s.question).toEqual(full.verdict);
        expect(lean.answers.map((a) => [a.id, a.score]), s.question).toEqual(full.answers.map((a) => [a.id, a.score]));
        expect(lean.answers.every((a) => a.paths.length === 0)).toBe(true);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(0);
  });
});
